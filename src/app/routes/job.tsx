import { useParams } from 'react-router-dom';
import { JobPlaceholder } from '@/features/jobs/components/job-placeholder';

export function Component() {
  return <JobPlaceholder id={useParams().id ?? ''} />;
}
