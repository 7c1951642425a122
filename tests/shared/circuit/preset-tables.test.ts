// The tables the harness editor is built from (shared/circuit/presets.ts): the value fields (what each
// value is, its SI unit, which presets use it), the presets' names, and the typical pickups. Each
// field's preset list is checked against what the presets' netlists actually do with the value.
import { describe, expect, it } from 'vitest';
import {
  DEFAULT_HARNESS_VALUES,
  HARNESS_PRESETS,
  HARNESS_VALUE_FIELDS,
  PICKUP_PRESETS,
  type HarnessValues,
  type ValueQuantity,
} from '@shared/circuit/presets';
import type { PickupPart } from '@shared/circuit/netlist';

/** SI units (BIPM, The International System of Units, 9th edition, 2019): ohm, farad, henry, metre. */
const SI_UNIT: Record<ValueQuantity, string> = {
  resistance: 'Ω',
  capacitance: 'F',
  inductance: 'H',
  length: 'm',
  'capacitance-per-length': 'F/m',
  law: '',
};

/** What a value is, from its name: …R and …Rp resistances, …C capacitances, …L inductances, …Law pot laws. */
function quantityOfKey(key: string): ValueQuantity {
  if (key === 'cableCapPerMetre') return 'capacitance-per-length';
  if (key === 'cableLength') return 'length';
  if (key.endsWith('Law')) return 'law';
  if (key.endsWith('R') || key.endsWith('Rp')) return 'resistance';
  if (key.endsWith('C')) return 'capacitance';
  if (key.endsWith('L')) return 'inductance';
  throw new Error(`no quantity for ${key}`);
}

/** The same values with one of them changed (a law to another law, a number doubled, the loss resistance given). */
function changed(values: HarnessValues, key: keyof HarnessValues): HarnessValues {
  const v = values[key];
  if (v === undefined) return { ...values, [key]: 250e3 };
  if (typeof v === 'number') return { ...values, [key]: v * 2 };
  return { ...values, [key]: { kind: 'linear' } };
}

describe('the harness value fields', () => {
  it('one field for every value, each with the quantity its name says and that quantity’s SI unit', () => {
    const keys = HARNESS_VALUE_FIELDS.map((f) => f.key);
    expect(new Set(keys).size).toBe(keys.length);
    expect([...keys].sort()).toEqual([...Object.keys(DEFAULT_HARNESS_VALUES), 'pickupRp'].sort());
    for (const f of HARNESS_VALUE_FIELDS) {
      expect(f.quantity, f.key).toBe(quantityOfKey(f.key));
      expect(f.unit, f.key).toBe(SI_UNIT[f.quantity]);
    }
  });

  it('labels are words, one per field; only the loss resistance may be left out', () => {
    const labels = HARNESS_VALUE_FIELDS.map((f) => f.label);
    expect(new Set(labels).size).toBe(labels.length);
    for (const l of labels) expect(l).toMatch(/^[A-Z][a-z-]+( [\w-]+| \(parallel\))*$/);
    // The one value without a default (HarnessValues.pickupRp is optional); every other one has one.
    expect(HARNESS_VALUE_FIELDS.filter((f) => f.optional).map((f) => f.key)).toEqual(['pickupRp']);
    expect(DEFAULT_HARNESS_VALUES.pickupRp).toBeUndefined();
  });

  it('a field lists exactly the presets whose netlist changes when its value changes', () => {
    for (const f of HARNESS_VALUE_FIELDS) {
      const using = HARNESS_PRESETS.filter((p) => {
        const before = JSON.stringify(p.build(p.defaults));
        const after = JSON.stringify(p.build(changed(p.defaults, f.key)));
        return before !== after;
      }).map((p) => p.id);
      expect([...f.presets].sort(), f.key).toEqual(using.sort());
    }
  });
});

describe('the presets', () => {
  it('names are words, one per preset, and title the netlist they build; descriptions are sentences', () => {
    const names = HARNESS_PRESETS.map((p) => p.name);
    expect(new Set(names).size).toBe(names.length);
    for (const p of HARNESS_PRESETS) {
      expect(p.name).toMatch(/^[A-Z][a-z]+[\w :-]*$/);
      expect(p.build(p.defaults).title).toBe(`${p.name} harness`);
      expect(p.description).toMatch(/^[A-Z].{40,}\.$/);
    }
  });

  it('the pickup carries a loss resistance only when one is given', () => {
    for (const p of HARNESS_PRESETS) {
      const pickup = (values: HarnessValues) => p.build(values).parts.find((x) => x.kind === 'pickup') as PickupPart;
      expect(Object.keys(pickup(p.defaults))).not.toContain('Rp');
      expect(pickup({ ...p.defaults, pickupRp: 300e3 }).Rp).toBe(300e3);
    }
  });
});

describe('the typical pickups', () => {
  // Typical values: common practice (no published source), from memory, as the presets module says.
  it('two, with their values; the humbucker-like one is the harness default', () => {
    expect(PICKUP_PRESETS).toEqual([
      { id: 'single-coil-like', name: 'Single-coil-like pickup', values: { pickupR: 6e3, pickupL: 2.5, pickupC: 100e-12 } },
      { id: 'humbucker-like', name: 'Humbucker-like pickup', values: { pickupR: 8e3, pickupL: 4.4, pickupC: 120e-12 } },
    ]);
    const { pickupR, pickupL, pickupC } = DEFAULT_HARNESS_VALUES;
    expect(PICKUP_PRESETS[1]!.values).toEqual({ pickupR, pickupL, pickupC });
  });
});
