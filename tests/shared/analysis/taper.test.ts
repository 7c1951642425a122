import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fitTaper, normaliseTaper, type TaperPoint } from '@shared/analysis/taper';
import { taperLawValue, type TaperLawKind } from '@shared/taper/law';
import { seededNormals } from '@shared/random/seeded';

// Check values of the exponential ("log") law y = (b^x − 1)/(b − 1), b = (1/y_m − 1)², copied from
// /work/shared/reference/worked-examples.txt (lines pot-exp-10, -15, -20, -85). Source of the law:
// B. Holmes, "Modelling logarithmic potentiometer laws", 2017 (READ); the numbers are DERIVED there.
const HOLMES_CHECKS: { m: number; at: [number, number][] }[] = [
  { m: 0.1, at: [[0.25, 0.025], [0.5, 0.1], [0.75, 0.325]] },
  { m: 0.15, at: [[0.25, 0.044372], [0.5, 0.15], [0.75, 0.401444]] },
  { m: 0.2, at: [[0.25, 0.0666667], [0.5, 0.2], [0.75, 0.466667]] },
  { m: 0.85, at: [[0.5, 0.85]] },
];

function synthetic(law: TaperLawKind, m: number, n: number, total: number, noise?: { seed: number; rel: number; abs: number }): TaperPoint[] {
  const g = noise ? seededNormals(noise.seed) : () => 0;
  return Array.from({ length: n }, (_, i) => {
    const x = i / (n - 1);
    const y = taperLawValue(law, m, x);
    const r = total * (y * (1 + (noise?.rel ?? 0) * g()) + (noise?.abs ?? 0) * g());
    return { rotation: x * 300, resistance: r };
  });
}

describe('taperLawValue', () => {
  it.each(HOLMES_CHECKS)('exponential law with m = $m matches the worked example (Holmes 2017)', ({ m, at }) => {
    for (const [x, y] of at) {
      const law = m < 0.5 ? 'audio' : 'reverse';
      // The worked values are given to 6 significant digits.
      expect(taperLawValue(law, m, x)).toBeCloseTo(y, 6);
    }
  });

  it('10 % audio taper on 10 kΩ gives 1 kΩ at mid-rotation (Wikipedia "Potentiometer", READ; worked-examples taper-10pct)', () => {
    expect(10_000 * taperLawValue('audio', 0.1, 0.5)).toBeCloseTo(1000, 9);
  });

  it('reverse audio is 1 − f(1 − x) of the audio law with mid value 1 − m (COMPUTATION.md §3)', () => {
    for (const m of [0.6, 0.75, 0.85, 0.9]) {
      for (const x of [0, 0.1, 0.33, 0.5, 0.8, 1]) {
        expect(taperLawValue('reverse', m, x)).toBeCloseTo(1 - taperLawValue('audio', 1 - m, 1 - x), 12);
      }
    }
  });

  it('every law passes through (0, 0), (0.5, m) and (1, 1)', () => {
    const cases: [TaperLawKind, number][] = [['linear', 0.5], ['audio', 0.15], ['reverse', 0.8], ['two-segment', 0.2]];
    for (const [law, m] of cases) {
      expect(taperLawValue(law, m, 0)).toBeCloseTo(0, 12);
      expect(taperLawValue(law, m, 0.5)).toBeCloseTo(m, 12);
      expect(taperLawValue(law, m, 1)).toBeCloseTo(1, 12);
    }
  });
});

describe('fitTaper', () => {
  it.each([
    ['linear', 0.5],
    ['audio', 0.1],
    ['audio', 0.3],
    ['reverse', 0.85],
    ['two-segment', 0.15],
  ] as [TaperLawKind, number][])('recovers the %s law with m = %f from exact readings', (law, m) => {
    const fit = fitTaper({ points: synthetic(law, m, 31, 500_000), rotationUnit: 'deg', total: 500_000 });
    expect(fit.law).toBe(law);
    expect(fit.m).toBeCloseTo(m, 6);
    expect(fit.r2).toBeCloseTo(1, 10);
    expect(fit.rmsPct).toBeLessThan(1e-5);
    expect(fit.candidates.map((c) => c.law)).toEqual(['linear', 'audio', 'reverse', 'two-segment']);
  });

  it('property: each law and m is recovered from noisy readings (1 % of reading + 0.2 % of R13)', () => {
    const lawAndM = fc.oneof(
      fc.constant<[TaperLawKind, number]>(['linear', 0.5]),
      fc.double({ min: 0.08, max: 0.35, noNaN: true }).map((m): [TaperLawKind, number] => ['audio', m]),
      fc.double({ min: 0.65, max: 0.92, noNaN: true }).map((m): [TaperLawKind, number] => ['reverse', m]),
      fc.double({ min: 0.08, max: 0.35, noNaN: true }).map((m): [TaperLawKind, number] => ['two-segment', m]),
      fc.double({ min: 0.65, max: 0.92, noNaN: true }).map((m): [TaperLawKind, number] => ['two-segment', m]),
    );
    fc.assert(
      fc.property(lawAndM, fc.integer({ min: 25, max: 300 }), fc.integer({ min: 1, max: 2 ** 31 - 1 }), ([law, m], n, seed) => {
        const fit = fitTaper({ points: synthetic(law, m, n, 250_000, { seed, rel: 0.01, abs: 0.002 }), rotationUnit: 'deg', total: 250_000 });
        expect(fit.law).toBe(law);
        expect(Math.abs(fit.m - m)).toBeLessThan(0.02);
      }),
      { numRuns: 200, seed: 20240601 },
    );
  });

  it('normalises percent rotation and takes R13 from the last reading plus its wiper-to-lug-3 value', () => {
    const points = [0, 25, 50, 75, 100].map((pct) => {
      const r = 100_000 * taperLawValue('audio', 0.15, pct / 100);
      return { rotation: pct, resistance: r * 0.98, resistanceW3: 100_000 - r * 0.98 };
    });
    // Shuffle: the fit must not depend on the input order.
    const shuffled = [points[3], points[0], points[4], points[2], points[1]] as TaperPoint[];
    const norm = normaliseTaper({ points: shuffled, rotationUnit: 'percent' });
    expect(norm.x).toEqual([0, 0.25, 0.5, 0.75, 1]);
    expect(norm.totalSource).toBe('last-reading-plus-end');
    expect(norm.total).toBeCloseTo(100_000, 6);
    const fit = fitTaper({ points: shuffled, rotationUnit: 'percent' });
    expect(fit.totalSource).toBe('last-reading-plus-end');
    expect(fit.halfSumMismatch).toBeCloseTo(0, 6);
    expect(fit.endResistance.end).toBeCloseTo(2000, 6);
  });

  it('reports R13 deviation, end resistances, half-sum mismatch and the profile flags', () => {
    const total = 540_000; // 8 % above a 500 kΩ nominal
    const points: TaperPoint[] = synthetic('linear', 0.5, 21, total).map((p, i) => ({
      rotation: p.rotation,
      resistance: p.resistance + 3000, // 3 kΩ stuck at the start of the track
      resistanceW3: i === 10 ? total - p.resistance - 3000 + 1500 : undefined,
    }));
    const fit = fitTaper({
      points,
      rotationUnit: 'deg',
      total,
      nominal: 500_000,
      tolerancePct: 5,
      profile: { law: 'audio-any', mMin: 0.1, mMax: 0.3, maxEndResistance: 1000 },
    });
    expect(fit.law).toBe('linear');
    expect(fit.totalDeviationPct).toBeCloseTo(8, 10);
    expect(fit.endResistance.start).toBeCloseTo(3000, 6);
    expect(fit.halfSumMismatch).toBeCloseTo(1500, 6);
    const codes = fit.flags.map((f) => f.code).sort();
    expect(codes).toEqual(['end-resistance-high', 'law-outside-profile', 'm-outside-profile', 'total-out-of-tolerance']);
  });

  it('raises no flag for a part inside its profile', () => {
    const fit = fitTaper({
      points: synthetic('audio', 0.15, 31, 495_000),
      rotationUnit: 'deg',
      total: 495_000,
      nominal: 500_000,
      tolerancePct: 10,
      profile: { law: 'audio-any', mMin: 0.1, mMax: 0.2, maxEndResistance: 1000 },
    });
    expect(fit.law).toBe('audio');
    expect(fit.flags).toEqual([]);
    expect(fit.monotonicBreaks).toEqual([]);
  });

  it('finds monotonicity breaks (a dip in the track) and flags them', () => {
    const points = synthetic('audio', 0.2, 31, 250_000);
    const dipped = points.map((p, i) => (i === 20 ? { ...p, resistance: (points[18] as TaperPoint).resistance } : p));
    const fit = fitTaper({ points: dipped, rotationUnit: 'deg', total: 250_000 });
    expect(fit.monotonicBreaks).toEqual([{ index: 20, rotation: (points[20] as TaperPoint).rotation }]);
    expect(fit.flags.map((f) => f.code)).toContain('non-monotonic');
  });

  it('rejects fewer than three usable readings', () => {
    expect(() => fitTaper({ points: [{ rotation: 0, resistance: 0 }, { rotation: 300, resistance: 1 }], rotationUnit: 'deg' })).toThrow(/three/);
  });
});
