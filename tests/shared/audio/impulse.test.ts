// Impulse responses of the harness presets (shared/audio/impulse.ts) against the engine's own
// exact response `simulate`, which the ngspice tests check. The filter's own response is read on a
// fine grid (the FFT of the impulse response zero-padded eight times, i.e. the DTFT of the finite
// response every fs/(8N) Hz), not through averaged spectra, so an error between the FFT bins
// shows. The FFT itself is checked against the DFT's definition, X[k] = Σ x[n]·e^(−j2πkn/N)
// (any signal-processing text, e.g. A. V. Oppenheim and R. W. Schafer, "Discrete-Time Signal
// Processing" — cited from memory).
import { describe, expect, it } from 'vitest';
import { RealFft } from '@shared/audio/fft';
import {
  filterResponse,
  harnessResponse,
  impulseLengthFor,
  impulseResponse,
  modellingDelayFor,
  ratioResponse,
  responseAtZero,
  type ImpulseResponse,
} from '@shared/audio/impulse';
import { simulate } from '@shared/circuit/metrics';
import type { Knobs, Netlist } from '@shared/circuit/netlist';
import { getPreset, HARNESS_PRESETS, type HarnessPresetId } from '@shared/circuit/presets';
import { lawValue } from '@shared/taper/law';
import { seededRandom } from '@shared/random/seeded';

function dft(x: ArrayLike<number>): { re: Float64Array; im: Float64Array } {
  const n = x.length;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let k = 0; k < n; k++) {
    for (let t = 0; t < n; t++) {
      const a = (-2 * Math.PI * ((k * t) % n)) / n;
      re[k]! += x[t]! * Math.cos(a);
      im[k]! += x[t]! * Math.sin(a);
    }
  }
  return { re, im };
}

describe('real FFT (fft.js) against the DFT definition', () => {
  const random = seededRandom(16);
  for (const n of [4, 8, 64, 512]) {
    it(`size ${n}: forward, inverse and the paired inverse`, () => {
      const fft = new RealFft(n);
      const x = Float64Array.from({ length: n }, () => random() * 2 - 1);
      const y = Float64Array.from({ length: n }, () => random() * 2 - 1);
      const ref = dft(x);
      const re = new Float64Array(n / 2 + 1);
      const im = new Float64Array(n / 2 + 1);
      fft.forward(x, re, im);
      for (let k = 0; k <= n / 2; k++) {
        expect(re[k]).toBeCloseTo(ref.re[k]!, 10);
        expect(im[k]).toBeCloseTo(ref.im[k]!, 10);
      }
      const back = new Float64Array(n);
      fft.inverse(re, im, back);
      for (let t = 0; t < n; t++) expect(back[t]).toBeCloseTo(x[t]!, 12);
      const yRe = new Float64Array(n / 2 + 1);
      const yIm = new Float64Array(n / 2 + 1);
      fft.forward(y, yRe, yIm);
      const a = new Float64Array(n);
      const b = new Float64Array(n);
      fft.inverse2(re, im, yRe, yIm, a, b);
      for (let t = 0; t < n; t++) {
        expect(a[t]).toBeCloseTo(x[t]!, 12);
        expect(b[t]).toBeCloseTo(y[t]!, 12);
      }
    });
  }
  it('refuses a size that is not a power of two', () => {
    expect(() => new RealFft(48)).toThrow(/power of two/);
  });
});

const db = (re: number, im: number) => 10 * Math.log10(re * re + im * im);

/** Largest |dB| and |degree| difference between the filter's own response and simulate, 50 Hz–10 kHz. */
function worstError(net: Netlist, knobs: Knobs, ir: ImpulseResponse): { dB: number; deg: number; at: number } {
  const fr = filterResponse(ir, 8);
  const idx: number[] = [];
  for (let k = 0; k < fr.frequencies.length; k++) if (fr.frequencies[k]! >= 50 && fr.frequencies[k]! <= 10000) idx.push(k);
  const sim = simulate(
    net,
    knobs,
    Float64Array.from(idx, (k) => fr.frequencies[k]!),
  );
  let dB = 0;
  let deg = 0;
  let at = 0;
  idx.forEach((k, j) => {
    const e = Math.abs(db(fr.re[k]!, fr.im[k]!) - sim.magnitudeDb[j]!);
    if (e > dB) {
      dB = e;
      at = fr.frequencies[k]!;
    }
    const p = (Math.atan2(fr.im[k]!, fr.re[k]!) * 180) / Math.PI - sim.phaseDeg[j]!;
    deg = Math.max(deg, Math.abs(((p + 540) % 360) - 180));
  });
  return { dB, deg, at };
}

const SETTINGS: Knobs[] = [
  { volume: 10, tone: 10 },
  { volume: 4, tone: 10 },
  { volume: 10, tone: 2 },
];

describe("impulse response: the filter's own response on a fine grid against simulate (50 Hz–10 kHz)", () => {
  for (const preset of HARNESS_PRESETS) {
    it(`${preset.name}: within 0.1 dB and 0.5° at volume/tone 10/10, 4/10 and 10/2 (48 kHz)`, () => {
      const net = preset.build(preset.defaults);
      for (const knobs of SETTINGS) {
        const ir = impulseResponse(harnessResponse(net, knobs), 48000);
        const e = worstError(net, knobs, ir);
        expect(e.dB, `${preset.id} ${knobs.volume}/${knobs.tone}: ${e.dB.toFixed(4)} dB at ${e.at.toFixed(0)} Hz`).toBeLessThan(0.1);
        expect(e.deg).toBeLessThan(0.5);
      }
    });
  }

  for (const rate of [22050, 44100, 96000]) {
    it(`every preset at volume 4 / tone 10 and 10 / 2 at ${rate} Hz: within 0.1 dB`, () => {
      for (const preset of HARNESS_PRESETS) {
        const net = preset.build(preset.defaults);
        for (const knobs of SETTINGS.slice(1)) {
          const e = worstError(net, knobs, impulseResponse(harnessResponse(net, knobs), rate));
          expect(e.dB, `${preset.id} ${knobs.volume}/${knobs.tone} at ${rate}`).toBeLessThan(0.1);
        }
      }
    });
  }

  it('the length scales with the sample rate (at least 85 ms) and the delay with the length', () => {
    expect(impulseLengthFor(48000)).toBe(4096);
    expect(impulseLengthFor(44100)).toBe(4096);
    expect(impulseLengthFor(22050)).toBe(4096);
    expect(impulseLengthFor(96000)).toBe(8192);
    expect(modellingDelayFor(4096)).toBe(512);
  });

  it('without the modelling delay, plain frequency sampling misses by more than 0.1 dB between the bins (the trap the delay avoids)', () => {
    // A bleed network at low volume: its response does not fall towards the Nyquist frequency, so
    // the ideal impulse response has energy before t = 0 that plain sampling wraps to the end.
    const net = getPreset('bleed-cap')!.build(getPreset('bleed-cap')!.defaults);
    const knobs = { volume: 3, tone: 10 };
    const plain = worstError(net, knobs, impulseResponse(harnessResponse(net, knobs), 48000, { delay: 0 }));
    const delayed = worstError(net, knobs, impulseResponse(harnessResponse(net, knobs), 48000));
    expect(plain.dB).toBeGreaterThan(0.1);
    expect(delayed.dB).toBeLessThan(0.01);
  });

  it('at volume 10 / tone 10 the bleed and interactive variants equal the plain wiring (the pot shorts the bleed; the tone branch starts at the same node)', () => {
    const ir = (id: HarnessPresetId) =>
      impulseResponse(harnessResponse(getPreset(id)!.build(getPreset(id)!.defaults), { volume: 10, tone: 10 }), 48000).samples;
    const plain = ir('independent-tone');
    const peak = plain.reduce((m, x) => Math.max(m, Math.abs(x)), 0);
    for (const id of ['interactive-tone', 'bleed-cap', 'bleed-cap-parallel-r', 'bleed-cap-series-r'] as const) {
      const other = ir(id);
      let worst = 0;
      for (let i = 0; i < plain.length; i++) worst = Math.max(worst, Math.abs(other[i]! - plain[i]!));
      // the pot's end stop is clamped at 1 mΩ, not 0: a difference of that order remains
      expect(worst / peak, id).toBeLessThan(1e-6);
    }
    // and a variant that is not the plain wiring at 10/10 does differ
    const floor = ir('tone-floor-resistor');
    let diff = 0;
    for (let i = 0; i < plain.length; i++) diff = Math.max(diff, Math.abs(floor[i]! - plain[i]!));
    expect(diff / peak).toBeGreaterThan(1e-4);
  });
});

describe('the 0 Hz bin as a limit', () => {
  it('equals the resistive divider of the network with its capacitors open (standard circuit theory)', () => {
    const preset = getPreset('independent-tone')!;
    const v = preset.defaults;
    const net = preset.build(v);
    for (const volume of [10, 5, 2]) {
      // volume pot: R·y from the wiper to ground, R·(1 − y) from the pickup hot to the wiper;
      // the amplifier's resistance across the wiper's lower half; the pickup's R in series.
      const y = lawValue(v.volumeLaw, volume / 10);
      const lower = 1 / (1 / Math.max(v.volumeR * y, 1e-3) + 1 / v.ampR);
      const upper = Math.max(v.volumeR * (1 - y), 1e-3);
      const expected = (lower / (lower + upper)) * ((lower + upper) / (lower + upper + v.pickupR));
      // 1e-8: the solver's own rounding with a pot half clamped at 1 mΩ (1000 S beside 1 µS) is ~1e-9
      expect(responseAtZero(harnessResponse(net, { volume, tone: 5 }))).toBeCloseTo(expected, 8);
    }
  });

  it('the impulse response sums to H(0) (its DFT at bin 0)', () => {
    const net = getPreset('dual-cap-tone')!.build(getPreset('dual-cap-tone')!.defaults);
    const response = harnessResponse(net, { volume: 6, tone: 3 });
    const ir = impulseResponse(response, 48000);
    expect(ir.samples.reduce((s, x) => s + x, 0)).toBeCloseTo(responseAtZero(response), 12);
  });
});

describe('H(design) / H(recording chain) with the boost limited to +12 dB', () => {
  it('follows the difference of the two simulated curves in dB, clipped at +12 dB', () => {
    const preset = getPreset('independent-tone')!;
    const design = preset.build(preset.defaults);
    // the recording chain: the same wiring into a 10 kΩ input (far darker) so that the ratio needs a large boost
    const chain = preset.build({ ...preset.defaults, ampR: 10e3 });
    const f = Float64Array.from({ length: 200 }, (_, k) => 50 * Math.pow(10000 / 50, k / 199));
    const re = new Float64Array(f.length);
    const im = new Float64Array(f.length);
    ratioResponse(harnessResponse(design, { volume: 10, tone: 10 }), harnessResponse(chain, { volume: 10, tone: 10 }))(f, re, im);
    const a = simulate(design, { volume: 10, tone: 10 }, f);
    const b = simulate(chain, { volume: 10, tone: 10 }, f);
    let clipped = 0;
    for (let k = 0; k < f.length; k++) {
      const want = Math.min(12, a.magnitudeDb[k]! - b.magnitudeDb[k]!);
      if (want === 12) clipped++;
      expect(db(re[k]!, im[k]!)).toBeCloseTo(want, 9);
      // the phase is the difference of the two phases whether clipped or not
      const p = (Math.atan2(im[k]!, re[k]!) * 180) / Math.PI - (a.phaseDeg[k]! - b.phaseDeg[k]!);
      expect(Math.abs(((p + 540) % 360) - 180)).toBeLessThan(1e-6);
    }
    expect(clipped).toBeGreaterThan(10);
  });

  it('is exactly 1 when the design is the recording chain', () => {
    const net = getPreset('bleed-cap')!.build(getPreset('bleed-cap')!.defaults);
    const f = Float64Array.of(50, 500, 5000);
    const re = new Float64Array(3);
    const im = new Float64Array(3);
    ratioResponse(harnessResponse(net, { volume: 10, tone: 10 }), harnessResponse(net, { volume: 10, tone: 10 }))(f, re, im);
    for (let k = 0; k < 3; k++) {
      expect(re[k]).toBeCloseTo(1, 12);
      expect(im[k]).toBeCloseTo(0, 12);
    }
  });
});
