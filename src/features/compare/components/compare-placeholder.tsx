import { NotBuiltYet } from '@/components/ui/not-built-yet';

export function ComparePlaceholder() {
  return <NotBuiltYet title="Compare" plannedFor="overlays of fitted taper curves with spread envelopes, loaded taper in dB, and matching." />;
}
