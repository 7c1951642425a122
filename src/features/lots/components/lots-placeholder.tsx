import { NotBuiltYet } from '@/components/ui/not-built-yet';

export function LotsPlaceholder() {
  return <NotBuiltYet title="Lots" plannedFor="the list of lots with their upload, status and disposition." />;
}
