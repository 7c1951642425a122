import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

export type OutboxMessage = {
  id: number;
  to: string;
  subject: string;
  text: string;
  topic: string;
  transport: 'outbox' | 'smtp';
  sentAt: number | null;
  error: string | null;
  createdAt: number;
};

export const getOutbox = (signal?: AbortSignal) => api.get<{ messages: OutboxMessage[] }>('/api/outbox', { signal });

export const outboxQueryOptions = () => queryOptions({ queryKey: queryKeys.outbox.list(), queryFn: ({ signal }) => getOutbox(signal) });

export const useOutbox = () => useQuery(outboxQueryOptions());
