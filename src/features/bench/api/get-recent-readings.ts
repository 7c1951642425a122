import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PartKind } from '@shared/schemas/common';
import type { Reading } from '@/data/readings';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

export type RecentReading = Reading & { partLabel: string; partKind: PartKind };

export const RECENT_LIMIT = 20;

export const getRecentReadings = (signal?: AbortSignal) =>
  api.get<{ readings: RecentReading[] }>('/api/readings/recent', { params: { limit: RECENT_LIMIT }, signal });

export const recentReadingsQueryOptions = () =>
  queryOptions({ queryKey: queryKeys.readings.recent(), queryFn: ({ signal }) => getRecentReadings(signal) });

export const useRecentReadings = () => useQuery(recentReadingsQueryOptions());
