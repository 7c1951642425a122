// The least-squares path's own parts against closed forms worked in this file: weighted straight
// line fits (the normal equations of y = a + b·x with weights 1/σ², W. H. Press et al., Numerical
// Recipes, 3rd ed., §15.2, from memory), the inverse of a small symmetric matrix by cofactors, and
// the covariance estimate s²·(JᵀJ)⁻¹ with s² = SSR/(n − p) (the same reference). No simulator.
import { describe, expect, it } from 'vitest';
import { fitLeastSquares, invertSpd, weightedJacobian } from '@shared/analysis/least-squares';

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

/** Weighted straight line by the closed-form normal equations. */
function lineFit(x: number[], y: number[], s: number[]) {
  let S = 0;
  let Sx = 0;
  let Sy = 0;
  let Sxx = 0;
  let Sxy = 0;
  x.forEach((xi, i) => {
    const w = 1 / s[i]! ** 2;
    S += w;
    Sx += w * xi;
    Sy += w * y[i]!;
    Sxx += w * xi * xi;
    Sxy += w * xi * y[i]!;
  });
  const D = S * Sxx - Sx * Sx;
  const a = (Sxx * Sy - Sx * Sxy) / D;
  const b = (S * Sxy - Sx * Sy) / D;
  const chi2 = x.reduce((acc, xi, i) => acc + ((y[i]! - a - b * xi) / s[i]!) ** 2, 0);
  const s2 = chi2 / (x.length - 2);
  return { a, b, chi2, sa: Math.sqrt((s2 * Sxx) / D), sb: Math.sqrt((s2 * S) / D) };
}

const X = [0, 1, 2, 3, 4, 5, 6, 7];
// y = 1 + 2x with a fixed, made-up scatter.
const Y = X.map((x, i) => 1 + 2 * x + [0.3, -0.2, 0.1, -0.4, 0.25, 0.05, -0.15, 0.2][i]!);
const line = (p: number[]) => (i: number) => p[0]! + p[1]! * X[i]!;

describe('fitLeastSquares: weights, degrees of freedom and covariance', () => {
  it('unweighted: the line, SSR, dof, s² and standard errors of the closed form', () => {
    const ref = lineFit(
      X,
      Y,
      X.map(() => 1),
    );
    const r = fitLeastSquares({ observed: Y, model: line, initial: [0, 0] });
    expect(r.converged).toBe(true);
    expect(rel(r.params[0]!, ref.a)).toBeLessThan(1e-9);
    expect(rel(r.params[1]!, ref.b)).toBeLessThan(1e-9);
    expect(rel(r.ssr, ref.chi2)).toBeLessThan(1e-9);
    expect(r.dof).toBe(6);
    expect(rel(r.sigma2, ref.chi2 / 6)).toBeLessThan(1e-9);
    expect(rel(r.stderr[0]!, ref.sa)).toBeLessThan(1e-6);
    expect(rel(r.stderr[1]!, ref.sb)).toBeLessThan(1e-6);
    expect(rel(r.covariance![1]![1]!, ref.sb ** 2)).toBeLessThan(1e-6);
    expect(r.iterations).toBeGreaterThan(0);
    expect(r.rounds).toBeGreaterThan(0);
  });

  it('one σ for all points leaves the line and the standard errors alone and scales SSR by 1/σ²', () => {
    const ref = lineFit(
      X,
      Y,
      X.map(() => 1),
    );
    const r = fitLeastSquares({ observed: Y, model: line, initial: [0, 0], sigma: 0.5 });
    expect(rel(r.params[1]!, ref.b)).toBeLessThan(1e-9);
    expect(rel(r.ssr, ref.chi2 / 0.25)).toBeLessThan(1e-9);
    expect(rel(r.stderr[1]!, ref.sb)).toBeLessThan(1e-6);
  });

  it('σ per point: the weighted line; a missing σ counts as 1', () => {
    const s = [0.1, 0.2, 0.1, 1, 0.3, 0.1, 2, 0.5];
    const ref = lineFit(X, Y, s);
    const r = fitLeastSquares({ observed: Y, model: line, initial: [0, 0], sigma: s });
    expect(rel(r.params[0]!, ref.a)).toBeLessThan(1e-9);
    expect(rel(r.params[1]!, ref.b)).toBeLessThan(1e-9);
    expect(rel(r.ssr, ref.chi2)).toBeLessThan(1e-9);
    expect(rel(r.stderr[0]!, ref.sa)).toBeLessThan(1e-6);
    const short = fitLeastSquares({ observed: Y, model: line, initial: [0, 0], sigma: s.slice(0, 5) });
    const refShort = lineFit(X, Y, [...s.slice(0, 5), 1, 1, 1]);
    expect(rel(short.params[1]!, refShort.b)).toBeLessThan(1e-9);
  });

  it('as many parameters as points: an exact fit with no degrees of freedom, so no covariance', () => {
    const r = fitLeastSquares({ observed: [3, 7], model: (p) => (i) => p[0]! + p[1]! * i, initial: [0, 0] });
    expect(r.params[0]!).toBeCloseTo(3, 9);
    expect(r.params[1]!).toBeCloseTo(4, 9);
    expect(r.dof).toBe(0);
    expect(r.sigma2).toBeNaN();
    expect(r.covariance).toBeNull();
    expect(r.stderr.every((v) => Number.isNaN(v))).toBe(true);
    // Also when the points cannot be met (y = p² against −1): SSR > 0 with no degrees of freedom.
    const unmet = fitLeastSquares({ observed: [-1, -1], model: (p) => (i) => p[i]! ** 2, initial: [1, 1] });
    expect(unmet.ssr).toBeGreaterThan(1.9);
    expect(unmet.sigma2).toBeNaN();
  });

  it('a parameter with no effect makes JᵀJ singular: not converged, no covariance', () => {
    const r = fitLeastSquares({ observed: Y, model: (p) => (i) => p[0]! + p[1]! * X[i]! + 0 * p[2]!, initial: [0, 0, 1] });
    expect(r.converged).toBe(false);
    expect(r.covariance).toBeNull();
    expect(r.stderr.every((v) => Number.isNaN(v))).toBe(true);
    // The dead column is left out of the gradient test (its cosine would be 0/0).
    expect(r.gradientCosine).toBeLessThan(1e-6);
  });

  it('an upper bound below the free optimum holds the slope at the bound', () => {
    const r = fitLeastSquares({ observed: Y, model: line, initial: [0, 1], min: [-Infinity, -Infinity], max: [Infinity, 1.5] });
    expect(r.params[1]!).toBeCloseTo(1.5, 9);
    const free = lineFit(
      X,
      Y,
      X.map(() => 1),
    );
    expect(free.b).toBeGreaterThan(1.9);
  });
});

describe('fitLeastSquares: stationary starts, a lower bound and a model that is not finite', () => {
  it('started at the closed-form solution it is already stationary: converged with no iterations', () => {
    const ref = lineFit(
      X,
      Y,
      X.map(() => 1),
    );
    const initial = [ref.a, ref.b];
    const r = fitLeastSquares({ observed: Y, model: line, initial });
    expect(r.converged).toBe(true);
    expect(r.iterations).toBe(0);
    // The result is a copy: changing it leaves the caller's start alone.
    r.params[0] = 99;
    expect(initial).toEqual([ref.a, ref.b]);
    expect(r.gradientCosine).toBeLessThan(1e-9);
  });

  it('an exact fit has no residual, so its gradient cosine is 0 (not 0/0)', () => {
    const r = fitLeastSquares({ observed: [0, 0, 0], model: (p) => (i) => p[0]! * i, initial: [0] });
    expect(r.ssr).toBe(0);
    expect(r.gradientCosine).toBe(0);
    expect(r.converged).toBe(true);
  });

  it('a lower bound above the free optimum holds the slope at the bound', () => {
    const r = fitLeastSquares({ observed: Y, model: line, initial: [0, 3], min: [-Infinity, 2.5], max: [Infinity, Infinity] });
    expect(r.params[1]!).toBeCloseTo(2.5, 9);
    expect(
      lineFit(
        X,
        Y,
        X.map(() => 1),
      ).b,
    ).toBeLessThan(2.1);
  });

  it('fewer points than parameters: negative degrees of freedom give no s² and no covariance', () => {
    const r = fitLeastSquares({ observed: [5], model: (p) => () => p[0]! + p[1]!, initial: [0, 0] });
    expect(r.dof).toBe(-1);
    expect(r.sigma2).toBeNaN();
    expect(r.covariance).toBeNull();
  });

  it('a model that is not finite away from the start: a few heavier-damped retries, then it gives up well inside the budget', () => {
    const r = fitLeastSquares({
      observed: [1, 2, 3, 4],
      initial: [1, 2],
      model: (p) => (i) => (p[0] === 1 && p[1] === 2 ? p[0] + p[1] * i : NaN),
    });
    expect(r.converged).toBe(false);
    expect(r.params).toEqual([1, 2]);
    // SSR at the start: residuals 0, −1, −2, −3.
    expect(r.ssr).toBe(14);
    expect(r.iterations).toBeGreaterThan(0);
    expect(r.iterations).toBeLessThan(100);
  });
});

describe('invertSpd against the cofactor inverse', () => {
  it('a 3 × 3 symmetric positive-definite matrix, and one with diagonal entries 1e-4…1e8 apart', () => {
    const inv3 = (m: number[][]) => {
      const [[a, b, c], [d, e, f], [g, h, k]] = m as [[number, number, number], [number, number, number], [number, number, number]];
      const A = e * k - f * h;
      const B = -(d * k - f * g);
      const C = d * h - e * g;
      const det = a * A + b * B + c * C;
      return [
        [A / det, -(b * k - c * h) / det, (b * f - c * e) / det],
        [B / det, (a * k - c * g) / det, -(a * f - c * d) / det],
        [C / det, -(a * h - b * g) / det, (a * e - b * d) / det],
      ];
    };
    const m = [
      [4, 2, 0.5],
      [2, 5, 1],
      [0.5, 1, 3],
    ];
    const sc = [1e-2, 1, 1e4];
    const wide = m.map((row, i) => row.map((v, j) => v * sc[i]! * sc[j]!));
    for (const a of [m, wide]) {
      const got = invertSpd(a)!;
      const ref = inv3(a);
      for (let i = 0; i < 3; i++) for (let j = 0; j < 3; j++) expect(rel(got[i]![j]!, ref[i]![j]!)).toBeLessThan(1e-12);
    }
  });

  it('scales to unit diagonal first: a well-conditioned matrix with entries near 1e-10 is inverted', () => {
    const got = invertSpd([
      [2e-10, 1e-10],
      [1e-10, 2e-10],
    ])!;
    // Inverse of [[2, 1], [1, 2]]·1e-10 is [[2, −1], [−1, 2]]/3·1e10 (cofactors).
    expect(rel(got[0]![0]!, (2 / 3) * 1e10)).toBeLessThan(1e-12);
    expect(rel(got[0]![1]!, (-1 / 3) * 1e10)).toBeLessThan(1e-12);
  });

  it('null for a zero or negative diagonal entry and for a singular or indefinite matrix', () => {
    expect(invertSpd([[0]])).toBeNull();
    expect(
      invertSpd([
        [1, 0],
        [0, -1],
      ]),
    ).toBeNull();
    expect(
      invertSpd([
        [1, 1],
        [1, 1],
      ]),
    ).toBeNull();
    expect(
      invertSpd([
        [1, 2],
        [2, 1],
      ]),
    ).toBeNull();
  });
});

describe('weightedJacobian', () => {
  const problem = {
    observed: [1, 2, 3],
    sigma: [1, 2, 4],
    model: (p: number[]) => (i: number) => p[0]! * Math.exp(p[1]! * i),
    initial: [1, 0],
  };
  // ∂/∂a = e^(b·i), ∂/∂b = a·i·e^(b·i), each divided by σ_i.
  const exact = (p: number[]) =>
    [0, 1, 2].map((i) => [Math.exp(p[1]! * i) / problem.sigma[i]!, (p[0]! * i * Math.exp(p[1]! * i)) / problem.sigma[i]!]);

  it('central differences (also at a zero parameter) and the analytic rows, divided by σ', () => {
    for (const p of [
      [2, 0.3],
      [2, 0],
    ]) {
      const numeric = weightedJacobian(problem, p);
      const ref = exact(p);
      for (let i = 0; i < 3; i++)
        for (let k = 0; k < 2; k++) expect(Math.abs(numeric[i]![k]! - ref[i]![k]!)).toBeLessThan(1e-8 * (1 + Math.abs(ref[i]![k]!)));
      const analytic = weightedJacobian(
        { ...problem, jacobian: (q: number[]) => (i: number) => [Math.exp(q[1]! * i), q[0]! * i * Math.exp(q[1]! * i)] },
        p,
      );
      for (let i = 0; i < 3; i++)
        for (let k = 0; k < 2; k++) expect(rel(analytic[i]![k]! + 1e-300, ref[i]![k]! + 1e-300)).toBeLessThan(1e-14);
    }
  });
});
