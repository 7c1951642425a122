// Pickup coil model (docs/computation.md §4): the winding's DC resistance R in series with its
// inductance L, the self-capacitance C across the terminals and, optionally, a parallel loss
// resistance Rp standing for eddy-current losses:
//
//     Z(ω) = ((R + jωL) ∥ 1/(jωC)) [∥ Rp]
//
// the lumped model used in the physics literature on magnetic pickups (e.g. D. Carson, UIUC senior
// thesis 2009; F. T. Ban, "Analysis of Electric Guitar Pickups", Penn State; docs/computation.md §4).
//
// The sweep is fitted by the engine's one least-squares path (./least-squares) on ln Z, i.e. on
// ln|Z| (nepers) and the phase (radians) together with equal weights. Why equal: a measurement error
// that multiplies Z by (1 + ε), ε small and complex, moves ln|Z| by Re ε and the phase by Im ε, so
// a 1 % magnitude error and a 0.01 rad (0.57°) phase error count the same. The parameters are the
// logarithms of R, L, C (and Rp), which keeps them positive and on one scale.
import { fitLeastSquares, invertSpd } from '@shared/analysis/least-squares';
import { ANALYSIS_ENGINE_VERSION } from '@shared/analysis/engine-version';
import { formatPercent, formatValue } from '@shared/units/format';

export interface CoilParams {
  R: number;
  L: number;
  C: number;
  Rp?: number | null;
}

export type CoilPoint = { frequency: number; magnitude: number; phaseDeg: number } | { frequency: number; re: number; im: number };

export interface CoilFlag {
  code:
    | 'not-converged'
    | 'resonance-outside-sweep'
    | 'poor-fit'
    | 'open-coil'
    | 'shorted-turns'
    | 'low-q'
    | 'dcr-out-of-tolerance'
    | 'inductance-out-of-tolerance';
  message: string;
}

export interface CoilFit {
  R: number;
  L: number;
  C: number;
  /** Parallel loss resistance; null when not fitted. Capped at 1000 × the largest |Z| (no measurable loss). */
  Rp: number | null;
  /** 1/(2π√(LC)), Hz. */
  f0: number;
  /**
   * Q of the equivalent parallel resonator at ω0 = 1/√(LC): Q = R_par/(ω0·L), where
   * R_par = (L/(R·C)) ∥ Rp is the series branch's loss turned into a parallel resistance
   * (L/(RC), the series-to-parallel conversion at resonance: standard theory, derived here) in parallel with Rp.
   * Without Rp this is exactly ω0·L/R, the series branch's Q.
   */
  Q: number;
  /** Largest |Z| of the fitted model and where it occurs (Ω, Hz). */
  peakMagnitude: number;
  peakFrequency: number;
  /** Standard errors from the covariance of the log-parameters (delta method: σ_R ≈ R·σ_lnR). */
  stderr: { R: number; L: number; C: number; Rp: number | null };
  /** RMS of the ln|Z| residuals (nepers, ≈ relative magnitude error) and of the phase residuals (°). */
  rmsLogMag: number;
  rmsPhaseDeg: number;
  /** Measured minus fitted: ln|Z| ratio and phase difference in degrees. */
  residuals: { frequency: number; logMag: number; phaseDeg: number }[];
  converged: boolean;
  iterations: number;
  flags: CoilFlag[];
  engineVersion: string;
}

export interface CoilFitInput {
  points: CoilPoint[];
  /**
   * Include the parallel loss resistance; 'auto' keeps it only when it improves the fit
   * significantly. Default 'auto', the same for uploads, "Fit again" and the stateless route.
   */
  withRp?: boolean | 'auto';
}

export interface CoilSpec {
  dcr?: { nominal: number; tolerancePct: number };
  inductance?: { nominal: number; tolerancePct: number };
  minQ?: number;
}

const TWO_PI = 2 * Math.PI;

/** Impedance of the coil model at one frequency (Hz). */
export function coilImpedance(params: CoilParams, frequency: number): { re: number; im: number } {
  const w = TWO_PI * frequency;
  const { R, L, C } = params;
  // Y = 1/(R + jωL) + jωC + 1/Rp; Z = 1/Y.
  const d = R * R + w * w * L * L;
  const yRe = R / d + (params.Rp ? 1 / params.Rp : 0);
  const yIm = -(w * L) / d + w * C;
  const yy = yRe * yRe + yIm * yIm;
  return { re: yRe / yy, im: -yIm / yy };
}

/** Resonance of L with C: f0 = 1/(2π√(LC)). */
export function resonanceFrequency(L: number, C: number): number {
  return 1 / (TWO_PI * Math.sqrt(L * C));
}

/**
 * Self-capacitance and inductance from two resonance readings: the coil peaks at f1 (with a known
 * capacitance c1 across it, default 0: the coil alone) and at f2 with a known capacitance cx across
 * it. With f = 1/(2π√(L(C + C_added))): C = (f2²·cx − f1²·c1)/(f1² − f2²), which for c1 = 0 is
 * C = cx/((f1/f2)² − 1); then L = 1/(4π²·f1²·(C + c1)). Method: smeter.net, "Determining Coil
 * Distributed Capacitance" (2004); closed form derived here (tests/fixtures/examples/coil-self-capacitance.txt).
 */
export function coilFromTwoResonances(input: { f1: number; f2: number; cx: number; c1?: number }): { C: number; L: number } {
  const { f1, f2, cx } = input;
  const c1 = input.c1 ?? 0;
  if (!(f1 > 0 && f2 > 0 && cx > 0 && c1 >= 0)) throw new RangeError('f1, f2 and Cx must be positive (and c1 not negative).');
  if (!(f2 < f1 && cx > c1)) throw new RangeError('The reading with the larger capacitor (f2, cx) must resonate below the other (f1).');
  const C = (f2 * f2 * cx - f1 * f1 * c1) / (f1 * f1 - f2 * f2);
  if (!(C > 0)) throw new RangeError('These readings give no positive self-capacitance.');
  const L = 1 / (4 * Math.PI ** 2 * f1 ** 2 * (C + c1));
  return { C, L };
}

/** What an LCR meter reads as inductance at `frequency`: L' = L/(1 − ω²LC) (below resonance). */
export function apparentInductance(input: { L: number; C: number; frequency: number }): number {
  const w = TWO_PI * input.frequency;
  return input.L / (1 - w * w * input.L * input.C);
}

/** The inverse: true L from a reading L' at `frequency` with known C, L = L'/(1 + ω²L'C). */
export function inductanceFromReading(input: { reading: number; C: number; frequency: number }): number {
  const w = TWO_PI * input.frequency;
  return input.reading / (1 + w * w * input.reading * input.C);
}

/** A sentence for an LCR reading of L (and R) at one frequency. */
export function lcrNote(input: { L: number; frequency: number; C?: number }): string {
  const f = input.frequency.toPrecision(3);
  if (input.C === undefined || !(input.C > 0)) {
    return `The inductance read at ${f} Hz is raised by the coil's self-capacitance (L' = L/(1 − ω²LC)); with C unknown the true L is somewhat lower than read.`;
  }
  const w = TWO_PI * input.frequency;
  const x = w * w * input.L * input.C;
  if (x >= 1) {
    return `At ${f} Hz the coil is at or above its self-resonance (${formatValue(resonanceFrequency(input.L, input.C), 'Hz')}): an LCR reading of inductance there is meaningless.`;
  }
  const raised = (1 / (1 - x) - 1) * 100;
  return `At ${f} Hz the self-capacitance of ${formatValue(input.C, 'F')} raises the apparent inductance by ${raised.toPrecision(2)} % (${apparentInductance({ L: input.L, C: input.C, frequency: input.frequency }).toPrecision(4)} H read for ${input.L.toPrecision(4)} H).`;
}

interface Sample {
  frequency: number;
  w: number;
  logMag: number;
  phase: number;
}

function toSamples(points: CoilPoint[]): Sample[] {
  const samples: Sample[] = [];
  for (const p of points) {
    if (!(p.frequency > 0)) continue;
    let logMag: number;
    let phase: number;
    if ('re' in p) {
      logMag = 0.5 * Math.log(p.re * p.re + p.im * p.im);
      phase = Math.atan2(p.im, p.re);
    } else {
      logMag = Math.log(p.magnitude);
      // Bring any phase into (−180°, 180°].
      const deg = ((((p.phaseDeg + 180) % 360) + 360) % 360) - 180;
      phase = ((deg === -180 ? 180 : deg) * Math.PI) / 180;
    }
    if (!Number.isFinite(logMag) || !Number.isFinite(phase)) continue;
    samples.push({ frequency: p.frequency, w: TWO_PI * p.frequency, logMag, phase });
  }
  return samples.sort((a, b) => a.frequency - b.frequency);
}

function median(values: number[]): number {
  const s = values.slice().sort((a, b) => a - b);
  const mid = s.length >> 1;
  return s.length % 2 ? (s[mid] as number) : 0.5 * ((s[mid - 1] as number) + (s[mid] as number));
}

/** Starting values from the data (docs/computation.md §4). */
function startFromData(samples: Sample[]): { R: number; L: number; C: number; Rp: number; peakIndex: number } {
  let peakIndex = 0;
  samples.forEach((s, i) => {
    if (s.logMag > (samples[peakIndex] as Sample).logMag) peakIndex = i;
  });
  const first = samples[0] as Sample;
  const peak = samples[peakIndex] as Sample;
  const mag0 = Math.exp(first.logMag);
  // R: the real part at the lowest frequency.
  const re0 = mag0 * Math.cos(first.phase);
  const R = re0 > 0 ? re0 : mag0;
  // L: Im Z/ω below a third of the peak, corrected for the rise L' = L/(1 − (f/f0)²) with f0 ≈ the peak.
  const wPeak = peak.w;
  const ls: number[] = [];
  for (const s of samples) {
    if (s.w > wPeak / 3) break;
    const im = Math.exp(s.logMag) * Math.sin(s.phase);
    if (im > 0) ls.push((im / s.w) * (1 - (s.w / wPeak) ** 2));
  }
  let L = ls.length > 0 ? median(ls) : NaN;
  if (!(L > 0)) {
    // No clean inductive region: |Z| ≈ ωL at the peak's lower flank.
    L = Math.exp(peak.logMag) / wPeak / 3;
  }
  // C: from the resonance. If the peak is the last sample, the resonance lies above the sweep.
  const wRes = peakIndex === samples.length - 1 ? 2 * wPeak : wPeak;
  const C = 1 / (wRes * wRes * L);
  // Rp: what the peak height leaves after the series branch's own loss L/(RC).
  const gLeft = 1 / Math.exp(peak.logMag) - (R * C) / L;
  const Rp = gLeft > 1e-3 * ((R * C) / L) ? 1 / gLeft : (100 * L) / (R * C);
  return { R, L, C, Rp, peakIndex };
}

/**
 * The fit's starting values (docs/computation.md §4) for a sweep with at least one point of positive
 * frequency: R from the real part at the lowest frequency, L from Im Z/ω below a third of the peak
 * with the (1 − (f/f0)²) correction, C from the peak's frequency, Rp from the peak's height.
 */
export function coilStartValues(points: CoilPoint[]): { R: number; L: number; C: number; Rp: number } {
  const { R, L, C, Rp } = startFromData(toSamples(points));
  return { R, L, C, Rp };
}

interface RawFit {
  theta: number[];
  ssr: number;
  stderrLog: number[];
  converged: boolean;
  iterations: number;
}

function lnZProblem(samples: Sample[], withRp: boolean) {
  const n = samples.length;
  const observed = new Float64Array(2 * n);
  samples.forEach((s, i) => {
    observed[2 * i] = s.logMag;
    observed[2 * i + 1] = s.phase;
  });
  // ln Z at every sample for parameters θ = ln(R, L, C[, Rp]); even index ln|Z|, odd index phase.
  const model = (theta: number[]) => {
    const R = Math.exp(theta[0] as number);
    const L = Math.exp(theta[1] as number);
    const C = Math.exp(theta[2] as number);
    const g = withRp ? Math.exp(-(theta[3] as number)) : 0;
    const out = new Float64Array(2 * n);
    for (let i = 0; i < n; i++) {
      const w = (samples[i] as Sample).w;
      const d = R * R + w * w * L * L;
      const yRe = R / d + g;
      const yIm = -(w * L) / d + w * C;
      // ln Z = −ln Y
      out[2 * i] = -0.5 * Math.log(yRe * yRe + yIm * yIm);
      out[2 * i + 1] = -Math.atan2(yIm, yRe);
    }
    return (i: number) => out[i] as number;
  };
  // ∂ln Z/∂ln p = −(p·∂Y/∂p)/Y, with p·∂Y/∂R = −R/(R + jωL)², p·∂Y/∂L = −jωL/(R + jωL)²,
  // p·∂Y/∂C = jωC, p·∂Y/∂Rp = −1/Rp. Real part → ln|Z| row, imaginary part → phase row.
  const jacobian = (theta: number[]) => {
    const R = Math.exp(theta[0] as number);
    const L = Math.exp(theta[1] as number);
    const C = Math.exp(theta[2] as number);
    const g = withRp ? Math.exp(-(theta[3] as number)) : 0;
    const np = withRp ? 4 : 3;
    const flat = new Float64Array(2 * n * np);
    for (let i = 0; i < n; i++) {
      const w = (samples[i] as Sample).w;
      // s = R + jωL; s² = (R² − ω²L²) + j·2RωL; 1/s² = conj(s²)/|s²|²
      const s2Re = R * R - w * w * L * L;
      const s2Im = 2 * R * w * L;
      const s4 = s2Re * s2Re + s2Im * s2Im;
      const is2Re = s2Re / s4;
      const is2Im = -s2Im / s4;
      const d = R * R + w * w * L * L;
      const yRe = R / d + g;
      const yIm = -(w * L) / d + w * C;
      const yy = yRe * yRe + yIm * yIm;
      const zRe = yRe / yy;
      const zIm = -yIm / yy;
      // t = p·∂Y/∂p for R, L, C (and Rp): −R/s², −jωL/s², jωC (, −1/Rp); the entry is −t·Z,
      // its real part in the ln|Z| row and its imaginary part in the phase row.
      const tRre = -R * is2Re;
      const tRim = -R * is2Im;
      const tLre = w * L * is2Im;
      const tLim = -w * L * is2Re;
      const m = 2 * i * np;
      const p = m + np;
      flat[m] = -(tRre * zRe - tRim * zIm);
      flat[p] = -(tRre * zIm + tRim * zRe);
      flat[m + 1] = -(tLre * zRe - tLim * zIm);
      flat[p + 1] = -(tLre * zIm + tLim * zRe);
      flat[m + 2] = w * C * zIm;
      flat[p + 2] = -w * C * zRe;
      if (withRp) {
        flat[m + 3] = g * zRe;
        flat[p + 3] = g * zIm;
      }
    }
    // One reused row buffer (the least-squares path reads each row at once).
    const row = new Array<number>(np).fill(0);
    return (i: number) => {
      for (let k = 0; k < np; k++) row[k] = flat[i * np + k] as number;
      return row;
    };
  };
  return { observed, model, jacobian };
}

function fitModel(samples: Sample[], start: number[], withRp: boolean, maxIterations = 600): RawFit {
  const { observed, model, jacobian } = lnZProblem(samples, withRp);
  // Rp above a thousand times the largest |Z| changes |Z| by under 0.1 %: cap it there, so that data
  // without such a loss stops the fit at the cap (not converged) instead of chasing Rp → ∞.
  let maxLogMag = -Infinity;
  for (const s of samples) maxLogMag = Math.max(maxLogMag, s.logMag);
  const bounds = withRp
    ? { min: [-Infinity, -Infinity, -Infinity, -Infinity], max: [Infinity, Infinity, Infinity, maxLogMag + Math.log(1e3)] }
    : {};
  const initial = withRp ? [...start.slice(0, 3), Math.min(start[3] as number, maxLogMag + Math.log(1e3))] : start;
  const r = fitLeastSquares({ observed, model, jacobian, initial, iterationsPerRound: 4, maxIterations, ...bounds });
  return {
    theta: r.params,
    ssr: r.ssr,
    stderrLog: r.stderr,
    converged: r.converged,
    iterations: r.iterations,
  };
}

/** Peak of |Z| of the fitted model: golden-section search in ln f around f0. */
function modelPeak(params: CoilParams, f0: number): { frequency: number; magnitude: number } {
  const mag = (lf: number) => {
    const z = coilImpedance(params, Math.exp(lf));
    return Math.hypot(z.re, z.im);
  };
  let a = Math.log(f0) - 1;
  let b = Math.log(f0) + 1;
  const r = (Math.sqrt(5) - 1) / 2;
  let c = b - r * (b - a);
  let d = a + r * (b - a);
  let fc = mag(c);
  let fd = mag(d);
  for (let k = 0; k < 80 && b - a > 1e-10; k++) {
    if (fc > fd) {
      b = d;
      d = c;
      fd = fc;
      c = b - r * (b - a);
      fc = mag(c);
    } else {
      a = c;
      c = d;
      fc = fd;
      d = a + r * (b - a);
      fd = mag(d);
    }
  }
  const lf = 0.5 * (a + b);
  return { frequency: Math.exp(lf), magnitude: mag(lf) };
}

/**
 * Score test for the parallel loss at the three-parameter solution: add the conductance g = 1/Rp
 * (zero there) as a fourth parameter and take one Gauss–Newton step of the linearised problem.
 * ∂ln Z/∂g = −Z (from d ln Z = −Z·dY). Returns the Rp the step points to (null if the step asks for
 * a negative loss) and the F statistic of the predicted drop of the sum of squares. Used so that
 * 'auto' does not run a four-parameter fit whose Rp would only run off to infinity.
 */
function lossScore(samples: Sample[], theta3: number[]): { rp: number | null; f: number } {
  const { observed, model, jacobian } = lnZProblem(samples, false);
  const f = model(theta3);
  const jac = jacobian(theta3);
  const R = Math.exp(theta3[0] as number);
  const L = Math.exp(theta3[1] as number);
  const C = Math.exp(theta3[2] as number);
  let zMax = 0;
  const zs = samples.map((s) => {
    const z = coilImpedance({ R, L, C }, s.frequency);
    zMax = Math.max(zMax, Math.hypot(z.re, z.im));
    return z;
  });
  // Normal equations of the 4 columns (g scaled by zMax for conditioning).
  const a = [0, 1, 2, 3].map(() => [0, 0, 0, 0]);
  const b = [0, 0, 0, 0];
  let ssr = 0;
  for (let i = 0; i < observed.length; i++) {
    const r = (observed[i] as number) - f(i);
    ssr += r * r;
    const row3 = jac(i);
    const z = zs[i >> 1] as { re: number; im: number };
    const row = [row3[0] as number, row3[1] as number, row3[2] as number, -((i & 1) === 0 ? z.re : z.im) * zMax];
    for (let p = 0; p < 4; p++) {
      b[p] = (b[p] as number) + (row[p] as number) * r;
      for (let q = 0; q < 4; q++) (a[p] as number[])[q] = ((a[p] as number[])[q] as number) + (row[p] as number) * (row[q] as number);
    }
  }
  const inv = invertSpd(a);
  if (!inv) return { rp: null, f: 0 };
  const step = inv.map((rowInv) => rowInv.reduce((acc, v, q) => acc + v * (b[q] as number), 0));
  const g = (step[3] as number) / zMax;
  if (!(g > 0)) return { rp: null, f: 0 };
  const drop = step.reduce((acc, v, p) => acc + v * (b[p] as number), 0);
  const dof = observed.length - 4;
  const rest = Math.max(ssr - drop, Number.MIN_VALUE);
  return { rp: 1 / g, f: drop / (rest / dof) };
}

// Significance for keeping Rp with withRp 'auto': F = (SSR_3 − SSR_4)/(SSR_4/(2n − 4)) above the 99.9 %
// point of F(1, ∞) ≈ 10.83 (project choice).
const F_KEEP_RP = 10.83;
// Fit-quality limits (project choice): 5 % RMS in magnitude or 3° RMS in phase.
const POOR_LOG_MAG = 0.05;
const POOR_PHASE_DEG = 3;

export function fitCoil(input: CoilFitInput): CoilFit {
  const samples = toSamples(input.points);
  const mode = input.withRp ?? 'auto';
  const minPoints = mode === false ? 3 : 4;
  if (samples.length < minPoints) throw new RangeError(`A coil fit needs at least ${minPoints} points with a positive frequency.`);
  const start = startFromData(samples);
  const base = [Math.log(start.R), Math.log(start.L), Math.log(start.C)];

  // 'auto': fit R, L, C; a score test (lossScore) says whether a parallel loss would help; only then
  // fit all four and keep Rp if the F test says the drop in the sum of squares is significant.
  let fit: RawFit;
  let withRp: boolean;
  if (mode === false) {
    withRp = false;
    fit = fitModel(samples, base, false);
  } else {
    const without = fitModel(samples, base, false);
    const score = lossScore(samples, without.theta);
    if (mode === 'auto' && (score.rp === null || score.f < F_KEEP_RP)) {
      // The parallel loss would not improve the fit significantly (or would have to be negative).
      withRp = false;
      fit = without;
    } else {
      const withP = fitModel(samples, [...without.theta, Math.log(score.rp ?? start.Rp)], true, 200);
      const fStat = withP.ssr > 0 ? (without.ssr - withP.ssr) / (withP.ssr / (2 * samples.length - 4)) : without.ssr > 0 ? Infinity : 0;
      withRp = mode === true || (withP.converged && fStat > F_KEEP_RP);
      fit = { ...(withRp ? withP : without), iterations: without.iterations + withP.iterations };
    }
  }

  const [lnR = 0, lnL = 0, lnC = 0, lnRp = 0] = fit.theta;
  const R = Math.exp(lnR);
  const L = Math.exp(lnL);
  const C = Math.exp(lnC);
  const Rp = withRp ? Math.exp(lnRp) : null;
  const params: CoilParams = { R, L, C, Rp };
  const f0 = resonanceFrequency(L, C);
  const w0 = TWO_PI * f0;
  const rSeriesAsParallel = L / (R * C);
  const rPar = Rp === null ? rSeriesAsParallel : (rSeriesAsParallel * Rp) / (rSeriesAsParallel + Rp);
  const Q = rPar / (w0 * L);
  const peak = modelPeak(params, f0);
  const se = fit.stderrLog;

  const residuals = samples.map((s) => {
    const z = coilImpedance(params, s.frequency);
    const dPhase = s.phase - Math.atan2(z.im, z.re);
    return { frequency: s.frequency, logMag: s.logMag - 0.5 * Math.log(z.re * z.re + z.im * z.im), phaseDeg: (dPhase * 180) / Math.PI };
  });
  const rms = (v: number[]) => Math.sqrt(v.reduce((a, x) => a + x * x, 0) / v.length);
  const rmsLogMag = rms(residuals.map((r) => r.logMag));
  const rmsPhaseDeg = rms(residuals.map((r) => r.phaseDeg));

  const flags: CoilFlag[] = [];
  const first = samples[0] as Sample;
  // A broken winding leaves only the capacitance (and leakage): capacitive at the lowest frequency.
  if (first.phase < -Math.PI / 4) {
    flags.push({
      code: 'open-coil',
      message: `The impedance is capacitive at ${first.frequency.toPrecision(3)} Hz (phase ${((first.phase * 180) / Math.PI).toFixed(1)}°): the coil looks open.`,
    });
  }
  if (!fit.converged)
    flags.push({
      code: 'not-converged',
      message: `The fit did not converge after ${fit.iterations} iterations; treat the values as rough.`,
    });
  const last = samples[samples.length - 1] as Sample;
  if (f0 < first.frequency || f0 > last.frequency || start.peakIndex === samples.length - 1) {
    flags.push({
      code: 'resonance-outside-sweep',
      message: `The resonance (${formatValue(f0, 'Hz')}) is not inside the sweep ${formatValue(first.frequency, 'Hz')}–${formatValue(last.frequency, 'Hz')}, so C is poorly determined.`,
    });
  }
  if (rmsLogMag > POOR_LOG_MAG || rmsPhaseDeg > POOR_PHASE_DEG) {
    flags.push({
      code: 'poor-fit',
      message: `The model fits poorly (RMS ${(rmsLogMag * 100).toPrecision(2)} % in magnitude, ${rmsPhaseDeg.toPrecision(2)}° in phase).`,
    });
  }

  return {
    R,
    L,
    C,
    Rp,
    f0,
    Q,
    peakMagnitude: peak.magnitude,
    peakFrequency: peak.frequency,
    stderr: {
      R: R * (se[0] ?? NaN),
      L: L * (se[1] ?? NaN),
      C: C * (se[2] ?? NaN),
      Rp: Rp === null ? null : Rp * (se[3] ?? NaN),
    },
    rmsLogMag,
    rmsPhaseDeg,
    residuals,
    converged: fit.converged,
    iterations: fit.iterations,
    flags,
    engineVersion: ANALYSIS_ENGINE_VERSION,
  };
}

// Thresholds against a part's spec — project choice, common practice (no published source):
// shorted turns when L is below nominal by more than max(3 × its tolerance, 20 %), or Q is below half
// the spec's minimum; an open coil when the fit flagged it or R exceeds 1 MΩ (pickup windings are
// a few kΩ to a few tens of kΩ — common practice (no published source)).
const OPEN_R = 1e6;
const SHORT_L_MIN_DROP_PCT = 20;

/** The fit's own flags plus those against the part's spec. */
export function coilFlags(fit: Pick<CoilFit, 'R' | 'L' | 'Q' | 'flags'>, spec: CoilSpec = {}): CoilFlag[] {
  const flags = fit.flags.slice();
  const has = (code: CoilFlag['code']) => flags.some((f) => f.code === code);
  if (!has('open-coil') && fit.R > OPEN_R) {
    flags.push({ code: 'open-coil', message: `DC resistance ${formatValue(fit.R, 'Ω')}: the winding looks open.` });
  }
  if (spec.dcr) {
    const dev = ((fit.R - spec.dcr.nominal) / spec.dcr.nominal) * 100;
    if (Math.abs(dev) > spec.dcr.tolerancePct) {
      flags.push({
        code: 'dcr-out-of-tolerance',
        message: `DCR ${formatValue(fit.R, 'Ω', { digits: 4 })} is ${formatPercent(dev)} from nominal ${formatValue(spec.dcr.nominal, 'Ω', { digits: 4 })} (±${spec.dcr.tolerancePct} %).`,
      });
    }
  }
  let shorted = false;
  if (spec.inductance) {
    const dev = ((fit.L - spec.inductance.nominal) / spec.inductance.nominal) * 100;
    if (Math.abs(dev) > spec.inductance.tolerancePct) {
      flags.push({
        code: 'inductance-out-of-tolerance',
        message: `L ${formatValue(fit.L, 'H', { digits: 4 })} is ${formatPercent(dev)} from nominal ${formatValue(spec.inductance.nominal, 'H', { digits: 4 })} (±${spec.inductance.tolerancePct} %).`,
      });
    }
    if (-dev > Math.max(3 * spec.inductance.tolerancePct, SHORT_L_MIN_DROP_PCT)) shorted = true;
  }
  if (spec.minQ !== undefined) {
    if (fit.Q < spec.minQ) flags.push({ code: 'low-q', message: `Q ${fit.Q.toPrecision(3)} is below the spec's minimum ${spec.minQ}.` });
    if (fit.Q < 0.5 * spec.minQ) shorted = true;
  }
  if (shorted) {
    flags.push({ code: 'shorted-turns', message: 'Inductance or Q is far below the spec: shorted turns are likely.' });
  }
  return flags;
}
