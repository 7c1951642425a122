// Statistics of a lot: the readings of one quantity over many parts of the same nominal value.
// One native sort (see lot-sort.ts) and a few linear passes over typed arrays; no object per value.
//
// Sources of the formulas:
// - Mean and sample standard deviation (n − 1) by the corrected two-pass algorithm: Chan, Golub &
//   LeVeque (1983), "Algorithms for computing the sample variance: analysis and recommendations",
//   The American Statistician 37(3), eq. 1.7; the first-pass sum is compensated (Neumaier 1974).
// - Quartiles: Hyndman & Fan (1996) definition 7 (linear interpolation; see lot-sort.ts).
// - Cp = (USL − LSL)/(6σ), Cpk = min(USL − μ, μ − LSL)/(3σ): NIST/SEMATECH e-Handbook of
//   Statistical Methods, §6.1.6 "What is Process Capability?", with σ estimated by the sample SD.
//   With asymmetric limits (a Z lot, −20 %/+80 %) both are computed from the limits as they are:
//   Cp still compares the spread with the width USL − LSL, whose middle is not the nominal, so it
//   says what the lot could do if centred between the limits, not on nominal; Cpk (nearer limit)
//   is the figure that describes the lot as it is. `asymmetric` and `midpoint` say so.
// - Outliers: Tukey's fences Q1 − 1.5·IQR and Q3 + 1.5·IQR (J. W. Tukey, Exploratory Data
//   Analysis, 1977; NIST/SEMATECH e-Handbook §7.1.6 "inner fences").
// - Histogram bin width: 2·IQR·n^(−1/3), Freedman & Diaconis (1981), "On the histogram as a density
//   estimator: L2 theory", Z. Wahrscheinlichkeitstheorie verw. Gebiete 57.

import { orderByKey, quantileSorted7, sortWithIndex } from './lot-sort';
import { limitsFromTolerance } from './verdict';

export interface SummaryStatistics {
  n: number;
  mean: number;
  /** Sample standard deviation (n − 1); NaN when n < 2. */
  sd: number;
  median: number;
  q1: number;
  q3: number;
  min: number;
  max: number;
}

export interface LotInput {
  values: ArrayLike<number>;
  nominal: number;
  /** Percent below nominal; also above it unless tolerancePlusPct is given. */
  tolerancePct: number;
  /** Percent above nominal (80 on a Z lot); default: tolerancePct. */
  tolerancePlusPct?: number;
  /** A second quantity per part (dissipation factor, ESR…) with its upper limit. */
  second?: { values: ArrayLike<number>; max: number };
  /** Parts whose values agree within this percentage form matched sets (see matchSets). */
  matchPct?: number;
  /** Fixed size of each matched set (e.g. 2 for pairs); omitted: sets as large as they come. */
  setSize?: number;
  /** Deviation-bin edges in percent, ascending; default: see defaultBinEdgesPct. */
  binEdgesPct?: number[];
  /** List the indices of the parts in each deviation bin (memory: one number per part). */
  withBinIndices?: boolean;
}

export interface DeviationBin {
  label: string;
  /** Bounds in percent of nominal; the outer bins reach −Infinity / +Infinity. */
  fromPct: number;
  toPct: number;
  count: number;
  indices?: number[];
}

export interface MatchedSet {
  /** Original indices of the parts, in ascending order of value. */
  indices: number[];
  /** (largest − smallest) / smallest × 100. */
  spreadPct: number;
  meanValue: number;
}

export interface LotStatistics extends SummaryStatistics {
  lower: number;
  upper: number;
  /** True when the limits are not symmetric about nominal (then Cp is measured about `midpoint`, not nominal). */
  asymmetric: boolean;
  /** (lower + upper) / 2: the centre Cp assumes. */
  midpoint: number;
  /** null when the SD is 0 or undefined (n < 2). */
  cp: number | null;
  cpk: number | null;
  /** Parts below the lower / above the upper limit (limits inclusive, as in verdict.ts). */
  countBelow: number;
  countAbove: number;
  outliers: { lowFence: number; highFence: number; indices: number[] };
  histogram: { binWidth: number; edges: number[]; counts: number[] };
  bins: DeviationBin[];
  matchedSets: MatchedSet[];
  secondFailures?: number[];
  /** (value − nominal)/|nominal| × 100 for each part, in input order. */
  deviationsPct: Float64Array;
}

/** Histograms with more bins than this are not useful on a screen; the width is then widened. */
export const MAX_HISTOGRAM_BINS = 1000;

function toFiniteFloat64(values: ArrayLike<number>, what: string): Float64Array {
  const n = values.length;
  const x = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const v = values[i]!;
    if (!Number.isFinite(v)) {
      throw new RangeError(`${what}: value ${i + 1} (index ${i}) is not a finite number (${String(v)}).`);
    }
    x[i] = v;
  }
  return x;
}

/** Neumaier-compensated sum (Neumaier 1974), so the first-pass mean is correctly rounded in practice. */
function compensatedSum(x: Float64Array): number {
  let sum = 0;
  let c = 0;
  for (let i = 0; i < x.length; i++) {
    const v = x[i]!;
    const t = sum + v;
    c += Math.abs(sum) >= Math.abs(v) ? sum - t + v : v - t + sum;
    sum = t;
  }
  return sum + c;
}

/**
 * SD from the corrected two-pass sums with the squares taken of d / spread (spread = the largest
 * |x − m0|), so that neither squaring overflows at 1e200 nor underflows at 1e-200 (the scaling
 * LAPACK's dnrm2 uses, Anderson 2017 "Algorithm 978: Safe scaling in the Level 1 BLAS").
 * s1 is the plain sum of d, s2 the sum of (d / spread)².
 */
function scaledSd(s1: number, s2: number, inv: number, spread: number, n: number): number {
  if (n < 2) return NaN;
  const s1s = s1 * inv;
  const v = Math.max(0, (s2 - (s1s * s1s) / n) / (n - 1));
  return spread > 0 ? spread * Math.sqrt(v) : 0;
}

/** Mean and sample SD by the corrected two-pass algorithm (Chan, Golub & LeVeque 1983, eq. 1.7). */
function meanSd(x: Float64Array): { mean: number; sd: number } {
  const n = x.length;
  if (n === 0) return { mean: NaN, sd: NaN };
  const m0 = compensatedSum(x) / n;
  let spread = 0;
  for (let i = 0; i < n; i++) spread = Math.max(spread, Math.abs(x[i]! - m0));
  const inv = spread > 0 ? 1 / spread : 1;
  let s1 = 0;
  let s2 = 0;
  for (let i = 0; i < n; i++) {
    const d = x[i]! - m0;
    const ds = d * inv;
    s1 += d;
    s2 += ds * ds;
  }
  const mean = m0 + s1 / n;
  return { mean, sd: scaledSd(s1, s2, inv, spread, n) };
}

function summaryFromSorted(sorted: Float64Array, mean: number, sd: number): SummaryStatistics {
  const n = sorted.length;
  return {
    n,
    mean,
    sd,
    median: quantileSorted7(sorted, 0.5),
    q1: quantileSorted7(sorted, 0.25),
    q3: quantileSorted7(sorted, 0.75),
    min: sorted[0]!,
    max: sorted[n - 1]!,
  };
}

/** n, mean, sample SD, median, quartiles (Hyndman–Fan 7), min and max of finite values. */
export function summaryStatistics(values: ArrayLike<number>): SummaryStatistics {
  const x = toFiniteFloat64(values, 'summaryStatistics');
  if (x.length === 0) throw new RangeError('summaryStatistics needs at least one value.');
  const { mean, sd } = meanSd(x);
  const sorted = x.slice().sort();
  return summaryFromSorted(sorted, mean, sd);
}

/**
 * Default deviation-bin edges, scaled to the tolerance t: ±t, ±t/2, ±t/4, ±t/10 and 0. For
 * t = 20 % these are −20, −10, −5, −2, 0, 2, 5, 10, 20 %; for t = 5 %: −5, −2.5, −1.25, −0.5, 0, ….
 * Parts outside ±t fall in the two open outer bins ("below" / "above" the limits).
 */
export function defaultBinEdgesPct(tolerancePct: number, tolerancePlusPct: number = tolerancePct): number[] {
  const t = tolerancePct;
  const u = tolerancePlusPct;
  // Each side scaled to its own tolerance (−20 %/+80 %: −20, −10, −5, −2, 0, 8, 20, 40, 80 %);
  // a side of 0 % (−0/+100) has no inner edges.
  const below = t > 0 ? [-t, -t / 2, -t / 4, -t / 10] : [];
  const above = u > 0 ? [u / 10, u / 4, u / 2, u] : [];
  return [...below, 0, ...above].map((e) => Number(e.toPrecision(12)));
}

function pctText(e: number): string {
  const s = String(Number(e.toPrecision(3)));
  return e > 0 ? `+${s}` : e < 0 ? `−${s.slice(1)}` : '0';
}

export function lotStatistics(input: LotInput): LotStatistics {
  const { nominal, tolerancePct } = input;
  const tolerancePlusPct = input.tolerancePlusPct ?? tolerancePct;
  if (!Number.isFinite(nominal) || nominal === 0) throw new RangeError('lotStatistics needs a finite, non-zero nominal.');
  if (
    !Number.isFinite(tolerancePct) ||
    !Number.isFinite(tolerancePlusPct) ||
    tolerancePct < 0 ||
    tolerancePlusPct < 0 ||
    tolerancePct + tolerancePlusPct <= 0
  )
    throw new RangeError('lotStatistics needs a tolerance above 0 %.');
  const x = toFiniteFloat64(input.values, 'lotStatistics');
  const n = x.length;
  if (n === 0) throw new RangeError('lotStatistics needs at least one value.');

  const { lower, upper } = limitsFromTolerance(nominal, { minusPct: tolerancePct, plusPct: tolerancePlusPct });
  const m0 = compensatedSum(x) / n;
  // The original index of each sorted value is only needed for matched sets; without them a
  // plain native sort of a copy is enough (and ~3 ms cheaper for 100 000 values).
  const wantSets = input.matchPct !== undefined;
  const { sorted, order } = wantSets ? sortWithIndex(x) : { sorted: x.slice().sort(), order: null };
  const q1 = quantileSorted7(sorted, 0.25);
  const q3 = quantileSorted7(sorted, 0.75);
  const min = sorted[0]!;
  const max = sorted[n - 1]!;
  const iqr = q3 - q1;
  const lowFence = q1 - 1.5 * iqr;
  const highFence = q3 + 1.5 * iqr;

  // Histogram layout (Freedman–Diaconis), widened so that both limits are inside.
  const hLo = Math.min(min, lower);
  const hHi = Math.max(max, upper);
  const range = hHi - hLo;
  let binWidth = (2 * iqr) / Math.cbrt(n);
  let nBins: number;
  if (!(binWidth > 0) || !Number.isFinite(binWidth)) {
    // IQR of 0 (most parts read the same): Sturges' rule, ⌈log2 n⌉ + 1 bins (Sturges 1926).
    nBins = Math.ceil(Math.log2(n)) + 1;
    binWidth = range > 0 ? range / nBins : Math.abs(hLo) * 1e-3 || 1;
  } else {
    nBins = Math.max(1, Math.ceil(range / binWidth));
    if (nBins > MAX_HISTOGRAM_BINS) {
      nBins = MAX_HISTOGRAM_BINS;
      binWidth = range / nBins;
    }
  }
  const histCounts = new Int32Array(nBins);
  const edges: number[] = new Array<number>(nBins + 1);
  for (let i = 0; i <= nBins; i++) edges[i] = hLo + i * binWidth;
  if (edges[nBins]! < hHi) edges[nBins] = hHi;

  // Deviation bins: edges e0 < … < ek−1; bin 0 is below e0, bins 1…k−1 are [e_i−1, e_i) with the
  // last one closed, bin k is above ek−1.
  const customEdges = input.binEdgesPct !== undefined;
  const be = customEdges ? [...input.binEdgesPct!] : defaultBinEdgesPct(tolerancePct, tolerancePlusPct);
  if (be.length < 2 || be.some((e, i) => !Number.isFinite(e) || (i > 0 && e <= be[i - 1]!))) {
    throw new RangeError('binEdgesPct needs at least two finite, strictly ascending edges.');
  }
  const k = be.length;
  const binCounts = new Int32Array(k + 1);
  const withIdx = input.withBinIndices === true;
  const binIndices: number[][] | null = withIdx ? Array.from({ length: k + 1 }, () => []) : null;
  const first = be[0]!;
  const last = be[k - 1]!;

  const deviationsPct = new Float64Array(n);
  const outlierIdx: number[] = [];
  let countBelow = 0;
  let countAbove = 0;
  let s1 = 0;
  let s2 = 0;
  const spread = Math.max(max - m0, m0 - min);
  const inv = spread > 0 ? 1 / spread : 1;
  const invNom = 100 / Math.abs(nominal); // as in verdict.ts, so a negative nominal keeps "below" below
  const invW = 1 / binWidth;
  for (let i = 0; i < n; i++) {
    const v = x[i]!;
    const d = v - m0;
    const ds = d * inv;
    s1 += d;
    s2 += ds * ds;
    const dev = (v - nominal) * invNom;
    deviationsPct[i] = dev;
    const below = v < lower;
    const above = v > upper;
    if (below) countBelow++;
    else if (above) countAbove++;
    if (v < lowFence || v > highFence) outlierIdx.push(i);
    let hb = Math.floor((v - hLo) * invW);
    if (hb >= nBins) hb = nBins - 1;
    else if (hb < 0) hb = 0;
    histCounts[hb]!++;
    // Default edges: the outer bins are decided on the values, like countBelow/countAbove, so
    // rounding in the percentage cannot put a part on the wrong side of a limit.
    let b: number;
    if (customEdges ? dev < first : below) b = 0;
    else if (customEdges ? dev > last : above) b = k;
    else {
      b = 1;
      while (b < k - 1 && dev >= be[b]!) b++;
    }
    binCounts[b]!++;
    if (binIndices !== null) binIndices[b]!.push(i);
  }
  const mean = m0 + s1 / n;
  const sd = scaledSd(s1, s2, inv, spread, n);
  const capable = n >= 2 && sd > 0;
  // NIST/SEMATECH e-Handbook §6.1.6.
  const cp = capable ? (upper - lower) / (6 * sd) : null;
  const cpk = capable ? Math.min(upper - mean, mean - lower) / (3 * sd) : null;

  const bins: DeviationBin[] = [];
  for (let b = 0; b <= k; b++) {
    const fromPct = b === 0 ? -Infinity : be[b - 1]!;
    const toPct = b === k ? Infinity : be[b]!;
    const label = b === 0 ? `< ${pctText(first)} %` : b === k ? `> ${pctText(last)} %` : `${pctText(fromPct)} … ${pctText(toPct)} %`;
    const bin: DeviationBin = { label, fromPct, toPct, count: binCounts[b]! };
    if (binIndices !== null) bin.indices = binIndices[b]!;
    bins.push(bin);
  }

  const result: LotStatistics = {
    n,
    mean,
    sd,
    median: quantileSorted7(sorted, 0.5),
    q1,
    q3,
    min,
    max,
    lower,
    upper,
    asymmetric: tolerancePct !== tolerancePlusPct,
    midpoint: (lower + upper) / 2,
    cp,
    cpk,
    countBelow,
    countAbove,
    outliers: { lowFence, highFence, indices: outlierIdx },
    histogram: { binWidth, edges, counts: Array.from(histCounts) },
    bins,
    matchedSets: order === null ? [] : matchSets(sorted, order, input.matchPct!, input.setSize),
    deviationsPct,
  };

  if (input.second !== undefined) {
    const sv = input.second.values;
    const smax = input.second.max;
    if (sv.length !== n) {
      throw new RangeError(`The second quantity has ${sv.length} values for ${n} parts.`);
    }
    const failures: number[] = [];
    // A missing reading (NaN) is not a failure: it is unknown. Infinity is a failure.
    for (let i = 0; i < n; i++) if (sv[i]! > smax) failures.push(i);
    result.secondFailures = failures;
  }
  return result;
}

/**
 * Matched sets over the values in ascending order (each set is a run of neighbours in that order).
 * A set qualifies when (largest − smallest) ≤ matchPct % of the smallest; only positive values match.
 * - With setSize k: slide along the sorted values; where the k values starting here qualify, take
 *   them and continue after them, otherwise move on by one. Taking the earliest-ending qualifying
 *   run is interval scheduling's greedy choice, so this finds the largest number of disjoint sets
 *   of k consecutive values. Sets are listed tightest first (smallest spread).
 * - Without setSize: from the smallest value not yet used, take every following value within
 *   matchPct of it; runs of two or more are sets. This is the classic greedy cover, which uses the
 *   fewest sets. Sets are listed largest first, then tightest.
 * Linear after the sort, plus sorting the (at most n/2) sets.
 */
export function matchSets(sorted: Float64Array, order: Uint32Array, matchPct: number, setSize?: number): MatchedSet[] {
  if (!Number.isFinite(matchPct) || matchPct < 0) throw new RangeError('matchPct must be a finite number ≥ 0.');
  if (setSize !== undefined && (!Number.isInteger(setSize) || setSize < 2)) {
    throw new RangeError('setSize must be a whole number ≥ 2.');
  }
  const n = sorted.length;
  const f = matchPct / 100;
  // Runs found are kept in typed arrays and ordered with one native sort; objects are made only
  // for the result (a comparator sort of 50 000 pair objects took ~60 ms, this takes a few).
  const starts = new Int32Array(Math.floor(n / 2) + 1);
  const ends = new Int32Array(starts.length);
  const spread = new Float64Array(starts.length);
  const means = new Float64Array(starts.length);
  let count = 0;
  const record = (i: number, j: number) => {
    let sum = 0;
    for (let t = i; t <= j; t++) sum += sorted[t]!;
    const a = sorted[i]!;
    starts[count] = i;
    ends[count] = j;
    spread[count] = ((sorted[j]! - a) / a) * 100;
    means[count] = sum / (j - i + 1);
    count++;
  };
  if (setSize !== undefined) {
    let i = 0;
    while (i + setSize <= n) {
      const a = sorted[i]!;
      const b = sorted[i + setSize - 1]!;
      if (a > 0 && b - a <= f * a) {
        record(i, i + setSize - 1);
        i += setSize;
      } else i++;
    }
  } else {
    let i = 0;
    while (i < n) {
      const a = sorted[i]!;
      if (!(a > 0)) {
        i++;
        continue;
      }
      const lim = f * a;
      let j = i;
      while (j + 1 < n && sorted[j + 1]! - a <= lim) j++;
      if (j > i) record(i, j);
      i = j + 1;
    }
  }
  // Sort key: spread (tightest first); without a fixed size, size first (largest first). The
  // spread is at most matchPct, so −size·(2·matchPct + 2) + spread orders by size, then spread.
  const keys = new Float64Array(count);
  const step = 2 * matchPct + 2;
  for (let s = 0; s < count; s++) {
    keys[s] = setSize !== undefined ? spread[s]! : -(ends[s]! - starts[s]! + 1) * step + spread[s]!;
  }
  const setOrder = orderByKey(keys, means.subarray(0, count));
  const sets: MatchedSet[] = new Array<MatchedSet>(count);
  for (let r = 0; r < count; r++) {
    const s = setOrder[r]!;
    const i = starts[s]!;
    const j = ends[s]!;
    const indices = new Array<number>(j - i + 1);
    for (let t = i; t <= j; t++) indices[t - i] = order[t]!;
    sets[r] = { indices, spreadPct: spread[s]!, meanValue: means[s]! };
  }
  return sets;
}
