// The taper comparison's helpers at their edges, against values worked by hand in this file:
// linear interpolation between neighbouring readings (repeated readings averaged), the grid, the
// groups and their labels, the dial level crossing and the matching of loaded tapers (the rules are
// the project's, docs/screens.md "Compare"; −40 dB as "practically off" is common practice, no
// published source). No simulator.
import { describe, expect, it } from 'vitest';
import {
  compareTapers,
  curveEnvelope,
  dialAtLevel,
  groupOf,
  interpolateOnGrid,
  matchLoadedTapers,
  normalisedCurve,
  rotationGrid,
  taperDistanceDb,
  volumeNetlist,
  type ComparePot,
} from '@shared/analysis/compare';

const potOf = (over: Partial<ComparePot>): ComparePot => ({
  partId: 1,
  label: 'P1',
  lotId: null,
  lotCode: null,
  supplier: null,
  nominal: null,
  taperClass: null,
  taperM: null,
  fit: {
    law: 'linear',
    m: 0.5,
    r2: 1,
    rmsPct: 0,
    maxPct: 0,
    total: 100_000,
    totalDeviationPct: null,
    endResistance: { start: 0, end: null },
  },
  curve: { x: [0, 1], y: [0, 1] },
  ...over,
});

describe('normalisedCurve and rotationGrid', () => {
  it('drops readings that are not finite, sorts by rotation and divides by the total; refuses a total that is not positive', () => {
    expect(
      normalisedCurve(
        [
          { x: 1, r: 200 },
          { x: Number.NaN, r: 5 },
          { x: 0.5, r: 100 },
          { x: 0.7, r: Number.POSITIVE_INFINITY },
        ],
        200,
      ),
    ).toEqual({ x: [0.5, 1], y: [0.5, 1] });
    for (const total of [0, -1, Number.NaN]) expect(() => normalisedCurve([{ x: 0, r: 0 }], total)).toThrow('must be positive');
  });

  it('n points from 0 to 1 with the last exactly 1; fewer than two or a fraction refused', () => {
    expect(rotationGrid(2)).toEqual([0, 1]);
    expect(rotationGrid(5)).toEqual([0, 0.25, 0.5, 0.75, 1]);
    const g = rotationGrid();
    expect(g).toHaveLength(101);
    expect(g[100]).toBe(1);
    expect(g[37]).toBe(37 / 100);
    for (const n of [1, 0, 2.5]) expect(() => rotationGrid(n)).toThrow('at least two points');
  });
});

describe('interpolateOnGrid', () => {
  it('readings at one rotation are averaged: no vertical step', () => {
    // (0, 0), (0.5, mean of 0.2 and 0.4 = 0.3), (1, 1): at 0.25 halfway to 0.3, at 0.75 halfway from 0.3 to 1.
    const y = interpolateOnGrid({ x: [0, 0.5, 0.5, 1], y: [0, 0.2, 0.4, 1] }, [0, 0.25, 0.5, 0.75, 1]);
    expect(y[0]).toBe(0);
    expect(y[1]).toBeCloseTo(0.15, 14);
    expect(y[2]).toBeCloseTo(0.3, 14);
    expect(y[3]).toBeCloseTo(0.65, 14);
    expect(y[4]).toBe(1);
  });

  it('a grid point within 1e-9 of the measured range is inside it; further out it is empty', () => {
    const c = { x: [0.2, 0.8], y: [0.2, 0.8] };
    const y = interpolateOnGrid(c, [0.2 - 5e-10, 0.2 - 1e-8, 0.8 + 5e-10, 0.8 + 1e-8, 0.2 - 1e-9, 0.8 + 1e-9]);
    expect(y[0]).toBeCloseTo(0.2, 12);
    expect(y[1]).toBeNull();
    expect(y[2]).toBeCloseTo(0.8, 12);
    expect(y[3]).toBeNull();
    // Exactly 1e-9 outside (the same floating-point sums) is still inside.
    expect(y[4]).toBeCloseTo(0.2, 12);
    expect(y[5]).toBeCloseTo(0.8, 12);
  });

  it('one reading gives its value at its own rotation only; no reading gives nothing', () => {
    expect(interpolateOnGrid({ x: [0.5], y: [0.3] }, [0.4, 0.5, 0.6])).toEqual([null, 0.3, null]);
    expect(interpolateOnGrid({ x: [], y: [] }, [0, 1])).toEqual([null, null]);
  });

  it('a grid in any order: each point is interpolated in its own segment', () => {
    const c = { x: [0, 0.2, 0.4, 0.6, 0.8, 1], y: [0, 0.1, 0.3, 0.6, 0.8, 1] };
    // By hand: 0.9 → 0.9, 0.1 → 0.05, 0.5 → 0.45, 0.3 → 0.2.
    const y = interpolateOnGrid(c, [0.9, 0.1, 0.5, 0.3]);
    [0.9, 0.05, 0.45, 0.2].forEach((v, i) => expect(y[i]).toBeCloseTo(v, 12));
  });
});

describe('curveEnvelope', () => {
  it('values that are not finite, and points past a curve’s end, are left out', () => {
    const env = curveEnvelope(
      [
        [0.2, Number.NaN, 0.4],
        [0.4, 0.5],
      ],
      3,
    );
    expect(env.n).toEqual([2, 1, 1]);
    expect(env.mean[0]).toBeCloseTo(0.3, 14);
    // Two values 0.2, 0.4: sample SD = √((0.1² + 0.1²)/1) = 0.1414…, so mean ± 2 SD.
    expect(env.upper2Sd[0]).toBeCloseTo(0.3 + 2 * Math.SQRT2 * 0.1, 12);
    expect(env.lower2Sd[0]).toBeCloseTo(0.3 - 2 * Math.SQRT2 * 0.1, 12);
    expect(env.lower2Sd[1]).toBeNull();
    expect(env.min[2]).toBe(0.4);
    expect(env.max[2]).toBe(0.4);
    // A grid point where no curve has a value: nothing at all there.
    const empty = curveEnvelope([[null, 1]], 2);
    expect(empty.n).toEqual([0, 1]);
    expect([empty.mean[0], empty.min[0], empty.max[0], empty.lower2Sd[0], empty.upper2Sd[0]]).toEqual([null, null, null, null, null]);
  });
});

describe('groups', () => {
  it('lot, supplier and no grouping: keys and labels', () => {
    expect(groupOf(potOf({ lotId: 7, lotCode: 'A-7' }), 'lot')).toEqual({ key: 'lot:7', label: 'A-7' });
    expect(groupOf(potOf({ lotId: 7 }), 'lot')).toEqual({ key: 'lot:7', label: 'Lot 7' });
    expect(groupOf(potOf({}), 'lot')).toEqual({ key: 'lot:none', label: 'No lot' });
    expect(groupOf(potOf({ supplier: 'East' }), 'supplier')).toEqual({ key: 'supplier:East', label: 'East' });
    expect(groupOf(potOf({ supplier: '' }), 'supplier')).toEqual({ key: 'supplier:none', label: 'No supplier' });
    expect(groupOf(potOf({ lotId: 7 }), 'none')).toEqual({ key: 'all', label: 'All pots' });
  });

  it('groups in natural label order (Lot 2 before Lot 10), one shared class named, the grid size as asked', () => {
    const pots = [
      potOf({ partId: 1, lotId: 10, taperClass: 'A' }),
      potOf({ partId: 2, lotId: 2, taperClass: 'A' }),
      potOf({ partId: 3, lotId: 10, taperClass: 'A' }),
      potOf({ partId: 4, lotId: 2, taperClass: 'B' }),
    ];
    const r = compareTapers(pots, 'lot', 11);
    expect(r.grid).toHaveLength(11);
    expect(r.groups.map((g) => [g.label, g.partIds, g.taperClass])).toEqual([
      ['Lot 2', [2, 4], null],
      ['Lot 10', [1, 3], 'A'],
    ]);
    expect(r.groups[0]!.envelope.n).toHaveLength(11);
    // No class on any pot: no class for the group.
    expect(compareTapers([potOf({})], 'none').groups[0]!.taperClass).toBeNull();
  });
});

describe('dialAtLevel', () => {
  it('a level met exactly at a setting gives that setting; the crossing nearest full rotation counts', () => {
    // From 10 down: 0 dB, −6 dB at 5: the −6 dB level is reached at 5 exactly.
    expect(dialAtLevel([0, 5, 10], [-10, -6, 0], -6)).toBe(5);
    // −8 dB: between 0 (−10 dB) and 5 (−6 dB), halfway: t = (−8 + 10)/4 = 0.5 → 2.5.
    expect(dialAtLevel([0, 5, 10], [-10, -6, 0], -8)).toBe(2.5);
    // Not monotonic: −6 dB is crossed between 6 and 10 and again between 0 and 3; the upper one counts.
    expect(dialAtLevel([0, 3, 6, 10], [-10, -3, -8, 0], -6)).toBe(6 + (2 / 8) * 4);
  });
});

describe('taperDistanceDb and matchLoadedTapers', () => {
  it('the distance runs over the shorter curve and uses a −40 dB floor unless told otherwise', () => {
    expect(taperDistanceDb([0, -50], [0, -45])).toBe(0);
    expect(taperDistanceDb([0, -50], [0, -45], -60)).toBe(5);
    expect(taperDistanceDb([0, -1, -2], [0, -1])).toBe(0);
    expect(taperDistanceDb([-3, -1], [0, -1, -2])).toBe(3);
  });

  it('refuses a tolerance that is not positive and a set of fewer than two or a fraction', () => {
    const c = [[0], [0]];
    for (const toleranceDb of [0, -1, Number.NaN])
      expect(() => matchLoadedTapers(c, { toleranceDb, setSize: 2 })).toThrow('more than 0 dB');
    for (const setSize of [1, 2.5]) expect(() => matchLoadedTapers(c, { toleranceDb: 1, setSize })).toThrow('at least two pots');
  });

  it('a distance exactly at the tolerance matches; a member must be within tolerance of every other member', () => {
    expect(matchLoadedTapers([[0], [0.5]], { toleranceDb: 0.5, setSize: 2 })).toEqual([{ indices: [0, 1], spreadDb: 0.5 }]);
    // −0.75 and +0.75 are each 0.75 from 0 but 1.5 from each other: no set of three within 1 dB.
    expect(matchLoadedTapers([[0], [0.75], [-0.75]], { toleranceDb: 1, setSize: 3 })).toEqual([]);
    // A set of three whose spread is the largest pairwise distance (0.5 + 0.25 = 0.75).
    expect(matchLoadedTapers([[0], [0.5], [-0.25], [9]], { toleranceDb: 1, setSize: 3 })).toEqual([{ indices: [0, 1, 2], spreadDb: 0.75 }]);
  });

  it('levels below the floor option are the floor', () => {
    expect(matchLoadedTapers([[-70], [-90]], { toleranceDb: 1, setSize: 2, floorDb: -60 })).toEqual([{ indices: [0, 1], spreadDb: 0 }]);
    expect(matchLoadedTapers([[-70], [-90]], { toleranceDb: 1, setSize: 2, floorDb: -80 })).toEqual([]);
  });

  it('the spread of a set of four is its largest pairwise distance, even when the last member added is close to all', () => {
    // Two-point curves (dB): the distance is the larger |difference| of the two points. 1 and 2 are
    // 0.4 from 0 and 0.8 apart; 3 is 0.45 from each of 0, 1 and 2 (all by hand).
    const curves = [
      [0, 0],
      [0.4, 0],
      [-0.4, 0],
      [0, 0.45],
    ];
    let widest = 0;
    for (let i = 0; i < 4; i++) for (let j = i + 1; j < 4; j++) widest = Math.max(widest, taperDistanceDb(curves[i]!, curves[j]!));
    expect(widest).toBeCloseTo(0.8, 14);
    expect(matchLoadedTapers(curves, { toleranceDb: 1, setSize: 4 })).toEqual([{ indices: [0, 1, 2, 3], spreadDb: widest }]);
  });

  it('equally tight sets: the one with the lower seed first; neighbours at equal distance taken by index', () => {
    expect(matchLoadedTapers([[4], [4.25], [0], [0.25]], { toleranceDb: 1, setSize: 2 }).map((s) => s.indices)).toEqual([
      [0, 1],
      [2, 3],
    ]);
    // Seed 0 has two neighbours at 0.5 (1 and 2): the lower index joins.
    expect(matchLoadedTapers([[0], [0.5], [-0.5]], { toleranceDb: 0.6, setSize: 2 })[0]).toEqual({ indices: [0, 1], spreadDb: 0.5 });
  });
});

describe('volumeNetlist', () => {
  it('the pickup across hot and ground, the volume pot from ground (lug 1) over hot (lug 3) with its wiper at the output, then the load', () => {
    const net = volumeNetlist(
      { R: 6000, L: 2.5, C: 100e-12 },
      { R: 250e3, law: { kind: 'linear' } },
      { id: 'amp', R: 1e6, C: 0, cableC: 500e-12 },
    );
    expect(net.title).toBe('Loaded volume taper');
    expect(net.parts.slice(0, 2)).toEqual([
      { kind: 'pickup', id: 'pickup', hot: 'hot', cold: '0', R: 6000, L: 2.5, C: 100e-12 },
      { kind: 'pot', id: 'volume', a: '0', b: 'hot', w: 'out', R: 250e3, law: { kind: 'linear' }, knob: 'volume' },
    ]);
    // A parallel loss is carried only when there is one.
    const lossy = volumeNetlist(
      { R: 6000, L: 2.5, C: 100e-12, Rp: 2e5 },
      { R: 250e3, law: { kind: 'linear' } },
      { id: 'amp', R: 1e6, C: 0, cableC: 0 },
    );
    expect(lossy.parts[0]).toMatchObject({ Rp: 2e5 });
  });
});
