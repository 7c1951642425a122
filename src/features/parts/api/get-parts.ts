import { keepPreviousData, useQuery } from '@tanstack/react-query';
import { PART_KINDS, PART_STATUSES, type PartKind, type PartStatus } from '@shared/schemas/common';
import { partsQueryOptions, type PartFilters } from '@/data/parts';

/** The list shows at most this many parts (the newest); filters narrow it. */
export const PARTS_LIST_LIMIT = 500;

/** Keeps the previous rows on screen while a new filter loads, so the table does not blink. */
export const useParts = (filters: PartFilters) => useQuery({ ...partsQueryOptions(filters), placeholderData: keepPreviousData });

const KINDS: readonly string[] = PART_KINDS;
const STATUSES: readonly string[] = PART_STATUSES;

/** The list filters kept in the page address (?kind=&status=&q=), so a filtered list can be linked. */
export function filtersFromSearch(search: URLSearchParams): PartFilters {
  const kind = search.get('kind') ?? '';
  const status = search.get('status') ?? '';
  const q = (search.get('q') ?? '').trim().slice(0, 100);
  return {
    ...(KINDS.includes(kind) ? { kind: kind as PartKind } : {}),
    ...(STATUSES.includes(status) ? { status: status as PartStatus } : {}),
    ...(q ? { q } : {}),
  };
}
