// Verdicts: a reading against limits, with a guard band when the measurement uncertainty is known.
//
// Decision rule (JCGM 106:2012 "The role of measurement uncertainty in conformity assessment",
// §8 guarded acceptance; ILAC-G8:09/2019 "Guidelines on Decision Rules and Statements of
// Conformity", §4.2 guard band w = U):
//   pass     — the whole interval [value − U, value + U] lies inside [lower, upper];
//   fail     — the interval lies wholly outside (value + U < lower, or value − U > upper);
//   marginal — otherwise (the limit lies within the uncertainty of the reading).
// Without an uncertainty: simple acceptance (ILAC-G8 §4.2.1, w = 0), pass when lower ≤ value ≤ upper.
// Limits are inclusive in both rules: a value exactly on a limit conforms.

import { formatValue } from '@shared/units/format';
import type { Quantity } from '@shared/units/quantities';
import type { TwoSidedTolerance } from './tolerance';

/** A meter's accuracy at the range in use: ±(pctOfReading % of reading + counts × resolution). */
export type Accuracy = {
  pctOfReading: number;
  counts: number;
  /**
   * The value of one count (least significant digit), in SI units: fixed, for an instrument whose
   * display counts are not recorded. With display counts it follows the range of each reading.
   */
  resolution: number;
  /** Accuracy on particular ranges (range = counts × 10^k in SI units), when it differs from the default. */
  ranges?: { range: number; pctOfReading: number; counts: number }[];
};

/**
 * The range a reading falls on: the smallest decade range counts × 10^k (SI units) that holds it,
 * a display of `displayCounts` counts showing 0 … displayCounts − 1. A 6000-count meter reads
 * 598 kΩ on its 600 kΩ range (common practice for auto-ranging meters, no published source).
 */
export function meterRange(reading: number, displayCounts: number): number {
  if (!(displayCounts >= 2) || !Number.isFinite(displayCounts)) throw new RangeError('Display counts must be 2 or more.');
  const a = Math.abs(reading);
  if (!Number.isFinite(a)) throw new RangeError('meterRange needs a finite reading.');
  if (a === 0) return displayCounts * 1e-3; // the lowest range a meter offers; any small decade does here
  let k = Math.ceil(Math.log10(a / displayCounts));
  const at = (e: number) => Number(`${displayCounts}e${e}`);
  while (at(k) <= a) k++;
  while (at(k - 1) > a) k--;
  return at(k);
}

/** The accuracy that applies to one reading: on a meter with display counts, per range (see meterRange). */
export function accuracyAt(reading: number, accuracy: Accuracy, displayCounts?: number | null): Accuracy {
  if (!displayCounts) return accuracy;
  const range = meterRange(reading, displayCounts);
  const own = accuracy.ranges?.find((r) => Math.abs(r.range - range) <= range * 1e-9);
  return {
    pctOfReading: own?.pctOfReading ?? accuracy.pctOfReading,
    counts: own?.counts ?? accuracy.counts,
    resolution: range / displayCounts,
  };
}

export type VerdictKind = 'pass' | 'fail' | 'marginal';

export interface JudgeInput {
  value: number;
  nominal?: number;
  lower: number;
  upper: number;
  /** Expanded uncertainty U of the reading (same unit as value); omit for simple acceptance. */
  uncertainty?: number | null;
  unit: string;
  quantity?: Quantity;
}

export interface Verdict {
  verdict: VerdictKind;
  reason: string;
  deviationPct: number | null;
  lower: number;
  upper: number;
  uncertainty: number | null;
  rule: 'guarded' | 'simple';
}

/**
 * U = p % · |reading| + counts · resolution.
 * Assumption: the meter's accuracy specification is taken as the expanded uncertainty U of the
 * reading. The specification is a limit of error: the maker states that the reading's error lies
 * within it. A GUM-style evaluation (JCGM 100:2008 §4.3.7) would instead treat it as a rectangular
 * distribution, u = spec/√3, and report U = 2u ≈ 1.15 × spec; using the specification itself is the
 * figure a technician reads off the meter's data sheet and differs from that by 13 %. Lead
 * resistance, fixture capacitance and temperature are not included; a caller that knows them adds
 * them to U.
 */
export function instrumentUncertainty(reading: number, accuracy: Accuracy): number {
  const { pctOfReading, counts, resolution } = accuracy;
  if (![reading, pctOfReading, counts, resolution].every(Number.isFinite)) {
    throw new RangeError('instrumentUncertainty needs finite numbers.');
  }
  if (pctOfReading < 0 || counts < 0 || resolution < 0) {
    throw new RangeError('Accuracy figures cannot be negative.');
  }
  return (pctOfReading / 100) * Math.abs(reading) + counts * resolution;
}

/**
 * The decimal number a limit means: products such as 100 nF × 1.01 land one binary ulp beside the
 * decimal 101 nF, which would judge a reading typed exactly on the limit as outside it. Rounding
 * to 15 significant digits (the digits a double always holds, IEEE 754 binary64) gives back the
 * double nearest the decimal value, the same double the parser makes from "101n".
 */
export function decimalLimit(x: number): number {
  if (!Number.isFinite(x) || x === 0) return x;
  return Number(x.toPrecision(15));
}

/**
 * nominal ± tolerance (symmetric percent, or {minusPct, plusPct} for e.g. −20 %/+80 %), as the
 * decimal values the user means (see decimalLimit). Lot counts below/above use the same limits.
 */
export function limitsFromTolerance(nominal: number, tolerancePct: number | TwoSidedTolerance): { lower: number; upper: number } {
  const minus = typeof tolerancePct === 'number' ? tolerancePct : tolerancePct.minusPct;
  const plus = typeof tolerancePct === 'number' ? tolerancePct : tolerancePct.plusPct;
  if (!Number.isFinite(nominal) || !Number.isFinite(minus) || !Number.isFinite(plus) || minus < 0 || plus < 0) {
    throw new RangeError('limitsFromTolerance needs a finite nominal and non-negative tolerances.');
  }
  const a = decimalLimit(nominal * (1 - minus / 100));
  const b = decimalLimit(nominal * (1 + plus / 100));
  return a <= b ? { lower: a, upper: b } : { lower: b, upper: a };
}

function fmtPctMagnitude(x: number): string {
  // Two significant digits below 1 %, one decimal above: 0.35 %, 2.6 %, 20 %.
  const a = Math.abs(x);
  const text = a === 0 ? '0' : a < 1 ? String(Number(a.toPrecision(2))) : String(Number(a.toFixed(1)));
  return `${text} %`;
}

/** Words for where the limits sit relative to nominal: "±20 %", "−20 %/+80 %". */
function limitsWords(nominal: number | undefined, lower: number, upper: number, unit: string): string {
  if (nominal === undefined || nominal === 0 || !Number.isFinite(nominal)) {
    return `the limits ${formatValue(lower, unit)} … ${formatValue(upper, unit)}`;
  }
  const lo = ((lower - nominal) / Math.abs(nominal)) * 100;
  const hi = ((upper - nominal) / Math.abs(nominal)) * 100;
  if (lo <= 0 && hi >= 0 && Math.abs(lo + hi) <= 1e-9 * Math.max(1, Math.abs(hi))) {
    return `±${fmtPctMagnitude(hi)}`;
  }
  if (lo <= 0 && hi >= 0) {
    return `−${fmtPctMagnitude(lo)}/+${fmtPctMagnitude(hi)}`;
  }
  return `the limits ${formatValue(lower, unit)} … ${formatValue(upper, unit)}`;
}

function subject(value: number, nominal: number | undefined, unit: string, deviationPct: number | null): string {
  const v = formatValue(value, unit);
  if (nominal === undefined || deviationPct === null) return v;
  const n = formatValue(nominal, unit);
  if (deviationPct === 0) return `${v} is equal to nominal ${n}`;
  const side = deviationPct < 0 ? 'under' : 'over';
  return `${v} is ${fmtPctMagnitude(deviationPct)} ${side} nominal ${n}`;
}

export function judge(input: JudgeInput): Verdict {
  const { value, nominal, lower, upper, unit } = input;
  const U = input.uncertainty ?? null;
  if (!Number.isFinite(value) || !Number.isFinite(lower) || !Number.isFinite(upper)) {
    throw new RangeError('judge needs a finite value and finite limits.');
  }
  if (lower > upper) throw new RangeError(`Lower limit ${lower} is above upper limit ${upper}.`);
  if (U !== null && (!Number.isFinite(U) || U < 0)) throw new RangeError('The uncertainty must be a finite number ≥ 0.');

  const deviationPct =
    nominal !== undefined && Number.isFinite(nominal) && nominal !== 0 ? ((value - nominal) / Math.abs(nominal)) * 100 : null;
  const head = subject(value, nominal, unit, deviationPct);
  const lim = limitsWords(nominal, lower, upper, unit);
  const base = { deviationPct, lower, upper, uncertainty: U };

  if (U === null) {
    const note = ' (simple acceptance: no measurement uncertainty given)';
    if (value >= lower && value <= upper) {
      return { ...base, verdict: 'pass', rule: 'simple', reason: `${head}, inside ${lim}${note}` };
    }
    const below = value < lower;
    const by = formatValue(below ? lower - value : value - upper, unit);
    const limName = below ? `the lower limit ${formatValue(lower, unit)}` : `the upper limit ${formatValue(upper, unit)}`;
    return {
      ...base,
      verdict: 'fail',
      rule: 'simple',
      reason: `${head}, outside ${lim}: ${below ? 'below' : 'above'} ${limName} by ${by}${note}`,
    };
  }

  const u = formatValue(U, unit);
  const lo = value - U;
  const hi = value + U;
  if (lo >= lower && hi <= upper) {
    return {
      ...base,
      verdict: 'pass',
      rule: 'guarded',
      reason: `${head}, inside ${lim} even allowing for the measurement uncertainty (±${u})`,
    };
  }
  if (hi < lower || lo > upper) {
    const below = hi < lower;
    const by = formatValue(below ? lower - value : value - upper, unit);
    const limName = below ? `the lower limit ${formatValue(lower, unit)}` : `the upper limit ${formatValue(upper, unit)}`;
    return {
      ...base,
      verdict: 'fail',
      rule: 'guarded',
      reason: `${head}, outside ${lim}: ${below ? 'below' : 'above'} ${limName} by ${by}, more than the measurement uncertainty (±${u})`,
    };
  }
  // Marginal: name the limit that lies within reach of the uncertainty (the nearer one if both do).
  const nearLower = lo < lower;
  const nearUpper = hi > upper;
  const which = nearLower && nearUpper ? (value - lower <= upper - value ? 'lower' : 'upper') : nearLower ? 'lower' : 'upper';
  const limValue = which === 'lower' ? lower : upper;
  return {
    ...base,
    verdict: 'marginal',
    rule: 'guarded',
    reason: `${head}, within the measurement uncertainty (±${u}) of the ${which} limit ${formatValue(limValue, unit)}: conformity cannot be stated either way`,
  };
}
