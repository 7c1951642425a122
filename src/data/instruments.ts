// Instruments: the reading forms (Bench, part page), lots and Team (which edits them) read the same list.
import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Accuracy } from '@shared/analysis/verdict';
import type { ReadingQuantity } from '@shared/schemas/bench';
import { api } from '@/lib/api-client';
import { queryKeys } from './query-keys';

export type InstrumentKind = 'multimeter' | 'lcr-meter' | 'analyser' | 'other';

export type Instrument = {
  id: number;
  name: string;
  kind: InstrumentKind;
  serial: string | null;
  accuracy: Partial<Record<ReadingQuantity, Accuracy>>;
  /** Display counts (e.g. 6000); null when not recorded. */
  displayCounts: number | null;
  /** YYYY-MM-DD */
  calibrationDue: string | null;
  notes: string | null;
  createdAt: number;
  calibrationOverdue: boolean;
};

export const instrumentsQueryOptions = () =>
  queryOptions({
    queryKey: queryKeys.instruments.list(),
    queryFn: ({ signal }) => api.get<{ instruments: Instrument[] }>('/api/instruments', { signal }),
    staleTime: 5 * 60_000,
  });

export const useInstruments = () => useQuery(instrumentsQueryOptions());
