// The part page's install call (the open jobs to install into come from src/data/jobs.ts).
import { useMutation } from '@tanstack/react-query';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

export const installPart = ({ jobId, partId, position }: { jobId: number; partId: number; position: string }) =>
  api.post<unknown>(`/api/jobs/${jobId}/parts`, { partId, position });

export const useInstallPart = () =>
  useMutation({ mutationFn: installPart, meta: { invalidates: [queryKeys.parts.all(), queryKeys.jobs.all()] } });
