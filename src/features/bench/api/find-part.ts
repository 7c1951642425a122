import { queryOptions } from '@tanstack/react-query';
import type { Part } from '@shared/schemas/parts';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

/**
 * What a scanner or a person typed: a part page address (`…/parts/42`, from the printed label's
 * QR code) or a label (`P-0142`).
 */
export function readScan(text: string): { id: number } | { label: string } | null {
  const t = text.trim();
  if (t === '') return null;
  const url = /\/parts\/(\d+)\/?(?:[?#].*)?$/.exec(t);
  if (url && /^(https?:\/\/|\/)/i.test(t)) return { id: Number(url[1]) };
  return { label: t };
}

export const findPart = (scan: { id: number } | { label: string }, signal?: AbortSignal) =>
  'id' in scan
    ? api.get<Part>(`/api/parts/${scan.id}`, { signal })
    : api.get<Part>(`/api/parts/by-label/${encodeURIComponent(scan.label)}`, { signal });

/** Asked afresh each time (staleTime 0): the part may have changed since the last scan. */
export const findPartQueryOptions = (scan: { id: number } | { label: string }) =>
  queryOptions({
    queryKey: queryKeys.parts.lookup(scan),
    queryFn: ({ signal }) => findPart(scan, signal),
    staleTime: 0,
    retry: false,
  });
