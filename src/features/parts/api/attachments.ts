import { queryOptions, useMutation, useQuery } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

export type Attachment = {
  id: number;
  ownerType: 'part' | 'lot' | 'job';
  ownerId: number;
  purpose: 'sweep' | 'lot-readings' | 'photo' | 'certificate';
  originalName: string;
  mime: string;
  size: number;
  createdAt: number;
};

export const attachmentFileHref = (id: number) => `/api/attachments/${id}/file`;

export const attachmentsQueryOptions = (partId: number) =>
  queryOptions({
    queryKey: queryKeys.parts.attachments(partId),
    queryFn: ({ signal }) => api.get<{ attachments: Attachment[] }>(`/api/parts/${partId}/attachments`, { signal }),
  });
export const useAttachments = (partId: number) => useQuery(attachmentsQueryOptions(partId));

export function uploadAttachment({ partId, file, purpose }: { partId: number; file: File; purpose: 'photo' | 'certificate' }) {
  const form = new FormData();
  form.set('purpose', purpose);
  form.set('file', file);
  return api.post<Attachment>(`/api/parts/${partId}/attachments`, form);
}
export const useUploadAttachment = () => useMutation({ mutationFn: uploadAttachment, meta: { invalidates: [queryKeys.parts.details()] } });
