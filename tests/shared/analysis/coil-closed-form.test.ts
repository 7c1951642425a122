// The coil model and fit against the textbook impedance of the lumped network, written out in this
// file with its own complex arithmetic: Z = ((R + jωL) ∥ 1/(jωC)) [∥ Rp], the impedance of parallel
// branches (standard circuit theory; e.g. P. Horowitz and W. Hill, The Art of Electronics, 3rd ed.,
// §1.7, from memory). coil.test.ts makes the same checks on ngspice sweeps; this file needs no
// simulator, so it also runs in the mutation runs (docs/mutation.md).
import { describe, expect, it } from 'vitest';
import { ANALYSIS_ENGINE_VERSION } from '@shared/analysis/engine-version';
import { seededNormals } from '@shared/random/seeded';
import {
  apparentInductance,
  coilFromTwoResonances,
  coilImpedance,
  fitCoil,
  inductanceFromReading,
  lcrNote,
  resonanceFrequency,
  type CoilPoint,
} from '@shared/analysis/coil';

type Complex = { re: number; im: number };
const add = (a: Complex, b: Complex): Complex => ({ re: a.re + b.re, im: a.im + b.im });
const mul = (a: Complex, b: Complex): Complex => ({ re: a.re * b.re - a.im * b.im, im: a.re * b.im + a.im * b.re });
const div = (a: Complex, b: Complex): Complex => {
  const d = b.re * b.re + b.im * b.im;
  return { re: (a.re * b.re + a.im * b.im) / d, im: (a.im * b.re - a.re * b.im) / d };
};
const parallel = (a: Complex, b: Complex): Complex => div(mul(a, b), add(a, b));
const abs = (z: Complex) => Math.hypot(z.re, z.im);

/** The textbook network: the series branch R + jωL, the capacitor 1/(jωC) = −j/(ωC), and Rp across. */
function textbookZ(p: { R: number; L: number; C: number; Rp?: number }, f: number): Complex {
  const w = 2 * Math.PI * f;
  const series = { re: p.R, im: w * p.L };
  const cap = { re: 0, im: -1 / (w * p.C) };
  const z = parallel(series, cap);
  return p.Rp === undefined ? z : parallel(z, { re: p.Rp, im: 0 });
}

/** 401 points, 100 a decade, 10 Hz–100 kHz (the grid of the bench sweeps). */
const GRID = Array.from({ length: 401 }, (_, i) => 10 * 10 ** (i / 100));
const sweepOf = (p: { R: number; L: number; C: number; Rp?: number }, grid = GRID) =>
  grid.map((frequency) => ({ frequency, ...textbookZ(p, frequency) }));
const asPolar = (points: { frequency: number; re: number; im: number }[]): CoilPoint[] =>
  points.map((p) => ({ frequency: p.frequency, magnitude: abs(p), phaseDeg: (Math.atan2(p.im, p.re) * 180) / Math.PI }));

// Typical pickup values — common practice (no published source); Rp is a value chosen for the test.
const SINGLE = { R: 6000, L: 2.5, C: 100e-12 };
const DOUBLE = { R: 8000, L: 4.4, C: 120e-12, Rp: 250e3 };
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);

describe('coilImpedance against the textbook network', () => {
  it('equals ((R + jωL) ∥ 1/(jωC)) within 1e-12 across 10 Hz–100 kHz, with and without Rp', () => {
    for (const p of [SINGLE, DOUBLE]) {
      for (const f of GRID) {
        const z = coilImpedance(p, f);
        const ref = textbookZ(p, f);
        expect(Math.abs(z.re - ref.re) / abs(ref)).toBeLessThan(1e-12);
        expect(Math.abs(z.im - ref.im) / abs(ref)).toBeLessThan(1e-12);
      }
    }
  });

  it('Rp null or absent means no parallel loss', () => {
    const ref = textbookZ(SINGLE, 7000);
    for (const z of [coilImpedance({ ...SINGLE, Rp: null }, 7000), coilImpedance(SINGLE, 7000)]) {
      expect(rel(z.re, ref.re)).toBeLessThan(1e-12);
      expect(rel(z.im, ref.im)).toBeLessThan(1e-12);
    }
  });
});

describe('fitCoil on textbook sweeps', () => {
  it('recovers R, L, C of the single-coil-like winding within 1e-6, with f0, Q, the peak and no flags', () => {
    for (const points of [sweepOf(SINGLE), asPolar(sweepOf(SINGLE))]) {
      for (const withRp of [false, 'auto'] as const) {
        const fit = fitCoil({ points, withRp });
        expect(fit.converged).toBe(true);
        expect(fit.iterations).toBeGreaterThan(0);
        expect(rel(fit.R, SINGLE.R)).toBeLessThan(1e-6);
        expect(rel(fit.L, SINGLE.L)).toBeLessThan(1e-6);
        expect(rel(fit.C, SINGLE.C)).toBeLessThan(1e-6);
        expect(fit.Rp).toBeNull();
        expect(fit.stderr.Rp).toBeNull();
        // f0 = 1/(2π√(LC)) and, without Rp, Q = ω0·L/R (the series branch's Q): standard theory.
        const f0 = 1 / (2 * Math.PI * Math.sqrt(SINGLE.L * SINGLE.C));
        expect(rel(fit.f0, f0)).toBeLessThan(1e-6);
        expect(rel(fit.Q, (2 * Math.PI * f0 * SINGLE.L) / SINGLE.R)).toBeLessThan(1e-6);
        expect(fit.rmsLogMag).toBeLessThan(1e-8);
        expect(fit.rmsPhaseDeg).toBeLessThan(1e-6);
        expect(fit.flags).toEqual([]);
        expect(fit.engineVersion).toBe(ANALYSIS_ENGINE_VERSION);
      }
    }
  });

  it('recovers R, L, C, Rp of the humbucker-like winding within 1e-5 (withRp true and auto), and Q of the parallel resonator', () => {
    const points = sweepOf(DOUBLE);
    for (const withRp of [true, 'auto'] as const) {
      const fit = fitCoil({ points, withRp });
      expect(fit.converged).toBe(true);
      expect(rel(fit.R, DOUBLE.R)).toBeLessThan(1e-5);
      expect(rel(fit.L, DOUBLE.L)).toBeLessThan(1e-5);
      expect(rel(fit.C, DOUBLE.C)).toBeLessThan(1e-5);
      expect(rel(fit.Rp as number, DOUBLE.Rp)).toBeLessThan(1e-5);
      expect(fit.stderr.Rp).not.toBeNull();
      // Q = R_par/(ω0·L) with R_par = (L/(R·C)) ∥ Rp: the series loss as a parallel resistance at
      // resonance, in parallel with Rp (standard theory of the parallel resonator).
      const w0 = 1 / Math.sqrt(DOUBLE.L * DOUBLE.C);
      const rs = DOUBLE.L / (DOUBLE.R * DOUBLE.C);
      const rPar = (rs * DOUBLE.Rp) / (rs + DOUBLE.Rp);
      expect(rel(fit.Q, rPar / (w0 * DOUBLE.L))).toBeLessThan(1e-5);
    }
    // Without the fourth parameter the model cannot follow the loss: a visible misfit, not flagged poor.
    const forced = fitCoil({ points, withRp: false });
    expect(forced.Rp).toBeNull();
    expect(forced.rmsLogMag).toBeGreaterThan(1e-3);
  });

  it('withRp true on data without a loss caps Rp at 1000 × the largest |Z| (no measurable loss)', () => {
    const points = sweepOf(SINGLE);
    const fit = fitCoil({ points, withRp: true });
    const zMax = Math.max(...points.map(abs));
    expect(fit.Rp).not.toBeNull();
    expect(rel(fit.Rp as number, 1000 * zMax)).toBeLessThan(1e-6);
    expect(rel(fit.L, SINGLE.L)).toBeLessThan(1e-3);
  });

  it('the peak of the fitted model is the largest |Z| of the textbook network (dense search in the test)', () => {
    for (const p of [SINGLE, DOUBLE]) {
      const fit = fitCoil({ points: sweepOf(p), withRp: 'auto' });
      const f0 = 1 / (2 * Math.PI * Math.sqrt(p.L * p.C));
      let best = { f: 0, m: 0 };
      for (let i = -3000; i <= 3000; i++) {
        const f = f0 * Math.exp(i * 1e-5);
        const m = abs(textbookZ(p, f));
        if (m > best.m) best = { f, m };
      }
      expect(rel(fit.peakFrequency, best.f)).toBeLessThan(2e-5);
      expect(rel(fit.peakMagnitude, best.m)).toBeLessThan(1e-6);
    }
  });

  it('residuals: one per usable point, in ascending frequency whatever the input order, measured minus fitted', () => {
    const points = sweepOf(SINGLE, GRID.slice(0, 350));
    const shuffled = points
      .map((p, i) => ({ p, k: (i * 7919) % points.length }))
      .sort((a, b) => a.k - b.k)
      .map((x) => x.p);
    // Points without a positive frequency or with a non-finite value are skipped.
    const input: CoilPoint[] = [
      ...shuffled,
      { frequency: 0, re: 1, im: 1 },
      { frequency: -5, re: 1, im: 1 },
      { frequency: 50, magnitude: 0, phaseDeg: 0 },
    ];
    // One point off the model by a known 2 % in magnitude and 1° in phase.
    const k = 150;
    const target = points[k] as { frequency: number; re: number; im: number };
    input.push({
      frequency: target.frequency * (1 + 1e-9),
      magnitude: abs(target) * 1.02,
      phaseDeg: (Math.atan2(target.im, target.re) * 180) / Math.PI + 1,
    });
    const fit = fitCoil({ points: input, withRp: false });
    expect(fit.residuals).toHaveLength(351);
    for (let i = 1; i < fit.residuals.length; i++) {
      expect(fit.residuals[i]!.frequency).toBeGreaterThan(fit.residuals[i - 1]!.frequency);
    }
    const off = fit.residuals.find((r) => r.frequency === target.frequency * (1 + 1e-9))!;
    // One outlier among 351 hardly moves the fit: its residual is close to the planted offset.
    expect(off.logMag).toBeCloseTo(Math.log(1.02), 2);
    expect(off.phaseDeg).toBeCloseTo(1, 0);
    // RMS over the residuals: the single outlier dominates.
    expect(fit.rmsLogMag).toBeCloseTo(Math.abs(off.logMag) / Math.sqrt(351), 4);
  });

  it('phases given as −350°, 370° or 180 + 360° read the same as their principal values', () => {
    const base = asPolar(sweepOf(SINGLE));
    const shifted = base.map((p, i) =>
      'phaseDeg' in p ? { ...p, phaseDeg: p.phaseDeg + (i % 3 === 0 ? 360 : i % 3 === 1 ? -360 : 720) } : p,
    );
    const a = fitCoil({ points: base, withRp: false });
    const b = fitCoil({ points: shifted, withRp: false });
    expect(rel(b.L, a.L)).toBeLessThan(1e-9);
    expect(rel(b.C, a.C)).toBeLessThan(1e-9);
    expect(rel(b.R, a.R)).toBeLessThan(1e-9);
    expect(b.rmsPhaseDeg).toBeLessThan(1e-6);
  });

  it('with 1 % noise (seeded): values within a few standard errors, residuals the size of the noise', () => {
    const clean = sweepOf(SINGLE);
    for (const seed of [1, 2]) {
      const g = seededNormals(seed);
      const points = clean.map((p) => ({
        frequency: p.frequency,
        magnitude: abs(p) * (1 + 0.01 * g()),
        phaseDeg: ((Math.atan2(p.im, p.re) + 0.01 * g()) * 180) / Math.PI,
      }));
      const fit = fitCoil({ points, withRp: false });
      for (const k of ['R', 'L', 'C'] as const) {
        expect(fit.stderr[k]).toBeGreaterThan(0);
        expect(fit.stderr[k] / fit[k]).toBeLessThan(0.02);
        expect(Math.abs(fit[k] - SINGLE[k])).toBeLessThan(5 * fit.stderr[k]);
      }
      expect(fit.rmsLogMag).toBeGreaterThan(0.008);
      expect(fit.rmsLogMag).toBeLessThan(0.012);
      expect(fit.rmsPhaseDeg).toBeGreaterThan(0.45);
      expect(fit.rmsPhaseDeg).toBeLessThan(0.7);
      expect(fit.flags).toEqual([]);
    }
  });

  it('needs 3 points without Rp and 4 otherwise, counting only positive frequencies', () => {
    const four = sweepOf(SINGLE, [1000, 3000, 10000, 30000]);
    expect(() => fitCoil({ points: four.slice(0, 2), withRp: false })).toThrow('at least 3 points');
    expect(() => fitCoil({ points: four.slice(0, 3), withRp: false })).not.toThrow();
    expect(() => fitCoil({ points: four.slice(0, 3) })).toThrow('at least 4 points');
    expect(() => fitCoil({ points: four.slice(0, 3), withRp: true })).toThrow(RangeError);
    expect(() => fitCoil({ points: [...four.slice(0, 3), { frequency: 0, re: 1, im: 0 }] })).toThrow('at least 4 points');
    expect(() => fitCoil({ points: four })).not.toThrow();
  });
});

describe('fitCoil flags', () => {
  it('an open winding (capacitor and leakage only) is flagged open-coil with the phase at the lowest frequency', () => {
    // 101 points (25 a decade): a fit of a network with no coil runs to its iteration limit.
    const grid = GRID.filter((_, i) => i % 4 === 0);
    const points = grid.map((frequency) => ({
      frequency,
      ...parallel({ re: 0, im: -1 / (2 * Math.PI * frequency * 100e-12) }, { re: 1e9, im: 0 }),
    }));
    const fit = fitCoil({ points });
    const open = fit.flags.find((f) => f.code === 'open-coil');
    expect(open?.message).toContain('capacitive at 10.0 Hz');
    // The textbook phase of 1 GΩ ∥ 100 pF at 10 Hz: −atan(ωRC) = −81.0°.
    const phase = (-Math.atan(2 * Math.PI * 10 * 1e9 * 100e-12) * 180) / Math.PI;
    expect(open?.message).toContain(`(phase ${phase.toFixed(1)}°)`);
    // With the leakage at 10 MΩ the lowest point is resistive (−3.6°): the phase rule does not fire.
    const leaky = grid.map((frequency) => ({
      frequency,
      ...parallel({ re: 0, im: -1 / (2 * Math.PI * frequency * 100e-12) }, { re: 10e6, im: 0 }),
    }));
    expect(fitCoil({ points: leaky }).flags.map((f) => f.code)).not.toContain('open-coil');
  });

  it('a sweep that stops below the resonance is flagged resonance-outside-sweep; one that covers it is not', () => {
    const f0 = resonanceFrequency(SINGLE.L, SINGLE.C); // ≈ 10 kHz
    const below = fitCoil({
      points: sweepOf(
        SINGLE,
        GRID.filter((f) => f < f0 / 2),
      ),
      withRp: false,
    });
    expect(below.flags.map((f) => f.code)).toContain('resonance-outside-sweep');
    expect(below.flags.find((f) => f.code === 'resonance-outside-sweep')?.message).toMatch(/is not inside the sweep 10(\.0)? Hz/);
    const above = fitCoil({
      points: sweepOf(
        SINGLE,
        GRID.filter((f) => f > f0 * 2),
      ),
      withRp: false,
    });
    expect(above.flags.map((f) => f.code)).toContain('resonance-outside-sweep');
    const around = fitCoil({
      points: sweepOf(
        SINGLE,
        GRID.filter((f) => f > f0 / 3 && f < f0 * 3),
      ),
      withRp: false,
    });
    expect(around.flags.map((f) => f.code)).not.toContain('resonance-outside-sweep');
  });

  it('data the model cannot follow (two resonances) is flagged poor-fit with its RMS', () => {
    // Two separate windings in series, resonating an octave and a half apart.
    const points = GRID.map((frequency) => ({
      frequency,
      ...add(textbookZ(SINGLE, frequency), textbookZ({ R: 3000, L: 0.5, C: 100e-12 }, frequency)),
    }));
    const fit = fitCoil({ points, withRp: false });
    const poor = fit.flags.find((f) => f.code === 'poor-fit');
    expect(poor).toBeDefined();
    expect(poor?.message).toContain(`RMS ${(fit.rmsLogMag * 100).toPrecision(2)} % in magnitude`);
    expect(fit.rmsLogMag > 0.05 || fit.rmsPhaseDeg > 3).toBe(true);
  });
});

describe('resonance and LCR helpers against their textbook forms', () => {
  it('apparent inductance L/(1 − ω²LC) and its inverse, at 1 kHz and 5 kHz', () => {
    for (const f of [1000, 5000]) {
      const w = 2 * Math.PI * f;
      const read = 2.5 / (1 - w * w * 2.5 * 100e-12);
      expect(rel(apparentInductance({ L: 2.5, C: 100e-12, frequency: f }), read)).toBeLessThan(1e-12);
      expect(rel(inductanceFromReading({ reading: read, C: 100e-12, frequency: f }), 2.5)).toBeLessThan(1e-12);
      // Im Z/ω of the lossless network is the apparent inductance (the textbook network above).
      expect(rel(textbookZ({ R: 1e-9, L: 2.5, C: 100e-12 }, f).im / w, read)).toBeLessThan(1e-9);
    }
  });

  it('two resonances give back C and L from their textbook frequencies, with c1 = 0 and with c1 > 0', () => {
    const f = (c: number) => 1 / (2 * Math.PI * Math.sqrt(2.5 * c));
    const alone = coilFromTwoResonances({ f1: f(100e-12), f2: f(200e-12), cx: 100e-12 });
    expect(rel(alone.C, 100e-12)).toBeLessThan(1e-9);
    expect(rel(alone.L, 2.5)).toBeLessThan(1e-9);
    const both = coilFromTwoResonances({ f1: f(150e-12), c1: 50e-12, f2: f(300e-12), cx: 200e-12 });
    expect(rel(both.C, 100e-12)).toBeLessThan(1e-9);
    expect(rel(both.L, 2.5)).toBeLessThan(1e-9);
  });

  it('two resonances refuse readings that cannot be', () => {
    expect(() => coilFromTwoResonances({ f1: 0, f2: 1, cx: 1e-10 })).toThrow('must be positive');
    expect(() => coilFromTwoResonances({ f1: 2, f2: 0, cx: 1e-10 })).toThrow('must be positive');
    expect(() => coilFromTwoResonances({ f1: 2, f2: 1, cx: 0 })).toThrow('must be positive');
    expect(() => coilFromTwoResonances({ f1: 2, f2: 1, cx: 1e-10, c1: -1e-12 })).toThrow('must be positive');
    expect(() => coilFromTwoResonances({ f1: 1, f2: 2, cx: 1e-10 })).toThrow('must resonate below');
    expect(() => coilFromTwoResonances({ f1: 2, f2: 1, cx: 1e-10, c1: 2e-10 })).toThrow('must resonate below');
    // f1/f2 = 1.1 with c1 = 0.9·cx: C = (f2²·cx − f1²·c1)/(f1² − f2²) < 0.
    expect(() => coilFromTwoResonances({ f1: 1.1, f2: 1, cx: 1e-10, c1: 0.9e-10 })).toThrow('no positive self-capacitance');
  });

  it('lcrNote: the rise in per cent from L/(1 − ω²LC), above self-resonance, and with C unknown', () => {
    const w = 2 * Math.PI * 1000;
    const raised = (1 / (1 - w * w * 2.5 * 100e-12) - 1) * 100;
    expect(lcrNote({ L: 2.5, C: 100e-12, frequency: 1000 })).toBe(
      `At 1.00e+3 Hz the self-capacitance of 100 pF raises the apparent inductance by ${raised.toPrecision(2)} % (${(2.5 / (1 - w * w * 2.5 * 100e-12)).toPrecision(4)} H read for 2.500 H).`,
    );
    const f0 = resonanceFrequency(2.5, 100e-12);
    expect(lcrNote({ L: 2.5, C: 100e-12, frequency: f0 * 1.001 })).toMatch(/at or above its self-resonance/);
    expect(lcrNote({ L: 2.5, C: 100e-12, frequency: f0 * 0.999 })).toMatch(/raises the apparent inductance/);
    for (const C of [undefined, 0]) {
      expect(lcrNote({ L: 2.5, C, frequency: 1000 })).toBe(
        "The inductance read at 1.00e+3 Hz is raised by the coil's self-capacitance (L' = L/(1 − ω²LC)); with C unknown the true L is somewhat lower than read.",
      );
    }
  });
});
