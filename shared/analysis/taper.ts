// Potentiometer taper fit (docs/computation.md §3).
//
// Readings of the resistance from lug 1 to the wiper against rotation are normalised to
// x = rotation fraction, y = R1W / R13 and compared with the four laws of shared/taper/law.ts
// (linear, audio, reverse audio, two-segment), each with one parameter m = y(0.5) (the "percent at
// mid-rotation"; linear has m = 0.5 fixed).
// Each law is fitted by least squares over m alone: a bounded one-dimensional minimisation (coarse
// scan, then Brent's method: R. P. Brent, "Algorithms for Minimization without Derivatives", 1973,
// ch. 5). The two-segment law is linear in m, so its fit is closed-form.
import { formatPercent, formatValue } from '@shared/units/format';
import { ANALYSIS_ENGINE_VERSION } from '@shared/analysis/engine-version';
import { fQuantile } from './f-distribution';
import { lawCurve, taperLawValue, TAPER_LAWS, type ProfileLaw, type TaperLawKind } from '@shared/taper/law';

export interface TaperPoint {
  rotation: number;
  /** Lug 1 (counter-clockwise end) to wiper, Ω. */
  resistance: number;
  /** Wiper to lug 3, Ω, when measured. */
  resistanceW3?: number;
  /** Lug 1 to lug 3 (R13), Ω, when the sweep measured it beside the reading. */
  total?: number;
}

export interface TaperProfile {
  /** Expected law; 'audio-any' accepts audio or two-segment. */
  law?: ProfileLaw;
  mMin?: number;
  mMax?: number;
  /** Largest acceptable end resistance, Ω. */
  maxEndResistance?: number;
}

export interface TaperInput {
  points: TaperPoint[];
  rotationUnit: 'deg' | 'percent';
  /** Full mechanical rotation in degrees; default 300 — common practice (no published source). */
  fullRotationDeg?: number;
  /**
   * R13 from a bench reading, Ω: used only when the sweep itself cannot give R13 (no R13 column, no
   * reading with both halves, no reading at full rotation), and the fit then says so.
   */
  total?: number;
  nominal?: number;
  tolerancePct?: number;
  profile?: TaperProfile;
  /** Report this law's fit instead of the chosen one ("Fit again" with a forced law). */
  forceLaw?: TaperLawKind;
  /** A drop between successive readings larger than this (% of R13) is a monotonicity break. Default 0.5. */
  monotonicTolerancePct?: number;
}

export const TOTAL_SOURCES = ['sweep-r13', 'sweep-halves', 'sweep-full-rotation', 'bench-reading'] as const;
export type TotalSource = (typeof TOTAL_SOURCES)[number];

/** "Full rotation" is x ≥ 0.99 of the rotation. */
const FULL_ROTATION_X = 0.99;

export interface TaperCandidate {
  law: TaperLawKind;
  m: number;
  r2: number;
  rmsPct: number;
}

export interface TaperFlag {
  code: 'total-out-of-tolerance' | 'law-outside-profile' | 'm-outside-profile' | 'end-resistance-high' | 'non-monotonic';
  message: string;
}

export interface TaperFit {
  law: TaperLawKind;
  /** y at x = 0.5, as a fraction. */
  m: number;
  /** R13 used for the normalisation, Ω. */
  total: number;
  /**
   * Where `total` came from, in this order of preference: the sweep's own R13 column (mean of its
   * readings); R1W + RW3 where both halves were measured (mean over those readings); the reading
   * at full rotation (x ≥ 0.99; the end resistance is then unknown); a bench reading given with
   * the sweep, only when the sweep gives none of these.
   */
  totalSource: TotalSource;
  totalDeviationPct: number | null;
  r2: number;
  /** RMS and largest |residual| of the best law, in % of R13. */
  rmsPct: number;
  maxPct: number;
  /**
   * start: the reading at the smallest rotation, Ω. end: wiper to lug 3 at the largest rotation when
   * measured, else R13 − R1W there when R13 was given and the reading is at full rotation, else null.
   */
  endResistance: { start: number; end: number | null };
  /** Readings (index into the input) that drop below the previous reading by more than the tolerance. */
  monotonicBreaks: { index: number; rotation: number }[];
  /** R1W + RW3 − R13 with the largest magnitude over the readings that have both halves, Ω. */
  halfSumMismatch: number | null;
  /** Every law with its fitted m, in the order linear, audio, reverse, two-segment. */
  candidates: TaperCandidate[];
  flags: TaperFlag[];
  /** ANALYSIS_ENGINE_VERSION of the code that made this fit. */
  engineVersion: string;
}

const AUDIO_RANGE: [number, number] = [0.01, 0.5];
const REVERSE_RANGE: [number, number] = [0.5, 0.99];
const DEFAULT_FULL_ROTATION_DEG = 300;

export interface NormalisedTaper {
  /** Rotation fractions and resistance fractions, sorted by rotation. */
  x: number[];
  y: number[];
  /** Index into the input points of each sorted reading. */
  order: number[];
  total: number;
  totalSource: TaperFit['totalSource'];
}

/** x = rotation fraction, y = R1W / R13, sorted by rotation. Throws on unusable input. */
export function normaliseTaper(input: TaperInput): NormalisedTaper {
  const full = input.rotationUnit === 'deg' ? (input.fullRotationDeg ?? DEFAULT_FULL_ROTATION_DEG) : 100;
  if (!(full > 0)) throw new RangeError('Full rotation must be positive.');
  const order = input.points
    .map((p, i) => i)
    .filter((i) => {
      const p = input.points[i] as TaperPoint;
      return Number.isFinite(p.rotation) && Number.isFinite(p.resistance);
    })
    .sort((a, b) => (input.points[a] as TaperPoint).rotation - (input.points[b] as TaperPoint).rotation);
  if (order.length < 3) throw new RangeError('A taper fit needs at least three readings.');
  const x = order.map((i) => (input.points[i] as TaperPoint).rotation / full);
  const { total, totalSource } = totalFromSweep(input, order, x);
  if (!(total > 0)) throw new RangeError('The end-to-end resistance (R13) must be positive.');
  const y = order.map((i) => (input.points[i] as TaperPoint).resistance / total);
  return { x, y, order, total, totalSource };
}

const finite = (v: number | undefined): v is number => v !== undefined && Number.isFinite(v);

/** R13 from the sweep itself (see TaperFit.totalSource), else the bench reading. */
function totalFromSweep(input: TaperInput, order: number[], x: number[]): { total: number; totalSource: TotalSource } {
  const pts = order.map((i) => input.points[i] as TaperPoint);
  const r13 = pts.map((p) => p.total).filter(finite);
  if (r13.length > 0) return { total: r13.reduce((a, b) => a + b, 0) / r13.length, totalSource: 'sweep-r13' };
  const halves = pts.filter((p) => finite(p.resistanceW3)).map((p) => p.resistance + (p.resistanceW3 as number));
  if (halves.length > 0) return { total: halves.reduce((a, b) => a + b, 0) / halves.length, totalSource: 'sweep-halves' };
  const lastX = x[x.length - 1] as number;
  if (lastX >= FULL_ROTATION_X) return { total: (pts[pts.length - 1] as TaperPoint).resistance, totalSource: 'sweep-full-rotation' };
  if (input.total !== undefined && Number.isFinite(input.total)) return { total: input.total, totalSource: 'bench-reading' };
  throw new RangeError(
    'The sweep gives no end-to-end resistance (R13): it has no R13 column, no reading of both halves (R1W and RW3) and no reading at full rotation, and no bench reading of R13 was given.',
  );
}

function ssrOf(law: TaperLawKind, m: number, x: number[], y: number[]): number {
  const f = lawCurve(law, m);
  let s = 0;
  for (let i = 0; i < x.length; i++) s += ((y[i] as number) - f(x[i] as number)) ** 2;
  return s;
}

/** Brent's bounded minimisation of f on [a, b] (Brent 1973, ch. 5, "localmin"). */
export function brentMinimise(f: (t: number) => number, lo: number, hi: number, tol: number): { t: number; value: number } {
  const golden = (3 - Math.sqrt(5)) / 2;
  let a = lo;
  let b = hi;
  let x = a + golden * (b - a);
  let w = x;
  let v = x;
  let fx = f(x);
  let fw = fx;
  let fv = fx;
  let d = 0;
  let e = 0;
  for (let iter = 0; iter < 100; iter++) {
    const mid = 0.5 * (a + b);
    const tol1 = 1e-10 * Math.abs(x) + tol / 3;
    const tol2 = 2 * tol1;
    if (Math.abs(x - mid) <= tol2 - 0.5 * (b - a)) break;
    let golden_step = true;
    if (Math.abs(e) > tol1) {
      // Parabola through (v, fv), (w, fw), (x, fx).
      const r = (x - w) * (fx - fv);
      let q = (x - v) * (fx - fw);
      let p = (x - v) * q - (x - w) * r;
      q = 2 * (q - r);
      if (q > 0) p = -p;
      else q = -q;
      const eOld = e;
      e = d;
      if (Math.abs(p) < Math.abs(0.5 * q * eOld) && p > q * (a - x) && p < q * (b - x)) {
        d = p / q;
        const u = x + d;
        if (u - a < tol2 || b - u < tol2) d = x < mid ? tol1 : -tol1;
        golden_step = false;
      }
    }
    if (golden_step) {
      e = (x < mid ? b : a) - x;
      d = golden * e;
    }
    const u = Math.abs(d) >= tol1 ? x + d : x + (d > 0 ? tol1 : -tol1);
    const fu = f(u);
    if (fu <= fx) {
      if (u < x) b = x;
      else a = x;
      v = w;
      fv = fw;
      w = x;
      fw = fx;
      x = u;
      fx = fu;
    } else {
      if (u < x) a = u;
      else b = u;
      if (fu <= fw || w === x) {
        v = w;
        fv = fw;
        w = u;
        fw = fu;
      } else if (fu <= fv || v === x || v === w) {
        v = u;
        fv = fu;
      }
    }
  }
  return { t: x, value: fx };
}

/** Least-squares m of one law over its bounded range. */
function fitLaw(law: TaperLawKind, x: number[], y: number[]): { m: number; ssr: number } {
  if (law === 'linear') return { m: 0.5, ssr: ssrOf('linear', 0.5, x, y) };
  if (law === 'two-segment') {
    // y = m·g(x) + h(x): g = 2x, h = 0 for x ≤ 0.5; g = 2 − 2x, h = 2x − 1 above. Linear in m.
    let num = 0;
    let den = 0;
    for (let i = 0; i < x.length; i++) {
      const xi = x[i] as number;
      const g = xi <= 0.5 ? 2 * xi : 2 - 2 * xi;
      const h = xi <= 0.5 ? 0 : 2 * xi - 1;
      num += g * ((y[i] as number) - h);
      den += g * g;
    }
    const m = den > 0 ? Math.min(1, Math.max(0, num / den)) : 0.5;
    return { m, ssr: ssrOf(law, m, x, y) };
  }
  const [lo, hi] = law === 'audio' ? AUDIO_RANGE : REVERSE_RANGE;
  // A coarse scan first, so that Brent's method starts in the basin of the global minimum.
  const steps = 12;
  let best = 0;
  let bestValue = Infinity;
  const grid: number[] = [];
  for (let k = 0; k <= steps; k++) {
    const m = lo + ((hi - lo) * k) / steps;
    grid.push(m);
    const s = ssrOf(law, m, x, y);
    if (s < bestValue) {
      bestValue = s;
      best = k;
    }
  }
  const a = grid[Math.max(0, best - 1)] as number;
  const b = grid[Math.min(steps, best + 1)] as number;
  const r = brentMinimise((m) => ssrOf(law, m, x, y), a, b, 1e-7);
  return r.value <= bestValue ? { m: r.t, ssr: r.value } : { m: grid[best] as number, ssr: bestValue };
}

// Model choice: the one-parameter law with the smallest sum of squares, unless the linear law
// (no free parameter) is not significantly worse: F = (SSR_lin − SSR_1)/(SSR_1/(n − 1)) below the
// 99.9 % point of F(1, n − 1) for the actual number of readings (the extra-sum-of-squares F test,
// e.g. Draper & Smith, "Applied Regression Analysis", 3rd ed., §6.1), or the fitted m is within
// 0.02 of one half. The 99.9 % level and the 0.02 band are this project's choice.
const F_LEVEL = 0.999;
const LINEAR_M_BAND = 0.02;

/** The 99.9 % point of F(1, ν) (f-distribution.ts: the inverse of the regularised incomplete beta). */
export function fCritical(df2: number, level = F_LEVEL): number {
  return fQuantile(level, 1, df2);
}

const fmt = (v: number, digits = 3) => v.toPrecision(digits);

export function fitTaper(input: TaperInput): TaperFit {
  const { x, y, order, total, totalSource } = normaliseTaper(input);
  const n = x.length;
  let mean = 0;
  for (const v of y) mean += v;
  mean /= n;
  let sst = 0;
  for (const v of y) sst += (v - mean) ** 2;

  const fits = TAPER_LAWS.map((law) => ({ law, ...fitLaw(law, x, y) }));
  const r2Of = (ssr: number) => (sst > 0 ? 1 - ssr / sst : ssr === 0 ? 1 : 0);
  const rmsOf = (ssr: number) => Math.sqrt(ssr / n) * 100;
  const candidates: TaperCandidate[] = fits.map((f) => ({ law: f.law, m: f.m, r2: r2Of(f.ssr), rmsPct: rmsOf(f.ssr) }));

  const linear = fits[0] as (typeof fits)[number];
  let best = fits.slice(1).reduce((a, b) => (b.ssr < a.ssr ? b : a));
  const df2 = Math.max(1, n - 1);
  const fStat = best.ssr > 0 ? (linear.ssr - best.ssr) / (best.ssr / df2) : linear.ssr > 0 ? Infinity : 0;
  if (fStat < fCritical(df2) || Math.abs(best.m - 0.5) <= LINEAR_M_BAND) best = linear;
  if (input.forceLaw !== undefined) best = fits.find((f) => f.law === input.forceLaw) ?? best;

  let maxAbs = 0;
  for (let i = 0; i < n; i++) {
    maxAbs = Math.max(maxAbs, Math.abs((y[i] as number) - taperLawValue(best.law, best.m, x[i] as number)));
  }

  // Monotonicity: a reading lower than the one before it by more than the tolerance.
  const tolerance = ((input.monotonicTolerancePct ?? 0.5) / 100) * total;
  const monotonicBreaks: TaperFit['monotonicBreaks'] = [];
  for (let k = 1; k < n; k++) {
    const prev = input.points[order[k - 1] as number] as TaperPoint;
    const cur = input.points[order[k] as number] as TaperPoint;
    if (prev.resistance - cur.resistance > tolerance) monotonicBreaks.push({ index: order[k] as number, rotation: cur.rotation });
  }

  const first = input.points[order[0] as number] as TaperPoint;
  const last = input.points[order[n - 1] as number] as TaperPoint;
  let end: number | null = null;
  if (last.resistanceW3 !== undefined && Number.isFinite(last.resistanceW3)) end = last.resistanceW3;
  else if ((totalSource === 'sweep-r13' || totalSource === 'bench-reading') && (x[n - 1] as number) >= FULL_ROTATION_X) {
    end = Math.max(0, total - last.resistance);
  }

  let halfSumMismatch: number | null = null;
  for (const p of input.points) {
    if (p.resistanceW3 === undefined || !Number.isFinite(p.resistanceW3) || !Number.isFinite(p.resistance)) continue;
    const d = p.resistance + p.resistanceW3 - total;
    if (halfSumMismatch === null || Math.abs(d) > Math.abs(halfSumMismatch)) halfSumMismatch = d;
  }

  const totalDeviationPct = input.nominal !== undefined && input.nominal > 0 ? ((total - input.nominal) / input.nominal) * 100 : null;

  const flags: TaperFlag[] = [];
  if (totalDeviationPct !== null && input.tolerancePct !== undefined && Math.abs(totalDeviationPct) > input.tolerancePct) {
    flags.push({
      code: 'total-out-of-tolerance',
      message: `R13 ${formatValue(total, 'Ω')} is ${formatPercent(totalDeviationPct)} from nominal ${formatValue(input.nominal as number, 'Ω')} (tolerance ±${input.tolerancePct} %).`,
    });
  }
  const profile = input.profile;
  if (profile?.law !== undefined) {
    const ok = profile.law === 'audio-any' ? best.law === 'audio' || best.law === 'two-segment' : best.law === profile.law;
    if (!ok) flags.push({ code: 'law-outside-profile', message: `Best-fitting law is ${best.law}; the profile expects ${profile.law}.` });
  }
  if ((profile?.mMin !== undefined && best.m < profile.mMin) || (profile?.mMax !== undefined && best.m > profile.mMax)) {
    flags.push({
      code: 'm-outside-profile',
      message: `Mid-rotation value ${fmt(best.m * 100)} % is outside the profile's ${profile?.mMin !== undefined ? fmt(profile.mMin * 100) : '–'}…${profile?.mMax !== undefined ? fmt(profile.mMax * 100) : '–'} %.`,
    });
  }
  if (profile?.maxEndResistance !== undefined) {
    const limit = profile.maxEndResistance;
    const high = [
      first.resistance > limit ? `start ${formatValue(first.resistance, 'Ω')}` : null,
      end !== null && end > limit ? `end ${formatValue(end, 'Ω')}` : null,
    ].filter(Boolean);
    if (high.length > 0)
      flags.push({
        code: 'end-resistance-high',
        message: `End resistance too high (${high.join(', ')}; limit ${formatValue(limit, 'Ω')}).`,
      });
  }
  if (monotonicBreaks.length > 0) {
    flags.push({
      code: 'non-monotonic',
      message: `Resistance falls as rotation rises at ${monotonicBreaks.length} reading(s), first at rotation ${fmt((monotonicBreaks[0] as { rotation: number }).rotation)}: a scratchy or damaged track.`,
    });
  }

  return {
    law: best.law,
    m: best.m,
    total,
    totalSource,
    totalDeviationPct,
    r2: r2Of(best.ssr),
    rmsPct: rmsOf(best.ssr),
    maxPct: maxAbs * 100,
    endResistance: { start: first.resistance, end },
    monotonicBreaks,
    halfSumMismatch,
    candidates,
    flags,
    engineVersion: ANALYSIS_ENGINE_VERSION,
  };
}
