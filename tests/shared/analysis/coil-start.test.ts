// The coil fit's starting values (docs/computation.md §4) against the method written out again in
// this file: R = Re Z at the lowest frequency (|Z| when that is not positive), L = the median of
// Im Z/ω·(1 − (f/f_peak)²) over the points up to a third of the peak frequency with Im Z > 0 (the
// apparent inductance L' = L/(1 − ω²LC) undone with f0 ≈ the peak; |Z_peak|/(3ω_peak) when there is
// no such point), C = 1/(ω_res²·L) with ω_res the peak (twice the peak when the peak is the last
// point: the resonance lies above the sweep), Rp = 1/(1/|Z_peak| − RC/L) when that conductance is
// above 1e-3·RC/L, else 100·L/(RC). The sweeps are the textbook network
// Z = ((R + jωL) ∥ 1/(jωC)) [∥ Rp] (parallel branches, standard circuit theory; e.g. P. Horowitz and
// W. Hill, The Art of Electronics, 3rd ed., §1.7, from memory), computed here. No simulator.
import { describe, expect, it } from 'vitest';
import { seededNormals } from '@shared/random/seeded';
import { coilStartValues, type CoilPoint } from '@shared/analysis/coil';
import { textbookZ, type Complex } from '../../support/coil-network';

type Pt = { frequency: number } & Complex;

/** The documented method, written out independently of the engine. */
function reference(points: Pt[]): { R: number; L: number; C: number; Rp: number; inductive: number } {
  const pts = points.slice().sort((a, b) => a.frequency - b.frequency);
  const mag = (p: Complex) => Math.hypot(p.re, p.im);
  let peak = 0;
  for (let i = 1; i < pts.length; i++) if (mag(pts[i]!) > mag(pts[peak]!)) peak = i;
  const fPeak = pts[peak]!.frequency;
  const wPeak = 2 * Math.PI * fPeak;
  const first = pts[0]!;
  const R = first.re > 0 ? first.re : mag(first);
  const ls = pts
    .filter((p) => p.frequency <= fPeak / 3 && p.im > 0)
    .map((p) => (p.im / (2 * Math.PI * p.frequency)) * (1 - (p.frequency / fPeak) ** 2))
    .sort((a, b) => a - b);
  const m = ls.length;
  const L = m === 0 ? mag(pts[peak]!) / wPeak / 3 : m % 2 === 1 ? ls[(m - 1) / 2]! : (ls[m / 2 - 1]! + ls[m / 2]!) / 2;
  const wRes = peak === pts.length - 1 ? 2 * wPeak : wPeak;
  const C = 1 / (wRes * wRes * L);
  const series = (R * C) / L;
  const gLeft = 1 / mag(pts[peak]!) - series;
  const Rp = gLeft > 1e-3 * series ? 1 / gLeft : 100 / series;
  return { R, L, C, Rp, inductive: m };
}

const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);
const expectStart = (points: Pt[], polar = false) => {
  const ref = reference(points);
  const input: CoilPoint[] = polar
    ? points.map((p) => ({ frequency: p.frequency, magnitude: Math.hypot(p.re, p.im), phaseDeg: (Math.atan2(p.im, p.re) * 180) / Math.PI }))
    : points;
  const got = coilStartValues(input);
  for (const k of ['R', 'L', 'C', 'Rp'] as const) expect(rel(got[k], ref[k]), k).toBeLessThan(1e-9);
  return ref;
};

// Typical pickup values — common practice (no published source); Rp is a value chosen for the test.
const SINGLE = { R: 6000, L: 2.5, C: 100e-12 };
const DOUBLE = { R: 8000, L: 4.4, C: 120e-12, Rp: 250e3 };
/** 100 points a decade from 10 Hz. */
const grid = (n: number, from = 10) => Array.from({ length: n }, (_, i) => from * 10 ** (i / 100));
const sweep = (p: { R: number; L: number; C: number; Rp?: number }, freqs: number[]): Pt[] =>
  freqs.map((frequency) => ({ frequency, ...textbookZ(p, frequency) }));
/** 1 % complex noise (seeded): Z·(1 + ε), the measurement error the fit's weights assume. */
const noisy = (points: Pt[], seed: number): Pt[] => {
  const g = seededNormals(seed);
  return points.map((p) => {
    const e = { re: 0.01 * g(), im: 0.01 * g() };
    return { frequency: p.frequency, re: p.re * (1 + e.re) - p.im * e.im, im: p.im * (1 + e.re) + p.re * e.im };
  });
};

describe('coilStartValues: the documented starting estimates', () => {
  it('a clean sweep through the resonance: the method, and values near the true R, L, C', () => {
    const points = sweep(SINGLE, grid(401));
    for (const polar of [false, true]) {
      const ref = expectStart(points, polar);
      // Sanity of the method itself against the network's own values (the estimates are rough by design).
      expect(rel(ref.R, SINGLE.R)).toBeLessThan(1e-3);
      expect(rel(ref.L, SINGLE.L)).toBeLessThan(2e-2);
      expect(rel(ref.C, SINGLE.C)).toBeLessThan(0.1);
    }
  });

  it('a lossy winding: Rp from the peak height once the series loss L/(RC) is taken off', () => {
    const ref = expectStart(sweep(DOUBLE, grid(401)));
    // The peak conductance is 1/Rp + RC/L (parallel resonator at resonance, standard theory), so
    // the estimate lands near the true Rp.
    expect(rel(ref.Rp, DOUBLE.Rp)).toBeLessThan(0.1);
  });

  it('a lossless winding sampled at its resonance: no conductance left at the peak, Rp starts at 100·L/(RC)', () => {
    // At ω0 = 1/√(LC) the lossless network has |Z| = RQ²·√(1 + 1/Q²) > L/(RC) = RQ² (derived from the
    // textbook network above), so 1/|Z_peak| − RC/L is negative: the fallback.
    const f0 = 1 / (2 * Math.PI * Math.sqrt(SINGLE.L * SINGLE.C));
    const points = sweep(
      SINGLE,
      Array.from({ length: 400 }, (_, i) => f0 * 10 ** ((i - 300) / 100)),
    );
    const ref = expectStart(points);
    expect(rel(ref.Rp, (100 * ref.L) / (ref.R * ref.C))).toBeLessThan(1e-12);
  });

  it('noisy sweeps: L is the median of the corrected Im Z/ω, for an odd and for an even count', () => {
    // With noise the corrected values are out of order, and the two counts separate the middle
    // value from the mean of the two middle values.
    const counts = new Set<number>();
    for (const from of [10, 11, 12, 13]) {
      for (const seed of [3, 4]) {
        const ref = expectStart(noisy(sweep(SINGLE, grid(401, from)), seed));
        counts.add(ref.inductive % 2);
      }
    }
    expect([...counts].sort()).toEqual([0, 1]);
  });

  it('a point with zero or negative reactance below a third of the peak is left out of the median', () => {
    const points = noisy(sweep(SINGLE, grid(401)), 5);
    // A resistive reading (phase exactly 0) and a capacitive one, both well below the peak.
    const withOdd: Pt[] = [...points, { frequency: 15, re: 6000, im: 0 }, { frequency: 25, re: 6000, im: -300 }];
    const ref = expectStart(withOdd);
    expect(ref.inductive).toBe(expectStart(points).inductive);
    // Given as magnitude and phase: phase 0° reads as Im Z = 0 exactly.
    const polar: CoilPoint[] = [
      ...points,
      { frequency: 15, magnitude: 6000, phaseDeg: 0 },
      { frequency: 25, magnitude: Math.hypot(6000, 300), phaseDeg: (Math.atan2(-300, 6000) * 180) / Math.PI },
    ];
    const got = coilStartValues(polar);
    expect(rel(got.L, ref.L)).toBeLessThan(1e-9);
  });

  it('a point exactly at a third of the peak frequency is inside the inductive region', () => {
    // Frequencies k·96 Hz: the peak sample of this winding is 10 080 Hz = 105·96 Hz, a third of it
    // 3360 Hz = 35·96 Hz is on the grid, and ω at the third equals ω_peak/3 in floating point.
    const freqs = Array.from({ length: 200 }, (_, k) => (k + 1) * 96);
    const points = noisy(sweep(SINGLE, freqs), 6);
    const mags = points.map((p) => Math.hypot(p.re, p.im));
    const fPeak = points[mags.indexOf(Math.max(...mags))]!.frequency;
    expect(fPeak).toBe(10080);
    expect(2 * Math.PI * (fPeak / 3)).toBe((2 * Math.PI * fPeak) / 3);
    const ref = expectStart(points);
    // The reference counts the point at exactly a third: 35 points in the region.
    expect(ref.inductive).toBe(35);
  });

  it('a sweep that stops below the resonance: the peak is its last point and C comes from twice its frequency', () => {
    const points = sweep(SINGLE, grid(280));
    const mags = points.map((p) => Math.hypot(p.re, p.im));
    expect(mags.indexOf(Math.max(...mags))).toBe(points.length - 1);
    expectStart(points);
  });

  it('no inductive region (a capacitor with leakage): L from the peak, |Z_peak|/(3ω_peak)', () => {
    const open = grid(101).map((frequency) => {
      const w = 2 * Math.PI * frequency;
      // 100 MΩ ∥ 100 pF: Y = 1/Rl + jωC.
      const yRe = 1e-8;
      const yIm = w * 100e-12;
      const yy = yRe * yRe + yIm * yIm;
      return { frequency, re: yRe / yy, im: -yIm / yy };
    });
    const ref = expectStart(open);
    expect(ref.inductive).toBe(0);
  });

  it('a lowest point with a negative real part: R starts at |Z| there', () => {
    const points = sweep(SINGLE, grid(401));
    // A reading at 5 Hz with phase 100° (Re Z < 0).
    const bad: Pt = { frequency: 5, re: 6000 * Math.cos((100 * Math.PI) / 180), im: 6000 * Math.sin((100 * Math.PI) / 180) };
    const ref = expectStart([bad, ...points]);
    expect(rel(ref.R, 6000)).toBeLessThan(1e-12);
  });
});
