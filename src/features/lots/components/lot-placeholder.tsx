import { NotBuiltYet } from '@/components/ui/not-built-yet';

export function LotPlaceholder({ id }: { id: string }) {
  return <NotBuiltYet title={`Lot ${id}`} plannedFor="statistics, histogram with limits, outliers, bins, matched sets and the disposition." />;
}
