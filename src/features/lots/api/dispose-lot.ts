import { useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import type { DispositionInputSchema, ReopenInputSchema } from '@shared/schemas/lots';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';
import type { Lot } from './types';

export const disposeLot = ({ id, input }: { id: number; input: z.input<typeof DispositionInputSchema> }) =>
  api.post<{ lot: Lot; notified: number }>(`/api/lots/${id}/disposition`, input);

export const reopenLot = ({ id, input }: { id: number; input: z.input<typeof ReopenInputSchema> }) =>
  api.post<{ lot: Lot }>(`/api/lots/${id}/reopen`, input);

// A disposition also e-mails the watchers: the outbox list goes stale.
export const useDisposeLot = () =>
  useMutation({ mutationFn: disposeLot, meta: { invalidates: [queryKeys.lots.all(), queryKeys.outbox.all()] } });
export const useReopenLot = () => useMutation({ mutationFn: reopenLot, meta: { invalidates: [queryKeys.lots.all()] } });
