// The one table of physical value ranges. Every schema that takes a part value, a frequency, a
// knob, a cable or a rotation takes its bounds from here, so a value outside what a guitar or
// bass circuit (and the bench that measures it) can hold is refused with a 422 that names the
// field, instead of being clamped or reaching the solver. SI units.
//
// The bounds are common practice (no published source): wide enough for every part a shop
// measures (a 1 mΩ jumper to a 100 MΩ insulation reading, a 0.1 pF stray to a 10 mF filter
// capacitor, a 1 µH lead to a 100 H transformer winding), narrow enough to keep the numbers
// inside what the engine solves accurately.
import { z } from 'zod';
import { formatValue } from '@shared/units/format';

export interface ValueRange {
  min: number;
  max: number;
  unit: string;
  /** Words for people: "a resistance". */
  what: string;
  /** Whether the minimum itself is allowed (0 m of cable is; 0 Ω is not). */
  minInclusive: boolean;
}

export const VALUE_RANGES = {
  resistance: { min: 1e-3, max: 100e6, unit: 'Ω', what: 'a resistance', minInclusive: true },
  capacitance: { min: 0.1e-12, max: 10e-3, unit: 'F', what: 'a capacitance', minInclusive: true },
  inductance: { min: 1e-6, max: 100, unit: 'H', what: 'an inductance', minInclusive: true },
  frequency: { min: 1, max: 1e6, unit: 'Hz', what: 'a frequency', minInclusive: true },
  knob: { min: 0, max: 10, unit: '', what: 'a knob setting', minInclusive: true },
  cableLength: { min: 0, max: 100, unit: 'm', what: 'a cable length', minInclusive: true },
  /** Cable capacitance per metre: 0 (no cable) to 1 nF/m (the worst coiled cords are a few hundred pF/m). */
  cableCapPerMetre: { min: 0, max: 1e-9, unit: 'F/m', what: 'a cable capacitance per metre', minInclusive: true },
  fullRotation: { min: 10, max: 3600, unit: '°', what: 'a full rotation', minInclusive: true },
  /** A dissipation factor (D = tan δ): 0 to 10; a film capacitor reads about 0.001, a failing electrolytic a few tenths. */
  dissipation: { min: 0, max: 10, unit: '', what: 'a dissipation factor', minInclusive: true },
  /** A quality factor Q: 0 to 10,000. */
  q: { min: 0, max: 10_000, unit: '', what: 'a quality factor', minInclusive: true },
} as const satisfies Record<string, ValueRange>;

export type RangeName = keyof typeof VALUE_RANGES;

function show(v: number, unit: string): string {
  return unit === '' ? String(v) : unit === 'F/m' ? `${formatValue(v, 'F')}/m` : formatValue(v, unit);
}

/** "from 1 mΩ to 100 MΩ" */
export function rangeWords(name: RangeName): string {
  const r = VALUE_RANGES[name];
  return `from ${show(r.min, r.unit)} to ${show(r.max, r.unit)}`;
}

/** Whether a number lies inside a range (NaN and ±∞ never do). */
export function inRange(name: RangeName, v: number): boolean {
  const r = VALUE_RANGES[name];
  return Number.isFinite(v) && v >= r.min && v <= r.max;
}

/** A zod number inside the named range, with a message that says the range. */
export function rangeNumber(name: RangeName) {
  const r = VALUE_RANGES[name];
  const msg = `Must be ${r.what} ${rangeWords(name)}.`;
  return z.number({ error: msg }).finite(msg).min(r.min, msg).max(r.max, msg);
}

/** A zod number that is 0 or inside the named range (a part that may be absent, e.g. a pickup's C). */
export function rangeNumberOrZero(name: RangeName) {
  const r = VALUE_RANGES[name];
  const msg = `Must be 0 or ${r.what} ${rangeWords(name)}.`;
  return z
    .number({ error: msg })
    .finite(msg)
    .refine((v) => v === 0 || (v >= r.min && v <= r.max), msg);
}

/** The SI quantity a value range belongs to, for quantities the range table covers. */
export const QUANTITY_RANGE: Partial<Record<string, RangeName>> = {
  resistance: 'resistance',
  esr: 'resistance',
  capacitance: 'capacitance',
  inductance: 'inductance',
  frequency: 'frequency',
  dissipation: 'dissipation',
  q: 'q',
};

/**
 * Why a measured reading of a quantity cannot be what a meter showed, or null when it can. A reading
 * may be 0 (a short, an open capacitor) and anything up to the range's maximum; below zero, beyond
 * the maximum, NaN or infinite it is refused. Quantities the table does not cover only need to be finite.
 */
export function readingProblem(quantity: string, value: number): string | null {
  const name = QUANTITY_RANGE[quantity];
  if (!name) return Number.isFinite(value) ? null : 'Must be a finite number.';
  const r = VALUE_RANGES[name];
  if (Number.isFinite(value) && value >= 0 && value <= r.max) return null;
  return `Must be ${r.what} from 0 to ${show(r.max, r.unit)}.`;
}
