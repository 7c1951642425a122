// IEC 60062 resistor colour code: digit and multiplier colours, tolerance colours and the
// temperature-coefficient band. Source of truth: tests/fixtures/iec/iec60062-marking-codes.txt
// (rows colour, tolerance-colour, tcr-colour).
//
// Decisions where that file records a CONFLICT between sources: the orange, yellow and grey
// tolerance bands are refused with a message (grey is ±0.01 % in 2016-edition tables but ±0.05 % in
// older ones; orange and yellow are missing from older charts, yellow is ±5 % on some HV parts).
// Forms: 3 bands (digit, digit, multiplier; no tolerance band = ±20 %), 4 bands (… tolerance),
// 5 bands (three digits, multiplier, tolerance), 6 bands (… temperature coefficient), and one black
// band for a zero-ohm link — common practice (no published source).

import { MarkingError } from './tolerance-letters';

export type BandColour =
  'black' | 'brown' | 'red' | 'orange' | 'yellow' | 'green' | 'blue' | 'violet' | 'grey' | 'white' | 'gold' | 'silver' | 'pink';

/** Significant digit of each colour (gold, silver and pink carry none). */
export const COLOUR_DIGIT: Readonly<Partial<Record<BandColour, number>>> = {
  black: 0,
  brown: 1,
  red: 2,
  orange: 3,
  yellow: 4,
  green: 5,
  blue: 6,
  violet: 7,
  grey: 8,
  white: 9,
};

/** Multiplier band as a power of ten (pink = 10^-3 is new in IEC 60062:2016). */
export const COLOUR_MULTIPLIER_EXP: Readonly<Record<BandColour, number>> = {
  black: 0,
  brown: 1,
  red: 2,
  orange: 3,
  yellow: 4,
  green: 5,
  blue: 6,
  violet: 7,
  grey: 8,
  white: 9,
  gold: -1,
  silver: -2,
  pink: -3,
};

/** Tolerance band in percent (CONSENSUS rows only). */
export const COLOUR_TOLERANCE_PCT: Readonly<Partial<Record<BandColour, number>>> = {
  brown: 1,
  red: 2,
  green: 0.5,
  blue: 0.25,
  violet: 0.1,
  gold: 5,
  silver: 10,
};

const CONFLICTING_TOLERANCE: Readonly<Partial<Record<BandColour, string>>> = {
  orange: 'orange is ±0.05 % in 2016-edition tables but has no tolerance in older charts',
  yellow: 'yellow is ±0.02 % in 2016-edition tables, has no tolerance in older charts and is ±5 % on some HV parts',
  grey: 'grey is ±0.01 % in 2016-edition tables but ±0.05 % in older charts',
};

/** Temperature coefficient band, ppm/K (reference: "not verified against the standard"). */
export const COLOUR_TCR_PPM: Readonly<Partial<Record<BandColour, number>>> = {
  black: 250,
  brown: 100,
  red: 50,
  orange: 15,
  yellow: 25,
  green: 20,
  blue: 10,
  violet: 5,
  grey: 1,
};

const ALIASES: Readonly<Record<string, BandColour>> = { gray: 'grey', purple: 'violet' };

export interface ColourBandValue {
  nominal: number;
  unit: 'Ω';
  tolerancePct: number | null;
  tcrPpmPerK: number | null;
  bands: number;
}

/** Split "yellow violet orange gold" (spaces, commas, hyphens or slashes) and check the names. */
export function parseColourNames(input: string | readonly string[]): BandColour[] {
  const words =
    typeof input === 'string'
      ? input
          .trim()
          .split(/[\s,;/-]+/)
          .filter((w) => w !== '')
      : [...input];
  return words.map((w) => {
    const k = w.trim().toLowerCase();
    const colour = (ALIASES[k] ?? k) as BandColour;
    if (!(colour in COLOUR_MULTIPLIER_EXP)) {
      throw new MarkingError(
        String(input),
        `"${w}" is not a resistor band colour (black, brown, red, orange, yellow, green, blue, violet, grey, white, gold, silver, pink).`,
      );
    }
    return colour;
  });
}

export function decodeColourBands(input: string | readonly string[]): ColourBandValue {
  const code = typeof input === 'string' ? input : input.join(' ');
  const bands = parseColourNames(input);
  const n = bands.length;
  if (n === 1 && bands[0] === 'black') {
    return { nominal: 0, unit: 'Ω', tolerancePct: null, tcrPpmPerK: null, bands: 1 };
  }
  if (n < 3 || n > 6) {
    throw new MarkingError(
      code,
      `${n} band${n === 1 ? '' : 's'} in "${code}": a resistor has 3, 4, 5 or 6 colour bands (or one black band for a zero-ohm link).`,
    );
  }
  const digitCount = n >= 5 ? 3 : 2;
  const first = bands[0]!;
  if (first === 'gold' || first === 'silver') {
    throw new MarkingError(
      code,
      `"${code}" starts with ${first}, which is never a first band; the bands are probably read from the wrong end.`,
    );
  }
  let digits = '';
  for (let i = 0; i < digitCount; i++) {
    const c = bands[i]!;
    const d = COLOUR_DIGIT[c];
    if (d === undefined) {
      throw new MarkingError(code, `Band ${i + 1} of "${code}" is ${c}, which carries no digit (only black … white are digit colours).`);
    }
    digits += String(d);
  }
  const multColour = bands[digitCount]!;
  const exp = COLOUR_MULTIPLIER_EXP[multColour];
  // Decimal text with the exponent converts with one rounding: 4.7 kΩ is exactly 4700.
  const nominal = Number(`${digits}e${exp}`);

  let tolerancePct: number | null = null;
  if (n === 3) {
    tolerancePct = 20; // no tolerance band: ±20 % (M), reference row tolerance-colour|none
  } else {
    const tc = bands[digitCount + 1]!;
    const conflict = CONFLICTING_TOLERANCE[tc];
    if (conflict !== undefined) {
      throw new MarkingError(code, `The tolerance band of "${code}" is ${tc}: ${conflict}; enter the tolerance by hand.`);
    }
    const t = COLOUR_TOLERANCE_PCT[tc];
    if (t === undefined) {
      throw new MarkingError(
        code,
        `The tolerance band of "${code}" is ${tc}, which is not a tolerance colour (brown, red, green, blue, violet, gold, silver).`,
      );
    }
    tolerancePct = t;
  }
  let tcrPpmPerK: number | null = null;
  if (n === 6) {
    const c = bands[5]!;
    const tcr = COLOUR_TCR_PPM[c];
    if (tcr === undefined) {
      throw new MarkingError(code, `The sixth band of "${code}" is ${c}, which is not a temperature-coefficient colour.`);
    }
    tcrPpmPerK = tcr;
  }
  return { nominal, unit: 'Ω', tolerancePct, tcrPpmPerK, bands: n };
}
