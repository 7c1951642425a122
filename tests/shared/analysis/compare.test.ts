import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { mean as ssMean, sampleStandardDeviation } from 'simple-statistics';
import {
  compareTapers,
  curveEnvelope,
  dialAtLevel,
  interpolateOnGrid,
  loadedTaper,
  LOADED_DIAL,
  matchLoadedTapers,
  normalisedCurve,
  rotationGrid,
  taperDistanceDb,
  volumeNetlist,
  type ComparePot,
} from '@shared/analysis/compare';
import { lotStatistics, summaryStatistics } from '@shared/analysis/lot-stats';
import { simulate } from '@shared/circuit/metrics';
import type { Netlist } from '@shared/circuit/netlist';
import { lawValue, taperLawValue, type TaperLawKind } from '@shared/taper/law';

function pot(partId: number, lot: number, law: TaperLawKind, m: number, total: number, step = 10): ComparePot {
  const points = [];
  for (let deg = 0; deg <= 300; deg += step) points.push({ x: deg / 300, r: total * taperLawValue(law, m, deg / 300) });
  return {
    partId,
    label: `P${partId}`,
    lotId: lot,
    lotCode: `L${lot}`,
    supplier: lot === 1 ? 'North' : 'South',
    nominal: 500e3,
    taperClass: law,
    taperM: m,
    fit: {
      law,
      m,
      r2: 0.999,
      rmsPct: 0.1,
      maxPct: 0.3,
      total,
      totalDeviationPct: (total / 500e3 - 1) * 100,
      endResistance: { start: 0, end: null },
    },
    curve: normalisedCurve(points, total),
  };
}

describe('group statistics', () => {
  const pots = [
    pot(1, 1, 'audio', 0.12, 480e3),
    pot(2, 1, 'audio', 0.15, 510e3),
    pot(3, 1, 'audio', 0.17, 530e3),
    pot(4, 2, 'audio', 0.2, 455e3),
    pot(5, 2, 'two-segment', 0.1, 520e3),
  ];

  it('m and total of each group equal summaryStatistics and lotStatistics of the same fits (the measurement engine)', () => {
    const r = compareTapers(pots, 'lot');
    expect(r.groups.map((g) => g.label)).toEqual(['L1', 'L2']);
    const l1 = r.groups[0]!;
    expect(l1.m).toEqual(summaryStatistics([0.12, 0.15, 0.17]));
    const lot = lotStatistics({ values: [480e3, 510e3, 530e3], nominal: 500e3, tolerancePct: 20 });
    for (const k of ['n', 'mean', 'sd', 'median', 'q1', 'q3', 'min', 'max'] as const) expect(l1.total![k]).toBe(lot[k]);
    // Independent library (simple-statistics) for the mean and sample SD.
    expect(l1.total!.mean).toBeCloseTo(ssMean([480e3, 510e3, 530e3]), 6);
    expect(l1.total!.sd!).toBeCloseTo(sampleStandardDeviation([480e3, 510e3, 530e3]), 6);
    expect(r.groups[1]!.taperClass).toBeNull(); // two classes in lot 2: no single nominal law
  });

  it('grouping by supplier and by nothing', () => {
    expect(compareTapers(pots, 'supplier').groups.map((g) => [g.label, g.partIds])).toEqual([
      ['North', [1, 2, 3]],
      ['South', [4, 5]],
    ]);
    const all = compareTapers(pots, 'none').groups;
    expect(all).toHaveLength(1);
    expect(all[0]!.m!.n).toBe(5);
  });

  it('a group of one pot has no SD (null, not NaN) and no ±2σ band', () => {
    const r = compareTapers([pots[0]!], 'lot');
    expect(r.groups[0]!.m!.sd).toBeNull();
    expect(r.groups[0]!.envelope.lower2Sd.every((v) => v === null)).toBe(true);
  });
});

describe('curves on a common grid', () => {
  it('linear interpolation reproduces a piecewise-linear curve exactly and leaves the outside empty', () => {
    const grid = rotationGrid(11);
    const y = interpolateOnGrid({ x: [0.1, 0.5, 0.9], y: [0.1, 0.3, 0.9] }, grid);
    expect(y[0]).toBeNull();
    expect(y[10]).toBeNull();
    expect(y[1]).toBeCloseTo(0.1, 14);
    expect(y[3]).toBeCloseTo(0.2, 14); // halfway between (0.1, 0.1) and (0.5, 0.3)
    expect(y[7]).toBeCloseTo(0.6, 14); // halfway between (0.5, 0.3) and (0.9, 0.9)
  });

  it('mean and ±2σ envelopes agree with simple-statistics pointwise', () => {
    const slopes = [0.9, 1.0, 1.05, 1.2];
    const grid = rotationGrid(21);
    const curves = slopes.map((a) => grid.map((x) => a * x));
    const env = curveEnvelope(curves, grid.length);
    grid.forEach((x, i) => {
      const vals = slopes.map((a) => a * x);
      expect(env.mean[i]).toBeCloseTo(ssMean(vals), 12);
      expect(env.min[i]).toBe(Math.min(...vals));
      expect(env.max[i]).toBe(Math.max(...vals));
      if (x > 0) expect(env.upper2Sd[i]! - env.mean[i]!).toBeCloseTo(2 * sampleStandardDeviation(vals), 12);
    });
  });

  it('a pot measured only over part of the rotation is left out of the envelope there', () => {
    const env = curveEnvelope(
      [
        [0, 0.5, 1],
        [null, 0.7, null],
      ],
      3,
    );
    expect(env.n).toEqual([1, 2, 1]);
    expect(env.mean[1]).toBeCloseTo(0.6, 14);
  });
});

describe('loaded taper', () => {
  it('an ideal linear pot into an infinite load is 20·log10(x) (standard circuit theory: unloaded voltage divider)', () => {
    const net = volumeNetlist({ R: 1e-6, L: 0, C: 0 }, { R: 500e3, law: { kind: 'linear' } }, { id: 'amp', R: 1e15, C: 0, cableC: 0 });
    const t = loadedTaper(net);
    t.dial.forEach((d, i) => {
      if (d >= 0.1) expect(t.relativeDb[i]).toBeCloseTo(20 * Math.log10(d / 10), 6);
    });
    expect(t.relativeDb[100]).toBe(0);
    // −20 dB is x = 0.1, i.e. dial 1; −6.02 dB is x = 0.5.
    expect(dialAtLevel(t.dial, t.relativeDb, -20)).toBeCloseTo(1, 6);
    expect(dialAtLevel(t.dial, t.relativeDb, 20 * Math.log10(0.5))).toBeCloseTo(5, 6);
    // −6 dB: x = 10^(−6/20) = 0.50119; interpolating in dB between dial 5.0 and 5.1 errs by < 1e-3.
    expect(dialAtLevel(t.dial, t.relativeDb, -6)).toBeCloseTo(10 * 10 ** (-6 / 20), 3);
  });

  it('with a real pickup and load it matches a hand Thévenin/divider calculation at 1 kHz (standard circuit theory)', () => {
    const pickup = { R: 8e3, L: 4.4, C: 120e-12, Rp: 300e3 };
    const R = 500e3;
    const law = { kind: 'audio', m: 0.15 } as const;
    const load = { id: 'amp' as const, R: 1e6, C: 0, cableC: 300e-12 };
    const t = loadedTaper(volumeNetlist(pickup, { R, law }, load));
    // Complex arithmetic written out here, apart from the engine's MNA solver.
    type C = [number, number];
    const add = (a: C, b: C): C => [a[0] + b[0], a[1] + b[1]];
    const mul = (a: C, b: C): C => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
    const inv = (a: C): C => {
      const d = a[0] * a[0] + a[1] * a[1];
      return [a[0] / d, -a[1] / d];
    };
    const par = (a: C, b: C): C => inv(add(inv(a), inv(b)));
    const w = 2 * Math.PI * 1000;
    const zSeries: C = [pickup.R, w * pickup.L];
    const zShunt = par([0, -1 / (w * pickup.C)], [pickup.Rp, 0]); // C ∥ Rp across the terminals
    const vth = mul(zShunt, inv(add(zSeries, zShunt))); // Thévenin voltage per volt of EMF
    const zth = par(zSeries, zShunt);
    const zLoad = par([load.R, 0], [0, -1 / (w * load.cableC)]);
    const level = (x: number) => {
      const y = lawValue(law, x);
      const low = par([Math.max(R * y, 1e-3), 0], zLoad);
      const h = mul(vth, mul(low, inv(add(add(zth, [Math.max(R * (1 - y), 1e-3), 0]), low))));
      return 10 * Math.log10(h[0] ** 2 + h[1] ** 2);
    };
    const ref = level(1);
    t.dial.forEach((d, i) => expect(t.relativeDb[i]).toBeCloseTo(level(d / 10) - ref, 6));
    expect(t.levelDb[100]).toBeCloseTo(ref, 8);
  });

  it('equals the harness engine (simulate) on the same network built by hand with the netlist types', () => {
    const net: Netlist = {
      parts: [
        { kind: 'pickup', id: 'pu', hot: 'h', cold: '0', R: 6e3, L: 2.5, C: 100e-12 },
        { kind: 'pot', id: 'vol', a: '0', b: 'h', w: 'out', R: 250e3, law: { kind: 'two-segment', m: 0.1 }, knob: 'volume' },
        { kind: 'capacitor', id: 'cab', a: 'out', b: '0', C: 600e-12 },
        { kind: 'resistor', id: 'amp', a: 'out', b: '0', R: 470e3 },
      ],
    };
    const ours = loadedTaper(
      volumeNetlist(
        { R: 6e3, L: 2.5, C: 100e-12 },
        { R: 250e3, law: { kind: 'two-segment', m: 0.1 } },
        { id: 'amp', R: 470e3, C: 0, cableC: 600e-12 },
      ),
    );
    const full = simulate(net, { volume: 10, tone: 10 }, [1000, 2000]).metrics.level1kDb;
    for (const d of [0.5, 2, 3.3, 5, 7.5, 10]) {
      const i = LOADED_DIAL.findIndex((v) => Math.abs(v - d) < 1e-9);
      const engine = simulate(net, { volume: d, tone: 10 }, [1000, 2000]).metrics.level1kDb - full;
      expect(ours.relativeDb[i]).toBeCloseTo(engine, 9);
    }
  });

  it('a dial level never reached gives null', () => {
    expect(dialAtLevel([0, 5, 10], [-3, -1, 0], -6)).toBeNull();
  });
});

describe('matching loaded tapers', () => {
  const base = LOADED_DIAL.map((d) => (d === 0 ? -170 : 20 * Math.log10(d / 10)));
  const shifted = (db: number) => base.map((v, i) => (i === 100 ? 0 : v + db));

  it('the distance ignores levels below the floor and counts a curve crossing it early up to the floor', () => {
    const deep = base.map((v) => (v < -40 ? v - 30 : v));
    expect(taperDistanceDb(base, deep, -40)).toBe(0);
    expect(taperDistanceDb(shifted(0), shifted(0.7), -40)).toBeCloseTo(0.7, 12);
  });

  it('pairs: the tightest pairs first, within the tolerance', () => {
    const curves = [shifted(0), shifted(0.35), shifted(0.5), shifted(2), shifted(2.1)];
    const pairs = matchLoadedTapers(curves, { toleranceDb: 1, setSize: 2 });
    expect(pairs.map((p) => p.indices)).toEqual([
      [3, 4],
      [1, 2],
    ]);
    expect(pairs[0]!.spreadDb).toBeCloseTo(0.1, 9);
    expect(pairs[1]!.spreadDb).toBeCloseTo(0.15, 9);
    const triples = matchLoadedTapers(curves, { toleranceDb: 0.6, setSize: 3 });
    expect(triples.map((p) => p.indices)).toEqual([[0, 1, 2]]);
  });

  it('every set is within tolerance, sets are disjoint, and the first pair is the globally closest (brute force)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: -3, max: 3, noNaN: true }), { minLength: 2, maxLength: 12 }),
        fc.integer({ min: 2, max: 4 }),
        (offsets, size) => {
          const curves = offsets.map((o) => shifted(o));
          const sets = matchLoadedTapers(curves, { toleranceDb: 0.8, setSize: size });
          const seen = new Set<number>();
          for (const s of sets) {
            expect(s.indices).toHaveLength(size);
            for (const i of s.indices) {
              expect(seen.has(i)).toBe(false);
              seen.add(i);
              for (const j of s.indices) expect(taperDistanceDb(curves[i]!, curves[j]!)).toBeLessThanOrEqual(0.8 + 1e-12);
            }
          }
          if (size === 2) {
            let best = Infinity;
            for (let i = 0; i < curves.length; i++)
              for (let j = i + 1; j < curves.length; j++) best = Math.min(best, taperDistanceDb(curves[i]!, curves[j]!));
            if (best <= 0.8) expect(sets[0]!.spreadDb).toBe(best);
            else expect(sets).toEqual([]);
          }
        },
      ),
    );
  });
});
