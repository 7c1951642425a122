// Guards a multer middleware: a request that claims to be multipart must be one multer can read.
// A missing boundary, a compressed body, or a body that breaks off or does not match its boundary
// is the client's fault and answers 400 naming the problem (multer hands these on as plain errors).
import type { RequestHandler } from 'express';
import multer from 'multer';
import { HttpError } from '@server/http/errors';

const badMultipart = (message: string) => new HttpError(400, 'bad_multipart', message, { file: message });

export function guardedUpload(upload: RequestHandler): RequestHandler {
  return (req, res, next) => {
    const type = req.headers['content-type'] ?? '';
    if (/^multipart\//i.test(type)) {
      const encoding = (req.headers['content-encoding'] ?? 'identity').trim().toLowerCase();
      if (encoding !== 'identity')
        return next(badMultipart(`Uploads are sent uncompressed; this one was sent with Content-Encoding "${encoding}".`));
      if (!/^multipart\/form-data/i.test(type)) return next(badMultipart('Uploads are sent as multipart/form-data.'));
      if (!/;\s*boundary=("[^"]+"|[^;\s]+)/i.test(type))
        return next(badMultipart('The multipart body has no boundary in its Content-Type.'));
    }
    upload(req, res, (err?: unknown) => {
      if (err === undefined || err === null || err instanceof multer.MulterError || err instanceof HttpError) return next(err);
      const message = err instanceof Error ? err.message : String(err);
      next(badMultipart(`The upload could not be read as multipart/form-data (${message}).`));
    });
  };
}
