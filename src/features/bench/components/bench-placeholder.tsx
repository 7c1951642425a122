import { NotBuiltYet } from '@/components/ui/not-built-yet';

export function BenchPlaceholder() {
  return <NotBuiltYet title="Bench" plannedFor="quick measure with an instant verdict, the bench-safety note, and recent readings." />;
}
