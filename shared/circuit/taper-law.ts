// Potentiometer laws for the harness engine: the fraction y of the track resistance between the
// wiper and the law's reference end at rotation x (0–1). Kept here, apart from shared/analysis, so
// the engine has no dependency on the taper-fit code; the formulas are the ones of docs/computation.md §3.

export type TaperLaw =
  | { kind: 'linear' }
  | { kind: 'audio'; m: number }
  | { kind: 'reverse'; m: number }
  | { kind: 'two-segment'; m: number };

/**
 * Exponential audio law y = (a^x − 1)/(a − 1) with a = ((1 − m)/m)², so that y(0.5) = m.
 * Source: B. Holmes, "Modelling logarithmic potentiometer laws", 2017 (y = A·b^x − A, A = 1/(b − 1),
 * b = (1/y_m − 1)²). At m = 0.5 the base is 1 and the law degenerates to the straight line y = x,
 * which is its limit, so that case is returned as linear instead of dividing 0 by 0.
 */
function audio(m: number, x: number): number {
  const base = ((1 - m) / m) ** 2;
  if (Math.abs(base - 1) < 1e-12) return x;
  return (base ** x - 1) / (base - 1);
}

/** y(x) of a law; x outside 0–1 is clamped to the end stops. */
export function lawValue(law: TaperLaw, x: number): number {
  const r = x <= 0 ? 0 : x >= 1 ? 1 : x;
  switch (law.kind) {
    case 'linear':
      return r;
    case 'audio':
      return audio(law.m, r);
    case 'reverse':
      // Mirror image of the audio law (docs/computation.md §3): y = 1 − f_audio(1 − x).
      return 1 - audio(law.m, 1 - r);
    case 'two-segment':
      // Two straight tracks (0,0)–(0.5,m)–(1,1), as many carbon audio pots are made (docs/computation.md §3).
      return r <= 0.5 ? 2 * law.m * r : law.m + (1 - law.m) * 2 * (r - 0.5);
  }
}
