// Upper points of the F distribution, for the taper fit's linear-versus-curved test.
//
// P(F(d1, d2) ≤ f) = I_x(d1/2, d2/2) with x = d1·f/(d1·f + d2), I the regularised incomplete beta
// function (Abramowitz & Stegun, "Handbook of Mathematical Functions", 26.6.2). I is evaluated by
// its continued fraction (A&S 26.5.8) with the modified Lentz method (Press et al., "Numerical
// Recipes", 3rd ed., §6.4 and §5.2), ln Γ by the Lanczos approximation (g = 7, n = 9; Lanczos 1964),
// and the quantile by bisection on ln f. Written here because the statistics packages that have it
// build polynomial code with `new Function`, which the page's content security policy forbids. The
// tests check it against published F tables and against @stdlib's F quantile (a reference library).

const LANCZOS = [
  0.99999999999980993, 676.5203681218851, -1259.1392167224028, 771.32342877765313, -176.61502916214059, 12.507343278686905,
  -0.13857109526572012, 9.9843695780195716e-6, 1.5056327351493116e-7,
];

/** ln Γ(z) for z > 0. */
export function lnGamma(z: number): number {
  if (z < 0.5) return Math.log(Math.PI / Math.sin(Math.PI * z)) - lnGamma(1 - z);
  const x = z - 1;
  let a = LANCZOS[0]!;
  const t = x + 7.5;
  for (let i = 1; i < 9; i++) a += LANCZOS[i]! / (x + i);
  return 0.5 * Math.log(2 * Math.PI) + (x + 0.5) * Math.log(t) - t + Math.log(a);
}

/** Continued fraction of the incomplete beta function (modified Lentz). */
function betaContinuedFraction(x: number, a: number, b: number): number {
  const tiny = 1e-300;
  let c = 1;
  let d = 1 - ((a + b) * x) / (a + 1);
  if (Math.abs(d) < tiny) d = tiny;
  d = 1 / d;
  let h = d;
  for (let m = 1; m <= 1000; m++) {
    const m2 = 2 * m;
    let aa = (m * (b - m) * x) / ((a + m2 - 1) * (a + m2));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    h *= d * c;
    aa = (-(a + m) * (a + b + m) * x) / ((a + m2) * (a + m2 + 1));
    d = 1 + aa * d;
    if (Math.abs(d) < tiny) d = tiny;
    c = 1 + aa / c;
    if (Math.abs(c) < tiny) c = tiny;
    d = 1 / d;
    const del = d * c;
    h *= del;
    if (Math.abs(del - 1) < 1e-16) break;
  }
  return h;
}

/** The regularised incomplete beta function I_x(a, b), 0 ≤ x ≤ 1. */
export function regularizedBeta(x: number, a: number, b: number): number {
  if (x <= 0) return 0;
  if (x >= 1) return 1;
  const front = Math.exp(lnGamma(a + b) - lnGamma(a) - lnGamma(b) + a * Math.log(x) + b * Math.log1p(-x));
  return x < (a + 1) / (a + b + 2) ? (front * betaContinuedFraction(x, a, b)) / a : 1 - (front * betaContinuedFraction(1 - x, b, a)) / b;
}

/** P(F(d1, d2) ≤ f). */
export function fCdf(f: number, d1: number, d2: number): number {
  if (!(f > 0)) return 0;
  return regularizedBeta((d1 * f) / (d1 * f + d2), d1 / 2, d2 / 2);
}

/** The p-quantile of F(d1, d2): the f with P(F ≤ f) = p, 0 < p < 1. */
export function fQuantile(p: number, d1: number, d2: number): number {
  if (!(p > 0 && p < 1) || !(d1 > 0) || !(d2 > 0)) throw new RangeError('fQuantile needs 0 < p < 1 and positive degrees of freedom.');
  let lo = -60;
  let hi = 60;
  for (let i = 0; i < 200 && hi - lo > 1e-13; i++) {
    const mid = (lo + hi) / 2;
    if (fCdf(Math.exp(mid), d1, d2) < p) lo = mid;
    else hi = mid;
  }
  return Math.exp((lo + hi) / 2);
}
