import { readFileSync } from 'node:fs';
import stdlibFQuantile from '@stdlib/stats-base-dists-f-quantile';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { fCritical, fitTaper, normaliseTaper, type TaperPoint } from '@shared/analysis/taper';
import { taperLawValue, type TaperLawKind } from '@shared/taper/law';
import { seededNormals } from '@shared/random/seeded';
import { sized } from '../../support/mutation-run';

// Check values of the exponential ("log") law y = (b^x − 1)/(b − 1), b = (1/y_m − 1)², copied from
// tests/fixtures/examples/pot-laws.txt (rows pot-exp-10, -15, -20, -85). Source of the law:
// B. Holmes, "Modelling logarithmic potentiometer laws", 2017 (READ); the numbers are DERIVED there.
const HOLMES_CHECKS: { m: number; at: [number, number][] }[] = [
  {
    m: 0.1,
    at: [
      [0.25, 0.025],
      [0.5, 0.1],
      [0.75, 0.325],
    ],
  },
  {
    m: 0.15,
    at: [
      [0.25, 0.044372],
      [0.5, 0.15],
      [0.75, 0.401444],
    ],
  },
  {
    m: 0.2,
    at: [
      [0.25, 0.0666667],
      [0.5, 0.2],
      [0.75, 0.466667],
    ],
  },
  { m: 0.85, at: [[0.5, 0.85]] },
];

function synthetic(
  law: TaperLawKind,
  m: number,
  n: number,
  total: number,
  noise?: { seed: number; rel: number; abs: number },
): TaperPoint[] {
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

  it('reverse audio is 1 − f(1 − x) of the audio law with mid value 1 − m (docs/computation.md §3)', () => {
    for (const m of [0.6, 0.75, 0.85, 0.9]) {
      for (const x of [0, 0.1, 0.33, 0.5, 0.8, 1]) {
        expect(taperLawValue('reverse', m, x)).toBeCloseTo(1 - taperLawValue('audio', 1 - m, 1 - x), 12);
      }
    }
  });

  it('every law passes through (0, 0), (0.5, m) and (1, 1)', () => {
    const cases: [TaperLawKind, number][] = [
      ['linear', 0.5],
      ['audio', 0.15],
      ['reverse', 0.8],
      ['two-segment', 0.2],
    ];
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
        // R13 measured beside every reading (an R13 column), so the normalisation carries no noise.
        const points = synthetic(law, m, n, 250_000, { seed, rel: 0.01, abs: 0.002 }).map((p) => ({ ...p, total: 250_000 }));
        const fit = fitTaper({ points, rotationUnit: 'deg' });
        expect(fit.law).toBe(law);
        expect(Math.abs(fit.m - m)).toBeLessThan(0.02);
      }),
      { numRuns: 200, seed: 20240601 },
    );
  });

  it('normalises percent rotation and takes R13 from the readings of both halves (R1W + RW3)', () => {
    const points = [0, 25, 50, 75, 100].map((pct) => {
      const r = 100_000 * taperLawValue('audio', 0.15, pct / 100);
      return { rotation: pct, resistance: r * 0.98, resistanceW3: 100_000 - r * 0.98 };
    });
    // Shuffle: the fit must not depend on the input order.
    const shuffled = [points[3], points[0], points[4], points[2], points[1]] as TaperPoint[];
    const norm = normaliseTaper({ points: shuffled, rotationUnit: 'percent' });
    expect(norm.x).toEqual([0, 0.25, 0.5, 0.75, 1]);
    expect(norm.totalSource).toBe('sweep-halves');
    expect(norm.total).toBeCloseTo(100_000, 6);
    const fit = fitTaper({ points: shuffled, rotationUnit: 'percent' });
    expect(fit.totalSource).toBe('sweep-halves');
    expect(fit.halfSumMismatch).toBeCloseTo(0, 6);
    expect(fit.endResistance.end).toBeCloseTo(2000, 6);
  });

  it('reports R13 deviation, end resistances, half-sum mismatch and the profile flags', () => {
    const total = 540_000; // 8 % above a 500 kΩ nominal
    const points: TaperPoint[] = synthetic('linear', 0.5, 21, total).map((p, i) => ({
      rotation: p.rotation,
      resistance: p.resistance + 3000, // 3 kΩ stuck at the start of the track
      resistanceW3: i === 10 ? total - p.resistance - 3000 + 1500 : undefined,
      total, // an R13 column in the sweep
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
    expect(() =>
      fitTaper({
        points: [
          { rotation: 0, resistance: 0 },
          { rotation: 300, resistance: 1 },
        ],
        rotationUnit: 'deg',
      }),
    ).toThrow(/three/);
  });
});

describe('R13 comes from the sweep itself', () => {
  // A linear 250 kΩ pot swept to full rotation, after a stale bench reading of 237.5 kΩ: the sweep's
  // own full-rotation reading normalises it (common practice: R13 is the resistance at full rotation).
  const linear250k = synthetic('linear', 0.5, 11, 250_000).map((p) => ({ ...p, resistance: Math.max(p.resistance, 50) }));

  it('a stale bench reading does not turn a linear sweep into a reverse law', () => {
    const fit = fitTaper({ points: linear250k, rotationUnit: 'deg', total: 237_500 });
    expect(fit.totalSource).toBe('sweep-full-rotation');
    expect(fit.total).toBe(250_000);
    expect(fit.law).toBe('linear');
    expect(fit.endResistance.end).toBeNull(); // not measured: R13 is the full-rotation reading itself
  });

  it('prefers an R13 column, then both halves, then full rotation, then the bench reading', () => {
    const withR13 = linear250k.map((p) => ({ ...p, total: 251_000, resistanceW3: 250_000 - p.resistance }));
    expect(fitTaper({ points: withR13, rotationUnit: 'deg', total: 1 }).totalSource).toBe('sweep-r13');
    expect(fitTaper({ points: withR13, rotationUnit: 'deg', total: 1 }).total).toBe(251_000);
    const halves = withR13.map(({ total: _t, ...p }) => p);
    expect(fitTaper({ points: halves, rotationUnit: 'deg', total: 1 }).totalSource).toBe('sweep-halves');
    const partial = linear250k.filter((p) => p.rotation <= 270); // stops at 90 % of the rotation
    const bench = fitTaper({ points: partial, rotationUnit: 'deg', total: 250_000 });
    expect(bench.totalSource).toBe('bench-reading');
    expect(bench.law).toBe('linear');
    expect(() => fitTaper({ points: partial, rotationUnit: 'deg' })).toThrow(/no end-to-end resistance/);
  });
});

describe('the linear-versus-curved F test uses F(1, n − 1) for the actual number of readings', () => {
  // Published F table: tests/fixtures/f-distribution/f-1-nu-upper-points.txt (sources inside).
  const rows = readFileSync(new URL('../../fixtures/f-distribution/f-1-nu-upper-points.txt', import.meta.url), 'utf8')
    .split('\n')
    .filter((l) => /^\d/.test(l))
    .map((l) => l.trim().split(/\s+/).map(Number) as [number, number, number]);

  it('fCritical matches the published table to the printed digits', () => {
    expect(rows.length).toBe(30);
    for (const [alpha, nu, f] of rows) {
      const digits = String(f).replace('.', '').replace(/^0+/, '').length;
      expect(Number(fCritical(nu, 1 - alpha).toPrecision(Math.max(digits, 4))), `alpha ${alpha}, nu ${nu}`).toBeCloseTo(
        f,
        3 - Math.floor(Math.log10(f)) - 1,
      );
    }
  });

  it('closed forms: F(1, 1) = tan²(πp/2), F(1, 2) = 2p²/(1 − p²) (t with 1 and 2 degrees of freedom, squared)', () => {
    for (const p of [0.9, 0.99, 0.999]) {
      expect(fCritical(1, p) / Math.tan((Math.PI * p) / 2) ** 2).toBeCloseTo(1, 9);
      expect(fCritical(2, p) / ((2 * p * p) / (1 - p * p))).toBeCloseTo(1, 9);
    }
    expect(fCritical(1e6)).toBeCloseTo(10.83, 2); // the large-sample point the test used before
  });

  it('agrees with @stdlib/stats-base-dists-f-quantile (reference library) to 1e-9 relative', () => {
    for (const nu of [1, 2, 3, 5, 7, 10, 30, 100, 1000]) {
      for (const p of [0.9, 0.95, 0.99, 0.999]) {
        expect(fCritical(nu, p) / stdlibFQuantile(p, 1, nu), `p ${p}, nu ${nu}`).toBeCloseTo(1, 9);
      }
    }
  });

  it('truly linear pots with 6 readings are rarely called curved (seeded simulation, 3 % noise; 1,500 runs, 300 in the mutation runs)', () => {
    let curved = 0;
    const runs = sized(1500, 300);
    for (let k = 0; k < runs; k++) {
      const points = synthetic('linear', 0.5, 6, 100_000, { seed: 1000 + k, rel: 0, abs: 0.03 }).map((p) => ({ ...p, total: 100_000 }));
      if (fitTaper({ points, rotationUnit: 'deg' }).law !== 'linear') curved++;
    }
    // Measured once: about 0.3 % with F(1, 5) (the laws are bounded and not nested in the linear
    // one, so the nominal 0.1 % is approximate); 2.7 % with the old F(1, ∞) = 10.83.
    expect(curved / runs).toBeLessThan(0.01);
  });
});
