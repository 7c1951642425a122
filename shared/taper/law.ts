// Potentiometer taper laws: the one definition used by the taper fit (shared/analysis/taper.ts),
// the harness engine (shared/circuit), the comparison, the request schemas and the screens.
//
// A law gives y, the fraction of the track resistance between lug 1 (the counter-clockwise end)
// and the wiper, at the rotation fraction x (0–1). Every law has one parameter, m = y(0.5): the
// share of the track at mid-rotation, the "percent at mid-rotation" figure people read off a pot.
// Linear has m = 0.5 fixed.
//  - linear: y = x;
//  - audio (exponential): y = (a^x − 1)/(a − 1), a = ((1 − m)/m)², m < 0.5
//    (B. Holmes, "Modelling logarithmic potentiometer laws", 2017: y = a'·b^x − a', a' = 1/(b − 1),
//    b = (1/y_m − 1)², which gives y(0.5) = y_m);
//  - reverse audio: the same formula with m > 0.5 (Holmes' "anti-log" case, y_m ≈ 0.85). It is the
//    audio law turned end for end: with f the audio law of mid value 1 − m, 1 − f(1 − x) =
//    (a^x − 1)/(a − 1) with the same a = ((1 − m)/m)² (standard algebra, derived here:
//    1 − (a^(1−x) − 1)/(a − 1) = (a − a^(1−x))/(a − 1), and dividing through by a gives the
//    formula in b = 1/a, whose m is 1 − (1 − m) = m);
//  - two-segment: two straight tracks meeting at (0.5, m), as many carbon audio tracks are made
//    — common practice (no published source).

/** Every law, in the order the fit lists its candidates and the screens list their choices. */
export const TAPER_LAWS = ['linear', 'audio', 'reverse', 'two-segment'] as const;
export type TaperLawKind = (typeof TAPER_LAWS)[number];

/** The laws a tolerance profile may expect: one law, or 'audio-any' (audio or two-segment). */
export const PROFILE_LAWS = [...TAPER_LAWS, 'audio-any'] as const;
export type ProfileLaw = (typeof PROFILE_LAWS)[number];

/** A law with its parameter, as the harness engine and saved designs hold it. */
export type TaperLaw =
  { kind: 'linear' } | { kind: 'audio'; m: number } | { kind: 'reverse'; m: number } | { kind: 'two-segment'; m: number };

export const TAPER_LAW_LABEL: Record<TaperLawKind, string> = {
  linear: 'Linear',
  audio: 'Audio',
  reverse: 'Reverse audio',
  'two-segment': 'Two-segment',
};

/**
 * The mid-rotation figure a law starts at when chosen without one: 15 % for audio and
 * two-segment, 85 % for reverse (Holmes 2017: 0.15 "quite a good approximation of a log pot",
 * about 0.85 for an anti-log pot).
 */
export const TYPICAL_MID: Record<TaperLawKind, number> = { linear: 0.5, audio: 0.15, reverse: 0.85, 'two-segment': 0.15 };

/** The law of a kind with mid-rotation value m (m is ignored for linear). */
export function taperLaw(kind: TaperLawKind, m: number): TaperLaw {
  return kind === 'linear' ? { kind } : { kind, m };
}

/** y(0.5) of a law. */
export function lawMid(law: TaperLaw): number {
  return law.kind === 'linear' ? 0.5 : law.m;
}

/**
 * The curve y(x) of a law with mid-rotation value m, for x in 0–1 (not clamped). Built once for
 * many x: the fit evaluates it at every reading for every trial m. expm1 keeps the exponential law
 * exact near m = 0.5, where its base tends to 1 and it becomes the straight line y = x (its limit,
 * returned as such instead of dividing 0 by 0).
 */
export function lawCurve(kind: TaperLawKind, m: number): (x: number) => number {
  switch (kind) {
    case 'linear':
      return (x) => x;
    case 'audio':
    case 'reverse': {
      const la = 2 * Math.log((1 - m) / m);
      if (Math.abs(la) < 1e-12) return (x) => x;
      const den = Math.expm1(la);
      return (x) => Math.expm1(x * la) / den;
    }
    case 'two-segment':
      return (x) => (x <= 0.5 ? 2 * m * x : m + 2 * (1 - m) * (x - 0.5));
  }
}

/** Value of a law with mid-rotation value m at rotation fraction x (0–1), as a fraction of the track. */
export function taperLawValue(kind: TaperLawKind, m: number, x: number): number {
  return lawCurve(kind, m)(x);
}

/** y(x) of a law; x outside 0–1 is clamped to the end stops. */
export function lawValue(law: TaperLaw, x: number): number {
  const r = x <= 0 ? 0 : x >= 1 ? 1 : x;
  return taperLawValue(law.kind, lawMid(law), r);
}
