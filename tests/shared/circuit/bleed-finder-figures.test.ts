// The treble-bleed finder's figures (shared/circuit/bleed-finder.ts) recomputed here from their
// definitions with the general simulation (simulateInstrument at 200 Hz, 1 kHz and 3 kHz), and its
// candidate values against the IEC 60063 series typed in the test.
import { describe, expect, it } from 'vitest';
import {
  BLEED_TOPOLOGIES,
  FINDER_VOLUMES,
  bleedCurves,
  bleedFigures,
  findBleed,
  preferredValuesBetween,
  type BleedTopology,
} from '@shared/circuit/bleed-finder';
import { buildLayoutNetlist, getLayout, layoutKnobs, resolveLayoutConfig, volumeKnobs, type LayoutConfig } from '@shared/circuit/layouts';
import { simulateInstrument } from '@shared/circuit/metrics';

// IEC 60063:2015, the E12 and E24 series (two significant figures).
const E12 = [10, 12, 15, 18, 22, 27, 33, 39, 47, 56, 68, 82];
const E24 = [10, 11, 12, 13, 15, 16, 18, 20, 22, 24, 27, 30, 33, 36, 39, 43, 47, 51, 56, 62, 68, 75, 82, 91];

/** Series values b·10^e for every decade e in `decades`, within [lo, hi], ascending. */
function seriesValues(series: number[], decades: number[], lo: number, hi: number): number[] {
  return decades.flatMap((e) => series.map((b) => b * 10 ** e)).filter((v) => v >= lo * (1 - 1e-12) && v <= hi * (1 + 1e-12));
}

function expectSameValues(actual: number[], expected: number[]) {
  expect(actual).toHaveLength(expected.length);
  actual.forEach((v, i) => expect(v / expected[i]! - 1).toBeCloseTo(0, 12));
}

describe('preferredValuesBetween', () => {
  it('the E12 capacitors of the finder (100 pF – 4.7 nF) and the E24 resistors (47 kΩ – 1 MΩ), both ends included, ascending', () => {
    expectSameValues(preferredValuesBetween('E12', 100e-12, 4.7e-9), seriesValues(E12, [-11, -10], 100e-12, 4.7e-9));
    expect(preferredValuesBetween('E12', 100e-12, 4.7e-9)).toHaveLength(21);
    expectSameValues(preferredValuesBetween('E24', 47e3, 1e6), seriesValues(E24, [3, 4, 5], 47e3, 1e6));
  });

  it('a range that starts and ends between series values', () => {
    expectSameValues(preferredValuesBetween('E12', 50, 200), [56, 68, 82, 100, 120, 150, 180]);
  });
});

describe('the finder’s figures, from their definitions', () => {
  // Levels at the finder's volumes (all volume knobs turned together), by the general simulation.
  function levels(net: ReturnType<typeof buildLayoutNetlist>, volumes: string[], knobs: Record<string, number>) {
    return FINDER_VOLUMES.map((v) => {
      const k = { ...knobs };
      for (const id of volumes) k[id] = v;
      const [l200, l1k, l3k] = simulateInstrument(net, k, [200, 1000, 3000]).magnitudeDb;
      return { l1k: l1k!, treble: l3k! - l200! };
    });
  }

  function expected(
    layoutId: string,
    options: Record<string, string>,
    bleed: { topology: BleedTopology; bleedC: number; bleedR?: number },
    weight: number,
  ) {
    const layout = getLayout(layoutId)!;
    const { config, problems } = resolveLayoutConfig(layout, { selector: layout.selector.positions.length > 1 ? 1 : 0, options });
    expect(problems).toEqual([]);
    const knobs = layoutKnobs(layout);
    const volumes = volumeKnobs(layout);
    // The bleed values of every volume: 'bleedC' beside 'volume', 'neck.bleedC' beside 'neck.volume'.
    const values = { ...config.values };
    for (const id of volumes) {
      values[id.replace(/volume$/, 'bleedC')] = bleed.bleedC;
      if (bleed.bleedR !== undefined) values[id.replace(/volume$/, 'bleedR')] = bleed.bleedR;
    }
    const withBleed: LayoutConfig = { ...config, values, options: { ...config.options, bleed: bleed.topology } };
    const without: LayoutConfig = { ...config, options: { ...config.options, bleed: 'none' } };
    const x = levels(buildLayoutNetlist(layout, withBleed), volumes, knobs);
    const ref = levels(buildLayoutNetlist(layout, without), volumes, knobs);
    const retention = x.map((p) => p.treble - x[0]!.treble);
    const spread = Math.max(...retention) - Math.min(...retention);
    const deviation = Math.sqrt(x.reduce((s, p, i) => s + (p.l1k - ref[i]!.l1k) ** 2, 0) / x.length);
    return { layout, config, knobs, spread, deviation, score: weight * spread + (1 - weight) * deviation, x, ref };
  }

  const cases: {
    layoutId: string;
    options: Record<string, string>;
    bleed: { topology: BleedTopology; bleedC: number; bleedR?: number };
  }[] = [
    { layoutId: 'one-pickup', options: {}, bleed: { topology: 'cap', bleedC: 1.5e-9 } },
    {
      layoutId: 'one-pickup',
      options: { bleed: 'cap', load: 'low-impedance-pedal' },
      bleed: { topology: 'cap-series-r', bleedC: 680e-12, bleedR: 220e3 },
    },
    { layoutId: 'two-pickups-3way', options: {}, bleed: { topology: 'cap-parallel-r', bleedC: 1e-9, bleedR: 150e3 } },
  ];

  for (const c of cases) {
    it(`${c.layoutId}, ${c.bleed.topology}${c.options.load ? ', into a pedal' : ''}: spread, deviation and score (default weight 0.7)`, () => {
      const e = expected(c.layoutId, c.options, c.bleed, 0.7);
      const f = bleedFigures(e.layout, e.config, e.knobs, c.bleed);
      expect(f.trebleSpreadDb).toBeCloseTo(e.spread, 9);
      expect(f.taperDeviationDb).toBeCloseTo(e.deviation, 9);
      expect(f.score).toBeCloseTo(e.score, 9);
      // The bleed does something here, so a figure that ignored it would differ.
      expect(e.deviation).toBeGreaterThan(0.01);

      const curves = bleedCurves(e.layout, e.config, e.knobs, c.bleed);
      curves.level1kDb.forEach((l, i) => expect(l).toBeCloseTo(e.x[i]!.l1k - e.ref[0]!.l1k, 9));
      curves.trebleDb.forEach((t, i) => expect(t).toBeCloseTo(e.x[i]!.treble - e.x[0]!.treble, 9));
      const none = bleedCurves(e.layout, e.config, e.knobs, { topology: 'none' });
      none.level1kDb.forEach((l, i) => expect(l).toBeCloseTo(e.ref[i]!.l1k - e.ref[0]!.l1k, 9));
    });
  }

  it('findBleed: the three topologies, every candidate named by its own values, figures as bleedFigures gives them', () => {
    expect(BLEED_TOPOLOGIES).toEqual(['cap', 'cap-parallel-r', 'cap-series-r']);
    const layout = getLayout('one-pickup')!;
    const { config } = resolveLayoutConfig(layout, { options: { load: 'low-impedance-pedal' } });
    const knobs = layoutKnobs(layout);
    const { candidates, evaluated } = findBleed(layout, config, knobs, { count: 1000, weight: 0.5 });
    expect(candidates).toHaveLength(evaluated);
    for (const t of BLEED_TOPOLOGIES) {
      const of = candidates.filter((x) => x.topology === t);
      expect(of.length, t).toBe(t === 'cap' ? 21 : 21 * 17);
      for (const x of of) expect(Object.keys(x.values).sort(), t).toEqual(t === 'cap' ? ['bleedC'] : ['bleedC', 'bleedR']);
    }
    for (const x of [candidates[0]!, candidates[200]!, candidates[evaluated - 1]!]) {
      const f = bleedFigures(layout, config, knobs, { topology: x.topology, ...x.values }, 0.5);
      expect(x.figures.trebleSpreadDb).toBeCloseTo(f.trebleSpreadDb, 9);
      expect(x.figures.taperDeviationDb).toBeCloseTo(f.taperDeviationDb, 9);
      expect(x.figures.score).toBeCloseTo(0.5 * f.trebleSpreadDb + 0.5 * f.taperDeviationDb, 9);
    }
  });
});
