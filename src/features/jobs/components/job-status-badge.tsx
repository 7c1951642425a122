import { Badge, type BadgeIconName, type BadgeTone } from '@/components/ui/badge';
import type { JobStatus } from '../api/types';

export const JOB_STATUS_LOOK: Record<JobStatus, { tone: BadgeTone; icon: BadgeIconName; label: string }> = {
  open: { tone: 'marginal', icon: 'flag', label: 'Open' },
  done: { tone: 'pass', icon: 'check', label: 'Done' },
  delivered: { tone: 'accent', icon: 'lug', label: 'Delivered' },
};

export function JobStatusBadge({ status }: { status: JobStatus }) {
  return <Badge {...JOB_STATUS_LOOK[status]} />;
}
