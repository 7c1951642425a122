// The slots of a design are exactly the parts its netlist holds: every slot value changes the
// netlist when changed, and every pot, capacitor, resistor and pickup the netlist holds (apart from
// the load: cable, amplifier, pedal) is some slot's.
import { describe, expect, test } from 'vitest';
import { buildLayoutNetlist, LAYOUTS, resolveLayoutConfig } from '@shared/circuit/layouts';
import { capacitorSlots, designSlots, slotPartKind, slotRefusal } from '@shared/circuit/slots';

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

describe('the slots of one design, as the rules in slots.ts state them', () => {
  const nameOf = (layoutId: string, key: string) => {
    const n = LAYOUTS.find((l) => l.id === layoutId)!.values.find((v) => v.key === key)!.name;
    return n.charAt(0).toUpperCase() + n.slice(1);
  };

  test('one pickup, a bleed with a resistor, a tone network with a floor resistor and a second capacitor', () => {
    const layout = LAYOUTS.find((l) => l.id === 'one-pickup')!;
    const n = (key: string) => nameOf('one-pickup', key);
    expect(designSlots(layout, { bleed: 'cap-series-r', toneNetwork: 'floor-and-second-cap' })).toEqual([
      {
        key: 'pickup',
        name: 'Pickup',
        accepts: 'pickup',
        values: { resistance: 'pickupR', inductance: 'pickupL', capacitance: 'pickupC', lossResistance: 'pickupRp' },
      },
      { key: 'volumeR', name: n('volumeR'), accepts: 'pot', values: { resistance: 'volumeR', law: 'volumeLaw' } },
      { key: 'bleedC', name: n('bleedC'), accepts: 'capacitor', values: { capacitance: 'bleedC' } },
      { key: 'bleedR', name: n('bleedR'), accepts: 'resistor', values: { resistance: 'bleedR' } },
      { key: 'toneR', name: n('toneR'), accepts: 'pot', values: { resistance: 'toneR', law: 'toneLaw' } },
      { key: 'toneC', name: n('toneC'), accepts: 'capacitor', values: { capacitance: 'toneC' } },
      { key: 'floorR', name: n('floorR'), accepts: 'resistor', values: { resistance: 'floorR' } },
      { key: 'secondC', name: n('secondC'), accepts: 'capacitor', values: { capacitance: 'secondC' } },
    ]);
  });

  test('left out, the options take their defaults: no bleed, the plain tone network', () => {
    const layout = LAYOUTS.find((l) => l.id === 'one-pickup')!;
    expect(designSlots(layout).map((s) => s.key)).toEqual(['pickup', 'volumeR', 'toneR', 'toneC']);
  });

  test('with several pickups each pickup slot is named by its pickup and keyed by its prefix', () => {
    const layout = LAYOUTS.find((l) => l.id === 'two-pickups-3way')!;
    const pickups = designSlots(layout).filter((s) => s.accepts === 'pickup');
    expect(pickups.map((s) => [s.key, s.name, s.values.resistance])).toEqual(
      layout.pickups.map((p) => [`${p.id}.pickup`, `${p.name} pickup`, `${p.id}.pickupR`]),
    );
  });

  test('value keys read by their last segment; the amplifier input capacitance is a capacitor value', () => {
    expect(slotPartKind('ampC')).toBe('capacitor');
    expect(slotPartKind('neck.bleedR')).toBe('resistor');
    expect(slotPartKind('cableLength')).toBeNull();
    expect(capacitorSlots(['toneC', 'neck.bleedC', 'volumeR', 'ampC', 'cableLength', 'north.pickupC'])).toEqual([
      'toneC',
      'neck.bleedC',
      'ampC',
    ]);
  });
});
