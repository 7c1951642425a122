// The slots of a wiring design: the places an installed part can fill. Each slot is one physical
// part of the design (a pot, a capacitor, a resistor, a pickup or one coil of a dual-coil pickup),
// takes parts of one kind, and sets one or more of the layout's values:
//   pot        '<prefix>volumeR' / '<prefix>toneR'  → its resistance and its law ('…volumeLaw')
//   capacitor  '<prefix>toneC', '…bleedC', '…secondC' → that capacitance
//   resistor   '<prefix>bleedR', '…floorR'           → that resistance
//   pickup     '<prefix>pickup' ('pickup', 'neck.pickup', 'north.pickup') → its R, L, C (and Rp)
// A slot exists only where the design's options use the part: the bleed resistor only with a bleed
// network that has one, the floor resistor and the second capacitor only with the tone networks
// that have them. The load (cable, amplifier) is not a slot: it is not installed in the instrument.
import type { LayoutDef, LayoutOptions } from './layouts';

// Which kind of measured part may supply a value of a layout (its "slot"): a pickup's coil fit gives
// the pickup values, a pot's taper fit its total and law, a capacitor's latest capacitance reading
// any capacitor value, a resistor's latest resistance reading a fixed resistor. Cable and load
// values are not parts. Keys are read by their last segment, so `neck.toneC` is a capacitor slot
// like `toneC`.
export type SlotPartKind = 'pickup' | 'pot' | 'capacitor' | 'resistor';

const SLOTS: Readonly<Record<string, SlotPartKind>> = {
  pickupR: 'pickup',
  pickupL: 'pickup',
  pickupC: 'pickup',
  pickupRp: 'pickup',
  volumeR: 'pot',
  volumeLaw: 'pot',
  toneR: 'pot',
  toneLaw: 'pot',
  toneC: 'capacitor',
  secondC: 'capacitor',
  bleedC: 'capacitor',
  ampC: 'capacitor',
  bleedR: 'resistor',
  floorR: 'resistor',
};

/** The kind of part a value key takes, or null when no part can supply it. */
export function slotPartKind(key: string): SlotPartKind | null {
  return SLOTS[key.slice(key.lastIndexOf('.') + 1)] ?? null;
}

/** The capacitor slots among a layout's value keys. */
export const capacitorSlots = (keys: readonly string[]) => keys.filter((k) => slotPartKind(k) === 'capacitor');

export type SlotKind = SlotPartKind;

export interface DesignSlot {
  /** The slot's id in the design: the key of the value it is named by ('neck.volumeR'), or the pickup's prefix + 'pickup'. */
  key: string;
  /** In words: "Neck: volume pot", "North coil". */
  name: string;
  /** The part kind the slot takes. */
  accepts: SlotKind;
  /** The layout value keys the part's measured values replace, by what they are. */
  values: { resistance?: string; law?: string; capacitance?: string; inductance?: string; lossResistance?: string };
}

const prefixed = (prefix: string, name: string) => (prefix ? `${prefix}.${name}` : name);
const capitalise = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/** Slots of a layout with these options (the defaults where an option is left out). */
export function designSlots(layout: LayoutDef, options: LayoutOptions = {}): DesignSlot[] {
  const choice = (id: string) => options[id] ?? layout.options.find((o) => o.id === id)?.choices[0]?.id;
  const bleed = choice('bleed') ?? 'none';
  const network = choice('toneNetwork') ?? 'plain';
  const has = (k: string) => layout.values.some((v) => v.key === k);
  const nameOf = (k: string) => capitalise(layout.values.find((v) => v.key === k)!.name);
  const slots: DesignSlot[] = [];

  for (const p of layout.pickups) {
    const sources =
      p.coils.length > 0
        ? p.coils.map((c) => ({ prefix: c.id, name: c.name }))
        : // The one-pickup layout names its pickup's values without a prefix ('pickupR').
          [{ prefix: has(prefixed(p.id, 'pickupR')) ? p.id : '', name: layout.pickups.length === 1 ? 'Pickup' : `${p.name} pickup` }];
    for (const { prefix, name } of sources) {
      if (!has(prefixed(prefix, 'pickupR'))) continue;
      slots.push({
        key: prefixed(prefix, 'pickup'),
        name,
        accepts: 'pickup',
        values: {
          resistance: prefixed(prefix, 'pickupR'),
          inductance: prefixed(prefix, 'pickupL'),
          capacitance: prefixed(prefix, 'pickupC'),
          lossResistance: prefixed(prefix, 'pickupRp'),
        },
      });
    }
  }
  // Volume and tone groups, in the layout's value order, found by their pot's key.
  for (const v of layout.values) {
    const m = /^(?:(.+)\.)?(volume|tone)R$/.exec(v.key);
    if (!m) continue;
    const prefix = m[1] ?? '';
    const k = (n: string) => prefixed(prefix, n);
    if (m[2] === 'volume') {
      slots.push({ key: v.key, name: nameOf(v.key), accepts: 'pot', values: { resistance: v.key, law: k('volumeLaw') } });
      if (bleed !== 'none' && has(k('bleedC')))
        slots.push({ key: k('bleedC'), name: nameOf(k('bleedC')), accepts: 'capacitor', values: { capacitance: k('bleedC') } });
      if ((bleed === 'cap-parallel-r' || bleed === 'cap-series-r') && has(k('bleedR')))
        slots.push({ key: k('bleedR'), name: nameOf(k('bleedR')), accepts: 'resistor', values: { resistance: k('bleedR') } });
    } else {
      slots.push({ key: v.key, name: nameOf(v.key), accepts: 'pot', values: { resistance: v.key, law: k('toneLaw') } });
      slots.push({ key: k('toneC'), name: nameOf(k('toneC')), accepts: 'capacitor', values: { capacitance: k('toneC') } });
      if ((network === 'floor-resistor' || network === 'floor-and-second-cap') && has(k('floorR')))
        slots.push({ key: k('floorR'), name: nameOf(k('floorR')), accepts: 'resistor', values: { resistance: k('floorR') } });
      if ((network === 'second-cap' || network === 'floor-and-second-cap') && has(k('secondC')))
        slots.push({ key: k('secondC'), name: nameOf(k('secondC')), accepts: 'capacitor', values: { capacitance: k('secondC') } });
    }
  }
  return slots;
}

/** Why a part of this kind may not fill the slot, in words; null when it may. */
export function slotRefusal(slot: DesignSlot, partKind: string): string | null {
  if (partKind === slot.accepts) return null;
  return `${slot.name} (${slot.key}) takes a ${slot.accepts}, not a ${partKind}.`;
}
