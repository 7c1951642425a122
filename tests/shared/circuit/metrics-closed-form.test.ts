// The figures of a response (shared/circuit/metrics.ts) against the closed form of the simplest
// pickup circuit: a source E in series with R and L, loaded by a capacitance C and a resistance Rl
// to ground. With Y = 1/Rl + jωC the transfer is H = 1 / D, D = 1 + (R + jωL)·Y, so
//   |D|² = (a − uLC)² + u·b²,  u = ω²,  a = 1 + R/Rl,  b = L/Rl + RC   (standard circuit theory:
// a voltage divider of the series impedance and the load admittance, any introductory circuits text).
// |D|² is a quadratic in u: its minimum (the resonant peak) is at u* = a/(LC) − b²/(2L²C²), and the
// frequency where the level is k dB below a reference is the larger root of |D|² = |D_ref|²·10^(k/10).
// Every expected figure below is computed from these formulas in the test, not taken from the engine.
import { describe, expect, it } from 'vitest';
import { logFrequencies, NO_SIGNAL_DB, simulate, simulateInstrument, sweepKnobs, gridCurve } from '@shared/circuit/metrics';
import type { Netlist } from '@shared/circuit/netlist';

const R = 6000;
const L = 2.5;
const C = 470e-12;
const RL = 1e6;

function circuit(emf = 1): Netlist {
  return {
    parts: [
      { kind: 'pickup', id: 'p', hot: 'out', cold: '0', R, L, C: 0, emf },
      { kind: 'capacitor', id: 'c', a: 'out', b: '0', C },
      { kind: 'resistor', id: 'rl', a: 'out', b: '0', R: RL },
    ],
  };
}

const a = 1 + R / RL;
const b = L / RL + R * C;
const lc = L * C;
const dSquared = (f: number) => {
  const u = (2 * Math.PI * f) ** 2;
  return (a - u * lc) ** 2 + u * b * b;
};
/** Level in dB of the closed form at f, for a source of `emf` volts. */
const levelDb = (f: number, emf = 1) => 20 * Math.log10(Math.abs(emf)) - 10 * Math.log10(dSquared(f));
/** The larger frequency at which |D|² equals `target`: L²C²u² + (b² − 2aLC)u + a² − target = 0. */
const upperRoot = (target: number) => {
  const qa = lc * lc;
  const qb = b * b - 2 * a * lc;
  const qc = a * a - target;
  const u = (-qb + Math.sqrt(qb * qb - 4 * qa * qc)) / (2 * qa);
  return Math.sqrt(u) / (2 * Math.PI);
};

describe('response figures against the closed form of a pickup into C ∥ Rl', () => {
  it('peak, rise, the two −3 dB frequencies and the 1 kHz level', () => {
    const uPeak = a / lc - (b * b) / (2 * lc * lc);
    const fPeak = Math.sqrt(uPeak) / (2 * Math.PI);
    const peakDb = -10 * Math.log10(dSquared(fPeak));
    const lowDb = levelDb(20);
    const m = simulate(circuit(), {}).metrics;

    // About 4.5 kHz and +8 dB for these values: a pronounced peak inside the swept range.
    expect(fPeak).toBeGreaterThan(3000);
    expect(fPeak).toBeLessThan(6000);
    expect(m.noSignal).toBe(false);
    expect(m.peak.interior).toBe(true);
    expect(m.peak.frequency / fPeak - 1).toBeCloseTo(0, 6);
    expect(m.peak.levelDb).toBeCloseTo(peakDb, 9);
    expect(m.lowFrequencyDb).toBeCloseTo(lowDb, 9);
    expect(m.peakRiseDb).toBeCloseTo(peakDb - lowDb, 9);
    expect(m.peakRiseDb).toBeGreaterThan(5);
    // 3 dB below the level at 20 Hz, and 3 dB below the peak, both above the peak
    expect(m.cornerHz! / upperRoot(dSquared(20) * 10 ** 0.3) - 1).toBeCloseTo(0, 8);
    expect(m.peakMinus3DbHz! / upperRoot(dSquared(fPeak) * 10 ** 0.3) - 1).toBeCloseTo(0, 8);
    expect(m.level1kDb).toBeCloseTo(levelDb(1000), 9);
  });

  it('the curve itself, in dB and degrees', () => {
    const freqs = [20, 200, 1000, 4000, 12000];
    const s = simulate(circuit(), {}, freqs);
    freqs.forEach((f, k) => {
      expect(s.magnitudeDb[k]).toBeCloseTo(levelDb(f), 9);
      // arg H = −arg D, D = (a − uLC) + j·ω·b
      const w = 2 * Math.PI * f;
      expect(s.phaseDeg[k]).toBeCloseTo((-Math.atan2(w * b, a - w * w * lc) * 180) / Math.PI, 7);
    });
  });

  it('"no signal" when the whole curve lies below −120 dB, not above it', () => {
    // The same circuit with a source of 1e-7 V (−140 dB) and of 1e-5 V (−100 dB); the peak adds ~8 dB.
    const quiet = simulate(circuit(1e-7), {}).metrics;
    expect(NO_SIGNAL_DB).toBe(-120);
    expect(quiet.peak.levelDb).toBeLessThan(-120);
    expect(quiet.noSignal).toBe(true);
    const faint = simulate(circuit(1e-5), {}).metrics;
    expect(faint.peak.levelDb).toBeGreaterThan(-120);
    expect(faint.noSignal).toBe(false);
    expect(faint.level1kDb).toBeCloseTo(levelDb(1000, 1e-5), 9);
  });

  it('a flat response (resistive divider): the peak is the first point, not interior, and the rise is 0', () => {
    const flat: Netlist = {
      parts: [
        { kind: 'pickup', id: 'p', hot: 'out', cold: '0', R: 3000, L: 0, C: 0 },
        { kind: 'resistor', id: 'rl', a: 'out', b: '0', R: 1000 },
      ],
    };
    const freqs = logFrequencies(20, 20000, 31);
    const s = simulate(flat, {}, freqs);
    const divider = 20 * Math.log10(1000 / 4000);
    s.magnitudeDb.forEach((x) => expect(x).toBeCloseTo(divider, 12));
    expect(s.metrics.peak.interior).toBe(false);
    // Every point is as high as the first: the first is the peak.
    expect(s.metrics.peak.frequency).toBe(20);
    expect(s.metrics.peakRiseDb).toBeCloseTo(0, 12);
    expect(s.metrics.cornerHz).toBeNull();
  });
});

describe('logFrequencies', () => {
  it('one point is the start frequency; the ends are exact', () => {
    expect(Array.from(logFrequencies(50, 20000, 1))).toEqual([50]);
    const f = logFrequencies(10, 1000, 3);
    expect(f).toHaveLength(3);
    expect(f[0]).toBe(10);
    expect(f[1]).toBeCloseTo(100, 10);
    expect(f[2]).toBe(1000);
  });
});

describe('a whole instrument whose sources cancel exactly', () => {
  it('two equal sources in opposite phase into the same node: "no signal (cancelled)", no figures', () => {
    // Two identical coils, one reversed, each through its own 10 kΩ into the output.
    const net: Netlist = {
      parts: [
        { kind: 'pickup', id: 'a', hot: 'na', cold: '0', R, L, C: 0 },
        { kind: 'pickup', id: 'b', hot: 'nb', cold: '0', R, L, C: 0, emf: -1 },
        { kind: 'resistor', id: 'ra', a: 'na', b: 'out', R: 10e3 },
        { kind: 'resistor', id: 'rb', a: 'nb', b: 'out', R: 10e3 },
        { kind: 'resistor', id: 'rl', a: 'out', b: '0', R: RL },
      ],
    };
    const r = simulateInstrument(net, {}, [100, 1000, 5000]);
    expect(r.signal).toBe('cancelled');
    expect(r.note).toBe('no signal (cancelled)');
    expect(r.metrics).toBeNull();
    // Each pickup alone is heard (about −6 dB at 100 Hz: the other branch loads the output); the sum is not.
    expect(r.perPickup.map((p) => p.pickupId)).toEqual(['a', 'b']);
    for (const p of r.perPickup) expect(p.magnitudeDb[0]).toBeGreaterThan(-10);
    for (const x of r.magnitudeDb) expect(x).toBeLessThan(-250);
    // Finite even where the sum is an exact zero.
    expect(r.magnitudeDb.every(Number.isFinite)).toBe(true);
  });
});

describe('sweepKnobs', () => {
  // The closed-form circuit with a volume pot in front of the load and a third knob ("blend") on a
  // series resistance: the grid must pass the other knobs through and keep its own settings.
  const net: Netlist = {
    parts: [
      { kind: 'pickup', id: 'p', hot: 'in', cold: '0', R, L, C: 0 },
      { kind: 'capacitor', id: 'c', a: 'in', b: '0', C },
      { kind: 'pot', id: 'vol', a: 'in', b: '0', w: 'mid', R: 250e3, law: { kind: 'linear' }, knob: 'volume' },
      { kind: 'pot', id: 'tone', a: 'mid', w: 'x', R: 250e3, law: { kind: 'linear' }, knob: 'tone' },
      { kind: 'capacitor', id: 'ct', a: 'x', b: '0', C: 22e-9 },
      { kind: 'pot', id: 'blend', a: 'mid', w: 'out', R: 100e3, law: { kind: 'linear' }, knob: 'blend' },
      { kind: 'resistor', id: 'rl', a: 'out', b: '0', R: RL },
    ],
  };

  it('every curve is simulate at its setting, the other knobs included; the settings are kept', () => {
    const volume = [3, 10];
    const tone = [0, 6, 10];
    const freqs = logFrequencies(20, 20000, 16);
    const g = sweepKnobs(net, { volume, tone }, freqs, { knobs: { blend: 2 } });
    expect(g.volume).toEqual(volume);
    expect(g.tone).toEqual(tone);
    expect(g.magnitudeDb).toHaveLength(volume.length * tone.length * freqs.length);
    for (let ti = 0; ti < tone.length; ti++) {
      for (let vi = 0; vi < volume.length; vi++) {
        const s = simulate(net, { volume: volume[vi]!, tone: tone[ti]!, blend: 2 }, freqs);
        const curve = gridCurve(g, vi, ti);
        expect(curve).toHaveLength(freqs.length);
        curve.forEach((x, k) => expect(x).toBeCloseTo(s.magnitudeDb[k]!, 9));
        expect(g.level1kDb[ti * volume.length + vi]).toBeCloseTo(s.metrics.level1kDb, 9);
      }
    }
    // The blend knob matters here, so a grid that dropped it would differ.
    const atTen = simulate(net, { volume: 3, tone: 0, blend: 10 }, freqs).magnitudeDb[5]!;
    expect(Math.abs(gridCurve(g, 0, 0)[5]! - atTen)).toBeGreaterThan(0.01);
  });
});
