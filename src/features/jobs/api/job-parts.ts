import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import type { Part } from '@shared/schemas/parts';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';
import type { JobDetail } from './types';

/** Finds a part by its printed label (the install form's look-up). */
export const getPartByLabel = (label: string) => api.get<Part>(`/api/parts/by-label/${encodeURIComponent(label)}`);

export const removePart = ({ id, partId }: { id: number; partId: number }) => api.delete<JobDetail>(`/api/jobs/${id}/parts/${partId}`);

/** Puts an installed part in a slot of the job's design, or takes it out (slot null). */
export const assignSlot = ({ id, partId, slot }: { id: number; partId: number; slot: string | null }) =>
  api.put<JobDetail>(`/api/jobs/${id}/parts/${partId}/slot`, { slot });

export const useAssignSlot = () => useMutation({ mutationFn: assignSlot, meta: { invalidates: [queryKeys.jobs.all()] } });

// Removing changes the part's status too: the parts lists go stale.
export const useRemovePart = () =>
  useMutation({ mutationFn: removePart, meta: { invalidates: [queryKeys.jobs.all(), queryKeys.parts.all()] } });

export const partByLabelQueryOptions = (label: string) =>
  queryOptions({ queryKey: queryKeys.parts.byLabel(label), queryFn: () => getPartByLabel(label), staleTime: 5_000 });

/** The part with this label, looked up as the tech types (a 404 means no such label). */
export const usePartByLabel = (label: string) => useQuery({ ...partByLabelQueryOptions(label), enabled: label.length > 0 });
