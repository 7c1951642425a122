// Treble-bleed finder: searches IEC 60063 values of the bleed capacitor (100 pF – 4.7 nF) and
// resistor (47 kΩ – 1 MΩ) for the three bleed topologies in a given instrument, and ranks them by
// how even the treble stays as the volume goes down and how little the volume taper moves.
//
// Figures, over the volume settings 10, 9, …, 2 (every volume knob of the layout turned together;
// the other knobs where the caller set them):
//  - treble retention at v: (L(3 kHz) − L(200 Hz)) at v minus the same at full volume;
//    trebleSpreadDb = max − min of it over the settings (0 at 10 is included);
//  - taperDeviationDb: RMS over the settings of L(1 kHz) with the candidate minus L(1 kHz) of the
//    same instrument without a bleed;
//  - score = weight · spread + (1 − weight) · deviation (lower is better; weight 1: only the treble counts).
import { E_SERIES } from '../series/e-series';
import { buildLayoutNetlist, volumeKnobs, type LayoutConfig, type LayoutDef } from './layouts';
import { compileHarness, prepareFrequencies, setKnobs, setPartValue, solvePrepared, type CompiledHarness } from './solver';

export type BleedTopology = 'cap' | 'cap-parallel-r' | 'cap-series-r';
export const BLEED_TOPOLOGIES: readonly BleedTopology[] = ['cap', 'cap-parallel-r', 'cap-series-r'];

export interface BleedCandidate {
  topology: BleedTopology;
  values: { bleedC: number; bleedR?: number };
  figures: { trebleSpreadDb: number; taperDeviationDb: number; score: number };
}

export const FINDER_VOLUMES: readonly number[] = [10, 9, 8, 7, 6, 5, 4, 3, 2];
export const FINDER_C_RANGE: readonly [number, number] = [100e-12, 4.7e-9];
export const FINDER_R_RANGE: readonly [number, number] = [47e3, 1e6];

/** The preferred values of a series between lo and hi (both included, to a part in 1e9). */
export function preferredValuesBetween(series: 'E12' | 'E24', lo: number, hi: number): number[] {
  const out: number[] = [];
  for (let exp = Math.floor(Math.log10(lo)) - 2; exp <= Math.ceil(Math.log10(hi)); exp++) {
    for (const base of E_SERIES[series]) {
      // base values are two-digit (10…91): value = base · 10^(exp − 1), rounded to 12 digits
      const v = Number((base * 10 ** (exp - 1)).toPrecision(12));
      if (v >= lo * (1 - 1e-9) && v <= hi * (1 + 1e-9)) out.push(v);
    }
  }
  return out.sort((a, b) => a - b);
}

const PROBES = new Float64Array([200, 1000, 3000]);
const DB_PER_LN = 10 / Math.LN10;

interface Levels {
  l1k: Float64Array;
  treble: Float64Array;
}

function levelsOf(layout: LayoutDef, config: LayoutConfig, knobs: Record<string, number>, volumes: readonly string[]): Levels {
  return levelsOfCompiled(compileHarness(buildLayoutNetlist(layout, config)), knobs, volumes);
}

function levelsOfCompiled(c: CompiledHarness, knobs: Record<string, number>, volumes: readonly string[]): Levels {
  prepareFrequencies(c, PROBES);
  const re = new Float64Array(3);
  const im = new Float64Array(3);
  const k: Record<string, number> = { ...knobs };
  const n = FINDER_VOLUMES.length;
  const l1k = new Float64Array(n);
  const treble = new Float64Array(n);
  FINDER_VOLUMES.forEach((v, i) => {
    for (const id of volumes) k[id] = v;
    setKnobs(c, k);
    solvePrepared(c, re, im);
    const db = (j: number) => DB_PER_LN * Math.log(re[j]! * re[j]! + im[j]! * im[j]!);
    l1k[i] = db(1);
    treble[i] = db(2) - db(0);
  });
  return { l1k, treble };
}

/** The figures of one instrument against its no-bleed reference. */
function figures(x: Levels, ref: Levels, weight: number): BleedCandidate['figures'] {
  const n = FINDER_VOLUMES.length;
  let lo = Infinity;
  let hi = -Infinity;
  let sq = 0;
  for (let i = 0; i < n; i++) {
    const t = x.treble[i]! - x.treble[0]!; // FINDER_VOLUMES[0] is full volume
    lo = Math.min(lo, t);
    hi = Math.max(hi, t);
    const d = x.l1k[i]! - ref.l1k[i]!;
    sq += d * d;
  }
  const trebleSpreadDb = hi - lo;
  const taperDeviationDb = Math.sqrt(sq / n);
  return { trebleSpreadDb, taperDeviationDb, score: weight * trebleSpreadDb + (1 - weight) * taperDeviationDb };
}

/** The value keys of the bleed parts on every volume of a layout ('bleedC', 'neck.bleedC' …). */
function bleedKeys(layout: LayoutDef): { c: string[]; r: string[]; capParts: string[]; resistorParts: string[] } {
  const prefixes = volumeKnobs(layout).map((id) => id.replace(/\.?volume$/, ''));
  const k = (p: string, n: string) => (p ? `${p}.${n}` : n);
  return {
    c: prefixes.map((p) => k(p, 'bleedC')),
    r: prefixes.map((p) => k(p, 'bleedR')),
    capParts: prefixes.map((p) => k(p, 'bleed-cap')),
    resistorParts: prefixes.map((p) => k(p, 'bleed-r')),
  };
}

/** Figures of a given bleed (or none) in an instrument, on the finder's scale (for comparisons). */
export function bleedFigures(
  layout: LayoutDef,
  config: LayoutConfig,
  knobs: Record<string, number>,
  bleed: { topology: BleedTopology | 'none'; bleedC?: number; bleedR?: number },
  weight = 0.7,
): BleedCandidate['figures'] {
  const volumes = volumeKnobs(layout);
  const keys = bleedKeys(layout);
  const ref = levelsOf(layout, { ...config, options: { ...config.options, bleed: 'none' } }, knobs, volumes);
  const values = { ...config.values };
  for (const key of keys.c) if (bleed.bleedC !== undefined) values[key] = bleed.bleedC;
  for (const key of keys.r) if (bleed.bleedR !== undefined) values[key] = bleed.bleedR;
  return figures(
    levelsOf(layout, { ...config, values, options: { ...config.options, bleed: bleed.topology } }, knobs, volumes),
    ref,
    weight,
  );
}

/**
 * The ten best bleeds for an instrument (lowest score first). `config` is the instrument as set
 * (its own bleed option is replaced by each candidate's), `knobs` the other knobs.
 */
export function findBleed(
  layout: LayoutDef,
  config: LayoutConfig,
  knobs: Record<string, number>,
  options: { series?: 'E12' | 'E24'; weight?: number; count?: number } = {},
): { candidates: BleedCandidate[]; evaluated: number } {
  const series = options.series ?? 'E12';
  const weight = options.weight ?? 0.7;
  const volumes = volumeKnobs(layout);
  const keys = bleedKeys(layout);
  const ref = levelsOf(layout, { ...config, options: { ...config.options, bleed: 'none' } }, knobs, volumes);
  const caps = preferredValuesBetween(series, FINDER_C_RANGE[0], FINDER_C_RANGE[1]);
  const resistors = preferredValuesBetween(series, FINDER_R_RANGE[0], FINDER_R_RANGE[1]);
  const all: BleedCandidate[] = [];
  for (const topology of BLEED_TOPOLOGIES) {
    // One compiled network per topology; each candidate only changes the bleed parts' values.
    const c = compileHarness(buildLayoutNetlist(layout, { ...config, options: { ...config.options, bleed: topology } }));
    const capParts = keys.capParts.filter((id) => c.fixedParts.has(id));
    const resistorParts = keys.resistorParts.filter((id) => c.fixedParts.has(id));
    for (const bleedC of caps) {
      for (const bleedR of topology === 'cap' ? [undefined] : resistors) {
        for (const id of capParts) setPartValue(c, id, bleedC);
        if (bleedR !== undefined) for (const id of resistorParts) setPartValue(c, id, bleedR);
        const x = levelsOfCompiled(c, knobs, volumes);
        all.push({ topology, values: bleedR === undefined ? { bleedC } : { bleedC, bleedR }, figures: figures(x, ref, weight) });
      }
    }
  }
  all.sort((a, b) => a.figures.score - b.figures.score);
  return { candidates: all.slice(0, options.count ?? 10), evaluated: all.length };
}

/** A bleed's curves over the finder's volumes (10, 9, …, 2), as the finder judges them (see `bleedCurves`). */
export interface BleedCurves {
  volumes: readonly number[];
  /** Level at 1 kHz, dB re the same instrument without a bleed at full volume. */
  level1kDb: Float64Array;
  /** Treble retention, dB: (L(3 kHz) − L(200 Hz)) at each volume minus the same at full volume. */
  trebleDb: Float64Array;
}

/**
 * The curves behind a candidate's figures: the 1 kHz level and the treble retention at each of the
 * finder's volumes (every volume of the layout turned together), for a bleed or for none. The
 * screen draws them for the best candidates beside the no-bleed curves.
 */
export function bleedCurves(
  layout: LayoutDef,
  config: LayoutConfig,
  knobs: Record<string, number>,
  bleed: { topology: BleedTopology | 'none'; bleedC?: number; bleedR?: number },
): BleedCurves {
  const volumes = volumeKnobs(layout);
  const keys = bleedKeys(layout);
  const ref = levelsOf(layout, { ...config, options: { ...config.options, bleed: 'none' } }, knobs, volumes);
  const values = { ...config.values };
  for (const key of keys.c) if (bleed.bleedC !== undefined) values[key] = bleed.bleedC;
  for (const key of keys.r) if (bleed.bleedR !== undefined) values[key] = bleed.bleedR;
  const x =
    bleed.topology === 'none'
      ? ref
      : levelsOf(layout, { ...config, values, options: { ...config.options, bleed: bleed.topology } }, knobs, volumes);
  return {
    volumes: FINDER_VOLUMES,
    level1kDb: x.l1k.map((l) => l - ref.l1k[0]!),
    trebleDb: x.treble.map((t) => t - x.treble[0]!),
  };
}
