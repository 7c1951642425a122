import { and, desc, eq } from 'drizzle-orm';
import fs from 'node:fs';
import { z } from 'zod';
import { audit } from '@server/audit';
import type { AppContext } from '@server/context';
import { attachments, jobs, lots, parts } from '@server/db/schema';
import { HttpError, notFound, unprocessable } from '@server/http/errors';
import { ApiRouter, takeWriteTurn } from '@server/http/router';
import { checkFileType, contentPath, singleFileUpload, storeContentAsync, storedName } from '@server/uploads/store';
import { readWavHeader, WavError } from '@shared/audio/wav';
import { IdParamsSchema } from '@shared/schemas/common';

const MAX_DOCUMENT_BYTES = 10 * 1024 * 1024;
const OWNERS = { parts: { type: 'part', table: parts }, lots: { type: 'lot', table: lots }, jobs: { type: 'job', table: jobs } } as const;
/** What a stored file may be served as: the types the upload check detects; anything else is bytes. */
const SERVED_TYPES: Record<string, string> = {
  'image/png': 'image/png',
  'image/jpeg': 'image/jpeg',
  'application/pdf': 'application/pdf',
  'text/csv': 'text/csv; charset=utf-8',
  'text/tab-separated-values': 'text/tab-separated-values; charset=utf-8',
  'audio/wav': 'audio/wav',
};
const INLINE_TYPES = new Set(['image/png', 'image/jpeg']);
/** `recording`: a job's direct-input WAV recording of the customer's instrument (the source of the report's clips). */
const UploadFields = z.object({ purpose: z.enum(['photo', 'certificate', 'recording']).default('photo') });

/** Photos of parts or meter displays and certificates, for parts, lots and jobs; a job's WAV recordings. */
export function attachmentRoutes(ctx: AppContext) {
  const { db } = ctx;
  const routers: ApiRouter[] = [];

  for (const [segment, owner] of Object.entries(OWNERS)) {
    const api = new ApiRouter(`/api/${segment}/:id/attachments`);
    const exists = (id: number) => db.select({ id: owner.table.id }).from(owner.table).where(eq(owner.table.id, id)).get() !== undefined;

    api.get('/', {
      schemas: { params: IdParamsSchema },
      handle: ({ params }) => {
        if (!exists(params.id)) throw notFound('That record');
        return {
          attachments: db
            .select()
            .from(attachments)
            .where(and(eq(attachments.ownerType, owner.type), eq(attachments.ownerId, params.id)))
            .orderBy(desc(attachments.id))
            .all(),
        };
      },
    });

    api.post('/', {
      status: 201,
      before: [singleFileUpload(MAX_DOCUMENT_BYTES)],
      schemas: { params: IdParamsSchema, body: UploadFields },
      handle: async ({ params, body, req, user }) => {
        if (!exists(params.id)) throw notFound('That record');
        if (body.purpose === 'recording' && owner.type !== 'job')
          throw unprocessable('Recordings are kept with jobs only.', { purpose: 'Use photo or certificate here.' });
        const { mime } = checkFileType(req.file, body.purpose === 'recording' ? 'recording' : 'document');
        const file = req.file!;
        if (body.purpose === 'recording') {
          // the clips decode it later: refuse here what the WAV reader would refuse then
          try {
            const h = readWavHeader(new Uint8Array(file.buffer.buffer, file.buffer.byteOffset, file.buffer.byteLength));
            if (h.frames === 0) throw new WavError('The WAV file holds no samples.');
          } catch (e) {
            if (e instanceof WavError) throw new HttpError(422, 'invalid_file', e.message, { file: e.message });
            throw e;
          }
        }
        // Hashed and written without holding the request thread (up to 10 MB), then the rows after a write turn.
        const content = await storeContentAsync(ctx.config.uploadsDir, file.buffer);
        await takeWriteTurn(req);
        try {
          return db.transaction((tx) => {
            const row = tx
              .insert(attachments)
              .values({
                ownerType: owner.type,
                ownerId: params.id,
                purpose: body.purpose,
                originalName: storedName(file.originalname),
                contentHash: content.contentHash,
                mime,
                size: content.size,
                createdBy: user.id,
              })
              .returning()
              .get();
            audit(tx, {
              userId: user.id,
              action: 'attachment.upload',
              entity: owner.type,
              entityId: params.id,
              detail: { attachmentId: row.id, purpose: body.purpose, name: row.originalName },
            });
            return row;
          });
        } catch (err) {
          // A refused upload leaves neither rows nor files behind.
          if (content.created) fs.rmSync(content.path, { force: true });
          throw err;
        }
      },
    });
    routers.push(api);
  }

  const files = new ApiRouter('/api/attachments');
  files.get('/:id/file', {
    schemas: { params: IdParamsSchema },
    handle: async ({ params, res }) => {
      const row = db.select().from(attachments).where(eq(attachments.id, params.id)).get();
      const file = row && contentPath(ctx.config.uploadsDir, row.contentHash);
      if (!row || !file || !fs.existsSync(file)) throw notFound('That file');
      // Only the type detected at upload is sent (never one guessed from the name), and only PNG and
      // JPEG images open in the page; everything else downloads. The name travels as RFC 6266/5987 UTF-8.
      const type = SERVED_TYPES[row.mime] ?? 'application/octet-stream';
      res.attachment(row.originalName);
      if (INLINE_TYPES.has(type))
        res.setHeader('Content-Disposition', (res.getHeader('Content-Disposition') as string).replace(/^attachment/, 'inline'));
      res.setHeader('Content-Type', type);
      res.setHeader('Content-Security-Policy', "default-src 'none'; img-src 'self'; sandbox");
      await new Promise<void>((resolve, reject) => res.sendFile(file, (err) => (err ? reject(err) : resolve())));
      return undefined;
    },
  });
  routers.push(files);
  return routers;
}
