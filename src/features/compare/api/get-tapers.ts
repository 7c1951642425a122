import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import type { CompareTapersResponse } from './types';
import { queryKeys, type TapersRequest } from '@/data/query-keys';

export type { TapersRequest } from '@/data/query-keys';

// A POST because a selection can list many part ids; it reads only, so it is a query.
export const getCompareTapers = (req: TapersRequest, signal?: AbortSignal) =>
  api.post<CompareTapersResponse>('/api/compare/tapers', req, { signal });

export const compareTapersQueryOptions = (req: TapersRequest) =>
  queryOptions({
    queryKey: queryKeys.compare.tapers(req),
    queryFn: ({ signal }) => getCompareTapers(req, signal),
  });

/** Keeps the last curves on screen while a changed selection loads. */
export const useCompareTapers = (req: TapersRequest) => useQuery({ ...compareTapersQueryOptions(req), placeholderData: keepPreviousData });
