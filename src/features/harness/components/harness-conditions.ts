// The conditions of a Harness export: which design, the knob positions and every value the
// preset's circuit uses (pickup, pots, capacitors, cable and amplifier load), each marked with the
// measured part it came from, or "typed" when it was entered by hand or left at its typical value.
import type { Condition } from '@shared/csv/conditions';
import type { VolumeToneKnobs } from '@shared/circuit/netlist';
import { describeValue, fieldsFor, presetOf, type DesignState } from './design-state';
import { formatKnob } from './harness-format';

export function harnessConditions(design: DesignState, knobs: VolumeToneKnobs, extra: readonly Condition[] = []): Condition[] {
  const preset = presetOf(design.preset);
  const out: Condition[] = [
    { key: 'design', value: design.loaded ? `${design.loaded.name} (saved design ${design.loaded.id})` : `${preset.name} (unsaved)` },
    { key: 'wiring', value: preset.name },
    { key: 'volume knob', value: formatKnob(knobs.volume) },
    { key: 'tone knob', value: formatKnob(knobs.tone) },
  ];
  for (const f of fieldsFor(design.preset)) {
    const ref = design.refs[f.key];
    const from = ref ? `measured part ${ref.label ?? `#${ref.partId}`}${ref.source ? `, ${ref.source}` : ''}` : 'typed';
    const value = design.values[f.key] === undefined ? null : `${describeValue(f.key, design.values)} (${from})`;
    out.push({ key: f.label, value });
  }
  return [...out, ...extra];
}
