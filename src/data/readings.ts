// Readings: the one call that stores a reading (the Bench and the part page both use the reading
// form) and the reading row the lists show.
import { useMutation } from '@tanstack/react-query';
import type { CreateReadingInput, ReadingQuantity } from '@shared/schemas/bench';
import type { Verdict } from '@shared/schemas/common';
import type { Part } from '@shared/schemas/parts';
import { api } from '@/lib/api-client';
import { queryKeys } from './query-keys';

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

/** The stored reading (the row as inserted, without names) and the part with its new status. */
export type CreatedReading = {
  reading: Omit<Reading, 'instrumentName' | 'takenBy'> & { takenBy: string | null };
  part: Part;
};

export const createReading = ({ partId, input }: { partId: number; input: CreateReadingInput }) =>
  api.post<CreatedReading>(`/api/parts/${partId}/readings`, input);

/** A reading changes the part's status too, so every part query and every reading list is stale. */
export const useCreateReading = () =>
  useMutation({ mutationFn: createReading, meta: { invalidates: [queryKeys.parts.all(), queryKeys.readings.all()] } });
