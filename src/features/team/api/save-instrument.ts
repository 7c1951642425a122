import { useMutation } from '@tanstack/react-query';
import type { InstrumentInput } from '@shared/schemas/bench';
import type { Instrument } from '@/data/instruments';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

export const saveInstrument = ({ id, input }: { id?: number; input: InstrumentInput }) =>
  id ? api.put<Instrument>(`/api/instruments/${id}`, input) : api.post<Instrument>('/api/instruments', input);

export const useSaveInstrument = () => useMutation({ mutationFn: saveInstrument, meta: { invalidates: [queryKeys.instruments.all()] } });
