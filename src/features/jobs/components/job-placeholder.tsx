import { NotBuiltYet } from '@/components/ui/not-built-yet';

export function JobPlaceholder({ id }: { id: string }) {
  return <NotBuiltYet title={`Job ${id}`} plannedFor="the harness, the installed parts (traceable both ways), notes and the customer report." />;
}
