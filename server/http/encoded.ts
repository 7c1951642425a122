// Answers compressed off the request thread (in a pool worker) and sent as they are: the encoding the
// client accepts (brotli first, then gzip), the compression itself, and the sending with
// Content-Encoding, Content-Length and Vary, so that the compression middleware leaves them alone.
import zlib from 'node:zlib';
import type { Request, Response } from 'express';
import { sendInSlices } from './send-slices';

export type Encoding = 'gzip' | 'br';

/** brotli when the client takes it, else gzip, else null (send it uncompressed). */
export function acceptedEncoding(req: Request): Encoding | null {
  return req.acceptsEncodings('br') ? 'br' : req.acceptsEncodings('gzip') ? 'gzip' : null;
}

/** gzip at level 6; brotli at quality 4 (about gzip's cost on our JSON, and smaller; higher qualities take seconds on megabytes). */
export function compress(bytes: Uint8Array, encoding: Encoding): Buffer {
  if (encoding === 'gzip') return zlib.gzipSync(bytes, { level: 6 });
  return zlib.brotliCompressSync(bytes, {
    params: {
      [zlib.constants.BROTLI_PARAM_MODE]: zlib.constants.BROTLI_MODE_TEXT,
      [zlib.constants.BROTLI_PARAM_QUALITY]: 4,
      [zlib.constants.BROTLI_PARAM_SIZE_HINT]: bytes.length,
    },
  });
}

/** A value's JSON text as UTF-8 bytes (what a pool job answers, so that megabytes cross as bytes, not a string). */
export function jsonBytes(value: unknown): Uint8Array {
  return new TextEncoder().encode(JSON.stringify(value));
}

/** Sends a file made in a pool job (a CSV export, a rendered WAV) as a download, a slice per turn of the event loop. */
export function sendDownload(res: Response, bytes: Uint8Array, type: string, filename: string): Promise<void> {
  res.status(200).type(type).attachment(filename).setHeader('Content-Length', bytes.byteLength);
  return sendInSlices(res, [bytes]);
}

/** Sends JSON bytes as they are, compressed in `encoding` (or not, when null), a slice per turn of the event loop. */
export function sendJsonBytes(res: Response, bytes: Uint8Array, encoding: Encoding | null, status = 200): Promise<void> {
  res.status(status).type('json').setHeader('Content-Length', bytes.length);
  if (encoding) res.setHeader('Content-Encoding', encoding);
  res.vary('Accept-Encoding');
  return sendInSlices(res, [bytes]);
}
