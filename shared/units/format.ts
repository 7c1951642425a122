// Engineering notation for display: a mantissa in [1, 1000) with an SI prefix (SI Brochure,
// 9th ed., Table 7), rounded to a number of significant digits, trailing zeros removed, and a
// space between the number and the unit as the SI Brochure §5.4.3 asks.

import { QUANTITY_UNIT, type Quantity } from './quantities';

const PREFIX_BY_EXP: Readonly<Record<number, string>> = {
  [-15]: 'f',
  [-12]: 'p',
  [-9]: 'n',
  [-6]: 'µ',
  [-3]: 'm',
  0: '',
  3: 'k',
  6: 'M',
  9: 'G',
  12: 'T',
};

// Units shown without prefixes: a dissipation factor of 0.005 reads better than "5 m", and
// prefixed degrees are not used.
const NO_PREFIX_UNITS: ReadonlySet<string> = new Set(['', '°', '%']);

function trimZeros(s: string): string {
  return s.includes('.') && !s.includes('e') ? s.replace(/\.?0+$/, '') : s;
}

/** Round to `digits` significant digits and return mantissa text and its power-of-ten step. */
function engineering(value: number, digits: number): { mantissa: string; exp3: number } {
  if (value === 0) return { mantissa: '0', exp3: 0 };
  const abs = Math.abs(value);
  // Round first, then choose the prefix, so 999.7 with 3 digits becomes "1 k", not "1000".
  const rounded = Number(abs.toPrecision(digits));
  let exp3 = Math.floor(Math.log10(rounded) / 3) * 3;
  // log10 can be off by one ulp at exact powers of ten (e.g. 1e-6); correct the step.
  if (rounded / 10 ** exp3 >= 1000) exp3 += 3;
  if (rounded / 10 ** exp3 < 1) exp3 -= 3;
  const scaled = exp3 >= 0 ? rounded / 10 ** exp3 : rounded * 10 ** -exp3;
  const r = Number(scaled.toPrecision(digits));
  // toFixed, not toPrecision: toPrecision(1) of 20 is "2e+1".
  const decimals = Math.max(0, digits - 1 - Math.floor(Math.log10(r)));
  const mantissa = trimZeros(r.toFixed(Math.min(20, decimals)));
  return { mantissa: (value < 0 ? '-' : '') + mantissa, exp3 };
}

/**
 * 22e-9, 'F' → "22 nF"; 487000, 'Ω' → "487 kΩ"; 2.61, 'H' → "2.61 H"; 0, 'Ω' → "0 Ω".
 * Default 3 significant digits. Values beyond the prefixes f…T use exponent notation.
 */
export function formatValue(value: number, unit: string, opts?: { digits?: number }): string {
  const digits = Math.min(17, Math.max(1, Math.round(opts?.digits ?? 3)));
  if (!Number.isFinite(value)) return unit === '' ? String(value) : `${String(value)} ${unit}`;
  if (NO_PREFIX_UNITS.has(unit)) {
    const text = value === 0 ? '0' : plain(value, digits);
    // SI Brochure §5.4.3: no space before the degree sign.
    return unit === '' ? text : unit === '°' ? `${text}°` : `${text} ${unit}`;
  }
  const { mantissa, exp3 } = engineering(value, digits);
  const prefix = PREFIX_BY_EXP[exp3];
  if (prefix === undefined) {
    const e = trimZeros(value.toExponential(digits - 1).replace(/\.?0+e/, 'e'));
    return `${e} ${unit}`;
  }
  return `${mantissa} ${prefix}${unit}`;
}

/** A plain decimal with `digits` significant digits (exponent form only when very small/large). */
function plain(value: number, digits: number): string {
  const abs = Math.abs(value);
  if (abs >= 1e-6 && abs < 1e15) {
    const p = Number(value.toPrecision(digits));
    const mag = Math.floor(Math.log10(Math.abs(p)));
    const decimals = Math.max(0, digits - 1 - mag);
    return trimZeros(p.toFixed(Math.min(20, decimals)));
  }
  return value.toExponential(digits - 1).replace(/\.?0+e/, 'e');
}

/** Signed deviation in percent: 2.6 → "+2.6 %", -0.04 → "-0.04 %" with digits=2, 0 → "0.0 %". */
export function formatPercent(x: number, digits = 1): string {
  if (!Number.isFinite(x)) return `${String(x)} %`;
  const d = Math.min(20, Math.max(0, Math.round(digits)));
  let text = Math.abs(x).toFixed(d);
  if (Number(text) === 0) return `${text} %`;
  text = (x < 0 ? '-' : '+') + text;
  return `${text} %`;
}

/** formatValue with the SI unit of a quantity. */
export function formatSi(value: number, quantity: Quantity, opts?: { digits?: number }): string {
  return formatValue(value, QUANTITY_UNIT[quantity], opts);
}
