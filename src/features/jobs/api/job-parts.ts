import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import type { InstallPartInput } from '@shared/schemas/jobs';
import type { Part } from '@shared/schemas/parts';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';
import type { JobDetail } from './types';

/** Finds a part by its printed label (the install form's look-up). */
export const getPartByLabel = (label: string) => api.get<Part>(`/api/parts/by-label/${encodeURIComponent(label)}`);

export const installPart = ({ id, input }: { id: number; input: InstallPartInput }) => api.post<JobDetail>(`/api/jobs/${id}/parts`, input);
export const removePart = ({ id, partId }: { id: number; partId: number }) => api.delete<JobDetail>(`/api/jobs/${id}/parts/${partId}`);

// Installing and removing change the part's status too: the parts lists go stale.
export const useInstallPart = () =>
  useMutation({ mutationFn: installPart, meta: { invalidates: [queryKeys.jobs.all(), queryKeys.parts.all()] } });
export const useRemovePart = () =>
  useMutation({ mutationFn: removePart, meta: { invalidates: [queryKeys.jobs.all(), queryKeys.parts.all()] } });

export const partByLabelQueryOptions = (label: string) =>
  queryOptions({ queryKey: queryKeys.parts.byLabel(label), queryFn: () => getPartByLabel(label), staleTime: 5_000 });

/** The part with this label, looked up as the tech types (a 404 means no such label). */
export const usePartByLabel = (label: string) => useQuery({ ...partByLabelQueryOptions(label), enabled: label.length > 0 });
