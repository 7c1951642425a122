// The taper fit's rules at their exact edges and its messages with their figures
// (docs/computation.md §3). Readings are made in the test from the laws' definitions
// (shared/taper/law.ts, checked against B. Holmes, "Modelling logarithmic potentiometer laws", 2017,
// in taper.test.ts); the thresholds (0.99 of the rotation is "full", 0.5 % of R13 for a monotonicity
// break, the 0.02 band around m = 0.5) are the project's choices. Units and digits follow the SI
// Brochure's conventions as the project writes them. No simulator.
import { describe, expect, it } from 'vitest';
import { fitTaper, normaliseTaper, type TaperInput, type TaperPoint } from '@shared/analysis/taper';
import { taperLawValue, type TaperLawKind } from '@shared/taper/law';

/** n readings from 0 to 300° of a law with mid value m, on R13 = total. */
const sweep = (law: TaperLawKind, m: number, n: number, total: number): TaperPoint[] =>
  Array.from({ length: n }, (_, i) => ({ rotation: (300 * i) / (n - 1), resistance: total * taperLawValue(law, m, i / (n - 1)) }));
const codes = (fit: { flags: { code: string }[] }) => fit.flags.map((f) => f.code).sort();
const flag = (fit: { flags: { code: string; message: string }[] }, code: string) => fit.flags.find((f) => f.code === code)?.message;

describe('normaliseTaper', () => {
  const pts: TaperPoint[] = [
    { rotation: 300, resistance: 100_000 },
    { rotation: 150, resistance: 50_000 },
    { rotation: Number.NaN, resistance: 1 },
    { rotation: 0, resistance: 0 },
    { rotation: 75, resistance: Number.POSITIVE_INFINITY },
  ];

  it('degrees over 300° by default; unusable readings dropped; sorted with their input indices', () => {
    const n = normaliseTaper({ points: pts, rotationUnit: 'deg' });
    expect(n.x).toEqual([0, 0.5, 1]);
    expect(n.y).toEqual([0, 0.5, 1]);
    expect(n.order).toEqual([3, 1, 0]);
    expect(n.totalSource).toBe('sweep-full-rotation');
    // A full rotation of 270°: 150° is 5/9 of it, and 300° is past the end.
    expect(normaliseTaper({ points: pts, rotationUnit: 'deg', fullRotationDeg: 270 }).x).toEqual([0, 150 / 270, 300 / 270]);
    // Percent ignores the full rotation in degrees.
    expect(normaliseTaper({ points: pts, rotationUnit: 'percent', fullRotationDeg: 0 }).x).toEqual([0, 1.5, 3]);
  });

  it('refuses a full rotation that is not positive, fewer than three usable readings and an R13 that is not positive', () => {
    expect(() => normaliseTaper({ points: pts, rotationUnit: 'deg', fullRotationDeg: 0 })).toThrow('Full rotation must be positive.');
    expect(() => normaliseTaper({ points: pts, rotationUnit: 'deg', fullRotationDeg: -300 })).toThrow('Full rotation must be positive.');
    expect(() => normaliseTaper({ points: pts.slice(2), rotationUnit: 'deg' })).toThrow('A taper fit needs at least three readings.');
    const partial = [
      { rotation: 0, resistance: 0 },
      { rotation: 100, resistance: 10 },
      { rotation: 200, resistance: 20 },
    ];
    expect(() => normaliseTaper({ points: partial, rotationUnit: 'deg', total: 0 })).toThrow(
      'The end-to-end resistance (R13) must be positive.',
    );
    expect(normaliseTaper({ points: partial, rotationUnit: 'deg', total: 30 }).totalSource).toBe('bench-reading');
    expect(() => normaliseTaper({ points: partial, rotationUnit: 'deg', total: Number.NaN })).toThrow('no end-to-end resistance');
  });

  it('full rotation starts at exactly 0.99 of the rotation (297° of 300°)', () => {
    const at = (deg: number) => [
      { rotation: 0, resistance: 0 },
      { rotation: 150, resistance: 50_000 },
      { rotation: deg, resistance: 99_000 },
    ];
    expect(normaliseTaper({ points: at(297), rotationUnit: 'deg' }).totalSource).toBe('sweep-full-rotation');
    expect(normaliseTaper({ points: at(296.9), rotationUnit: 'deg', total: 100_000 }).totalSource).toBe('bench-reading');
  });

  it('R13 as the mean of the readings that carry it, or of R1W + RW3 where both halves were read', () => {
    const r13 = normaliseTaper({
      points: [
        { rotation: 0, resistance: 0, total: 99_000 },
        { rotation: 100, resistance: 30_000 },
        { rotation: 200, resistance: 60_000, total: 101_000 },
      ],
      rotationUnit: 'deg',
    });
    expect(r13.total).toBe(100_000);
    const halves = normaliseTaper({
      points: [
        { rotation: 0, resistance: 0, resistanceW3: 98_000 },
        { rotation: 100, resistance: 30_000 },
        { rotation: 200, resistance: 60_000, resistanceW3: 40_000 },
      ],
      rotationUnit: 'deg',
    });
    expect(halves.totalSource).toBe('sweep-halves');
    expect(halves.total).toBe(99_000);
  });
});

describe('fitTaper: messages with their figures', () => {
  it('R13 out of tolerance, a law outside the profile, m outside the profile', () => {
    const fit = fitTaper({
      points: sweep('linear', 0.5, 21, 540_000),
      rotationUnit: 'deg',
      nominal: 500_000,
      tolerancePct: 5,
      profile: { law: 'audio-any', mMin: 0.1, mMax: 0.3 },
    });
    expect(fit.flags).toEqual([
      { code: 'total-out-of-tolerance', message: 'R13 540 kΩ is +8.0 % from nominal 500 kΩ (tolerance ±5 %).' },
      { code: 'law-outside-profile', message: 'Best-fitting law is linear; the profile expects audio-any.' },
      { code: 'm-outside-profile', message: "Mid-rotation value 50.0 % is outside the profile's 10.0…30.0 %." },
    ]);
  });

  it('m outside a one-sided profile shows a dash for the missing bound', () => {
    const lin = sweep('linear', 0.5, 21, 100_000);
    expect(flag(fitTaper({ points: lin, rotationUnit: 'deg', profile: { mMin: 0.6 } }), 'm-outside-profile')).toBe(
      "Mid-rotation value 50.0 % is outside the profile's 60.0…– %.",
    );
    expect(flag(fitTaper({ points: lin, rotationUnit: 'deg', profile: { mMax: 0.4 } }), 'm-outside-profile')).toBe(
      "Mid-rotation value 50.0 % is outside the profile's –…40.0 %.",
    );
  });

  it('end resistance: the start, the end, or both, against the limit', () => {
    // Wiper to lug 3 measured at the last reading: that is the end resistance.
    const base = sweep('linear', 0.5, 11, 100_000).map((p) => ({ ...p, total: 100_000 }));
    const withEnds = (start: number, end: number) =>
      base.map((p, i) => (i === 0 ? { ...p, resistance: start } : i === base.length - 1 ? { ...p, resistanceW3: end } : p));
    const limit = { maxEndResistance: 1000 };
    expect(flag(fitTaper({ points: withEnds(3000, 2000), rotationUnit: 'deg', profile: limit }), 'end-resistance-high')).toBe(
      'End resistance too high (start 3 kΩ, end 2 kΩ; limit 1 kΩ).',
    );
    expect(flag(fitTaper({ points: withEnds(3000, 500), rotationUnit: 'deg', profile: limit }), 'end-resistance-high')).toBe(
      'End resistance too high (start 3 kΩ; limit 1 kΩ).',
    );
    expect(flag(fitTaper({ points: withEnds(500, 2000), rotationUnit: 'deg', profile: limit }), 'end-resistance-high')).toBe(
      'End resistance too high (end 2 kΩ; limit 1 kΩ).',
    );
    // Exactly at the limit is not "too high".
    expect(codes(fitTaper({ points: withEnds(1000, 1000), rotationUnit: 'deg', profile: limit }))).toEqual([]);
  });

  it('a monotonicity break: the count and the first rotation; a drop of exactly the tolerance is no break', () => {
    const base = sweep('linear', 0.5, 11, 100_000).map((p) => ({ ...p, total: 100_000 }));
    // Readings every 10 kΩ; the default tolerance is 0.5 % of R13 = 500 Ω.
    const dip = (k: number, by: number) => base.map((p, i) => (i === k ? { ...p, resistance: base[k - 1]!.resistance - by } : p));
    expect(fitTaper({ points: dip(4, 500), rotationUnit: 'deg' }).monotonicBreaks).toEqual([]);
    const one = fitTaper({ points: dip(4, 501), rotationUnit: 'deg' });
    expect(one.monotonicBreaks).toEqual([{ index: 4, rotation: 120 }]);
    expect(flag(one, 'non-monotonic')).toBe(
      'Resistance falls as rotation rises at 1 reading(s), first at rotation 120: a scratchy or damaged track.',
    );
    // With a 1 % tolerance (1000 Ω) a 600 Ω drop is allowed.
    expect(fitTaper({ points: dip(4, 600), rotationUnit: 'deg', monotonicTolerancePct: 1 }).monotonicBreaks).toEqual([]);
  });
});

describe('fitTaper: values at their edges', () => {
  it('R13 exactly at its tolerance (+5 % of ±5 %) passes; no nominal or a zero nominal gives no deviation', () => {
    const pts = sweep('linear', 0.5, 11, 525_000);
    expect(fitTaper({ points: pts, rotationUnit: 'deg', nominal: 500_000, tolerancePct: 5 }).flags).toEqual([]);
    expect(fitTaper({ points: pts, rotationUnit: 'deg', nominal: 500_000, tolerancePct: 4.99 }).flags.map((f) => f.code)).toEqual([
      'total-out-of-tolerance',
    ]);
    expect(fitTaper({ points: pts, rotationUnit: 'deg', nominal: 500_000 }).totalDeviationPct).toBe(5);
    expect(fitTaper({ points: pts, rotationUnit: 'deg' }).totalDeviationPct).toBeNull();
    expect(fitTaper({ points: pts, rotationUnit: 'deg', nominal: 0, tolerancePct: 5 }).totalDeviationPct).toBeNull();
  });

  it('m exactly at the profile bounds passes (linear m = 0.5)', () => {
    const fit = fitTaper({
      points: sweep('linear', 0.5, 11, 100_000),
      rotationUnit: 'deg',
      profile: { mMin: 0.5, mMax: 0.5, law: 'linear' },
    });
    expect(fit.flags).toEqual([]);
  });

  it('the 0.02 band around one half: an audio law with m = 0.485 is called linear, m = 0.47 audio', () => {
    expect(fitTaper({ points: sweep('audio', 0.485, 31, 100_000), rotationUnit: 'deg' }).law).toBe('linear');
    const curved = fitTaper({ points: sweep('audio', 0.47, 31, 100_000), rotationUnit: 'deg' });
    expect(curved.law).toBe('audio');
    expect(curved.m).toBeCloseTo(0.47, 6);
    // Reverse: 0.515 is linear, 0.53 reverse.
    expect(fitTaper({ points: sweep('reverse', 0.515, 31, 100_000), rotationUnit: 'deg' }).law).toBe('linear');
    expect(fitTaper({ points: sweep('reverse', 0.53, 31, 100_000), rotationUnit: 'deg' }).law).toBe('reverse');
  });

  it('a forced law is reported with its own fitted m and figures', () => {
    const pts = sweep('audio', 0.15, 31, 100_000);
    const fit = fitTaper({ points: pts, rotationUnit: 'deg', forceLaw: 'reverse' });
    expect(fit.law).toBe('reverse');
    const reverse = fit.candidates.find((c) => c.law === 'reverse')!;
    expect(fit.m).toBe(reverse.m);
    expect(fit.rmsPct).toBe(reverse.rmsPct);
    expect(fit.r2).toBe(reverse.r2);
    // The largest residual of the reported law is at least its RMS.
    expect(fit.maxPct).toBeGreaterThanOrEqual(fit.rmsPct);
    const lin = fitTaper({ points: pts, rotationUnit: 'deg', forceLaw: 'linear' });
    expect(lin.law).toBe('linear');
    expect(lin.m).toBe(0.5);
  });

  it('the end resistance from R13 − R1W at full rotation when R13 is known, never below 0', () => {
    const pts = sweep('linear', 0.5, 11, 100_000).map((p) => ({ ...p, total: 100_000 }));
    const last = pts.length - 1;
    const short = pts.map((p, i) => (i === last ? { ...p, resistance: 99_400 } : p));
    expect(fitTaper({ points: short, rotationUnit: 'deg' }).endResistance).toEqual({ start: 0, end: 600 });
    const over = pts.map((p, i) => (i === last ? { ...p, resistance: 100_300 } : p));
    expect(fitTaper({ points: over, rotationUnit: 'deg' }).endResistance.end).toBe(0);
    // Bench R13 and a sweep that stops at 297° (x = 0.99): still full rotation.
    const bench = sweep('linear', 0.5, 11, 100_000)
      .slice(0, 10)
      .concat([{ rotation: 297, resistance: 98_800 }]);
    expect(fitTaper({ points: bench, rotationUnit: 'deg', total: 100_000 }).totalSource).toBe('sweep-full-rotation');
    const benchR13 = bench.map((p) => ({ ...p, total: 100_000 }));
    expect(fitTaper({ points: benchR13, rotationUnit: 'deg' }).endResistance.end).toBe(1200);
    // Stopping short of 0.99 with a bench R13: no end resistance.
    const stop = sweep('linear', 0.5, 11, 100_000).slice(0, 10);
    expect(fitTaper({ points: stop, rotationUnit: 'deg', total: 100_000 }).endResistance.end).toBeNull();
    expect(
      fitTaper({ points: stop.concat([{ rotation: 296, resistance: 98_700 }]), rotationUnit: 'deg', total: 100_000 }).endResistance.end,
    ).toBeNull();
    expect(
      fitTaper({ points: stop.concat([{ rotation: 297, resistance: 98_700 }]).map((p) => ({ ...p })), rotationUnit: 'deg', total: 100_000 })
        .totalSource,
    ).toBe('sweep-full-rotation');
  });

  it('the half-sum mismatch is the largest in magnitude, either sign, over the readings with both halves', () => {
    const pts: TaperPoint[] = [
      { rotation: 0, resistance: 0, resistanceW3: 100_200, total: 100_000 },
      { rotation: 150, resistance: 50_000, resistanceW3: 49_300, total: 100_000 },
      { rotation: 200, resistance: 66_000, resistanceW3: Number.NaN, total: 100_000 },
      { rotation: 300, resistance: 100_000, resistanceW3: 400, total: 100_000 },
    ];
    expect(fitTaper({ points: pts, rotationUnit: 'deg' }).halfSumMismatch).toBe(-700);
    expect(fitTaper({ points: sweep('linear', 0.5, 11, 100_000), rotationUnit: 'deg' }).halfSumMismatch).toBeNull();
  });

  it('the two-segment fit is clamped to 0…1, and takes one half when no reading lies inside the track', () => {
    // Readings far above the line: the closed-form m would exceed 1.
    const high: TaperPoint[] = [
      { rotation: 0, resistance: 0 },
      { rotation: 75, resistance: 90_000 },
      { rotation: 150, resistance: 100_000 },
      { rotation: 300, resistance: 100_000 },
    ];
    expect(fitTaper({ points: high, rotationUnit: 'deg' }).candidates.find((c) => c.law === 'two-segment')!.m).toBe(1);
    const low: TaperPoint[] = [
      { rotation: 0, resistance: 0 },
      { rotation: 150, resistance: -20_000 },
      { rotation: 300, resistance: 100_000 },
    ];
    expect(fitTaper({ points: low, rotationUnit: 'deg' }).candidates.find((c) => c.law === 'two-segment')!.m).toBe(0);
    const ends: TaperPoint[] = [
      { rotation: 0, resistance: 0 },
      { rotation: 0, resistance: 10 },
      { rotation: 300, resistance: 100_000 },
    ];
    expect(fitTaper({ points: ends, rotationUnit: 'deg' }).candidates.find((c) => c.law === 'two-segment')!.m).toBe(0.5);
  });

  it('R² with no spread in the readings: 1 for an exact fit, 0 otherwise', () => {
    // Three readings at mid-rotation, all at half of R13 (bench): the linear law meets them exactly.
    const mid = [150, 150, 150].map((rotation) => ({ rotation, resistance: 50_000 }));
    const exact = fitTaper({ points: mid, rotationUnit: 'deg', total: 100_000 });
    expect(exact.candidates[0]!.r2).toBe(1);
    const off = fitTaper({ points: mid.map((p) => ({ ...p, resistance: 60_000 })), rotationUnit: 'deg', total: 100_000 });
    expect(off.candidates[0]!.r2).toBe(0);
    // R² = 1 − SSR/SST on spread readings (the definition): linear law against an audio sweep.
    const pts = sweep('audio', 0.2, 11, 100_000);
    const y = pts.map((p) => p.resistance / 100_000);
    const mean = y.reduce((a, b) => a + b, 0) / y.length;
    const sst = y.reduce((a, v) => a + (v - mean) ** 2, 0);
    const ssrLin = y.reduce((a, v, i) => a + (v - i / 10) ** 2, 0);
    const fit = fitTaper({ points: pts, rotationUnit: 'deg' } as TaperInput);
    expect(fit.candidates[0]!.r2).toBeCloseTo(1 - ssrLin / sst, 12);
    expect(fit.candidates[0]!.rmsPct).toBeCloseTo(Math.sqrt(ssrLin / 11) * 100, 10);
  });
});

describe('fitTaper: readings that are missing or not finite, and the law checks', () => {
  it('an R13 column with a reading that is not finite: the mean of the others', () => {
    const n = normaliseTaper({
      points: [
        { rotation: 0, resistance: 0, total: 99_000 },
        { rotation: 100, resistance: 30_000, total: Number.NaN },
        { rotation: 200, resistance: 60_000, total: 101_000 },
      ],
      rotationUnit: 'deg',
    });
    expect(n.totalSource).toBe('sweep-r13');
    expect(n.total).toBe(100_000);
  });

  it('a last reading whose RW3 is not finite falls back to R13 − R1W; with no end reading and a high start, only the start is named', () => {
    const pts = sweep('linear', 0.5, 11, 100_000).map((p) => ({ ...p, total: 100_000 }));
    const last = pts.length - 1;
    const nanEnd = pts.map((p, i) => (i === last ? { ...p, resistance: 99_400, resistanceW3: Number.NaN } : p));
    expect(fitTaper({ points: nanEnd, rotationUnit: 'deg' }).endResistance.end).toBe(600);
    // Full rotation from the sweep itself: the end resistance is unknown (null) and not reported.
    const noEnd = sweep('linear', 0.5, 11, 100_000).map((p, i) => (i === 0 ? { ...p, resistance: 3000 } : p));
    const fit = fitTaper({ points: noEnd, rotationUnit: 'deg', profile: { maxEndResistance: 1000 } });
    expect(fit.endResistance.end).toBeNull();
    expect(flag(fit, 'end-resistance-high')).toBe('End resistance too high (start 3 kΩ; limit 1 kΩ).');
  });

  it('the half-sum mismatch skips a first reading whose RW3 is not finite, and is 0 (not null) when the halves add up exactly', () => {
    const pts: TaperPoint[] = [
      { rotation: 0, resistance: 0, resistanceW3: Number.NaN, total: 100_000 },
      { rotation: 150, resistance: 50_000, resistanceW3: 50_300, total: 100_000 },
      { rotation: 300, resistance: 100_000, total: 100_000 },
    ];
    expect(fitTaper({ points: pts, rotationUnit: 'deg' }).halfSumMismatch).toBe(300);
    const exact = pts.map((p) => ({ ...p, resistanceW3: 100_000 - p.resistance }));
    expect(fitTaper({ points: exact, rotationUnit: 'deg' }).halfSumMismatch).toBe(0);
  });

  it('the largest residual of the reported law, in % of R13 (here linear, worked by hand)', () => {
    // Readings 0, 30 %, 45 %, 80 %, 100 % at 0, 25 %, 50 %, 75 %, 100 % rotation; linear residuals 0, 5, −5, 5, 0 %.
    const pts = [0, 30_000, 45_000, 80_000, 100_000].map((resistance, i) => ({ rotation: 75 * i, resistance }));
    const fit = fitTaper({ points: pts, rotationUnit: 'deg', forceLaw: 'linear' });
    expect(fit.maxPct).toBeCloseTo(5, 9);
    expect(fit.rmsPct).toBeCloseTo(Math.sqrt((3 * 25) / 5), 9);
  });

  it('exact two-segment readings: SSR 0 for that law, so it is chosen over linear; audio-any accepts it, a reverse profile does not', () => {
    // m = 0.25: y = 2·0.25·x up to one half, then 0.25 + 1.5·(x − 0.5): 0, 12.5, 25, 62.5, 100 % (by hand).
    const pts = [0, 12_500, 25_000, 62_500, 100_000].map((resistance, i) => ({ rotation: 75 * i, resistance }));
    const fit = fitTaper({ points: pts, rotationUnit: 'deg', profile: { law: 'audio-any' } });
    expect(fit.law).toBe('two-segment');
    expect(fit.m).toBe(0.25);
    expect(fit.rmsPct).toBe(0);
    expect(fit.flags).toEqual([]);
    expect(codes(fitTaper({ points: pts, rotationUnit: 'deg', profile: { law: 'reverse' } }))).toEqual(['law-outside-profile']);
    expect(codes(fitTaper({ points: pts, rotationUnit: 'deg', profile: { law: 'two-segment' } }))).toEqual([]);
  });
});

describe('fitTaper: the F test with the degrees of freedom of the actual readings', () => {
  it('five readings whose F lies between the 99.9 % points of F(1, 6) and F(1, 4): linear', () => {
    // An audio law with m = 0.42 plus ±3 % of R13 at the inner readings (made up for the test).
    const pts = [0, 1, 2, 3, 4].map((i) => ({
      rotation: 75 * i,
      resistance: 100_000 * (taperLawValue('audio', 0.42, i / 4) + [0, 0.03, -0.03, 0.03, 0][i]!),
    }));
    const fit = fitTaper({ points: pts, rotationUnit: 'deg' });
    // F = (SSR_lin − SSR_best)/(SSR_best/(n − 1)) from the candidates' RMS (SSR = n·RMS²).
    const ssr = fit.candidates.map((c) => 5 * (c.rmsPct / 100) ** 2);
    const best = Math.min(...ssr.slice(1));
    const F = (ssr[0]! - best) / (best / 4);
    // 99.9 % points: F(1, 4) = 74.14, F(1, 6) = 35.51 (published F tables, from memory; taper.test.ts
    // checks fCritical against the table).
    // The case separates n − 1 from n + 1 degrees of freedom: with 6 the same data give F·6/4, above 35.51.
    expect((F * 6) / 4).toBeGreaterThan(35.51);
    expect(F).toBeLessThan(74.14);
    expect(fit.law).toBe('linear');
  });
});
