// Brent's bounded minimisation (shared/analysis/taper.ts `brentMinimise`, used by the taper fit for the
// law's m): R. P. Brent, "Algorithms for Minimization without Derivatives" (1973), ch. 5, procedure
// localmin. Its properties: the minimum found to within about 2·(tol/3) of the true one; successive
// parabolic interpolation, which is exact for a parabola, so a smooth function needs far fewer
// evaluations than golden-section search alone (about log(1e-7)/log(0.618) ≈ 34 for tol 1e-7 on [0, 1]);
// golden-section steps where a parabola would not help (a kink), so it still converges there.
import { describe, expect, it } from 'vitest';
import { brentMinimise } from '@shared/analysis/taper';

/** f with a count of its evaluations. */
function counted(f: (t: number) => number) {
  const c = { n: 0, f: (t: number) => (c.n++, f(t)) };
  return c;
}

describe('brentMinimise', () => {
  it('a parabola: its vertex, exactly enough, in a handful of evaluations', () => {
    for (const [t0, lo, hi] of [
      [0.3, 0, 1],
      [0.77, 0.1, 0.9],
      [1.6, 1, 3],
    ] as const) {
      const c = counted((t) => 2 * (t - t0) ** 2 + 0.5);
      const r = brentMinimise(c.f, lo, hi, 1e-7);
      expect(Math.abs(r.t - t0)).toBeLessThan(1e-7);
      expect(r.value).toBe(2 * (r.t - t0) ** 2 + 0.5);
      // Three points for the parabola, its vertex, then the steps of about tol on either side that confirm the stop.
      expect(c.n).toBeLessThanOrEqual(7);
    }
  });

  it('a smooth function that is not a parabola: exp(t) − 2t, minimum at ln 2, well under the golden-section count', () => {
    const c = counted((t) => Math.exp(t) - 2 * t);
    const r = brentMinimise(c.f, 0, 2, 1e-8);
    expect(Math.abs(r.t - Math.LN2)).toBeLessThan(1e-8);
    expect(r.value).toBeCloseTo(2 - 2 * Math.LN2, 14);
    expect(c.n).toBeLessThanOrEqual(13);
  });

  it('a kink (|t − 0.7|): golden-section steps still close in on it to the tolerance', () => {
    // Golden-section search alone needs log(tol)/log(0.618) evaluations: 19 for 1e-4, 34 for 1e-7.
    for (const [tol, golden] of [
      [1e-4, 19],
      [1e-7, 34],
    ] as const) {
      const c = counted((t) => Math.abs(t - 0.7));
      const r = brentMinimise(c.f, 0, 1, tol);
      expect(Math.abs(r.t - 0.7)).toBeLessThan(tol);
      expect(r.value).toBe(Math.abs(r.t - 0.7));
      expect(c.n).toBeLessThanOrEqual(golden);
    }
  });

  it('a minimum at an end of the interval: the end, to the tolerance', () => {
    const up = brentMinimise((t) => t * t, 0.2, 0.9, 1e-7);
    expect(up.t - 0.2).toBeGreaterThanOrEqual(0);
    expect(up.t - 0.2).toBeLessThan(2e-7);
    const down = brentMinimise((t) => -t, 0.2, 0.9, 1e-7);
    expect(0.9 - down.t).toBeGreaterThanOrEqual(0);
    expect(0.9 - down.t).toBeLessThan(2e-7);
  });

  it('an asymmetric valley with a flat side: (t − 0.25)⁴ + max(0, t − 0.25)', () => {
    const c = counted((t) => (t - 0.25) ** 4 + Math.max(0, t - 0.25));
    const r = brentMinimise(c.f, 0, 1, 1e-6);
    // Flat to the fourth order on the left: the level tells little, so only to the fourth root of it.
    expect(Math.abs(r.t - 0.25)).toBeLessThan(0.05);
    expect(r.value).toBeLessThan(1e-6);
  });
});
