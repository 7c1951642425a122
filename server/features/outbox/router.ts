import { and, desc, eq, inArray, sql } from 'drizzle-orm';
import { z } from 'zod';
import type { AppContext } from '@server/context';
import { auditLog, outbox, outboxAttachments } from '@server/db/schema';
import { notFound } from '@server/http/errors';
import { ApiRouter } from '@server/http/router';
import { IdParamsSchema } from '@shared/schemas/common';

/** Types an attachment is served as; anything else goes out as bytes. Always as a download, never shown in the page. */
const SERVED_TYPES: Record<string, string> = {
  'text/csv': 'text/csv; charset=utf-8',
  'text/plain': 'text/plain; charset=utf-8',
  'audio/wav': 'audio/wav',
  'audio/x-wav': 'audio/wav',
  'image/png': 'image/png',
  'application/pdf': 'application/pdf',
};

export function outboxRoutes(ctx: AppContext) {
  const { db } = ctx;
  const api = new ApiRouter('/api');
  api.get('/outbox', {
    handle: () => {
      // Without the message source (it carries every attachment again); attachments by name, type and size.
      const messages = db
        .select({
          id: outbox.id,
          to: outbox.to,
          subject: outbox.subject,
          text: outbox.text,
          topic: outbox.topic,
          transport: outbox.transport,
          sentAt: outbox.sentAt,
          error: outbox.error,
          createdAt: outbox.createdAt,
          sourceHasAttachment: sql<number>`coalesce(${outbox.raw} like '%Content-Disposition: attachment%', 0)`,
        })
        .from(outbox)
        .orderBy(desc(outbox.id))
        .limit(200)
        .all();
      const files = messages.length
        ? db
            .select({
              id: outboxAttachments.id,
              messageId: outboxAttachments.messageId,
              filename: outboxAttachments.filename,
              contentType: outboxAttachments.contentType,
              size: outboxAttachments.size,
            })
            .from(outboxAttachments)
            .where(
              inArray(
                outboxAttachments.messageId,
                messages.map((m) => m.id),
              ),
            )
            .orderBy(outboxAttachments.id)
            .all()
        : [];
      return {
        messages: messages.map(({ sourceHasAttachment, ...m }) => {
          const attachments = files.filter((f) => f.messageId === m.id).map(({ messageId: _, ...f }) => f);
          return {
            ...m,
            attachments,
            // Messages written before attachments were kept apart hold them only in their source.
            attachmentsInSourceOnly: attachments.length === 0 && sourceHasAttachment === 1,
          };
        }),
      };
    },
  });
  api.get('/outbox/:id/attachments/:attachmentId', {
    schemas: { params: IdParamsSchema.extend({ attachmentId: z.coerce.number().int().positive() }) },
    handle: ({ params, res }) => {
      const row = db
        .select()
        .from(outboxAttachments)
        .where(and(eq(outboxAttachments.id, params.attachmentId), eq(outboxAttachments.messageId, params.id)))
        .get();
      if (!row) throw notFound('That attachment');
      // A download, whatever it holds: the stored type only when it is a known one, the name as
      // RFC 6266/5987 UTF-8, and a sandbox in case a browser opens it anyway.
      res.attachment(row.filename);
      res.setHeader('Content-Type', SERVED_TYPES[row.contentType] ?? 'application/octet-stream');
      res.setHeader('X-Content-Type-Options', 'nosniff');
      res.setHeader('Content-Security-Policy', "default-src 'none'; sandbox");
      res.status(200).end(row.content);
      return undefined;
    },
  });
  api.get('/audit', {
    handle: () => ({ entries: db.select().from(auditLog).orderBy(desc(auditLog.id)).limit(500).all() }),
  });
  return api;
}
