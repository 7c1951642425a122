// Figures of a harness response (docs/computation.md §6): the curve in dB and degrees, the resonant peak,
// the corner above it, the level at 1 kHz, and over knob sweeps the volume taper, the treble
// retention and an interaction index. Every figure at a named frequency (1 kHz, 200 Hz, 3 kHz) and
// every refined peak or corner is computed with extra exact solves, not read off the curve.
import type { Knobs, Netlist } from './netlist';
import {
  compileHarness,
  prepareFrequencies,
  setKnobs,
  solve,
  solveGroups,
  solvePoint,
  solvePrepared,
  type CompiledHarness,
} from './solver';

/** n frequencies from fStart to fStop, equally spaced on a log axis (both ends included). */
export function logFrequencies(fStart = 20, fStop = 20000, count = 151): Float64Array {
  const f = new Float64Array(count);
  if (count === 1) {
    f[0] = fStart;
    return f;
  }
  const ratio = Math.log(fStop / fStart) / (count - 1);
  for (let k = 0; k < count; k++) f[k] = fStart * Math.exp(ratio * k);
  f[count - 1] = fStop;
  return f;
}

/** The default axis: 151 points from 20 Hz to 20 kHz (50 a decade, as ngspice's `.ac dec 50 20 20k`). */
export const DEFAULT_FREQUENCIES: Float64Array = logFrequencies(20, 20000, 151);

export const LEVEL_FREQUENCY = 1000;
export const TREBLE_FREQUENCY = 3000;
export const BASS_FREQUENCY = 200;

/**
 * 10/ln 10: power ratio in dB as DB_PER_LN·ln(|H|²). Math.log is quicker than Math.log10
 * in V8 and the product differs from 10·log10 by a rounding or two (~1e-15 relative).
 */
const DB_PER_LN = 10 / Math.LN10;

function asCompiled(x: Netlist | CompiledHarness): CompiledHarness {
  return 'size' in x ? x : compileHarness(x);
}

/** |V(out)/E| in dB at one frequency for the knob setting last stamped. */
function levelDb(c: CompiledHarness, f: number): number {
  solvePoint(c, f);
  return DB_PER_LN * Math.log(c.hRe * c.hRe + c.hIm * c.hIm);
}

/**
 * Below this level everywhere in the swept range the output is "no signal": −120 dB of a pickup's
 * ~100 mV is 0.1 µV, under the input noise of any amplifier (common practice, no published source).
 * A volume pot at 0 leaves only its 1 mΩ clamp (netlist.ts), about −170 dB: no peak to speak of.
 */
export const NO_SIGNAL_DB = -120;

export interface ResponseMetrics {
  /** True when the whole curve lies below NO_SIGNAL_DB: the other figures then describe nothing audible. */
  noSignal: boolean;
  /**
   * The highest point of the curve. When it lies inside the swept range it is refined by a
   * golden-section search on the log-frequency axis with exact solves (to 1e-9 of a decade);
   * `interior` is false when the maximum sits at either end of the range (no resonant peak there).
   */
  peak: { frequency: number; levelDb: number; interior: boolean };
  /** Peak level above the level at the first (lowest) swept frequency, dB. */
  peakRiseDb: number;
  /** Level at the first (lowest) swept frequency, dB: the reference for `cornerHz`. */
  lowFrequencyDb: number;
  /**
   * The −3 dB corner: the first frequency above the peak where the level falls 3 dB below the
   * low-frequency level `lowFrequencyDb` (the usual low-pass corner of the loaded pickup; found by
   * bisection on the log axis with exact solves). null when the curve does not fall that far in range.
   */
  cornerHz: number | null;
  /** The first frequency above the peak where the level is 3 dB below the peak itself; null if not in range. */
  peakMinus3DbHz: number | null;
  /** Level at 1 kHz, dB (exact solve). */
  level1kDb: number;
}

export interface SimulationResult {
  frequencies: Float64Array;
  magnitudeDb: Float64Array;
  phaseDeg: Float64Array;
  metrics: ResponseMetrics;
}

const GOLDEN = (Math.sqrt(5) - 1) / 2;

/** Golden-section search for the maximum of the level on [lo, hi] (log10 frequency). */
function refinePeak(c: CompiledHarness, lo: number, hi: number): { frequency: number; levelDb: number } {
  let a = lo;
  let b = hi;
  let x1 = b - GOLDEN * (b - a);
  let x2 = a + GOLDEN * (b - a);
  let f1 = levelDb(c, 10 ** x1);
  let f2 = levelDb(c, 10 ** x2);
  while (b - a > 1e-9) {
    if (f1 < f2) {
      a = x1;
      x1 = x2;
      f1 = f2;
      x2 = a + GOLDEN * (b - a);
      f2 = levelDb(c, 10 ** x2);
    } else {
      b = x2;
      x2 = x1;
      f2 = f1;
      x1 = b - GOLDEN * (b - a);
      f1 = levelDb(c, 10 ** x1);
    }
  }
  const x = (a + b) / 2;
  return { frequency: 10 ** x, levelDb: levelDb(c, 10 ** x) };
}

/** First downward crossing of `target` dB after index `from`, refined by bisection on log f. */
function crossingAbove(
  c: CompiledHarness,
  freqs: ArrayLike<number>,
  db: ArrayLike<number>,
  from: number,
  startFrequency: number,
  target: number,
): number | null {
  let lo = Math.log10(startFrequency);
  for (let k = from + 1; k < freqs.length; k++) {
    if (db[k]! <= target) {
      let hi = Math.log10(freqs[k]!);
      const lastAbove = Math.log10(freqs[k - 1]!);
      if (lastAbove > lo) lo = lastAbove;
      while (hi - lo > 1e-10) {
        const mid = (lo + hi) / 2;
        if (levelDb(c, 10 ** mid) > target) lo = mid;
        else hi = mid;
      }
      return 10 ** ((lo + hi) / 2);
    }
  }
  return null;
}

/** Metrics of one curve already solved for the knob setting last stamped into `c`. */
function curveMetrics(c: CompiledHarness, freqs: ArrayLike<number>, db: ArrayLike<number>): ResponseMetrics {
  const m = freqs.length;
  let iMax = 0;
  for (let k = 1; k < m; k++) if (db[k]! > db[iMax]!) iMax = k;
  const interior = iMax > 0 && iMax < m - 1;
  const peak = interior
    ? { ...refinePeak(c, Math.log10(freqs[iMax - 1]!), Math.log10(freqs[iMax + 1]!)), interior }
    : { frequency: freqs[iMax]!, levelDb: db[iMax]!, interior };
  const lowFrequencyDb = db[0]!;
  return {
    noSignal: !(db[iMax]! >= NO_SIGNAL_DB),
    peak,
    peakRiseDb: peak.levelDb - lowFrequencyDb,
    lowFrequencyDb,
    cornerHz: crossingAbove(c, freqs, db, iMax, peak.frequency, lowFrequencyDb - 3),
    peakMinus3DbHz: crossingAbove(c, freqs, db, iMax, peak.frequency, peak.levelDb - 3),
    level1kDb: levelDb(c, LEVEL_FREQUENCY),
  };
}

/** The response of a harness at one knob setting, with its figures. */
export function simulate(
  harness: Netlist | CompiledHarness,
  knobs: Knobs,
  frequencies: ArrayLike<number> = DEFAULT_FREQUENCIES,
): SimulationResult {
  const c = asCompiled(harness);
  const m = frequencies.length;
  const h = solve(c, knobs, frequencies);
  const magnitudeDb = new Float64Array(m);
  const phaseDeg = new Float64Array(m);
  for (let k = 0; k < m; k++) {
    const re = h.re[k]!;
    const im = h.im[k]!;
    magnitudeDb[k] = DB_PER_LN * Math.log(re * re + im * im);
    phaseDeg[k] = (Math.atan2(im, re) * 180) / Math.PI;
  }
  return { frequencies: Float64Array.from(frequencies), magnitudeDb, phaseDeg, metrics: curveMetrics(c, frequencies, magnitudeDb) };
}

/** One pickup's own transfer (its sources alone, the others silent). */
export interface PickupCurve {
  pickupId: string;
  magnitudeDb: Float64Array;
  phaseDeg: Float64Array;
}

export interface InstrumentResult {
  frequencies: Float64Array;
  magnitudeDb: Float64Array;
  phaseDeg: Float64Array;
  /** null when the output is cancelled */
  metrics: ResponseMetrics | null;
  /** 'cancelled': the sources oppose and cancel (no figure of the sum means anything) */
  signal: 'present' | 'cancelled';
  /** 'no signal (cancelled)' when cancelled */
  note: string | null;
  perPickup: PickupCurve[];
}

/**
 * How far below the largest pickup contribution the sum must sit at every frequency to count as
 * cancelled: 1e-9 in amplitude (180 dB), far below any real difference between pickups and far
 * above the rounding left when identical sources oppose (about 1e-16).
 */
export const CANCELLED_RATIO = 1e-9;

/** A level in dB that stays finite for an exact zero (−400 dB, below anything audible or measurable). */
function dbOf(re: number, im: number): number {
  const p = re * re + im * im;
  return p > 0 ? DB_PER_LN * Math.log(p) : -400;
}

/**
 * The response of a whole instrument at one knob setting: the sum of every pickup's transfer (unit
 * sources, reversed ones negated), each pickup's own transfer, and the figures of the sum, or "no
 * signal (cancelled)" when the sources cancel.
 */
export function simulateInstrument(
  harness: Netlist | CompiledHarness,
  knobs: Knobs,
  frequencies: ArrayLike<number> = DEFAULT_FREQUENCIES,
): InstrumentResult {
  const c = asCompiled(harness);
  const m = frequencies.length;
  const { total, groups } = solveGroups(c, knobs, frequencies);
  const magnitudeDb = new Float64Array(m);
  const phaseDeg = new Float64Array(m);
  let cancelled = true;
  for (let k = 0; k < m; k++) {
    const re = total.re[k]!;
    const im = total.im[k]!;
    magnitudeDb[k] = dbOf(re, im);
    phaseDeg[k] = (Math.atan2(im, re) * 180) / Math.PI;
    let largest = 0;
    for (const g of groups) largest = Math.max(largest, Math.hypot(g.re[k]!, g.im[k]!));
    if (Math.hypot(re, im) > CANCELLED_RATIO * largest) cancelled = false;
  }
  // Each pickup's own transfer: the sum of its sources (a dual-coil pickup has two).
  const pickupIds = [...new Set(c.pickupOf)];
  const perPickup = pickupIds.map((pickupId) => {
    const db = new Float64Array(m);
    const deg = new Float64Array(m);
    for (let k = 0; k < m; k++) {
      let re = 0;
      let im = 0;
      groups.forEach((g, i) => {
        if (c.pickupOf[i] === pickupId) {
          re += g.re[k]!;
          im += g.im[k]!;
        }
      });
      db[k] = dbOf(re, im);
      deg[k] = (Math.atan2(im, re) * 180) / Math.PI;
    }
    return { pickupId, magnitudeDb: db, phaseDeg: deg };
  });
  return {
    frequencies: Float64Array.from(frequencies),
    magnitudeDb,
    phaseDeg,
    metrics: cancelled ? null : curveMetrics(c, frequencies, magnitudeDb),
    signal: cancelled ? 'cancelled' : 'present',
    note: cancelled ? 'no signal (cancelled)' : null,
    perPickup,
  };
}

export interface KnobGrid {
  frequencies: Float64Array;
  volume: readonly number[];
  tone: readonly number[];
  /** Curves in dB, flat: the point k of (volume index vi, tone index ti) is at ((ti·nv) + vi)·nf + k. */
  magnitudeDb: Float64Array;
  /** Level at 1 kHz, dB, at [ti·nv + vi]: the volume taper at each tone setting. */
  level1kDb: Float64Array;
  /** Level at 1 kHz relative to full volume (10) at the same tone, dB, at [ti·nv + vi]. */
  volumeTaperDb: Float64Array;
  /**
   * Treble retention, dB, at [ti·nv + vi]: (L(3 kHz) − L(200 Hz)) at the setting minus the same at
   * full volume (10) and the same tone. Negative: the volume knob darkens the sound.
   */
  trebleRetentionDb: Float64Array;
  /**
   * Interaction index, dB: the RMS over the grid of the mixed difference
   *   D(v, t) = L1k(v, t) − L1k(10, t) − L1k(v, 10) + L1k(10, 10),
   * i.e. how much the volume taper (level at 1 kHz against volume, relative to full volume) at tone
   * t differs from the taper at tone 10. D is symmetric in the two knobs (it is equally how much the
   * tone knob's effect at 1 kHz changes with the volume), and it is exactly 0 when the two knobs act
   * independently (the level separates into a volume term plus a tone term).
   */
  interactionIndexDb: number;
}

/** Returns the curve of one grid setting as a view into grid.magnitudeDb. */
export function gridCurve(grid: KnobGrid, volumeIndex: number, toneIndex: number): Float64Array {
  const nf = grid.frequencies.length;
  const start = (toneIndex * grid.volume.length + volumeIndex) * nf;
  return grid.magnitudeDb.subarray(start, start + nf);
}

/** Curves and sweep figures over every volume × tone combination. */
export function sweepKnobs(
  harness: Netlist | CompiledHarness,
  settings: { volume: readonly number[]; tone: readonly number[] },
  frequencies: ArrayLike<number> = DEFAULT_FREQUENCIES,
  axes: { volumeKnob?: string; toneKnob?: string; knobs?: Knobs } = {},
): KnobGrid {
  const c = asCompiled(harness);
  const nv = settings.volume.length;
  const nt = settings.tone.length;
  const nf = frequencies.length;
  const magnitudeDb = new Float64Array(nv * nt * nf);
  const level1kDb = new Float64Array(nv * nt);
  const volumeTaperDb = new Float64Array(nv * nt);
  const trebleRetentionDb = new Float64Array(nv * nt);
  const knobs: Record<string, number> = { ...(axes.knobs ?? {}) };
  const vk = axes.volumeKnob ?? 'volume';
  const tk = axes.toneKnob ?? 'tone';

  // References at full volume (per tone) and full tone (per volume), solved exactly rather than
  // taken from the grid, so the grid need not contain the setting 10.
  const fullVolume1k = new Float64Array(nt);
  const fullVolumeTreble = new Float64Array(nt);
  for (let ti = 0; ti < nt; ti++) {
    knobs[vk] = 10;
    knobs[tk] = settings.tone[ti]!;
    setKnobs(c, knobs);
    fullVolume1k[ti] = levelDb(c, LEVEL_FREQUENCY);
    fullVolumeTreble[ti] = levelDb(c, TREBLE_FREQUENCY) - levelDb(c, BASS_FREQUENCY);
  }
  const fullTone1k = new Float64Array(nv);
  for (let vi = 0; vi < nv; vi++) {
    knobs[vk] = settings.volume[vi]!;
    knobs[tk] = 10;
    setKnobs(c, knobs);
    fullTone1k[vi] = levelDb(c, LEVEL_FREQUENCY);
  }
  knobs[vk] = 10;
  knobs[tk] = 10;
  setKnobs(c, knobs);
  const full1k = levelDb(c, LEVEL_FREQUENCY);

  // One batch per setting: the curve's frequencies followed by the three probe frequencies.
  const probes = [LEVEL_FREQUENCY, TREBLE_FREQUENCY, BASS_FREQUENCY];
  const all = new Float64Array(nf + probes.length);
  for (let k = 0; k < nf; k++) all[k] = frequencies[k]!;
  all.set(probes, nf);
  prepareFrequencies(c, all);
  const re = new Float64Array(all.length);
  const im = new Float64Array(all.length);
  const db = (k: number) => DB_PER_LN * Math.log(re[k]! * re[k]! + im[k]! * im[k]!);

  let sumSq = 0;
  for (let ti = 0; ti < nt; ti++) {
    for (let vi = 0; vi < nv; vi++) {
      knobs[vk] = settings.volume[vi]!;
      knobs[tk] = settings.tone[ti]!;
      setKnobs(c, knobs);
      solvePrepared(c, re, im);
      const base = (ti * nv + vi) * nf;
      for (let k = 0; k < nf; k++) magnitudeDb[base + k] = DB_PER_LN * Math.log(re[k]! * re[k]! + im[k]! * im[k]!);
      const g = ti * nv + vi;
      const l1k = db(nf);
      level1kDb[g] = l1k;
      volumeTaperDb[g] = l1k - fullVolume1k[ti]!;
      trebleRetentionDb[g] = db(nf + 1) - db(nf + 2) - fullVolumeTreble[ti]!;
      const d = l1k - fullVolume1k[ti]! - fullTone1k[vi]! + full1k;
      sumSq += d * d;
    }
  }
  return {
    frequencies: Float64Array.from(frequencies),
    volume: [...settings.volume],
    tone: [...settings.tone],
    magnitudeDb,
    level1kDb,
    volumeTaperDb,
    trebleRetentionDb,
    interactionIndexDb: Math.sqrt(sumSq / (nv * nt)),
  };
}
