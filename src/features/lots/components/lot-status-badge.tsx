import { Badge, type BadgeIconName, type BadgeTone } from '@/components/ui/badge';
import type { LotStatus } from '../api/types';

export const LOT_STATUS_LOOK: Record<LotStatus, { tone: BadgeTone; icon: BadgeIconName; label: string }> = {
  open: { tone: 'neutral', icon: 'arrive', label: 'Open' },
  accepted: { tone: 'pass', icon: 'check', label: 'Accepted' },
  rejected: { tone: 'fail', icon: 'cross', label: 'Rejected' },
  // Sorted: kept, but only after sorting into bins and sets.
  sorted: { tone: 'accent', icon: 'shelf', label: 'Sorted' },
};

export function LotStatusBadge({ status, reason }: { status: LotStatus; reason?: string | null }) {
  return <Badge {...LOT_STATUS_LOOK[status]} title={reason ?? undefined} />;
}
