import { NotBuiltYet } from '@/components/ui/not-built-yet';

export function JobsPlaceholder() {
  return <NotBuiltYet title="Jobs" plannedFor="customer instruments, the parts installed in them and their reports." />;
}
