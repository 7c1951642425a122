import { NotBuiltYet } from '@/components/ui/not-built-yet';

export function HarnessPlaceholder() {
  return <NotBuiltYet title="Harness" plannedFor="wiring designs with live knobs, predicted curves and A/B comparisons." />;
}
