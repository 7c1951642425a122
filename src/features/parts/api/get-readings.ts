import { useQuery } from '@tanstack/react-query';
import { partReadingsQueryOptions } from '@/data/parts';

// A part's readings: the query lives in src/data/parts.ts (the Harness screen's capacitor chooser reads it too).
export { getPartReadings, partReadingsQueryOptions } from '@/data/parts';

export const usePartReadings = (id: number) => useQuery(partReadingsQueryOptions(id));
