// The lot's CSV export goes up as multipart (`file`, optional `replace` and `mapping`). The shared
// JSON client cannot send a file, so this one request is made here, and its error keeps the
// envelope's `issues` (line and column of each problem) and `details` (the columns found when the
// file needs a mapping) for the upload panel.
import { useMutation } from '@tanstack/react-query';
import type { ExplicitMapping } from '@shared/csv/columns';
import { ApiErrorSchema, type ApiErrorBody } from '@shared/schemas/common';
import { ApiError } from '@/lib/api-client';
import type { Lot, LotStats } from './types';

export type UploadIssue = NonNullable<ApiErrorBody['error']['issues']>[number];

/** What the server found in a file whose columns it could not name by itself. */
export interface NeedsMapping {
  header: string[];
  detected: Partial<Record<string, { index: number; header: string; unit?: string }>>;
  missing: string[];
}

export class UploadError extends ApiError {
  constructor(
    status: number,
    code: string,
    message: string,
    fields: Record<string, string> | undefined,
    readonly issues: UploadIssue[],
    readonly needsMapping: NeedsMapping | null,
  ) {
    super(status, code, message, fields);
    this.name = 'UploadError';
  }
}

export interface UploadResult {
  lot: Lot;
  rows: number;
  columns: Record<string, string>;
  stats: LotStats | null;
  /** Server time spent reading, storing and computing (ms). */
  timings?: { parseMs: number; storeMs: number; statsMs: number };
}

/** Total server time of an upload, when the server reports it. */
export const uploadMs = (r: UploadResult): number | null => (r.timings ? Math.round(r.timings.parseMs + r.timings.storeMs + r.timings.statsMs) : null);

export interface UploadInput {
  id: number;
  file: File;
  replace: boolean;
  mapping?: ExplicitMapping;
}

export async function uploadLotReadings({ id, file, replace, mapping }: UploadInput): Promise<UploadResult> {
  const form = new FormData();
  // Fields before the file, so the server has them when the file part arrives.
  if (replace) form.append('replace', 'true');
  if (mapping) form.append('mapping', JSON.stringify(mapping));
  form.append('file', file, file.name);
  let response: Response;
  try {
    response = await fetch(`/api/lots/${id}/readings`, { method: 'POST', body: form, credentials: 'same-origin', headers: { Accept: 'application/json' } });
  } catch {
    throw new ApiError(0, 'network', 'The server cannot be reached. Check the connection and try again.');
  }
  const text = await response.text();
  let data: unknown;
  try {
    data = text ? JSON.parse(text) : undefined;
  } catch {
    data = undefined;
  }
  if (!response.ok) {
    const envelope = ApiErrorSchema.safeParse(data);
    if (!envelope.success) throw new ApiError(response.status, 'http_error', `The server answered ${response.status} ${response.statusText}.`.trim());
    const { code, message, fields, issues, details } = envelope.data.error;
    const needs = details?.needsMapping as NeedsMapping | undefined;
    throw new UploadError(response.status, code, message, fields, issues ?? [], needs && Array.isArray(needs.header) ? needs : null);
  }
  return data as UploadResult;
}

export const useUploadLotReadings = () => useMutation({ mutationFn: uploadLotReadings, meta: { invalidates: [['lots']] } });
