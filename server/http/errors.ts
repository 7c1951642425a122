import fs from 'node:fs';
import type { ErrorRequestHandler, RequestHandler } from 'express';
import multer from 'multer';
import type { ApiErrorBody } from '@shared/schemas/common';

/** An error the API reports to the client as it is: status, code, message and per-field messages. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string>,
    readonly extra?: Pick<ApiErrorBody['error'], 'issues' | 'details'>,
    /** Response headers the refusal carries (Retry-After on a 503 from the job pool). */
    readonly headers?: Record<string, string>,
  ) {
    super(message);
  }
}

export const notFound = (what: string) => new HttpError(404, 'not_found', `${what} was not found.`);
export const conflict = (message: string) => new HttpError(409, 'conflict', message);
export const unprocessable = (message: string, fields?: Record<string, string>) => new HttpError(422, 'invalid', message, fields);
export const forbidden = (message = 'Your role may not do this.') => new HttpError(403, 'forbidden', message);

export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new HttpError(404, 'not_found', `No API route ${req.method} ${req.path}.`));
};

const MULTER_STATUS: Record<string, [number, string]> = {
  LIMIT_FILE_SIZE: [413, 'The file is larger than this upload allows.'],
  LIMIT_FILE_COUNT: [413, 'Too many files in one upload.'],
  LIMIT_PART_COUNT: [413, 'Too many parts in one upload.'],
  LIMIT_FIELD_COUNT: [413, 'Too many fields in one upload.'],
  LIMIT_UNEXPECTED_FILE: [400, 'Unexpected file field; send the file as "file".'],
};

/** The one error path: known errors keep their status; anything else is a 500 without details. */
export function errorHandler(log: (message: string, err: unknown) => void): ErrorRequestHandler {
  return (err, req, res, _next) => {
    // An upload kept on disk (lot files) is removed before the refusal goes out.
    if (req.file?.path) fs.rmSync(req.file.path, { force: true });
    let status = 500;
    let body: ApiErrorBody = { error: { code: 'internal', message: 'Something went wrong on the server.' } };
    if (err instanceof HttpError) {
      status = err.status;
      for (const [name, value] of Object.entries(err.headers ?? {})) res.setHeader(name, value);
      body = { error: { code: err.code, message: err.message, ...(err.fields ? { fields: err.fields } : {}), ...(err.extra ?? {}) } };
    } else if (err instanceof multer.MulterError) {
      const [s, message] = MULTER_STATUS[err.code] ?? [400, err.message];
      status = s;
      body = { error: { code: err.code.toLowerCase(), message } };
    } else if (isBodyParserError(err)) {
      status = err.status;
      body = {
        error: {
          code: err.type === 'entity.too.large' ? 'too_large' : 'bad_request',
          message: err.type === 'entity.too.large' ? 'The request body is too large.' : 'The request body is not valid JSON.',
        },
      };
    } else if (err instanceof URIError || (isClientError(err) && /decode param/i.test(err.message))) {
      status = 400;
      body = { error: { code: 'bad_path', message: 'The address holds bad percent-encoding.' } };
    } else if (isSqliteConstraint(err, 'SQLITE_CONSTRAINT_FOREIGNKEY')) {
      // A reference the handler did not check by name (those answer with their field): still the client's input.
      status = 422;
      body = { error: { code: 'invalid', message: 'The request refers to a record that does not exist.' } };
    } else if (isSqliteBusy(err)) {
      // Another connection (a pool worker storing a lot) held the write lock past the busy timeout: not a
      // fault of the request, and over in a moment.
      status = 503;
      res.setHeader('Retry-After', '1');
      body = { error: { code: 'busy', message: 'The database is busy with another write; try again in a moment.' } };
    } else if (isClientError(err)) {
      // Errors from Express and its parsers that carry a 4xx status (http-errors): the client's fault.
      status = err.status;
      body = { error: { code: 'bad_request', message: err.expose && err.message ? err.message : 'The request could not be read.' } };
    } else {
      log('Unhandled error', err);
    }
    res.status(status).json(body);
  };
}

function isBodyParserError(err: unknown): err is { status: number; type: string } {
  return (
    typeof err === 'object' && err !== null && 'type' in err && 'status' in err && typeof (err as { status: unknown }).status === 'number'
  );
}

function isClientError(err: unknown): err is { status: number; message: string; expose?: boolean } {
  if (typeof err !== 'object' || err === null) return false;
  const status = (err as { status?: unknown }).status;
  return typeof status === 'number' && status >= 400 && status < 500;
}

/** SQLITE_BUSY and its extended codes (SQLITE_BUSY_SNAPSHOT, …). */
function isSqliteBusy(err: unknown): boolean {
  const code = typeof err === 'object' && err !== null ? (err as { code?: unknown }).code : undefined;
  return typeof code === 'string' && /^SQLITE_BUSY/.test(code);
}

function isSqliteConstraint(err: unknown, code: string): boolean {
  return typeof err === 'object' && err !== null && (err as { code?: unknown }).code === code;
}
