import { useMutation } from '@tanstack/react-query';
import type { z } from 'zod';
import type { JobReportInputSchema } from '@shared/schemas/jobs';
import { api } from '@/lib/api-client';
import { queryKeys } from '@/data/query-keys';

export const sendJobReport = ({ id, input }: { id: number; input: z.output<typeof JobReportInputSchema> }) =>
  api.post<{ ok: true; to: string }>(`/api/jobs/${id}/report`, input);

export const useSendJobReport = () => useMutation({ mutationFn: sendJobReport, meta: { invalidates: [queryKeys.outbox.all()] } });
