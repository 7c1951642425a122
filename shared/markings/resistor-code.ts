// IEC 60062 RKM code for resistors: the letter R, K (k), M, G or T stands for the decimal point
// and the multiplier (R47 = 0.47 Ω, 4R7 = 4.7 Ω, 470R = 470 Ω, 4K7 = 4.7 kΩ, 47K3 = 47.3 kΩ,
// 4M7 = 4.7 MΩ; reference rows rkm in tests/fixtures/iec/iec60062-marking-codes.txt), optionally
// followed by an upper-case tolerance letter (4K7J = 4.7 kΩ ±5 %).
// A lower-case m is refused: RKM reads it as milli, while people often mean mega.

import { decodeToleranceLetter, MarkingError, tolerancePctOf, type Tolerance } from './tolerance-letters';

export interface ResistorCode {
  nominal: number;
  unit: 'Ω';
  tolerancePct: number | null;
  tolerance: Tolerance | null;
  letter: string | null;
}

const RKM_RES_EXP: Readonly<Record<string, number>> = { R: 0, K: 3, k: 3, M: 6, G: 9, T: 12 };

export function decodeResistorCode(code: string): ResistorCode {
  const s = String(code ?? '').replace(/\s+/g, '');
  if (/^\d*m\d*[A-Z]?$/.test(s) && /\d/.test(s)) {
    throw new MarkingError(
      code,
      `"${s}": a lower-case m is milliohm in the RKM code but is often meant as mega; write ${s.replace('m', 'M')} for megohms.`,
    );
  }
  const m = /^(\d*)([RKkMGT])(\d*)([A-Z])?$/.exec(s);
  if (!m || (m[1] === '' && m[3] === '')) {
    throw new MarkingError(code, `"${s}" is not a resistor code: expected an RKM code such as 4K7, 470R, R47 or 4K7J.`);
  }
  const [, before, mult, after] = m as unknown as [string, string, string, string];
  const letter = m[4] ?? null;
  const nominal = Number(`${before || '0'}.${after || '0'}e${RKM_RES_EXP[mult]!}`);
  const tolerance = letter === null ? null : decodeToleranceLetter(letter, 'resistor', nominal, s);
  return { nominal, unit: 'Ω', tolerancePct: tolerancePctOf(tolerance), tolerance, letter };
}
