// IEC 60063 preferred-number series. Each constant is one decade of base values exactly as
// tabulated (E6–E24 with two significant digits, 10…99; E48–E192 with three, 100…999); a preferred
// value is a base value times any power of ten. Checked value for value against
// tests/fixtures/iec/iec60063-*.txt (IEC 60063 values as tabulated in a public library, cross-
// checked against a university book appendix; see the files' source lines).

export type ESeriesName = 'E6' | 'E12' | 'E24' | 'E48' | 'E96' | 'E192';

export const E_SERIES_NAMES: readonly ESeriesName[] = ['E6', 'E12', 'E24', 'E48', 'E96', 'E192'];

export const E_SERIES: Readonly<Record<ESeriesName, readonly number[]>> = {
  E6: [10, 15, 22, 33, 47, 68],
  E12: [10, 12, 15, 18, 22, 27, 33, 39, 47, 56, 68, 82],
  E24: [10, 11, 12, 13, 15, 16, 18, 20, 22, 24, 27, 30, 33, 36, 39, 43, 47, 51, 56, 62, 68, 75, 82, 91],
  E48: [
    100, 105, 110, 115, 121, 127, 133, 140, 147, 154, 162, 169, 178, 187, 196, 205, 215, 226, 237, 249, 261, 274, 287, 301, 316, 332, 348,
    365, 383, 402, 422, 442, 464, 487, 511, 536, 562, 590, 619, 649, 681, 715, 750, 787, 825, 866, 909, 953,
  ],
  E96: [
    100, 102, 105, 107, 110, 113, 115, 118, 121, 124, 127, 130, 133, 137, 140, 143, 147, 150, 154, 158, 162, 165, 169, 174, 178, 182, 187,
    191, 196, 200, 205, 210, 215, 221, 226, 232, 237, 243, 249, 255, 261, 267, 274, 280, 287, 294, 301, 309, 316, 324, 332, 340, 348, 357,
    365, 374, 383, 392, 402, 412, 422, 432, 442, 453, 464, 475, 487, 499, 511, 523, 536, 549, 562, 576, 590, 604, 619, 634, 649, 665, 681,
    698, 715, 732, 750, 768, 787, 806, 825, 845, 866, 887, 909, 931, 953, 976,
  ],
  E192: [
    100, 101, 102, 104, 105, 106, 107, 109, 110, 111, 113, 114, 115, 117, 118, 120, 121, 123, 124, 126, 127, 129, 130, 132, 133, 135, 137,
    138, 140, 142, 143, 145, 147, 149, 150, 152, 154, 156, 158, 160, 162, 164, 165, 167, 169, 172, 174, 176, 178, 180, 182, 184, 187, 189,
    191, 193, 196, 198, 200, 203, 205, 208, 210, 213, 215, 218, 221, 223, 226, 229, 232, 234, 237, 240, 243, 246, 249, 252, 255, 258, 261,
    264, 267, 271, 274, 277, 280, 284, 287, 291, 294, 298, 301, 305, 309, 312, 316, 320, 324, 328, 332, 336, 340, 344, 348, 352, 357, 361,
    365, 370, 374, 379, 383, 388, 392, 397, 402, 407, 412, 417, 422, 427, 432, 437, 442, 448, 453, 459, 464, 470, 475, 481, 487, 493, 499,
    505, 511, 517, 523, 530, 536, 542, 549, 556, 562, 569, 576, 583, 590, 597, 604, 612, 619, 626, 634, 642, 649, 657, 665, 673, 681, 690,
    698, 706, 715, 723, 732, 741, 750, 759, 768, 777, 787, 796, 806, 816, 825, 835, 845, 856, 866, 876, 887, 898, 909, 920, 931, 942, 953,
    965, 976, 988,
  ],
};

/** Tolerance usually paired with each series (read in the same library and book appendix named in the source lines of tests/fixtures/iec/iec60063-*.txt, not in the standard). */
export const E_SERIES_TOLERANCE_PCT: Readonly<Record<ESeriesName, number>> = {
  E6: 20,
  E12: 10,
  E24: 5,
  E48: 2,
  E96: 1,
  E192: 0.5,
};

/** Significant digits of the tabulated base values. */
function digitsOf(series: ESeriesName): number {
  return E_SERIES[series][0]! >= 100 ? 3 : 2;
}

/** base × 10^exp, converted from decimal text so 47 × 10^-9 is exactly the double nearest 47e-9. */
function scale(base: number, exp: number): number {
  return Number(`${base}e${exp}`);
}

/**
 * The preferred value of `series` nearest to `value` on a logarithmic scale (the series are
 * geometric, so "nearest" is the smallest |log(value / preferred)|), across decade boundaries
 * (9.6 kΩ → 10 kΩ in E12). Ties go to the lower value. deviationPct is how far `value` lies from
 * the preferred value, in percent of the preferred value: (value − preferred) / preferred × 100.
 */
export function nearestPreferred(value: number, series: ESeriesName): { value: number; deviationPct: number } {
  if (!Number.isFinite(value) || value <= 0) {
    throw new RangeError(`nearestPreferred needs a positive finite value, got ${String(value)}.`);
  }
  const base = E_SERIES[series];
  if (base === undefined) throw new RangeError(`Unknown series "${String(series)}".`);
  const digits = digitsOf(series);
  const decade = Math.floor(Math.log10(value));
  const shift = decade - (digits - 1); // preferred = base × 10^shift
  const scaled = shift >= 0 ? value / 10 ** shift : value * 10 ** -shift;

  // Candidates: the last value of the decade below, this decade, and the first of the next.
  let best = -1;
  let bestShift = shift;
  let bestDist = Infinity;
  const consider = (b: number, sh: number, s: number) => {
    const d = Math.abs(Math.log(s / (sh === shift ? b : sh < shift ? b / 10 : b * 10)));
    if (d < bestDist) {
      bestDist = d;
      best = b;
      bestShift = sh;
    }
  };
  consider(base[base.length - 1]!, shift - 1, scaled);
  for (const b of base) consider(b, shift, scaled);
  consider(base[0]!, shift + 1, scaled);

  const preferred = scale(best, bestShift);
  return { value: preferred, deviationPct: ((value - preferred) / preferred) * 100 };
}

/** True when `value` is a member of the series within a relative tolerance (default 1e-9). */
export function isPreferredValue(value: number, series: ESeriesName, relTol = 1e-9): boolean {
  if (!Number.isFinite(value) || value <= 0) return false;
  const { value: p } = nearestPreferred(value, series);
  return Math.abs(value - p) <= relTol * p;
}
