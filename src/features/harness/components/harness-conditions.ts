// The conditions of a Harness export: which design, the layout, selector position, options, the
// knob positions and every value the design uses (pickups, pots, capacitors, cable and load), each
// marked with the measured part it came from, or "typed" when it was entered by hand or left at its
// typical value.
import type { Condition } from '@shared/csv/conditions';
import { describeValue, layoutOf, presetOf, quickStartOf, usedKeys, type DesignState } from './design-state';
import { formatKnob } from './harness-format';

/** The design's name in words: its saved name, else its quick start (preset), else its layout. */
export function designName(design: DesignState): string {
  if (design.loaded) return design.loaded.name;
  const preset = quickStartOf(design);
  return preset ? presetOf(preset).name : layoutOf(design).name;
}

export function harnessConditions(design: DesignState, knobs: Record<string, number>, extra: readonly Condition[] = []): Condition[] {
  const layout = layoutOf(design);
  const preset = quickStartOf(design);
  const out: Condition[] = [
    {
      key: 'design',
      value: design.loaded ? `${design.loaded.name} (saved design ${design.loaded.id})` : `${designName(design)} (unsaved)`,
    },
    { key: 'layout', value: layout.name },
    { key: 'wiring', value: preset ? presetOf(preset).name : 'options as listed' },
    ...(layout.selector.positions.length > 1
      ? [{ key: 'selector position', value: `${design.selector}: ${layout.selector.positions[design.selector]?.name ?? ''}` }]
      : []),
    ...layout.options.map((o) => ({
      key: o.name.toLowerCase(),
      value: o.choices.find((c) => c.id === design.options[o.id])?.name ?? null,
    })),
    ...layout.knobs.map((k) => ({ key: `${k.name.toLowerCase()} knob`, value: formatKnob(knobs[k.id] ?? 10) })),
  ];
  for (const key of usedKeys(design)) {
    const def = layout.values.find((d) => d.key === key)!;
    const ref = design.refs[key];
    const from = ref ? `measured part ${ref.label ?? `#${ref.partId}`}${ref.source ? `, ${ref.source}` : ''}` : 'typed';
    const value = design.values[key] === undefined ? null : `${describeValue(def, design.values)} (${from})`;
    out.push({ key: def.name, value });
  }
  return [...out, ...extra];
}
