// One non-linear least-squares path for the whole engine (coil fit, NIST StRD checks).
//
// The iterations are done by the npm package ml-levenberg-marquardt. Used alone it has three
// traits that matter here (read in its source, v5.1.0):
//  - its finite-difference step (`gradientDifference`) is absolute, and its damping is a plain
//    λ·I, so both depend on the scale of the parameters (raw R, L, C span 1e-10…1e4 and do not move);
//  - it stops only at `maxIterations` or when the sum of squares drops below an absolute
//    `errorTolerance`, so its iteration count says nothing about convergence;
//  - it applies every step, even one that raises the sum of squares, and only remembers the best
//    point seen.
// So the package is driven in short rounds. Before each round the parameters are rescaled to ±1
// (scale = |current value|), which makes the finite-difference step relative and the damping
// scale-free (initial damping τ·max diag(JᵀJ)); each round continues from the best point of the
// last, and once the parameters move by under 1 % a round is two nearly undamped iterations. Between rounds this file does
// its own convergence test (relative change of the sum of squares and of the parameters, and the
// angle between the residual vector and the Jacobian's columns, as in MINPACK's gtol test: Moré,
// Garbow, Hillstrom, "User Guide for MINPACK-1", ANL-80-74, 1980).
// Covariance: σ²·(JᵀJ)⁻¹ with σ² = SSR/(n − p), the usual linearised estimate (the NIST StRD
// certified standard deviations follow this estimate; tests/shared/analysis/nist-nonlinear.test.ts
// compares them).
import { levenbergMarquardt } from 'ml-levenberg-marquardt';

export interface LeastSquaresProblem {
  /** Observed values y_i, i = 0 … n − 1. */
  observed: ArrayLike<number>;
  /**
   * The model: given the parameters, returns a function giving the predicted value of
   * observation i. It is called once per evaluation of all points, so it may precompute.
   */
  model: (params: number[]) => (i: number) => number;
  /**
   * Optional analytic Jacobian: for observation i, ∂model_i/∂params_k for every k. The returned row
   * is read at once, before the next call, so it may be a reused buffer.
   */
  jacobian?: (params: number[]) => (i: number) => number[];
  /** Starting parameters. */
  initial: number[];
  /** Standard uncertainty of each observation (residuals are divided by it). Default 1. */
  sigma?: number | ArrayLike<number>;
  /** Bounds on the parameters (optional, each a full array). */
  min?: number[];
  max?: number[];
  /** Budget of Levenberg–Marquardt iterations over all rounds. Default 2000. */
  maxIterations?: number;
  /** Iterations per round of the package between convergence tests (2 once nearly settled). Default 8. */
  iterationsPerRound?: number;
  /** Relative change of the sum of squares over a round below which it counts as settled. Default 1e-12. */
  ssrTolerance?: number;
  /** Relative change of every parameter over a round below which it counts as settled. Default 1e-8. */
  paramTolerance?: number;
  /** Cosine between residuals and each Jacobian column below which the point is stationary. Default 1e-9. */
  gradientTolerance?: number;
  /** Relative step of the central differences when no Jacobian is given. Default 1e-6. */
  relativeStep?: number;
  /** τ: each round starts with damping τ·max diag(JᵀJ) on the rescaled parameters. Default 1e-3. */
  dampingFactor?: number;
}

export interface LeastSquaresResult {
  params: number[];
  /** Weighted residual sum of squares Σ((y_i − f_i)/σ_i)². */
  ssr: number;
  /** Degrees of freedom n − p. */
  dof: number;
  /** SSR/(n − p) (NaN when n ≤ p). */
  sigma2: number;
  /** σ²·(JᵀJ)⁻¹ at the solution, or null when JᵀJ is singular. */
  covariance: number[][] | null;
  /** √diag(covariance); NaN where unavailable. */
  stderr: number[];
  /** Levenberg–Marquardt iterations done by the package over all rounds. */
  iterations: number;
  rounds: number;
  /** Own convergence test passed (not merely stopped by the budget). */
  converged: boolean;
  /** Largest cosine between the residual vector and a Jacobian column at the solution. */
  gradientCosine: number;
}

function sigmaAt(sigma: LeastSquaresProblem['sigma'], i: number): number {
  if (sigma === undefined) return 1;
  if (typeof sigma === 'number') return sigma;
  return sigma[i] ?? 1;
}

/** 1/σ_i for every observation. */
function inverseSigmas(p: LeastSquaresProblem): Float64Array {
  const n = p.observed.length;
  const w = new Float64Array(n);
  for (let i = 0; i < n; i++) w[i] = 1 / sigmaAt(p.sigma, i);
  return w;
}

/** Weighted residuals (y_i − f_i)/σ_i. */
function weightedResiduals(p: LeastSquaresProblem, params: number[], w: Float64Array): Float64Array {
  const f = p.model(params);
  const n = p.observed.length;
  const r = new Float64Array(n);
  for (let i = 0; i < n; i++) r[i] = ((p.observed[i] as number) - f(i)) * (w[i] as number);
  return r;
}

function sumSquares(r: Float64Array): number {
  let s = 0;
  for (let i = 0; i < r.length; i++) s += (r[i] as number) ** 2;
  return s;
}

/** Weighted Jacobian rows J_ik = ∂f_i/∂p_k / σ_i (analytic, or central differences). */
export function weightedJacobian(p: LeastSquaresProblem, params: number[], w: Float64Array = inverseSigmas(p)): number[][] {
  const n = p.observed.length;
  const np = params.length;
  const rows: number[][] = new Array(n);
  if (p.jacobian) {
    const g = p.jacobian(params);
    for (let i = 0; i < n; i++) {
      const src = g(i);
      const wi = w[i] as number;
      const row = new Array<number>(np);
      for (let k = 0; k < np; k++) row[k] = (src[k] as number) * wi;
      rows[i] = row;
    }
    return rows;
  }
  for (let i = 0; i < n; i++) rows[i] = new Array<number>(np).fill(0);
  const rel = p.relativeStep ?? 1e-6;
  for (let k = 0; k < np; k++) {
    const pk = params[k] as number;
    const h = rel * (pk !== 0 ? Math.abs(pk) : 1);
    const up = params.slice();
    const dn = params.slice();
    up[k] = pk + h;
    dn[k] = pk - h;
    const fu = p.model(up);
    const fd = p.model(dn);
    for (let i = 0; i < n; i++) {
      (rows[i] as number[])[k] = ((fu(i) - fd(i)) / (2 * h)) * (w[i] as number);
    }
  }
  return rows;
}

/**
 * Inverse of a small symmetric positive-definite matrix via Cholesky, after scaling it to unit
 * diagonal (the NIST problems have JᵀJ with diagonal entries 1e-2…1e10 apart). Null if singular.
 */
export function invertSpd(a: number[][]): number[][] | null {
  const n = a.length;
  const d = a.map((row, i) => {
    const v = row[i] as number;
    return v > 0 ? 1 / Math.sqrt(v) : NaN;
  });
  if (d.some((v) => !Number.isFinite(v))) return null;
  const s = a.map((row, i) => row.map((v, j) => v * (d[i] as number) * (d[j] as number)));
  // Cholesky s = L·Lᵀ.
  const l: number[][] = s.map(() => new Array<number>(n).fill(0));
  for (let j = 0; j < n; j++) {
    let sum = (s[j] as number[])[j] as number;
    for (let k = 0; k < j; k++) sum -= ((l[j] as number[])[k] as number) ** 2;
    if (!(sum > 1e-15)) return null;
    const ljj = Math.sqrt(sum);
    (l[j] as number[])[j] = ljj;
    for (let i = j + 1; i < n; i++) {
      let t = (s[i] as number[])[j] as number;
      for (let k = 0; k < j; k++) t -= ((l[i] as number[])[k] as number) * ((l[j] as number[])[k] as number);
      (l[i] as number[])[j] = t / ljj;
    }
  }
  // Inverse of L (lower triangular), then s⁻¹ = L⁻ᵀ·L⁻¹.
  const li: number[][] = s.map(() => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) {
    (li[i] as number[])[i] = 1 / ((l[i] as number[])[i] as number);
    for (let j = 0; j < i; j++) {
      let t = 0;
      for (let k = j; k < i; k++) t -= ((l[i] as number[])[k] as number) * ((li[k] as number[])[j] as number);
      (li[i] as number[])[j] = t / ((l[i] as number[])[i] as number);
    }
  }
  const inv: number[][] = s.map(() => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let t = 0;
      for (let k = i; k < n; k++) t += ((li[k] as number[])[i] as number) * ((li[k] as number[])[j] as number);
      const v = t * (d[i] as number) * (d[j] as number);
      (inv[i] as number[])[j] = v;
      (inv[j] as number[])[i] = v;
    }
  }
  return inv;
}

function normalMatrix(rows: number[][], np: number): number[][] {
  const a: number[][] = [];
  for (let r = 0; r < np; r++) a.push(new Array<number>(np).fill(0));
  for (const row of rows) {
    for (let r = 0; r < np; r++) {
      const vr = row[r] as number;
      const ar = a[r] as number[];
      for (let c = 0; c <= r; c++) ar[c] = (ar[c] as number) + vr * (row[c] as number);
    }
  }
  for (let r = 0; r < np; r++) for (let c = r + 1; c < np; c++) (a[r] as number[])[c] = (a[c] as number[])[r] as number;
  return a;
}

/** Largest |J_kᵀ r| / (‖J_k‖·‖r‖) over the columns k: zero at a stationary point. */
function gradientCosine(r: Float64Array, rows: number[][], np: number): number {
  const dot = new Array<number>(np).fill(0);
  const col = new Array<number>(np).fill(0);
  let rr = 0;
  for (let i = 0; i < r.length; i++) {
    const ri = r[i] as number;
    const row = rows[i] as number[];
    rr += ri * ri;
    for (let k = 0; k < np; k++) {
      const j = row[k] as number;
      dot[k] = (dot[k] as number) + j * ri;
      col[k] = (col[k] as number) + j * j;
    }
  }
  if (rr === 0) return 0;
  let worst = 0;
  for (let k = 0; k < np; k++) {
    const c = col[k] as number;
    if (c === 0) continue;
    worst = Math.max(worst, Math.abs(dot[k] as number) / Math.sqrt(c * rr));
  }
  return worst;
}

const STALL_GRADIENT = 1e-6;
// Damping factor of a short confirming round: nearly a plain Gauss–Newton step, which from a
// converged point cannot lower the sum of squares, and from an unconverged one (an ill-conditioned
// problem crawling under heavy damping, e.g. NIST Thurber) still makes visible progress.
const CONFIRM_TAU = 1e-9;

export function fitLeastSquares(problem: LeastSquaresProblem): LeastSquaresResult {
  const n = problem.observed.length;
  const np = problem.initial.length;
  const budget = problem.maxIterations ?? 2000;
  const perRound = problem.iterationsPerRound ?? 8;
  const ssrTol = problem.ssrTolerance ?? 1e-12;
  const parTol = problem.paramTolerance ?? 1e-8;
  const gradTol = problem.gradientTolerance ?? 1e-9;
  const relStep = problem.relativeStep ?? 1e-6;
  let tau = problem.dampingFactor ?? 1e-3;
  const xs = Array.from({ length: n }, (_, i) => i);
  // Weights are applied here (y_i/σ_i against f_i/σ_i) rather than through the package's `weights`
  // option, which in v5.1.0 scales the sum of squares by w² but the normal equations by 1/w².
  const inv = inverseSigmas(problem);
  const ys = Array.from({ length: n }, (_, i) => (problem.observed[i] as number) * (inv[i] as number));
  // Below this the sum of squares is rounding noise (noise-free data), where relative changes of
  // it and the gradient angle mean nothing; then only the parameter test decides.
  const ssrFloor = 1e-24 * ys.reduce((a, y) => a + y * y, 0) + Number.MIN_VALUE;

  let params = problem.initial.slice();
  let residuals = weightedResiduals(problem, params, inv);
  let ssr = sumSquares(residuals);
  let rows = weightedJacobian(problem, params, inv);
  let cosine = gradientCosine(residuals, rows, np);
  let iterations = 0;
  let rounds = 0;
  let converged = false;
  let failures = 0;
  // Once a round has moved the parameters by less than 1 % (relative), the rest is the quadratic end
  // game: the next rounds are short (the package cannot stop early by itself) and start nearly
  // undamped (CONFIRM_TAU).
  let roundLength = perRound;

  while (iterations < budget && Number.isFinite(ssr)) {
    if (cosine <= gradTol && ssr > ssrFloor) {
      converged = true;
      break;
    }
    const scale = params.map((v) => (v !== 0 ? Math.abs(v) : 1));
    const toRaw = (q: number[]) => q.map((v, k) => v * (scale[k] as number));
    // Initial damping τ·max diag(JᵀJ) on the rescaled parameters (Madsen, Nielsen, Tingleff,
    // "Methods for non-linear least squares problems", 2nd ed., 2004, §3.2), since the package's
    // damping is absolute.
    let maxDiag = 0;
    for (let k = 0; k < np; k++) {
      let d = 0;
      for (const row of rows) d += ((row[k] as number) * (scale[k] as number)) ** 2;
      maxDiag = Math.max(maxDiag, d);
    }
    const jac = problem.jacobian;
    let result;
    try {
      result = levenbergMarquardt(
        { x: xs, y: ys },
        (q) => {
          const f = problem.model(toRaw(q));
          return (i: number) => f(i) * (inv[i] as number);
        },
        {
          initialValues: params.map((v, k) => v / (scale[k] as number)),
          damping: Math.min(Math.max((roundLength < perRound ? CONFIRM_TAU : tau) * maxDiag, 1e-7), 1e7),
          gradientDifference: relStep,
          centralDifference: true,
          // 0: never stop on an absolute threshold; rounds are short and tested here instead.
          errorTolerance: 0,
          maxIterations: Math.min(roundLength, budget - iterations),
          ...(jac
            ? {
                jacobianFunction: (q: number[]) => {
                  const g = jac(toRaw(q));
                  // One buffer for all points: the package copies each row into its matrix at once,
                  // and a fresh array per point made this the fit's largest cost (garbage collection).
                  const buf = new Array<number>(np).fill(0);
                  return (i: number) => {
                    const row = g(i);
                    const w = inv[i] as number;
                    for (let k = 0; k < np; k++) buf[k] = (row[k] as number) * (scale[k] as number) * w;
                    return buf;
                  };
                },
              }
            : {}),
          ...(problem.min ? { minValues: problem.min.map((v, k) => v / (scale[k] as number)) } : {}),
          ...(problem.max ? { maxValues: problem.max.map((v, k) => v / (scale[k] as number)) } : {}),
        },
      );
    } catch {
      // A step reached a point where the model is not finite (the package then fails in its
      // Cholesky check). Retry the round from the same point with heavier damping.
      if (++failures > 3) break;
      tau *= 1e3;
      iterations += roundLength;
      roundLength = perRound;
      continue;
    }
    iterations += result.iterations;
    rounds++;
    const next = toRaw(result.parameterValues);
    const nextResiduals = weightedResiduals(problem, next, inv);
    const nextSsr = sumSquares(nextResiduals);
    if (!(nextSsr < ssr)) {
      if (roundLength < perRound && !(ssr <= ssrFloor || cosine <= STALL_GRADIENT)) {
        // A short confirming round found nothing better far from a stationary point; that may be
        // only a rejected first step, so give it a full round before judging.
        roundLength = perRound;
        continue;
      }
      // A round found nothing better than where it began: the sum of squares cannot be lowered at
      // double precision (with well-scaled columns a Gauss–Newton step would lower it by about
      // cos²·SSR, under 1e-12 of it for cos ≤ 1e-6). Accept if the point is that nearly
      // stationary, or at the rounding floor.
      converged = ssr <= ssrFloor || cosine <= STALL_GRADIENT;
      break;
    }
    const dSsr = (ssr - nextSsr) / nextSsr;
    let dPar = 0;
    for (let k = 0; k < np; k++) {
      const a = params[k] as number;
      const b = next[k] as number;
      dPar = Math.max(dPar, Math.abs(b - a) / Math.max(Math.abs(a), Math.abs(b), Number.MIN_VALUE));
    }
    params = next;
    ssr = nextSsr;
    residuals = nextResiduals;
    rows = weightedJacobian(problem, params, inv);
    cosine = gradientCosine(residuals, rows, np);
    roundLength = dPar < 1e-2 ? Math.min(2, perRound) : perRound;
    const ssrSettled = dSsr <= ssrTol || ssr <= ssrFloor;
    // Small changes alone are not enough: a heavily damped round also moves little. So they count
    // only together with a (nearly) stationary point, or at the rounding floor.
    if (dPar <= parTol && ssrSettled && (ssr <= ssrFloor || cosine <= gradTol * 10)) {
      converged = true;
      break;
    }
  }

  const dof = n - np;
  const sigma2 = dof > 0 ? ssr / dof : Number.NaN;
  const unscaled = invertSpd(normalMatrix(rows, np));
  // A singular JᵀJ (a parameter with no effect, e.g. a saturated exponential) is not a converged fit.
  if (!unscaled) converged = false;
  const covariance = unscaled && dof > 0 ? unscaled.map((row) => row.map((v) => v * sigma2)) : null;
  const stderr = params.map((_, k) => (covariance ? Math.sqrt((covariance[k] as number[])[k] as number) : Number.NaN));
  return { params, ssr, dof, sigma2, covariance, stderr, iterations, rounds, converged, gradientCosine: cosine };
}
