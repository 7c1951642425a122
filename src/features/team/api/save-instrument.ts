import { useMutation } from '@tanstack/react-query';
import type { InstrumentInput } from '@shared/schemas/bench';
import type { Instrument } from '@/components/readings/api';
import { api } from '@/lib/api-client';

export const saveInstrument = ({ id, input }: { id?: number; input: InstrumentInput }) =>
  id ? api.put<Instrument>(`/api/instruments/${id}`, input) : api.post<Instrument>('/api/instruments', input);

export const useSaveInstrument = () => useMutation({ mutationFn: saveInstrument, meta: { invalidates: [['instruments']] } });
