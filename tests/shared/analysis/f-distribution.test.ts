// The F distribution's pieces against closed forms that need no table: ln Γ at integers and at ½
// (Γ(n) = (n − 1)!, Γ(½) = √π), Legendre's duplication formula Γ(z)Γ(z + ½) = 2^(1−2z)·√π·Γ(2z)
// (Abramowitz & Stegun 6.1.18), which exercises the reflection branch below ½; the incomplete beta
// function's special cases I_x(a, 1) = x^a and I_x(1, b) = 1 − (1 − x)^b (from its defining
// integral, A&S 26.5.1), on both sides of the continued fraction's switch; and F(2, 2), whose
// distribution function is f/(1 + f), so its p-quantile is p/(1 − p). taper.test.ts checks the
// quantiles against a published F table and a reference library.
import { describe, expect, it } from 'vitest';
import { fCdf, fQuantile, lnGamma, regularizedBeta } from '@shared/analysis/f-distribution';

describe('lnGamma', () => {
  it('ln Γ(n) = ln (n − 1)! and ln Γ(½) = ln √π', () => {
    let factorial = 1;
    for (let n = 1; n <= 20; n++) {
      if (n > 1) factorial *= n - 1;
      expect(lnGamma(n), `n = ${n}`).toBeCloseTo(Math.log(factorial), 12);
    }
    expect(lnGamma(0.5)).toBeCloseTo(0.5 * Math.log(Math.PI), 13);
  });

  it('the duplication formula holds for z below ½, where the reflection branch is used', () => {
    for (const z of [0.05, 0.1, 0.2, 0.3, 0.4, 0.45]) {
      const left = lnGamma(z) + lnGamma(z + 0.5);
      const right = (1 - 2 * z) * Math.LN2 + 0.5 * Math.log(Math.PI) + lnGamma(2 * z);
      expect(left, `z = ${z}`).toBeCloseTo(right, 11);
    }
    // ln Γ(z) → ln(1/z) as z → 0 (Γ(z) ≈ 1/z − γ): a small z is on the reflection branch.
    expect(lnGamma(1e-8)).toBeCloseTo(Math.log(1e8), 6);
  });
});

describe('regularizedBeta', () => {
  it('I_x(a, 1) = x^a and I_x(1, b) = 1 − (1 − x)^b on both sides of the switch at (a + 1)/(a + b + 2)', () => {
    for (const x of [0.01, 0.2, 0.45, 0.55, 0.8, 0.99]) {
      for (const a of [0.5, 1, 2.5, 7]) {
        expect(regularizedBeta(x, a, 1), `x ${x}, a ${a}`).toBeCloseTo(x ** a, 12);
        expect(regularizedBeta(x, 1, a), `x ${x}, b ${a}`).toBeCloseTo(1 - (1 - x) ** a, 12);
      }
    }
  });

  it('is 0 at and below x = 0 and 1 at and above x = 1', () => {
    expect(regularizedBeta(0, 2, 3)).toBe(0);
    expect(regularizedBeta(-0.5, 2, 3)).toBe(0);
    expect(regularizedBeta(1, 2, 3)).toBe(1);
    expect(regularizedBeta(1.5, 2, 3)).toBe(1);
  });

  it('large parameters: I_½(a, a) = ½ by symmetry, and I_x(a, b) = 1 − I_(1−x)(b, a)', () => {
    for (const a of [5, 50, 500]) expect(regularizedBeta(0.5, a, a)).toBeCloseTo(0.5, 12);
    expect(regularizedBeta(0.3, 40, 60) + regularizedBeta(0.7, 60, 40)).toBeCloseTo(1, 12);
  });
});

describe('fCdf and fQuantile', () => {
  it('F(2, 2): P(F ≤ f) = f/(1 + f); nothing at or below 0', () => {
    for (const f of [0.01, 0.5, 1, 3, 99]) expect(fCdf(f, 2, 2)).toBeCloseTo(f / (1 + f), 13);
    expect(fCdf(0, 2, 2)).toBe(0);
    expect(fCdf(-1, 2, 2)).toBe(0);
    expect(fCdf(Number.NaN, 2, 2)).toBe(0);
  });

  it('F(2, 2): the p-quantile is p/(1 − p), to 1e-11 relative (1e-9 at p = 1 − 1e-6)', () => {
    for (const p of [1e-6, 0.01, 0.5, 0.9, 0.999]) {
      expect(fQuantile(p, 2, 2) / (p / (1 - p)), `p ${p}`).toBeCloseTo(1, 11);
    }
    // Near p = 1 a rounding of p by 1e-16 moves p/(1 − p) by 1e-10 relative: that is the limit there.
    expect(fQuantile(1 - 1e-6, 2, 2) / ((1 - 1e-6) / 1e-6)).toBeCloseTo(1, 9);
  });

  it.each([
    [0, 2, 2],
    [1, 2, 2],
    [-0.1, 2, 2],
    [1.1, 2, 2],
    [Number.NaN, 2, 2],
    [0.5, 0, 2],
    [0.5, 2, 0],
    [0.5, -1, 2],
    [0.5, 2, Number.NaN],
  ])('fQuantile(%d, %d, %d) is refused', (p, d1, d2) => {
    expect(() => fQuantile(p, d1, d2)).toThrow('fQuantile needs 0 < p < 1 and positive degrees of freedom.');
  });
});
