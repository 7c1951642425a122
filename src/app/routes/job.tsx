import type { QueryClient } from '@tanstack/react-query';
import { data, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { jobQueryOptions } from '@/features/jobs/api/get-job';
import { JobScreen } from '@/features/jobs/components/job-screen';

const jobId = (raw: string | undefined) => {
  const id = Number(raw);
  return Number.isInteger(id) && id > 0 ? id : null;
};

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ params }: LoaderFunctionArgs) => {
    const id = jobId(params.id);
    if (id === null) throw data('There is no such job.', { status: 404 });
    await queryClient.ensureQueryData(jobQueryOptions(id));
    return null;
  };

export function Component() {
  const id = jobId(useParams().id);
  return id === null ? null : <JobScreen key={id} id={id} />;
}
