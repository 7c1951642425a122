// IEC 60062 tolerance letters (the letter after a value code, e.g. 104K, 4K7J).
// Source of truth: tests/fixtures/iec/iec60062-marking-codes.txt (compiled from public secondary
// sources that state IEC 60062; the standard itself was not read). Only rows tagged CONSENSUS,
// plus W (±0.05 %, which no source contradicts), are decoded. Letters whose meaning differs between
// sources (E, H, L, P, and N) are refused with a message instead of guessed.

export type Tolerance =
  | { kind: 'percent'; pct: number }
  | { kind: 'asymmetric'; minusPct: number; plusPct: number }
  /** Absolute ± in the value's SI unit (farads), used by B/C/D on capacitors below 10 pF. */
  | { kind: 'absolute'; plusMinus: number };

export class MarkingError extends Error {
  readonly code: string;
  constructor(code: string, message: string) {
    super(message);
    this.name = 'MarkingError';
    this.code = code;
  }
}

/** Symmetric percentage tolerances (CONSENSUS rows, and W). */
export const TOLERANCE_LETTER_PCT: Readonly<Record<string, number>> = {
  W: 0.05,
  B: 0.1,
  C: 0.25,
  D: 0.5,
  F: 1,
  G: 2,
  J: 5,
  K: 10,
  M: 20,
};

/** Absolute tolerance in pF for capacitors below 10 pF (reference: "B, C, D (and F) are absolute"). */
const ABSOLUTE_PF: Readonly<Record<string, number>> = { B: 0.1, C: 0.25, D: 0.5 };

const CONFLICTING: Readonly<Record<string, string>> = {
  E: 'E is used for ±0.005 % and, in some capacitor tables, for ±0.5 % or ±0.25 %',
  H: 'H is ±3 % in some tables and ±2.5 % in others',
  L: 'L is ±0.01 % for resistors but ±15 % in some capacitor tables',
  P: 'P is ±0.02 % for resistors but −0/+100 % in some capacitor tables',
  N: 'N is used inconsistently between the sources',
};

/** Tolerance as one symmetric percentage, or null when it is asymmetric or absolute. */
export function tolerancePctOf(t: Tolerance | null): number | null {
  return t !== null && t.kind === 'percent' ? t.pct : null;
}

/**
 * Decode a tolerance letter for a part of the given kind and nominal value (SI units).
 * Throws MarkingError for unknown letters, letters the sources disagree on, and cases that
 * cannot be decided (F on a capacitor below 10 pF: ±1 % in some tables, ±1 pF in others).
 */
export function decodeToleranceLetter(letter: string, kind: 'capacitor' | 'resistor', nominal: number, code = letter): Tolerance {
  const L = letter.toUpperCase();
  if (CONFLICTING[L] !== undefined) {
    throw new MarkingError(code, `Tolerance letter ${L} in "${code}" is not decoded: ${CONFLICTING[L]}. Enter the tolerance by hand.`);
  }
  if (L === 'Z') {
    if (kind !== 'capacitor') {
      throw new MarkingError(code, `Tolerance letter Z (−20 %/+80 %) in "${code}" is used on capacitors, not resistors.`);
    }
    return { kind: 'asymmetric', minusPct: 20, plusPct: 80 };
  }
  const pct = TOLERANCE_LETTER_PCT[L];
  if (pct === undefined) {
    throw new MarkingError(code, `"${L}" in "${code}" is not an IEC 60062 tolerance letter (B, C, D, F, G, J, K, M, W, Z).`);
  }
  if (kind === 'capacitor' && nominal < 10e-12) {
    const abs = ABSOLUTE_PF[L];
    if (abs !== undefined) return { kind: 'absolute', plusMinus: abs * 1e-12 };
    if (L === 'F') {
      throw new MarkingError(
        code,
        `Tolerance letter F on a capacitor below 10 pF ("${code}") means ±1 % in some tables and ±1 pF in others; enter the tolerance by hand.`,
      );
    }
  }
  return { kind: 'percent', pct };
}
