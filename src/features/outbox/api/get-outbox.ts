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
  /** The files that went with it, served by outboxAttachmentHref. */
  attachments: OutboxAttachment[];
  /** Written before attachments were kept apart: any it had are only in its stored source. */
  attachmentsInSourceOnly: boolean;
};

export type OutboxAttachment = { id: number; filename: string; contentType: string; size: number };

/** Where an attachment downloads from (admins only, always as a download). */
export const outboxAttachmentHref = (messageId: number, attachmentId: number) => `/api/outbox/${messageId}/attachments/${attachmentId}`;

export const getOutbox = (signal?: AbortSignal) => api.get<{ messages: OutboxMessage[] }>('/api/outbox', { signal });

export const outboxQueryOptions = () => queryOptions({ queryKey: queryKeys.outbox.list(), queryFn: ({ signal }) => getOutbox(signal) });

export const useOutbox = () => useQuery(outboxQueryOptions());
