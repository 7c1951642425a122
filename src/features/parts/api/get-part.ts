import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PartStatus } from '@shared/schemas/common';
import type { Part } from '@shared/schemas/parts';
import { api } from '@/lib/api-client';

export type PartStatusEvent = {
  id: number;
  partId: number;
  fromStatus: PartStatus | null;
  toStatus: PartStatus;
  reason: string | null;
  userId: string | null;
  /** Who made the change (null when the member has left). */
  userName: string | null;
  at: number;
};

/** A job the part went into (the other direction of the job's parts list). */
export type PartInstallation = { jobId: number; code: string; customer: string; instrument: string; position: string; installedAt: number };

export type PartDetail = Part & { lotCode: string | null; statusHistory: PartStatusEvent[]; installedIn: PartInstallation[] };

export const getPart = (id: number, signal?: AbortSignal) => api.get<PartDetail>(`/api/parts/${id}`, { signal });

export const partQueryOptions = (id: number) =>
  queryOptions({
    queryKey: ['parts', 'detail', id],
    queryFn: ({ signal }) => getPart(id, signal),
  });

export const usePart = (id: number) => useQuery(partQueryOptions(id));
