// The slots of a design are exactly the parts its netlist holds: every slot value changes the
// netlist when changed, and every pot, capacitor, resistor and pickup the netlist holds (apart from
// the load: cable, amplifier, pedal) is some slot's.
import { describe, expect, test } from 'vitest';
import { buildLayoutNetlist, LAYOUTS, resolveLayoutConfig } from '@shared/circuit/layouts';
import { designSlots, slotPartKind, slotRefusal } from '@shared/circuit/slots';

const LOAD_PARTS = new Set(['cable', 'amp', 'amp-c', 'buffer', 'pedal']);

/** Every combination of the bleed and tone-network choices a layout offers. */
function optionSets(layoutId: string) {
  const layout = LAYOUTS.find((l) => l.id === layoutId)!;
  const bleed = layout.options.find((o) => o.id === 'bleed')!.choices.map((c) => c.id);
  const network = layout.options.find((o) => o.id === 'toneNetwork')!.choices.map((c) => c.id);
  return bleed.flatMap((b) => network.map((n) => ({ bleed: b, toneNetwork: n })));
}

describe('design slots', () => {
  test('a slot takes the kind of part the value keys it sets take (the editor and the job agree)', () => {
    for (const layout of LAYOUTS) {
      for (const options of optionSets(layout.id)) {
        for (const slot of designSlots(layout, options)) {
          for (const key of Object.values(slot.values)) expect([key, slotPartKind(key!)]).toEqual([key, slot.accepts]);
        }
      }
    }
  });

  for (const layout of LAYOUTS) {
    test(`${layout.id}: each slot value feeds the netlist, and each installed part of the netlist has a slot`, () => {
      for (const options of optionSets(layout.id)) {
        const slots = designSlots(layout, options);
        expect(new Set(slots.map((s) => s.key)).size).toBe(slots.length);
        // Every selector position, so that each pickup and each tone branch is in some netlist.
        const positions = layout.selector.positions.map((p) => p.index);
        const coilChoices = layout.options.find((o) => o.id === 'coils') ? ['series'] : [undefined];
        const built = (values: Record<string, unknown>, selector: number, coils?: string) => {
          const { config, problems } = resolveLayoutConfig(layout, {
            selector,
            options: { ...options, ...(coils ? { coils } : {}) },
            values,
          });
          expect(problems).toEqual([]);
          return JSON.stringify(buildLayoutNetlist(layout, config));
        };
        const defaults = resolveLayoutConfig(layout, {}).config.values;
        for (const slot of slots) {
          for (const [quantity, key] of Object.entries(slot.values)) {
            if (quantity === 'lossResistance') continue; // absent unless given
            const v = defaults[key!];
            const changed = quantity === 'law' ? { kind: 'linear' } : (v as number) * 2;
            const differs = positions.some((sel) => coilChoices.some((c) => built({}, sel, c) !== built({ [key!]: changed }, sel, c)));
            expect(differs, `${layout.id} ${JSON.stringify(options)}: ${slot.key} → ${key}`).toBe(true);
          }
        }
        // Parts of the netlist at every position: each belongs to a slot (by the value it was built from).
        for (const sel of positions) {
          const { config } = resolveLayoutConfig(layout, { selector: sel, options });
          for (const p of buildLayoutNetlist(layout, config).parts) {
            if (LOAD_PARTS.has(p.id)) continue;
            const value = p.kind === 'capacitor' ? p.C : p.kind === 'pickup' ? p.L : 'R' in p ? p.R : undefined;
            const keys = slots.flatMap((s) => Object.values(s.values)).filter((k) => config.values[k!] === value);
            expect(keys.length, `${layout.id} ${JSON.stringify(options)}: part ${p.id}`).toBeGreaterThan(0);
          }
        }
      }
    });
  }

  test('a slot takes its own kind only, and the refusal names the slot', () => {
    const slot = designSlots(LAYOUTS.find((l) => l.id === 'two-pickups-3way')!).find((s) => s.key === 'neck.toneC')!;
    expect(slotRefusal(slot, 'capacitor')).toBeNull();
    expect(slotRefusal(slot, 'resistor')).toBe('Neck: tone capacitor (neck.toneC) takes a capacitor, not a resistor.');
  });
});
