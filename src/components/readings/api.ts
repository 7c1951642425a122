// The bench records every reading screen needs: tolerance profiles, instruments and the one call
// that stores a reading. Kept here (not in a feature) because the Bench, the part page and the
// Team screen all use them and features may not import each other; one query key per list keeps
// one cache.
import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import type { Accuracy } from '@shared/analysis/verdict';
import type { CreateReadingInput, ProfileRules, ReadingQuantity } from '@shared/schemas/bench';
import type { PartKind, Verdict } from '@shared/schemas/common';
import type { Part } from '@shared/schemas/parts';
import { api } from '@/lib/api-client';

export type Profile = {
  id: number;
  name: string;
  kind: PartKind;
  nominalMin: number | null;
  nominalMax: number | null;
  tolerancePct: number;
  rules: ProfileRules;
  createdAt: number;
};

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

/** A stored reading as the API lists it. */
export type Reading = {
  id: number;
  partId: number;
  quantity: ReadingQuantity;
  value: number;
  frequency: number | null;
  instrumentId: number | null;
  instrumentName: string | null;
  calibrationOverdue: boolean;
  uncertainty: number | null;
  verdict: Verdict | null;
  verdictReason: string | null;
  entry: 'typed' | 'file' | 'lot';
  takenBy: string | null;
  takenAt: number;
};

export const profilesQueryOptions = () =>
  queryOptions({
    queryKey: ['profiles'],
    queryFn: ({ signal }) => api.get<{ profiles: Profile[] }>('/api/profiles', { signal }),
    staleTime: 5 * 60_000,
  });

export const useProfiles = () => useQuery(profilesQueryOptions());

export const instrumentsQueryOptions = () =>
  queryOptions({
    queryKey: ['instruments'],
    queryFn: ({ signal }) => api.get<{ instruments: Instrument[] }>('/api/instruments', { signal }),
    staleTime: 5 * 60_000,
  });

export const useInstruments = () => useQuery(instrumentsQueryOptions());

/** The stored reading (the row as inserted, without names) and the part with its new status. */
export type CreatedReading = {
  reading: Omit<Reading, 'instrumentName' | 'takenBy'> & { takenBy: string | null };
  part: Part;
};

export const createReading = ({ partId, input }: { partId: number; input: CreateReadingInput }) =>
  api.post<CreatedReading>(`/api/parts/${partId}/readings`, input);

/** A reading changes the part's status too, so every part query and every reading list is stale. */
export const useCreateReading = () => useMutation({ mutationFn: createReading, meta: { invalidates: [['parts'], ['readings']] } });
