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
