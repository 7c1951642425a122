import nodemailer, { type Transporter } from 'nodemailer';
import type { WriteTurns } from '@server/db/write-turns';
import type { Db } from '@server/db/client';
import { outbox, outboxAttachments } from '@server/db/schema';

export type MailTopic = 'invitation' | 'password-reset' | 'lot-disposition' | 'lot-reopen' | 'customer-report';

export interface MailMessage {
  to: string;
  subject: string;
  text: string;
  topic: MailTopic;
  attachments?: { filename: string; content: string | Buffer; contentType?: string }[];
}

export interface Mailer {
  send(message: MailMessage): Promise<void>;
}

/**
 * Every message is built by nodemailer. With SMTP_URL it is sent for real; without it, the
 * local stand-in keeps the built message (RFC 5322 source) in the outbox table, where admins
 * read it on the Outbox screen. Either way the outbox row is the record of what was sent.
 */
export function createMailer(db: Db, opts: { smtpUrl?: string; from: string; writeTurns?: WriteTurns }): Mailer {
  const builder: Transporter = nodemailer.createTransport({ streamTransport: true, buffer: true, newline: 'unix' });
  const smtp: Transporter | null = opts.smtpUrl ? nodemailer.createTransport(opts.smtpUrl) : null;

  return {
    async send(message) {
      const mail = { from: opts.from, to: message.to, subject: message.subject, text: message.text, attachments: message.attachments };
      const built = await builder.sendMail(mail);
      const raw = Buffer.isBuffer(built.message) ? built.message.toString('utf8') : String(built.message);
      let sentAt: number | null = null;
      let error: string | null = null;
      if (smtp) {
        try {
          await smtp.sendMail(mail);
          sentAt = Date.now();
        } catch (err) {
          error = err instanceof Error ? err.message : String(err);
        }
      }
      // The message and its attachments in one transaction: the Outbox lists them and serves them back.
      await opts.writeTurns?.take();
      db.transaction((tx) => {
        const row = tx
          .insert(outbox)
          .values({
            to: message.to,
            subject: message.subject,
            text: message.text,
            topic: message.topic,
            raw,
            transport: smtp ? 'smtp' : 'outbox',
            sentAt,
            error,
          })
          .returning({ id: outbox.id })
          .get();
        for (const a of message.attachments ?? []) {
          const content = typeof a.content === 'string' ? Buffer.from(a.content, 'utf8') : a.content;
          tx.insert(outboxAttachments)
            .values({
              messageId: row.id,
              filename: a.filename,
              contentType: a.contentType ?? 'application/octet-stream',
              size: content.length,
              content,
            })
            .run();
        }
      });
    },
  };
}
