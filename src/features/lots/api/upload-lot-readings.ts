// The lot's CSV export goes up as multipart (`file`, optional `replace` and `mapping`). A refused
// file's ApiError carries `issues` (line and column of each problem) and, when its columns were not
// recognised, `details.needsMapping` for the mapping step.
import { useMutation } from '@tanstack/react-query';
import type { ExplicitMapping, NeedsMapping } from '@shared/csv/columns';
import { api, isApiError, type FileIssue } from '@/lib/api-client';
import type { Lot, LotStats } from './types';
import { queryKeys } from '@/data/query-keys';

export type UploadIssue = FileIssue;

/** The columns the server found when a file needs a mapping (from the error's details). */
export function needsMappingOf(err: unknown): NeedsMapping | null {
  if (!isApiError(err) || err.code !== 'needs_mapping') return null;
  const needs = err.details?.needsMapping as NeedsMapping | undefined;
  return needs && Array.isArray(needs.header) ? needs : null;
}

export interface UploadResult {
  lot: Lot;
  rows: number;
  columns: Record<string, string>;
  /** Header texts of the file's columns no role used (listed back to the user). */
  ignoredColumns?: string[];
  stats: LotStats | null;
  /** Server time spent reading, storing and computing (ms). */
  timings?: { parseMs: number; storeMs: number; statsMs: number };
}

/** Total server time of an upload, when the server reports it. */
export const uploadMs = (r: UploadResult): number | null =>
  r.timings ? Math.round(r.timings.parseMs + r.timings.storeMs + r.timings.statsMs) : null;

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
  return api.post<UploadResult>(`/api/lots/${id}/readings`, form);
}

export const useUploadLotReadings = () => useMutation({ mutationFn: uploadLotReadings, meta: { invalidates: [queryKeys.lots.all()] } });
