import nodemailer, { type Transporter } from 'nodemailer';
import type { WriteTurns } from '@server/db/write-turns';
import type { Db } from '@server/db/client';
import { HttpError } from '@server/http/errors';
import type { JobPool } from '@server/pool';
import { outboxRecordBytes, storeOutboxMessage, type OutboxRecord } from './outbox-store';

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

/** A message larger than this (source and files) is written to the outbox by a pool worker. */
const LARGE_MESSAGE_BYTES = 256 * 1024;

/**
 * Every message is built by nodemailer. With SMTP_URL it is sent for real; without it, the
 * local stand-in keeps the built message (RFC 5322 source) in the outbox table, where admins
 * read it on the Outbox screen. Either way the outbox row is the record of what was sent.
 */
export function createMailer(
  db: Db,
  opts: { smtpUrl?: string; from: string; writeTurns?: WriteTurns; pool?: JobPool; dbFile?: string },
): Mailer {
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
      const record: OutboxRecord = {
        to: message.to,
        subject: message.subject,
        text: message.text,
        topic: message.topic,
        raw,
        transport: smtp ? 'smtp' : 'outbox',
        sentAt,
        error,
        attachments: (message.attachments ?? []).map((a) => ({
          filename: a.filename,
          contentType: a.contentType ?? 'application/octet-stream',
          content: typeof a.content === 'string' ? Buffer.from(a.content, 'utf8') : a.content,
        })),
      };
      // The message and its attachments in one transaction: the Outbox lists them and serves them back.
      // A large one is written by a pool worker; when the pool cannot take it now, here rather than not at all.
      if (opts.pool && opts.dbFile && outboxRecordBytes(record) > LARGE_MESSAGE_BYTES) {
        try {
          await opts.pool.run('outboxStore', { dbFile: opts.dbFile, record });
          return;
        } catch (err) {
          if (!(err instanceof HttpError && err.status === 503)) throw err;
        }
      }
      await opts.writeTurns?.take();
      storeOutboxMessage(db, record);
    },
  };
}
