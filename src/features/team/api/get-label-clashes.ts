import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

/** Part labels that differ only in case, kept from before labels were compared without case. */
export interface LabelClash {
  key: string;
  parts: { id: number; label: string }[];
}

export const getLabelClashes = (signal?: AbortSignal) => api.get<{ clashes: LabelClash[] }>('/api/team/label-clashes', { signal });

export const labelClashesQueryOptions = () =>
  queryOptions({ queryKey: queryKeys.team.labelClashes(), queryFn: ({ signal }) => getLabelClashes(signal) });

export const useLabelClashes = () => useQuery(labelClashesQueryOptions());
