// Uploaded files on disk: under the data folder (never the web root), named by the SHA-256 of
// their content (never by the user's file name), after a check of the file's own signature
// (OWASP File Upload Cheat Sheet: the client's Content-Type proves nothing).
import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import multer from 'multer';
import { HttpError } from '@server/http/errors';
import { guardedUpload } from './multipart';

export type UploadKind = 'table' | 'document' | 'recording';

interface FileType {
  extensions: string[];
  mime: string;
  matches: (head: Buffer) => boolean;
}

const isText = (head: Buffer) => !head.includes(0);
const TYPES: Record<string, FileType> = {
  csv: { extensions: ['.csv', '.txt'], mime: 'text/csv', matches: isText },
  tsv: { extensions: ['.tsv', '.tab'], mime: 'text/tab-separated-values', matches: isText },
  jpeg: { extensions: ['.jpg', '.jpeg'], mime: 'image/jpeg', matches: (h) => h[0] === 0xff && h[1] === 0xd8 && h[2] === 0xff },
  png: {
    extensions: ['.png'],
    mime: 'image/png',
    matches: (h) => h.subarray(0, 8).equals(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a])),
  },
  pdf: { extensions: ['.pdf'], mime: 'application/pdf', matches: (h) => h.subarray(0, 5).toString('latin1') === '%PDF-' },
  wav: {
    extensions: ['.wav'],
    mime: 'audio/wav',
    matches: (h) => h.subarray(0, 4).toString('latin1') === 'RIFF' && h.subarray(8, 12).toString('latin1') === 'WAVE',
  },
};

const ALLOWED: Record<UploadKind, string[]> = { table: ['csv', 'tsv'], document: ['jpeg', 'png', 'pdf'], recording: ['wav'] };

/** multer for one file in field `file`, kept in memory until it has been checked and parsed. */
export function singleFileUpload(maxBytes: number) {
  return guardedUpload(
    multer({
      storage: multer.memoryStorage(),
      defParamCharset: 'utf8',
      limits: { fileSize: maxBytes, files: 1, fields: 20, parts: 25 },
    }).single('file'),
  );
}

/** The file's type by extension and signature, or a 415 naming what is allowed. */
export function checkFileType(file: Express.Multer.File | undefined, kind: UploadKind): { type: string; mime: string } {
  if (!file) throw new HttpError(422, 'invalid', 'Attach a file in the "file" field.', { file: 'No file was sent.' });
  const ext = path.extname(file.originalname).toLowerCase();
  const allowed = ALLOWED[kind];
  const type = allowed.find((t) => TYPES[t]!.extensions.includes(ext));
  const names = allowed.flatMap((t) => TYPES[t]!.extensions).join(', ');
  if (!type)
    throw new HttpError(415, 'unsupported_type', `Files of type "${ext || 'none'}" are not accepted here; use ${names}.`, {
      file: `Use ${names}.`,
    });
  if (file.size === 0) throw new HttpError(422, 'invalid', 'The file is empty.', { file: 'The file is empty.' });
  if (!TYPES[type]!.matches(file.buffer.subarray(0, 4096))) {
    throw new HttpError(415, 'unsupported_type', `The file is named ${ext} but its content is not a ${type.toUpperCase()} file.`, {
      file: 'Content does not match the file type.',
    });
  }
  return { type, mime: TYPES[type]!.mime };
}

export interface StoredFile {
  contentHash: string;
  size: number;
  /** True when this call wrote the file (so a failed transaction may remove it again). */
  created: boolean;
  path: string;
}

/** Where uploads wait (multer's temporary files) until they are parsed and moved into place. */
export function incomingDir(uploadsDir: string): string {
  return path.join(uploadsDir, 'incoming');
}

const MAX_NAME = 200;
/**
 * The user's file name as it is kept (at most 200 characters): shortened before its extension,
 * never through it, so the checked extension is the one the stored name ends with.
 */
export function storedName(originalName: string): string {
  // Control characters (C0 and DEL) are dropped: a name is shown in headers and on screens.
  const name = Array.from(originalName)
    .filter((ch) => {
      const c = ch.codePointAt(0)!;
      return c > 0x1f && c !== 0x7f;
    })
    .join('');
  if (name.length <= MAX_NAME) return name;
  const ext = path.extname(name).slice(0, 16);
  return name.slice(0, MAX_NAME - ext.length) + ext;
}

export function contentPath(uploadsDir: string, contentHash: string): string {
  return path.join(uploadsDir, contentHash.slice(0, 2), contentHash);
}

/** Writes the content under its hash (atomically, via a temporary name); the same content is stored once. */
export function storeContent(uploadsDir: string, content: Buffer): StoredFile {
  const contentHash = createHash('sha256').update(content).digest('hex');
  const file = contentPath(uploadsDir, contentHash);
  if (fs.existsSync(file)) return { contentHash, size: content.length, created: false, path: file };
  fs.mkdirSync(path.dirname(file), { recursive: true });
  const tmp = `${file}.${process.pid}.${Date.now()}.tmp`;
  fs.writeFileSync(tmp, content);
  fs.renameSync(tmp, file);
  return { contentHash, size: content.length, created: true, path: file };
}

/** Bytes hashed per turn of the event loop by `storeContentAsync` (SHA-256 of 10 MB at once holds the thread ~25 ms). */
const HASH_SLICE = 1024 * 1024;

/** The content's SHA-256 (hex), a slice per turn of the event loop. */
export async function sha256InSlices(content: Buffer): Promise<string> {
  const hash = createHash('sha256');
  for (let at = 0; at < content.length; at += HASH_SLICE) {
    hash.update(content.subarray(at, at + HASH_SLICE));
    if (at + HASH_SLICE < content.length) await new Promise((r) => setImmediate(r));
  }
  return hash.digest('hex');
}

/**
 * `storeContent` for the request thread: the hash a megabyte per turn of the event loop, the file
 * written by the thread pool. Same result, same atomic rename.
 */
export async function storeContentAsync(uploadsDir: string, content: Buffer): Promise<StoredFile> {
  const contentHash = await sha256InSlices(content);
  const file = contentPath(uploadsDir, contentHash);
  if (fs.existsSync(file)) return { contentHash, size: content.length, created: false, path: file };
  await fs.promises.mkdir(path.dirname(file), { recursive: true });
  const tmp = `${file}.${process.pid}.${Date.now()}.tmp`;
  await fs.promises.writeFile(tmp, content);
  await fs.promises.rename(tmp, file);
  return { contentHash, size: content.length, created: true, path: file };
}

/**
 * Stores the file, runs the database work, and removes the file again if that work throws,
 * so a refused upload leaves neither rows nor files behind.
 */
export function withStoredFile<T>(uploadsDir: string, content: Buffer, work: (stored: StoredFile) => T): T {
  const stored = storeContent(uploadsDir, content);
  try {
    return work(stored);
  } catch (err) {
    if (stored.created) fs.rmSync(stored.path, { force: true });
    throw err;
  }
}
