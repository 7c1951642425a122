import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import type { ColumnRole } from '@shared/csv/columns';
import type { RefitInput, RefitResult, Sweep, SweepKind, SweepUploadResult } from '@shared/schemas/sweeps';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

export type { Sweep } from '@shared/schemas/sweeps';

export const sweepsQueryOptions = (partId: number) =>
  queryOptions({
    queryKey: queryKeys.parts.sweeps(partId),
    queryFn: ({ signal }) => api.get<{ sweeps: Sweep[] }>(`/api/parts/${partId}/sweeps`, { signal }),
  });
export const useSweeps = (partId: number) => useQuery(sweepsQueryOptions(partId));

export type SweepUpload = {
  partId: number;
  file: File;
  kind: SweepKind;
  fullRotationDeg?: number;
  /** role → { column index, unit }, from the column-mapping step. */
  mapping?: Partial<Record<ColumnRole, { column: number; unit?: string }>>;
};

export function uploadSweep({ partId, file, kind, fullRotationDeg, mapping }: SweepUpload) {
  const form = new FormData();
  form.set('kind', kind);
  if (kind === 'taper' && fullRotationDeg) form.set('fullRotationDeg', String(fullRotationDeg));
  if (mapping) form.set('mapping', JSON.stringify(mapping));
  form.set('file', file);
  return api.post<SweepUploadResult>(`/api/parts/${partId}/sweeps`, form);
}

/** A fit moves the part's status, so the whole part is stale. */
export const useUploadSweep = () => useMutation({ mutationFn: uploadSweep, meta: { invalidates: [queryKeys.parts.all()] } });

export const refitSweep = ({ partId, sweepId, choices }: { partId: number; sweepId: number; choices?: RefitInput }) =>
  api.post<RefitResult>(`/api/parts/${partId}/sweeps/${sweepId}/refit`, choices ?? {});
export const useRefitSweep = () => useMutation({ mutationFn: refitSweep, meta: { invalidates: [queryKeys.parts.all()] } });
