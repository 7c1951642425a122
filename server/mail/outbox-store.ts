// Writing a built message and its attachments to the outbox: one transaction, on the request thread for an
// ordinary message, in a pool worker (server/pool/tasks.ts `outboxStore`) for a large one (a customer report
// with two sound clips is ~3 MB of message source and ~2 MB of files, and its commit waits for the disk).
import type { Db } from '@server/db/client';
import { outbox, outboxAttachments } from '@server/db/schema';
import type { MailTopic } from './mailer';

export interface OutboxRecord {
  to: string;
  subject: string;
  text: string;
  topic: MailTopic;
  /** The RFC 5322 source as built. */
  raw: string;
  transport: 'smtp' | 'outbox';
  sentAt: number | null;
  error: string | null;
  attachments: { filename: string; contentType: string; content: Uint8Array }[];
}

/** The record's size in bytes as stored (source and files), to decide where it is written. */
export function outboxRecordBytes(record: OutboxRecord): number {
  return record.raw.length + record.attachments.reduce((n, a) => n + a.content.byteLength, 0);
}

export function storeOutboxMessage(db: Db, record: OutboxRecord): void {
  const { attachments, ...message } = record;
  db.transaction((tx) => {
    const row = tx.insert(outbox).values(message).returning({ id: outbox.id }).get();
    for (const a of attachments) {
      const content = Buffer.from(a.content.buffer, a.content.byteOffset, a.content.byteLength);
      tx.insert(outboxAttachments)
        .values({ messageId: row.id, filename: a.filename, contentType: a.contentType, size: content.length, content })
        .run();
    }
  });
}
