import type { ReadingQuantity } from '@shared/schemas/bench';
import type { PartKind } from '@shared/schemas/common';
import { formatValue } from '@shared/units/format';
import { QUANTITY_UNIT } from '@shared/units/quantities';

export const QUANTITY_NAME: Record<ReadingQuantity, string> = {
  resistance: 'Resistance',
  capacitance: 'Capacitance',
  inductance: 'Inductance',
  dissipation: 'Dissipation factor (D)',
  esr: 'ESR',
  q: 'Q',
};

/** Short form for tables. */
export const QUANTITY_SHORT: Record<ReadingQuantity, string> = {
  resistance: 'R',
  capacitance: 'C',
  inductance: 'L',
  dissipation: 'D',
  esr: 'ESR',
  q: 'Q',
};

export const QUANTITY_EXAMPLES: Record<ReadingQuantity, string> = {
  resistance: 'e.g. 487k, 4k7, 1meg',
  capacitance: 'e.g. 22n, 2n2, 0.047u',
  inductance: 'e.g. 2.6, 4.3 H, 850m',
  dissipation: 'e.g. 0.002 or 0.2 %',
  esr: 'e.g. 0.8, 12R, 1k2',
  q: 'a plain number, e.g. 12',
};

/** The quantity a tech measures first on each kind of part. */
export const DEFAULT_QUANTITY: Record<PartKind, ReadingQuantity> = {
  pot: 'resistance',
  resistor: 'resistance',
  pickup: 'resistance',
  capacitor: 'capacitance',
  other: 'resistance',
};

/** A reading's value with its unit; dissipation factors as plain fractions. */
export const formatReading = (quantity: ReadingQuantity, value: number) => formatValue(value, QUANTITY_UNIT[quantity], { digits: 4 });
