// Taper comparison (docs/screens.md, Compare): group statistics of fitted pots, mean curves with
// spread envelopes on a common rotation grid, the loaded volume taper in dB through the harness
// engine, and matching of pots whose loaded tapers track.
//
// - Group statistics of m and of the total use summaryStatistics (lot-stats.ts), so a group's
//   figures are exactly what the measurement engine reports for the same values.
// - Curves are put on a common grid by linear interpolation between neighbouring readings; a grid
//   point outside a pot's measured rotation range gets no value (it is not extrapolated).
// - The ±2σ envelope is mean ± 2·(sample SD) at each grid point, pointwise; with fewer than two
//   curves at a point there is no SD and no ±2σ band.
// - The loaded taper is the level at 1 kHz (docs/computation.md §6: LEVEL_FREQUENCY) of a small netlist:
//   pickup → volume pot (lug 3 to the pickup's hot, wiper to the output, lug 1 to ground) → cable
//   capacitance and amplifier input resistance from the output to ground, relative to full rotation.
import { summaryStatistics, type SummaryStatistics } from './lot-stats';
import { LEVEL_FREQUENCY } from '@shared/circuit/metrics';
import { GROUND, OUTPUT, type Netlist } from '@shared/circuit/netlist';
import { loadParts, type LoadSetting } from '@shared/circuit/loads';
import { compileHarness, solve } from '@shared/circuit/solver';
import type { TaperLaw, TaperLawKind } from '@shared/taper/law';

export type GroupBy = 'lot' | 'supplier' | 'none';

/** One pot as the comparison sees it: who it is, its current taper fit and its measured curve. */
export interface ComparePot {
  partId: number;
  label: string;
  lotId: number | null;
  lotCode: string | null;
  supplier: string | null;
  nominal: number | null;
  taperClass: string | null;
  /** The class's mid-rotation value as recorded on the part (fraction), if any. */
  taperM: number | null;
  fit: {
    law: TaperLawKind;
    m: number;
    r2: number;
    rmsPct: number;
    maxPct: number;
    total: number;
    totalDeviationPct: number | null;
    endResistance: { start: number; end: number | null };
  };
  /** Measured curve: x = rotation fraction, y = R1W / total (the fit's total), sorted by x. */
  curve: { x: number[]; y: number[] };
}

/** Rotation fraction and R1W (Ω) of a stored sweep → x, y = R1W / total, sorted by rotation. */
export function normalisedCurve(points: readonly { x: number; r: number }[], total: number): { x: number[]; y: number[] } {
  if (!(total > 0)) throw new RangeError('The total resistance must be positive to normalise a curve.');
  const sorted = points.filter((p) => Number.isFinite(p.x) && Number.isFinite(p.r)).sort((a, b) => a.x - b.x);
  return { x: sorted.map((p) => p.x), y: sorted.map((p) => p.r / total) };
}

/** n equally spaced rotation fractions from 0 to 1, both included (101 → steps of 0.01). */
export function rotationGrid(n = 101): number[] {
  if (!Number.isInteger(n) || n < 2) throw new RangeError('A rotation grid needs at least two points.');
  return Array.from({ length: n }, (_, i) => (i === n - 1 ? 1 : i / (n - 1)));
}

/**
 * The curve linearly interpolated at each grid point; null outside the curve's x range. Readings at
 * the same rotation are averaged first, so a repeated reading does not make a vertical step.
 */
export function interpolateOnGrid(curve: { x: readonly number[]; y: readonly number[] }, grid: readonly number[]): (number | null)[] {
  const xs: number[] = [];
  const ys: number[] = [];
  for (let i = 0; i < curve.x.length;) {
    const x = curve.x[i]!;
    let sum = 0;
    let k = 0;
    while (i < curve.x.length && curve.x[i] === x) {
      sum += curve.y[i]!;
      k++;
      i++;
    }
    xs.push(x);
    ys.push(sum / k);
  }
  const out: (number | null)[] = [];
  let j = 0;
  const eps = 1e-9;
  for (const g of grid) {
    if (xs.length === 0 || g < xs[0]! - eps || g > xs[xs.length - 1]! + eps) {
      out.push(null);
      continue;
    }
    while (j < xs.length - 2 && xs[j + 1]! < g) j++;
    while (j > 0 && xs[j]! > g) j--;
    if (xs.length === 1) {
      out.push(ys[0]!);
      continue;
    }
    const x0 = xs[j]!;
    const x1 = xs[j + 1]!;
    const t = Math.min(1, Math.max(0, (g - x0) / (x1 - x0)));
    out.push(ys[j]! + t * (ys[j + 1]! - ys[j]!));
  }
  return out;
}

export interface CurveEnvelope {
  /** Number of curves with a value at each grid point. */
  n: number[];
  mean: (number | null)[];
  min: (number | null)[];
  max: (number | null)[];
  /** mean − 2·SD and mean + 2·SD (sample SD); null where fewer than two curves have a value. */
  lower2Sd: (number | null)[];
  upper2Sd: (number | null)[];
}

/** Pointwise mean, min–max and ±2σ over curves already on one grid. */
export function curveEnvelope(curves: readonly (readonly (number | null)[])[], gridSize: number): CurveEnvelope {
  const env: CurveEnvelope = { n: [], mean: [], min: [], max: [], lower2Sd: [], upper2Sd: [] };
  for (let i = 0; i < gridSize; i++) {
    const values: number[] = [];
    for (const c of curves) {
      const v = c[i];
      if (v !== null && v !== undefined && Number.isFinite(v)) values.push(v);
    }
    env.n.push(values.length);
    if (values.length === 0) {
      env.mean.push(null);
      env.min.push(null);
      env.max.push(null);
      env.lower2Sd.push(null);
      env.upper2Sd.push(null);
      continue;
    }
    const s = summaryStatistics(values);
    env.mean.push(s.mean);
    env.min.push(s.min);
    env.max.push(s.max);
    const sdOk = values.length >= 2 && Number.isFinite(s.sd);
    env.lower2Sd.push(sdOk ? s.mean - 2 * s.sd : null);
    env.upper2Sd.push(sdOk ? s.mean + 2 * s.sd : null);
  }
  return env;
}

/** Summary statistics with the SD as null (not NaN) when there is only one value, so it survives JSON. */
export type GroupFigures = Omit<SummaryStatistics, 'sd'> & { sd: number | null };

function figures(values: number[]): GroupFigures | null {
  if (values.length === 0) return null;
  const s = summaryStatistics(values);
  return { ...s, sd: Number.isFinite(s.sd) ? s.sd : null };
}

export interface CompareGroup {
  key: string;
  label: string;
  partIds: number[];
  /** Statistics of the fitted m (fraction) and of the total (Ω) over the group's pots. */
  m: GroupFigures | null;
  total: GroupFigures | null;
  /** The nominal law of the group's taper class, when all its pots share one class. */
  taperClass: string | null;
  envelope: CurveEnvelope;
}

export interface CompareResult {
  grid: number[];
  /** Each pot's measured curve on the grid (same order as the input pots). */
  gridCurves: (number | null)[][];
  groups: CompareGroup[];
}

/** The group a pot belongs to, with a label for people. */
export function groupOf(pot: Pick<ComparePot, 'lotId' | 'lotCode' | 'supplier'>, groupBy: GroupBy): { key: string; label: string } {
  if (groupBy === 'lot')
    return pot.lotId !== null
      ? { key: `lot:${pot.lotId}`, label: pot.lotCode ?? `Lot ${pot.lotId}` }
      : { key: 'lot:none', label: 'No lot' };
  if (groupBy === 'supplier')
    return pot.supplier ? { key: `supplier:${pot.supplier}`, label: pot.supplier } : { key: 'supplier:none', label: 'No supplier' };
  return { key: 'all', label: 'All pots' };
}

/** Puts every pot's curve on the grid and computes each group's statistics and envelopes. */
export function compareTapers(pots: readonly ComparePot[], groupBy: GroupBy, gridSize = 101): CompareResult {
  const grid = rotationGrid(gridSize);
  const gridCurves = pots.map((p) => interpolateOnGrid(p.curve, grid));
  const byKey = new Map<string, { label: string; members: number[] }>();
  pots.forEach((p, i) => {
    const g = groupOf(p, groupBy);
    const entry = byKey.get(g.key) ?? { label: g.label, members: [] };
    entry.members.push(i);
    byKey.set(g.key, entry);
  });
  const groups: CompareGroup[] = [...byKey.entries()]
    .sort((a, b) => a[1].label.localeCompare(b[1].label, undefined, { numeric: true }))
    .map(([key, { label, members }]) => {
      const classes = new Set(members.map((i) => pots[i]!.taperClass));
      return {
        key,
        label,
        partIds: members.map((i) => pots[i]!.partId),
        m: figures(members.map((i) => pots[i]!.fit.m)),
        total: figures(members.map((i) => pots[i]!.fit.total)),
        taperClass: classes.size === 1 ? ([...classes][0] ?? null) : null,
        envelope: curveEnvelope(
          members.map((i) => gridCurves[i]!),
          grid.length,
        ),
      };
    });
  return { grid, gridCurves, groups };
}

// ---------------------------------------------------------------------------------------------
// Loaded taper

export interface PickupModel {
  /** Ω */
  R: number;
  /** H */
  L: number;
  /** F */
  C: number;
  /** Ω, parallel loss; absent or null = none */
  Rp?: number | null;
}

/** Pickup → volume pot (the pot's fitted law and total) → the load of loads.ts (cable and input). */
export function volumeNetlist(pickup: PickupModel, pot: { R: number; law: TaperLaw }, load: LoadSetting): Netlist {
  const parts: Netlist['parts'] = [
    {
      kind: 'pickup',
      id: 'pickup',
      hot: 'hot',
      cold: GROUND,
      R: pickup.R,
      L: pickup.L,
      C: pickup.C,
      ...(pickup.Rp ? { Rp: pickup.Rp } : {}),
    },
    { kind: 'pot', id: 'volume', a: GROUND, b: 'hot', w: OUTPUT, R: pot.R, law: pot.law, knob: 'volume' },
    ...loadParts(load),
  ];
  return { title: 'Loaded volume taper', parts };
}

/** Dial settings 0, 0.1, …, 10 (101 points). */
export const LOADED_DIAL: readonly number[] = Array.from({ length: 101 }, (_, i) => i / 10);

export interface LoadedTaper {
  dial: number[];
  /** |V_out/E| at 1 kHz, dB. */
  levelDb: number[];
  /** levelDb minus the level at full rotation (the last dial setting), dB. */
  relativeDb: number[];
}

/** The level at 1 kHz at each dial setting (last setting = full rotation = the 0 dB reference). */
export function loadedTaper(netlist: Netlist, dial: readonly number[] = LOADED_DIAL): LoadedTaper {
  const compiled = compileHarness(netlist);
  const f = [LEVEL_FREQUENCY];
  const out = { re: new Float64Array(1), im: new Float64Array(1) };
  const levelDb = dial.map((v) => {
    solve(compiled, { volume: v, tone: 10 }, f, out);
    return 10 * Math.log10(out.re[0]! ** 2 + out.im[0]! ** 2);
  });
  const ref = levelDb[levelDb.length - 1]!;
  return { dial: [...dial], levelDb, relativeDb: levelDb.map((l) => l - ref) };
}

/**
 * The dial setting at which the relative level first reaches `targetDb` coming down from full
 * rotation, linearly interpolated between the two neighbouring settings; null when never reached.
 */
export function dialAtLevel(dial: readonly number[], relativeDb: readonly number[], targetDb: number): number | null {
  for (let i = relativeDb.length - 1; i > 0; i--) {
    const hi = relativeDb[i]!;
    const lo = relativeDb[i - 1]!;
    if (hi >= targetDb && lo < targetDb) {
      const t = (targetDb - lo) / (hi - lo);
      return dial[i - 1]! + t * (dial[i]! - dial[i - 1]!);
    }
  }
  return null;
}

// ---------------------------------------------------------------------------------------------
// Matching

/**
 * How far apart two loaded tapers are: the largest |difference| in dB over the dial grid, with both
 * curves first raised to `floorDb` (levels below it are treated as the floor). Below about −40 dB a
 * volume control is practically off, and near the end stop the level falls towards −∞ where tiny
 * differences in end resistance make huge dB differences that nobody hears; clamping at the floor
 * keeps those out while a curve that crosses the floor earlier than the other is still counted up to
 * the floor. (−40 dB as "practically off": common practice (no published source).)
 */
export function taperDistanceDb(a: readonly number[], b: readonly number[], floorDb = -40): number {
  let worst = 0;
  const n = Math.min(a.length, b.length);
  for (let i = 0; i < n; i++) {
    const d = Math.abs(Math.max(a[i]!, floorDb) - Math.max(b[i]!, floorDb));
    if (d > worst) worst = d;
  }
  return worst;
}

export interface LoadedMatch {
  /** Indices into the input curves, ascending. */
  indices: number[];
  /** Largest pairwise distance inside the set, dB. */
  spreadDb: number;
}

/**
 * Sets of `setSize` curves whose pairwise distances are all within `toleranceDb`. Greedy: every
 * round, each unused curve seeds a set by adding its nearest unused neighbours that stay within the
 * tolerance of every member; the tightest of those sets (smallest spread) is taken and its members
 * are used up; repeat until no set can be formed. For pairs this takes the closest remaining pair
 * first. It does not promise the largest possible number of sets (that is a maximum matching / set
 * packing problem); it promises that each set taken was the tightest available at its turn.
 */
export function matchLoadedTapers(
  curves: readonly (readonly number[])[],
  options: { toleranceDb: number; setSize: number; floorDb?: number },
): LoadedMatch[] {
  const { toleranceDb, setSize } = options;
  const floorDb = options.floorDb ?? -40;
  if (!(toleranceDb > 0)) throw new RangeError('The tolerance must be more than 0 dB.');
  if (!Number.isInteger(setSize) || setSize < 2) throw new RangeError('A matched set has at least two pots.');
  const n = curves.length;
  const dist: number[][] = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) {
    for (let j = i + 1; j < n; j++) {
      const d = taperDistanceDb(curves[i]!, curves[j]!, floorDb);
      dist[i]![j] = d;
      dist[j]![i] = d;
    }
  }
  const used = new Array<boolean>(n).fill(false);
  const sets: LoadedMatch[] = [];
  for (;;) {
    let best: LoadedMatch | null = null;
    for (let seed = 0; seed < n; seed++) {
      if (used[seed]) continue;
      const neighbours = [];
      for (let j = 0; j < n; j++) if (j !== seed && !used[j] && dist[seed]![j]! <= toleranceDb) neighbours.push(j);
      if (neighbours.length < setSize - 1) continue;
      neighbours.sort((a, b) => dist[seed]![a]! - dist[seed]![b]! || a - b);
      const members = [seed];
      let spread = 0;
      for (const j of neighbours) {
        if (members.length === setSize) break;
        let worst = 0;
        let fits = true;
        for (const k of members) {
          const d = dist[j]![k]!;
          if (d > toleranceDb) {
            fits = false;
            break;
          }
          if (d > worst) worst = d;
        }
        if (!fits) continue;
        members.push(j);
        if (worst > spread) spread = worst;
      }
      if (members.length < setSize) continue;
      if (!best || spread < best.spreadDb) best = { indices: members.sort((a, b) => a - b), spreadDb: spread };
    }
    if (!best) break;
    for (const i of best.indices) used[i] = true;
    sets.push(best);
  }
  return sets;
}
