// The coil fit's rules at their edges: the flags of fitCoil with their messages, the choice of the
// parallel loss with withRp 'auto', the standard error of Rp, the phase read into (−180°, 180°],
// and the refusals of the two-resonance method and the LCR note at their exact edges. The sweeps
// are the textbook network Z = ((R + jωL) ∥ 1/(jωC)) [∥ Rp] (parallel branches, standard circuit
// theory; e.g. P. Horowitz and W. Hill, The Art of Electronics, 3rd ed., §1.7, from memory),
// computed here. No simulator.
import { describe, expect, it } from 'vitest';
import { seededNormals } from '@shared/random/seeded';
import { coilFromTwoResonances, fitCoil, lcrNote, type CoilPoint } from '@shared/analysis/coil';
import { textbookZ, type Complex, type CoilNetwork } from '../../support/coil-network';

const deg = (z: Complex) => (Math.atan2(z.im, z.re) * 180) / Math.PI;
const polar = (p: CoilNetwork, freqs: number[]): CoilPoint[] =>
  freqs.map((frequency) => {
    const z = textbookZ(p, frequency);
    return { frequency, magnitude: Math.hypot(z.re, z.im), phaseDeg: deg(z) };
  });
const f0Of = (p: CoilNetwork) => 1 / (2 * Math.PI * Math.sqrt(p.L * p.C));
/** 100 points a decade from 10 Hz. */
const grid = (n: number) => Array.from({ length: n }, (_, i) => 10 * 10 ** (i / 100));
const rel = (a: number, b: number) => Math.abs(a - b) / Math.abs(b);
const codes = (fit: { flags: { code: string }[] }) => fit.flags.map((f) => f.code);

// Typical pickup values — common practice (no published source); Rp is a value chosen for the test.
const SINGLE: CoilNetwork = { R: 6000, L: 2.5, C: 100e-12 };
const DOUBLE: CoilNetwork = { R: 8000, L: 4.4, C: 120e-12, Rp: 250e3 };

describe('fitCoil flags at their edges', () => {
  it('open coil: a lowest point at exactly −45° is not capacitive enough; a hair beyond is', () => {
    // −45° read as (−45·π)/180, which is −π/4 exactly in floating point (checked here).
    expect((-45 * Math.PI) / 180).toBe(-Math.PI / 4);
    const sweep = polar(SINGLE, grid(401));
    const at = fitCoil({ points: [{ frequency: 5, magnitude: 6000, phaseDeg: -45 }, ...sweep], withRp: false });
    expect(codes(at)).not.toContain('open-coil');
    const beyond = fitCoil({ points: [{ frequency: 5, magnitude: 6000, phaseDeg: -45.01 }, ...sweep], withRp: false });
    expect(beyond.flags.find((f) => f.code === 'open-coil')?.message).toBe(
      'The impedance is capacitive at 5.00 Hz (phase -45.0°): the coil looks open.',
    );
  });

  it('a fit that runs out of iterations says so with its iteration count', () => {
    // A capacitor with leakage (1 GΩ ∥ 100 pF) and no coil: the model's L runs away.
    const points = grid(101).map((frequency) => {
      const w = 2 * Math.PI * frequency;
      const yy = 1e-18 + (w * 100e-12) ** 2;
      return { frequency, re: 1e-9 / yy, im: -(w * 100e-12) / yy };
    });
    const fit = fitCoil({ points, withRp: false });
    expect(fit.converged).toBe(false);
    expect(fit.flags).toContainEqual({
      code: 'not-converged',
      message: `The fit did not converge after ${fit.iterations} iterations; treat the values as rough.`,
    });
  });

  it('resonance outside the sweep: the message gives f0 and the sweep’s ends in Hz', () => {
    // f0 = 1/(2π√(2.5 H · 100 pF)) = 10.07 kHz (computed here); the sweep stops at 10^3.7 Hz = 5.01 kHz.
    const freqs = grid(271);
    expect(rel(f0Of(SINGLE), 10065.84)).toBeLessThan(1e-6);
    const fit = fitCoil({ points: polar(SINGLE, freqs), withRp: false });
    expect(fit.flags).toEqual([
      {
        code: 'resonance-outside-sweep',
        message: 'The resonance (10.1 kHz) is not inside the sweep 10 Hz–5.01 kHz, so C is poorly determined.',
      },
    ]);
  });

  it('a low-Q winding swept up to 0.95·f0: the |Z| peak is inside, f0 is not, and that alone flags it', () => {
    // Q = ω0L/R = 1: the largest |Z| of the network lies near 0.86·f0 (below f0 for any Q; derived
    // from the textbook network), so the highest point is not the sweep's largest.
    const f0 = f0Of(SINGLE);
    const lowQ: CoilNetwork = { R: 2 * Math.PI * f0 * SINGLE.L, L: SINGLE.L, C: SINGLE.C };
    const freqs = Array.from({ length: 199 }, (_, i) => f0 * 10 ** ((i - 200) / 100));
    const points = polar(lowQ, freqs);
    const mags = points.map((p) => ('magnitude' in p ? p.magnitude : 0));
    expect(mags.indexOf(Math.max(...mags))).toBeLessThan(points.length - 5);
    const fit = fitCoil({ points, withRp: false });
    expect(rel(fit.f0, f0)).toBeLessThan(1e-6);
    expect(fit.f0).toBeGreaterThan(freqs[freqs.length - 1]!);
    expect(codes(fit)).toEqual(['resonance-outside-sweep']);
  });

  it('poor fit from the magnitude alone and from the phase alone, with their RMS figures; below the limits no flag', () => {
    const base = polar(SINGLE, grid(401));
    // Every other magnitude × k and ÷ k: the fit stays on the network and the ln|Z| residuals are
    // ±ln k, RMS ln k (ln 1.1 = 0.0953: 9.5 %, over the 5 % limit; ln 1.04 = 0.039, under it).
    const zigMag = (k: number) => base.map((p, i) => ('magnitude' in p ? { ...p, magnitude: p.magnitude * (i % 2 ? k : 1 / k) } : p));
    const mag = fitCoil({ points: zigMag(1.1), withRp: false });
    expect(rel(mag.L, SINGLE.L)).toBeLessThan(1e-3);
    expect(mag.rmsPhaseDeg).toBeLessThan(0.1);
    expect(mag.flags.find((f) => f.code === 'poor-fit')?.message).toMatch(
      /^The model fits poorly \(RMS 9\.5 % in magnitude, [^)]*° in phase\)\.$/,
    );
    expect(codes(fitCoil({ points: zigMag(1.04), withRp: false }))).toEqual([]);
    // Every other phase ± d: phase RMS d (5° over the 3° limit; 2.5° under it), magnitude exact.
    const zigPhase = (d: number) => base.map((p, i) => ('phaseDeg' in p ? { ...p, phaseDeg: p.phaseDeg + (i % 2 ? d : -d) } : p));
    const phase = fitCoil({ points: zigPhase(5), withRp: false });
    expect(phase.rmsLogMag).toBeLessThan(1e-3);
    expect(phase.flags.find((f) => f.code === 'poor-fit')?.message).toMatch(
      /^The model fits poorly \(RMS [^ ]+ % in magnitude, 5\.0° in phase\)\.$/,
    );
    expect(codes(fitCoil({ points: zigPhase(2.5), withRp: false }))).toEqual([]);
  });
});

describe("fitCoil withRp 'auto': the score test and the F test", () => {
  it('without a parallel loss, auto is the three-parameter fit itself (the four-parameter fit is not run)', () => {
    const exact = polar(SINGLE, grid(401));
    // 1 % complex noise, seeded; and a "negative loss" (a conductance of −1 µS across), which the
    // score step rejects outright.
    const noisy = (seed: number) => {
      const g = seededNormals(seed);
      return exact.map((p) =>
        'magnitude' in p ? { ...p, magnitude: p.magnitude * (1 + 0.01 * g()), phaseDeg: p.phaseDeg + 0.57 * g() } : p,
      );
    };
    const negative = polar({ ...SINGLE, Rp: -1e6 }, grid(401));
    for (const points of [exact, noisy(1), noisy(2), noisy(3), noisy(4), negative]) {
      const fixed = fitCoil({ points, withRp: false });
      expect(fitCoil({ points, withRp: 'auto' })).toEqual(fixed);
      // 'auto' is the default.
      expect(fitCoil({ points })).toEqual(fixed);
    }
  });

  it('a strong loss is kept even from five points (F well above 10.83 with 2·5 − 4 = 6 degrees of freedom)', () => {
    const points = polar(DOUBLE, [500, 2000, 5000, 7000, 10000]);
    const fit = fitCoil({ points });
    expect(fit.Rp).not.toBeNull();
    expect(rel(fit.Rp!, DOUBLE.Rp!)).toBeLessThan(1e-4);
    expect(rel(fit.L, DOUBLE.L)).toBeLessThan(1e-4);
  });

  it('withRp true counts the iterations of both fits: more than the three-parameter fit alone', () => {
    const points = polar(DOUBLE, grid(401));
    const three = fitCoil({ points, withRp: false });
    const four = fitCoil({ points, withRp: true });
    expect(four.converged).toBe(true);
    expect(four.iterations).toBeGreaterThan(three.iterations);
  });
});

describe('the standard error of Rp', () => {
  it('is Rp·σ_lnRp from the covariance s²·(JᵀJ)⁻¹ at the solution (delta method), J by central differences here', () => {
    const g = seededNormals(7);
    const freqs = grid(401);
    const points = freqs.map((frequency) => {
      const z = textbookZ(DOUBLE, frequency);
      return { frequency, magnitude: Math.hypot(z.re, z.im) * (1 + 0.01 * g()), phaseDeg: deg(z) + 0.57 * g() };
    });
    const fit = fitCoil({ points, withRp: true });
    expect(fit.converged).toBe(true);
    expect(Math.abs(fit.Rp! - DOUBLE.Rp!)).toBeLessThan(5 * fit.stderr.Rp!);
    // The loss stands far above 1 % noise: 'auto' keeps it and gives the four-parameter fit.
    expect(fitCoil({ points, withRp: 'auto' })).toEqual(fit);
    const theta = [fit.R, fit.L, fit.C, fit.Rp!].map(Math.log);
    // ln Z as [ln|Z|, phase] of the textbook network at θ = ln(R, L, C, Rp).
    const lnZ = (t: number[], f: number) => {
      const z = textbookZ({ R: Math.exp(t[0]!), L: Math.exp(t[1]!), C: Math.exp(t[2]!), Rp: Math.exp(t[3]!) }, f);
      return [Math.log(Math.hypot(z.re, z.im)), Math.atan2(z.im, z.re)];
    };
    const jtj = [0, 1, 2, 3].map(() => [0, 0, 0, 0]);
    let ssr = 0;
    points.forEach((p) => {
      const at = lnZ(theta, p.frequency);
      const r = [Math.log(p.magnitude) - at[0]!, (p.phaseDeg * Math.PI) / 180 - at[1]!];
      ssr += r[0]! ** 2 + r[1]! ** 2;
      const cols = [0, 1, 2, 3].map((k) => {
        const h = 1e-6;
        const up = theta.map((v, j) => (j === k ? v + h : v));
        const dn = theta.map((v, j) => (j === k ? v - h : v));
        const a = lnZ(up, p.frequency);
        const b = lnZ(dn, p.frequency);
        return [(a[0]! - b[0]!) / (2 * h), (a[1]! - b[1]!) / (2 * h)];
      });
      for (const row of [0, 1]) for (let i = 0; i < 4; i++) for (let j = 0; j < 4; j++) jtj[i]![j]! += cols[i]![row]! * cols[j]![row]!;
    });
    // Gauss–Jordan inverse of the 4 × 4 normal matrix.
    const m = jtj.map((row, i) => [...row, ...[0, 1, 2, 3].map((j) => (i === j ? 1 : 0))]);
    for (let c = 0; c < 4; c++) {
      const piv = m[c]![c]!;
      for (let j = 0; j < 8; j++) m[c]![j]! /= piv;
      for (let r = 0; r < 4; r++) {
        if (r === c) continue;
        const k = m[r]![c]!;
        for (let j = 0; j < 8; j++) m[r]![j]! -= k * m[c]![j]!;
      }
    }
    const s2 = ssr / (2 * points.length - 4);
    const expected = fit.Rp! * Math.sqrt(s2 * m[3]![7]!);
    expect(fit.stderr.Rp).not.toBeNull();
    expect(rel(fit.stderr.Rp!, expected)).toBeLessThan(1e-3);
    // And for C, the same way.
    expect(rel(fit.stderr.C, fit.C * Math.sqrt(s2 * m[2]![6]!))).toBeLessThan(1e-3);
  });
});

describe('phases read into (−180°, 180°]', () => {
  it('−180° and 540° read as 180°, the same as a negative real impedance given as re and im', () => {
    const sweep = polar(SINGLE, grid(401));
    // One odd reading at 20 Hz: a negative resistance of 5 kΩ.
    const asReIm = fitCoil({ points: [...sweep, { frequency: 20, re: -5000, im: 0 }], withRp: false });
    for (const phaseDeg of [-180, 180, 540]) {
      const asPolar = fitCoil({ points: [...sweep, { frequency: 20, magnitude: 5000, phaseDeg }], withRp: false });
      expect(asPolar.residuals[0]).toEqual(asReIm.residuals[0]);
      expect(asPolar.R).toBe(asReIm.R);
    }
  });
});

describe('two resonances and the LCR note at their exact edges', () => {
  it('equal frequencies, equal capacitors and a zero self-capacitance are refused', () => {
    expect(() => coilFromTwoResonances({ f1: 1000, f2: 1000, cx: 1e-10 })).toThrow('must resonate below');
    expect(() => coilFromTwoResonances({ f1: 2000, f2: 1000, cx: 1e-10, c1: 1e-10 })).toThrow('must resonate below');
    // f1 = 2·f2 with cx = 4·c1: C = (f2²·cx − f1²·c1)/(f1² − f2²) = 0 exactly.
    expect(() => coilFromTwoResonances({ f1: 2, f2: 1, cx: 4e-10, c1: 1e-10 })).toThrow('no positive self-capacitance');
  });

  it('exactly at self-resonance (ω²LC = 1 in floating point) the reading is called meaningless, with f0', () => {
    const C = 100e-12;
    const f = 1 / (2 * Math.PI * Math.sqrt(2.5 * C));
    // The L within a few ulps of 2.5 H (ulp 2^−51) at which ω²LC rounds to exactly 1 at this f.
    const w = 2 * Math.PI * f;
    const L = Array.from({ length: 41 }, (_, k) => 2.5 + (k - 20) * 2 ** -51).find((l) => w * w * l * C === 1);
    expect(L).toBeDefined();
    expect(lcrNote({ L: L!, C, frequency: f })).toBe(
      'At 1.01e+4 Hz the coil is at or above its self-resonance (10.1 kHz): an LCR reading of inductance there is meaningless.',
    );
  });
});
