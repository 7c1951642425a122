// Reading component values typed by people: engineering notation with SI prefixes, the RKM code
// of IEC 60062 (letter in place of the decimal point: 4k7, 2n2, 1R5, R47) and exponent notation.
//
// Prefix rules (decided here; the SI itself is case-sensitive, the trade is not):
// - With an explicit unit the SI prefixes are read case-sensitively (SI Brochure, 9th ed., §3):
//   `1mF`, `1mH`, `1mΩ` are milli, `1MΩ`, `1MHz` are mega. `k` and `K` both mean kilo, since
//   `470K` is how resistors are written in the trade — common practice (no published source).
// - `meg` (any case) is always mega, as in SPICE, and is the unambiguous way to write megohms.
// - A bare `m` (no unit after it) is refused for resistance, ESR and capacitance, and when no
//   quantity is given: in the trade `1m` on a resistor is often meant as 1 MΩ, while the SI says
//   milli, and on a capacitor it has been used for micro. For inductance (mH is the usual unit of a
//   pickup coil), frequency, voltage and the dimensionless quantities a bare `m` is milli.
// - A bare `M` is mega, except for capacitance: a megafarad is no component value, and old
//   capacitor markings use M / MF / MFD for microfarad, so `1M` and `1MF` are refused there.
// - A comma is a decimal separator (`0,022 µF`); digit grouping is not accepted.
// - A capacitance written as a bare number, with no prefix, unit or exponent: below 1 it is read in
//   microfarads, as film capacitors print `.022` or `0.1` (common practice, no published source),
//   and the result says how it was read; 1 or more (`100`, `470`) could be picofarads or a code, so
//   it is refused with a hint. Exponent notation (`2.2e-8`) stays in farads.
// - `µ` (U+00B5 micro sign), `μ` (U+03BC Greek mu) and `u` are micro; `Ω` (U+03A9) and the ohm
//   sign U+2126 are both ohm; `ohm`, `Ohm`, `ohms` and a trailing `R` (as in 470R) also are.

import { formatValue } from './format';
import { NON_NEGATIVE_QUANTITIES, QUANTITY_LABEL, QUANTITY_UNIT, type Quantity } from './quantities';

export type ValueParseReason = 'empty' | 'syntax' | 'ambiguous' | 'unit-mismatch' | 'negative' | 'not-finite';

export class ValueParseError extends Error {
  readonly reason: ValueParseReason;
  readonly input: string;
  constructor(reason: ValueParseReason, input: string, message: string) {
    super(message);
    this.name = 'ValueParseError';
    this.reason = reason;
    this.input = input;
  }
}

export type TryParseResult = { ok: true; value: number; unit: string; readAs?: string } | { ok: false; error: string };

/** Power of ten for each accepted prefix. */
const PREFIX_EXP: Readonly<Record<string, number>> = {
  f: -15,
  p: -12,
  n: -9,
  u: -6,
  µ: -6,
  μ: -6,
  m: -3,
  k: 3,
  K: 3,
  M: 6,
  meg: 6,
  Meg: 6,
  MEG: 6,
  G: 9,
  T: 12,
};
// Longest first so that `meg` wins over `m`.
const PREFIXES = Object.keys(PREFIX_EXP).sort((a, b) => b.length - a.length);

/** Unit spellings accepted on their own (e.g. `470R`, `2.5 H`) → canonical symbol. */
const UNIT_ALIASES: Readonly<Record<string, string>> = {
  Ω: 'Ω',
  ohm: 'Ω',
  ohms: 'Ω',
  Ohm: 'Ω',
  Ohms: 'Ω',
  OHM: 'Ω',
  OHMS: 'Ω',
  R: 'Ω',
  F: 'F',
  H: 'H',
  Hz: 'Hz',
  hz: 'Hz',
  HZ: 'Hz',
  V: 'V',
  '°': '°',
  deg: '°',
  '%': '%',
};
// After a prefix, a lower-case `f` can only be farad (`22pf`, `0.1uf`); on its own it is refused
// (femto or farad?). `R` after a prefix (`4.7kR`) is not a form anyone writes, so it is refused.
const UNIT_AFTER_PREFIX: Readonly<Record<string, string>> = { ...UNIT_ALIASES, f: 'F' };
delete (UNIT_AFTER_PREFIX as Record<string, string>)['R'];
delete (UNIT_AFTER_PREFIX as Record<string, string>)['%'];

const UNIT_QUANTITY_WORD: Readonly<Record<string, string>> = {
  Ω: 'a resistance',
  F: 'a capacitance',
  H: 'an inductance',
  Hz: 'a frequency',
  V: 'a voltage',
  '°': 'an angle',
  '%': 'a percentage',
};

const DIMENSIONLESS: ReadonlySet<Quantity> = new Set<Quantity>(['dissipation', 'ratio', 'q']);

const NUMBER_RE = /^([+-]?)(\d+(?:\.\d*)?|\.\d+)(?:[eE]([+-]?\d+))?\s*(.*)$/;
// RKM (IEC 60062): optional digits, one letter standing for the decimal point and the
// multiplier, at least one digit after it, then optionally a unit.
const RKM_RE = /^([+-]?)(\d*)([RrKkMGTpnuµμm])(\d+)\s*(.*)$/;

const RKM_EXP: Readonly<Record<string, number>> = {
  R: 0,
  r: 0,
  k: 3,
  K: 3,
  M: 6,
  G: 9,
  T: 12,
  p: -12,
  n: -9,
  u: -6,
  µ: -6,
  μ: -6,
  m: -3,
};

function normalise(text: string): string {
  return text
    .replace(/[\u00A0\u2009\u202F\u2007\t]/g, ' ')
    .replace(/\u2126/g, 'Ω')
    .replace(/\u2212/g, '-')
    .trim();
}

function quantityName(q: Quantity): string {
  const label = QUANTITY_LABEL[q];
  return /^[aeiou]/.test(label) ? `an ${label}` : `a ${label}`;
}

/**
 * Read a value such as `22n`, `0,022 µF`, `4k7`, `1R5`, `6.2 kΩ`, `1meg` or `2.2e-8`.
 * With a quantity, the unit (if written) must be that quantity's unit, and the returned unit is the
 * quantity's SI unit; without one, the written unit (or '') is returned.
 * Throws ValueParseError with a message that says what is wrong.
 */
export function parseValue(text: string, quantity?: Quantity): { value: number; unit: string; readAs?: string } {
  const input = text;
  let s = normalise(String(text ?? ''));
  if (s === '') {
    throw new ValueParseError('empty', input, 'Empty value: type a number such as 22n, 4k7 or 0.022 µF.');
  }
  const commas = (s.match(/,/g) ?? []).length;
  if (commas > 0) {
    if (commas > 1 || s.includes('.')) {
      throw new ValueParseError(
        'syntax',
        input,
        `"${input}" mixes separators: use one decimal separator (a point or a comma) and no digit grouping.`,
      );
    }
    s = s.replace(',', '.');
  }

  let sign = '';
  let digits: string; // decimal digits with an optional point
  let exp = 0; // power of ten written in the number itself
  let prefix: string | null = null;
  let unitText = '';
  let rkm = false;

  const r = RKM_RE.exec(s);
  if (r) {
    const [, sg, before, letter, after, rest] = r as unknown as [string, string, string, string, string, string];
    rkm = true;
    sign = sg;
    digits = `${before || '0'}.${after}`;
    prefix = letter;
    unitText = rest;
    if (letter === 'R' || letter === 'r') {
      prefix = null;
      if (quantity !== undefined && QUANTITY_UNIT[quantity] !== 'Ω') {
        throw new ValueParseError(
          'unit-mismatch',
          input,
          `"${input}" uses R (ohm) as its decimal point, which marks a resistance, not ${quantityName(quantity)}.`,
        );
      }
      if (unitText !== '' && UNIT_ALIASES[unitText] !== 'Ω') {
        throw new ValueParseError('syntax', input, `"${input}": unexpected "${unitText}" after the RKM value ${before}R${after}.`);
      }
      unitText = 'Ω';
    } else if (unitText !== '' && UNIT_AFTER_PREFIX[unitText] === undefined) {
      throw new ValueParseError(
        'syntax',
        input,
        `"${input}" is not a value: after the RKM value ${before}${letter}${after} (IEC 60062) there is unexpected text "${unitText}".`,
      );
    }
  } else {
    const m = NUMBER_RE.exec(s);
    if (!m) {
      throw new ValueParseError(
        'syntax',
        input,
        `"${input}" is not a value: it should start with a number (for example 22n, 4k7, 0.022 µF or 2.2e-8).`,
      );
    }
    const [, sg, num, e, rest] = m as unknown as [string, string, string, string | undefined, string];
    sign = sg;
    digits = num;
    exp = e === undefined ? 0 : Number(e);
    const split = splitSuffix(rest);
    if (split === null) {
      throw new ValueParseError(
        'syntax',
        input,
        `"${input}" is not a value: "${rest}" after the number is neither an SI prefix nor a unit (for example n, k, meg, nF, kΩ, mH, Hz).`,
      );
    }
    prefix = split.prefix;
    unitText = split.unit;
  }

  let unit = unitText === '' ? '' : rkm && unitText === 'Ω' ? 'Ω' : (UNIT_AFTER_PREFIX[unitText] ?? UNIT_ALIASES[unitText] ?? '');

  // Ambiguous prefixes (see the rules at the top of this file).
  if (prefix === 'm' && unit === '') {
    const refuse = quantity === undefined || quantity === 'resistance' || quantity === 'esr' || quantity === 'capacitance';
    if (refuse) {
      const what = quantity === undefined ? 'without a quantity' : `for ${quantityName(quantity)}`;
      const readings = quantity === 'capacitance' ? 'milli, or micro as on old markings' : 'milli or mega';
      const hint =
        quantity === 'capacitance'
          ? 'write the unit: 1 mF for millifarads, 1 µF (or 1u) for microfarads'
          : quantity === undefined
            ? 'write the unit (1 mH, 1 mΩ) or use 1M / 1meg for mega'
            : 'write 1M or 1meg for megohms, or 1 mΩ for milliohms';
      throw new ValueParseError('ambiguous', input, `"${input}" is ambiguous ${what}: "m" could mean ${readings}; ${hint}.`);
    }
  }
  if (prefix === 'M' && (quantity === 'capacitance' || unit === 'F')) {
    throw new ValueParseError(
      'ambiguous',
      input,
      `"${input}" is ambiguous for a capacitance: "M" would be megafarad, but old markings use M / MF for microfarad; write µF (or u) for microfarads, or mF for millifarads.`,
    );
  }
  if (prefix === 'f' && unit !== 'F') {
    throw new ValueParseError('ambiguous', input, `"${input}": "f" alone could be femto or farad; write fF or F.`);
  }

  if (unit === '%') {
    if (prefix !== null) {
      throw new ValueParseError('syntax', input, `"${input}": a percentage takes no SI prefix.`);
    }
    if (quantity !== undefined && !DIMENSIONLESS.has(quantity)) {
      throw new ValueParseError(
        'unit-mismatch',
        input,
        `"${input}" is a percentage, which does not fit ${quantityName(quantity)} (${QUANTITY_UNIT[quantity]}).`,
      );
    }
    exp -= 2;
    unit = '';
  } else if (unit !== '' && quantity !== undefined && unit !== QUANTITY_UNIT[quantity]) {
    const expected = QUANTITY_UNIT[quantity];
    throw new ValueParseError(
      'unit-mismatch',
      input,
      `"${input}" is ${UNIT_QUANTITY_WORD[unit] ?? `in ${unit}`} (${unit}), not ${quantityName(quantity)}` +
        (expected === '' ? ' (a plain number).' : ` (${expected}).`),
    );
  }

  const totalExp = exp + (prefix === null ? 0 : ((rkm ? RKM_EXP[prefix] : PREFIX_EXP[prefix]) ?? 0));
  // Converting the decimal text with the combined exponent rounds once, so `22n` is exactly the
  // double nearest 22e-9 rather than 22 × 1e-9 rounded twice.
  let value = Number(`${sign}${digits}e${totalExp}`);
  if (!Number.isFinite(value)) {
    throw new ValueParseError('not-finite', input, `"${input}" is too large to be a value.`);
  }
  if (value === 0) value = 0; // no negative zero
  let readAs: string | undefined;
  const bare = !rkm && prefix === null && unitText === '' && !/[eE]/.test(s);
  if (quantity === 'capacitance' && bare && value !== 0) {
    if (Math.abs(value) < 1) {
      value = Number(`${sign}${digits}e-6`);
      readAs = `read as ${formatValue(value, 'F')}: a bare decimal on a capacitor is in microfarads`;
    } else {
      const n = s.replace(/^[+-]/, '');
      throw new ValueParseError(
        'ambiguous',
        input,
        `"${input}" has no unit: on a capacitor a bare ${n} could be picofarads or a marking code; add a unit: ${n}p, ${n}n, ${n}u.`,
      );
    }
  }
  if (value < 0 && quantity !== undefined && NON_NEGATIVE_QUANTITIES.has(quantity)) {
    throw new ValueParseError('negative', input, `"${input}" is negative, but ${quantityName(quantity)} cannot be.`);
  }
  const out = { value, unit: quantity !== undefined ? QUANTITY_UNIT[quantity] : unit };
  return readAs !== undefined ? { ...out, readAs } : out;
}

/** Like parseValue, but returns the error message instead of throwing. */
export function tryParseValue(text: string, quantity?: Quantity): TryParseResult {
  try {
    const r = parseValue(text, quantity);
    return r.readAs !== undefined
      ? { ok: true, value: r.value, unit: r.unit, readAs: r.readAs }
      : { ok: true, value: r.value, unit: r.unit };
  } catch (err) {
    if (err instanceof ValueParseError) return { ok: false, error: err.message };
    throw err;
  }
}

/** Split the text after the number into an optional prefix and an optional unit, or null. */
function splitSuffix(rest: string): { prefix: string | null; unit: string } | null {
  if (rest === '') return { prefix: null, unit: '' };
  if (UNIT_ALIASES[rest] !== undefined) return { prefix: null, unit: rest };
  for (const p of PREFIXES) {
    if (!rest.startsWith(p)) continue;
    const after = rest.slice(p.length).trimStart();
    if (after === '') return { prefix: p, unit: '' };
    if (UNIT_AFTER_PREFIX[after] !== undefined) return { prefix: p, unit: after };
  }
  return null;
}
