// The one way the client talks to the API: same-origin fetches (JSON, or multipart for files) that
// throw a typed ApiError carrying the server's envelope
// `{ error: { code, message, fields?, issues?, details? } }` (shared/schemas/common.ts).
import { ApiErrorSchema, type ApiErrorBody } from '@shared/schemas/common';

/** One problem in an uploaded file, with its line and column. */
export type FileIssue = NonNullable<ApiErrorBody['error']['issues']>[number];

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string>,
    /** A refused file's problems (line, column, message). */
    readonly issues: FileIssue[] = [],
    /** Error-specific data, e.g. `needsMapping` when a file's columns were not recognised. */
    readonly details?: Record<string, unknown>,
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

export const isApiError = (err: unknown): err is ApiError => err instanceof ApiError;

type QueryValue = string | number | boolean | null | undefined;

interface RequestOptions {
  params?: Record<string, QueryValue>;
  /** JSON-encoded, or sent as it is when FormData (multipart: the browser writes the boundary). */
  body?: unknown;
  signal?: AbortSignal;
  /** 'text' returns the body as a string (e.g. a SPICE netlist) instead of parsing JSON. */
  as?: 'json' | 'text';
}

/** `/api/parts` + `{ kind: 'pot', q: '' }` → `/api/parts?kind=pot` (empty values are left out). */
export function withParams(path: string, params?: Record<string, QueryValue>): string {
  if (!params) return path;
  const search = new URLSearchParams();
  for (const [key, value] of Object.entries(params)) {
    if (value === undefined || value === null || value === '') continue;
    search.set(key, String(value));
  }
  const text = search.toString();
  return text ? `${path}?${text}` : path;
}

async function request<T>(method: string, path: string, opts: RequestOptions = {}): Promise<T> {
  const multipart = opts.body instanceof FormData;
  let response: Response;
  try {
    response = await fetch(withParams(path, opts.params), {
      method,
      // Same-origin only: the session cookie goes along, and the browser sends Origin, which the
      // server checks on every state-changing request.
      credentials: 'same-origin',
      headers: {
        Accept: opts.as === 'text' ? 'text/plain, application/json' : 'application/json',
        ...(opts.body !== undefined && !multipart ? { 'Content-Type': 'application/json' } : {}),
      },
      body: opts.body === undefined ? undefined : multipart ? (opts.body as FormData) : JSON.stringify(opts.body),
      signal: opts.signal,
    });
  } catch (err) {
    if (err instanceof DOMException && err.name === 'AbortError') throw err;
    throw new ApiError(0, 'network', 'The server cannot be reached. Check the connection and try again.');
  }

  if (response.status === 204) return undefined as T;
  const text = await response.text();
  if (response.ok && opts.as === 'text') return text as T;
  let data: unknown = undefined;
  if (text) {
    try {
      data = JSON.parse(text);
    } catch {
      data = undefined;
    }
  }
  if (!response.ok) {
    const envelope = ApiErrorSchema.safeParse(data);
    if (envelope.success) {
      const { code, message, fields, issues, details } = envelope.data.error;
      throw new ApiError(response.status, code, message, fields, issues ?? [], details);
    }
    throw new ApiError(response.status, 'http_error', `The server answered ${response.status} ${response.statusText}.`.trim());
  }
  return data as T;
}

export const api = {
  get: <T>(path: string, opts?: Omit<RequestOptions, 'body'>) => request<T>('GET', path, opts),
  post: <T>(path: string, body?: unknown, opts?: Omit<RequestOptions, 'body'>) => request<T>('POST', path, { ...opts, body: body ?? {} }),
  put: <T>(path: string, body: unknown, opts?: Omit<RequestOptions, 'body'>) => request<T>('PUT', path, { ...opts, body }),
  patch: <T>(path: string, body: unknown, opts?: Omit<RequestOptions, 'body'>) => request<T>('PATCH', path, { ...opts, body }),
  delete: <T>(path: string, opts?: Omit<RequestOptions, 'body'>) => request<T>('DELETE', path, opts),
};
