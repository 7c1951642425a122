import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import type { CoilPoint } from '@shared/analysis/coil';
import type { TaperPoint } from '@shared/analysis/taper';
import type { ColumnRole } from '@shared/csv/columns';
import type { Fit, RefitInput, SweepKind } from '@shared/schemas/sweeps';
import { api } from '@/lib/api-client';

type SweepBase = {
  id: number;
  partId: number;
  attachmentId: number | null;
  columns: Record<string, string> | null;
  pointCount: number;
  createdAt: number;
  fit: Fit | null;
};

/** Points come back in the engines' input shape: taper rotation in percent, impedance as re/im. */
export type Sweep = SweepBase &
  ({ kind: 'taper'; points: TaperPoint[] } | { kind: 'impedance'; points: Extract<CoilPoint, { re: number }>[] });

export const sweepsQueryOptions = (partId: number) =>
  queryOptions({
    queryKey: ['parts', 'detail', partId, 'sweeps'],
    queryFn: ({ signal }) => api.get<{ sweeps: Sweep[] }>(`/api/parts/${partId}/sweeps`, { signal }),
  });
export const useSweeps = (partId: number) => useQuery(sweepsQueryOptions(partId));

export const fitsQueryOptions = (partId: number) =>
  queryOptions({
    queryKey: ['parts', 'detail', partId, 'fits'],
    queryFn: ({ signal }) => api.get<{ fits: Fit[] }>(`/api/parts/${partId}/fits`, { signal }),
  });
export const useFits = (partId: number) => useQuery(fitsQueryOptions(partId));

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
  return api.post<Sweep & { ignoredColumns: string[]; notes: string[] }>(`/api/parts/${partId}/sweeps`, form);
}

/** A fit moves the part's status, so the whole part is stale. */
export const useUploadSweep = () => useMutation({ mutationFn: uploadSweep, meta: { invalidates: [['parts']] } });

export const refitSweep = ({ partId, sweepId, choices }: { partId: number; sweepId: number; choices?: RefitInput }) =>
  api.post<{ fit: Fit }>(`/api/parts/${partId}/sweeps/${sweepId}/refit`, choices ?? {});
export const useRefitSweep = () => useMutation({ mutationFn: refitSweep, meta: { invalidates: [['parts']] } });
