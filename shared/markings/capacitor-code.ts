// IEC 60062 capacitor value codes.
// - Three-digit code: two significant digits, then the number of zeros, in picofarads
//   (223 = 22 000 pF = 22 nF, 104 = 100 nF, 100 = 10 pF); a bare two-digit code is read directly in
//   pF (47 = 47 pF). Source: tests/fixtures/iec/iec60062-marking-codes.txt, rows cap-code.
// - A third digit of 8 or 9 is refused by default: the reference file records that one maker's
//   convention reads 9 as ×0.1 and 8 as ×0.01 (479 = 4.7 pF) while the plain rule gives 10^9 and
//   10^8, and that neither reading was verified in IEC 60062. Pass { thirdDigit89: 'fraction' } to
//   use the ×0.1 / ×0.01 reading when the maker's datasheet says so.
// - RKM code (IEC 60062): the letter p, n, u (µ) or m stands for the decimal point and the
//   multiplier: 2n2 = 2.2 nF, p47 = 0.47 pF, 4u7 = 4.7 µF.
// - An optional tolerance letter follows either form (see tolerance-letters.ts).

import { decodeToleranceLetter, MarkingError, tolerancePctOf, type Tolerance } from './tolerance-letters';

export interface CapacitorCode {
  nominal: number;
  unit: 'F';
  /** Symmetric tolerance in percent; null when none was marked or it is asymmetric/absolute. */
  tolerancePct: number | null;
  tolerance: Tolerance | null;
  letter: string | null;
}

const RKM_CAP_EXP: Readonly<Record<string, number>> = { p: -12, n: -9, u: -6, µ: -6, μ: -6, m: -3 };

export function decodeCapacitorCode(code: string, opts?: { thirdDigit89?: 'refuse' | 'fraction' }): CapacitorCode {
  const s = String(code ?? '').replace(/\s+/g, '');
  if (s === '') throw new MarkingError(code, 'Empty capacitor code: type a code such as 104, 223J or 2n2.');

  let nominal: number;
  let letter: string | null = null;

  // RKM first: in 47n the n is the multiplier, not a tolerance letter.
  const rkm = /^(\d*)([pnuµμm])(\d*)([A-Z])?$/.exec(s);
  const digitCode = rkm ? null : /^(\d{2,3})([A-Za-z])?$/.exec(s);
  if (digitCode) {
    const digits = digitCode[1]!;
    letter = digitCode[2]?.toUpperCase() ?? null;
    if (digits.length === 2) {
      nominal = Number(`${digits}e-12`);
    } else {
      const sig = digits.slice(0, 2);
      let exp = Number(digits[2]);
      if (exp === 8 || exp === 9) {
        if (opts?.thirdDigit89 !== 'fraction') {
          throw new MarkingError(
            code,
            `"${s}": a third digit of ${exp} is ambiguous — the plain rule gives ${sig} × 10^${exp} pF, one maker's convention gives ${sig} × ${exp === 9 ? '0.1' : '0.01'} pF; neither is confirmed in IEC 60062. Check the datasheet and enter the value.`,
          );
        }
        exp = exp === 9 ? -1 : -2;
      }
      nominal = Number(`${sig}e${exp - 12}`);
    }
  } else if (rkm && (rkm[1] !== '' || rkm[3] !== '')) {
    const [, before, unitLetter, after] = rkm as unknown as [string, string, string, string];
    letter = rkm[4] ?? null;
    if (letter === 'F') {
      throw new MarkingError(
        code,
        `"${s}": the trailing F could be the unit farad or the tolerance letter F (±1 %); write ${before}${unitLetter}${after} alone, or give the tolerance separately.`,
      );
    }
    const exp = RKM_CAP_EXP[unitLetter]!;
    nominal = Number(`${before || '0'}.${after || '0'}e${exp}`);
  } else {
    throw new MarkingError(
      code,
      `"${s}" is not a capacitor code: expected three digits with an optional tolerance letter (104, 223J) or an RKM code (2n2, 4u7J).`,
    );
  }

  if (nominal === 0) {
    throw new MarkingError(code, `"${s}" decodes to 0 pF, which is no capacitor value.`);
  }
  const tolerance = letter === null ? null : decodeToleranceLetter(letter, 'capacitor', nominal, s);
  return { nominal, unit: 'F', tolerancePct: tolerancePctOf(tolerance), tolerance, letter };
}
