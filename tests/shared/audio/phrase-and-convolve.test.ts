// The built-in phrase (plucked-string model of Karplus and Strong, Computer Music Journal 7(2),
// 1983) and the overlap-add convolution with crossfades (shared/audio/phrase.ts, convolve.ts).
import { describe, expect, it } from 'vitest';
import { convolve, renderSegments } from '@shared/audio/convolve';
import { RealFft } from '@shared/audio/fft';
import { harnessResponse, impulseResponse, type ImpulseResponse } from '@shared/audio/impulse';
import { DEFAULT_PHRASE_SEED, phraseFrames, synthesizePhrase } from '@shared/audio/phrase';
import { getPreset } from '@shared/circuit/presets';
import { seededRandom } from '@shared/random/seeded';

/** Magnitude spectrum (Hann window) of x[from, from + n), bins 0..n/2. */
function spectrum(x: Float32Array, from: number, n: number): Float64Array {
  const fft = new RealFft(n);
  const w = new Float64Array(n);
  for (let i = 0; i < n; i++) w[i] = x[from + i]! * (0.5 - 0.5 * Math.cos((2 * Math.PI * i) / n));
  const re = new Float64Array(n / 2 + 1);
  const im = new Float64Array(n / 2 + 1);
  fft.forward(w, re, im);
  return re.map((r, k) => Math.hypot(r, im[k]!));
}

/** The largest bin within ±3 % of f, refined by parabolic interpolation on the log magnitude; frequency and magnitude. */
function peakNear(mag: Float64Array, f: number, fs: number, n: number): { f: number; mag: number } {
  const lo = Math.floor((f * 0.97 * n) / fs);
  const hi = Math.ceil((f * 1.03 * n) / fs);
  let k = lo;
  for (let i = lo; i <= hi; i++) if (mag[i]! > mag[k]!) k = i;
  const a = Math.log(mag[k - 1]!);
  const b = Math.log(mag[k]!);
  const c = Math.log(mag[k + 1]!);
  const d = (0.5 * (a - c)) / (a - 2 * b + c);
  return { f: ((k + d) * fs) / n, mag: mag[k]! };
}

describe('plucked-string phrase', () => {
  it('phraseFrames gives the length the synthesis makes, without synthesising', () => {
    for (const options of [
      { sampleRate: 22050 },
      { sampleRate: 48000 },
      {
        sampleRate: 44100,
        notes: [
          { string: 2, fret: 3, time: 0.75, velocity: 0.7 },
          { string: 5, fret: 0, time: 0.1, velocity: 0.9 },
        ],
      },
      { sampleRate: 22050, seconds: 1.25 },
    ]) {
      expect(phraseFrames(options)).toBe(synthesizePhrase(options).tracks[0]!.length);
    }
    // The last note at 0.75 s and 1.6 s of ring, at 44.1 kHz: round(2.35 × 44100).
    expect(phraseFrames({ sampleRate: 44100, notes: [{ string: 2, fret: 3, time: 0.75, velocity: 0.7 }] })).toBe(103635);
  });

  it('is the same for the same seed and differs for another', () => {
    const a = synthesizePhrase({ sampleRate: 22050, seed: 3 }).tracks[0]!;
    const b = synthesizePhrase({ sampleRate: 22050, seed: 3 }).tracks[0]!;
    const c = synthesizePhrase({ sampleRate: 22050, seed: 4 }).tracks[0]!;
    expect(b).toEqual(a);
    let diff = 0;
    for (let i = 0; i < a.length; i++) diff = Math.max(diff, Math.abs(a[i]! - c[i]!));
    expect(diff).toBeGreaterThan(0.01);
  });

  it('plays in tune: A4 (top string, fifth fret) at 440 Hz within 2 cents (ISO 16:1975 concert pitch, equal temperament)', () => {
    for (const fs of [44100, 48000]) {
      const note = synthesizePhrase({ sampleRate: fs, notes: [{ string: 5, fret: 5, time: 0, velocity: 0.8 }], seconds: 1.5 }).tracks[0]!;
      const n = 32768;
      const mag = spectrum(note, Math.round(0.2 * fs), n);
      const f = peakNear(mag, 440, fs, n).f;
      expect(Math.abs(1200 * Math.log2(f / 440)), `${fs} Hz: ${f.toFixed(3)}`).toBeLessThan(2);
    }
  });

  it('each pickup hears the string through the comb of its place: harmonic k scales as |sin(πkp)| (two places compared)', () => {
    const fs = 48000;
    const positions = [0.25, 0.1];
    // low E (82.4 Hz); a mid-phrase window where the note rings
    const phrase = synthesizePhrase({
      sampleRate: fs,
      pickupPositions: positions,
      notes: [{ string: 0, fret: 0, time: 0, velocity: 0.8 }],
      seconds: 1.5,
    });
    const n = 32768;
    const f0 = 440 * Math.pow(2, (40 - 69) / 12);
    const a = spectrum(phrase.tracks[0]!, Math.round(0.3 * fs), n);
    const b = spectrum(phrase.tracks[1]!, Math.round(0.3 * fs), n);
    for (const k of [1, 2, 3, 5, 6]) {
      const measured = 20 * Math.log10(peakNear(a, k * f0, fs, n).mag / peakNear(b, k * f0, fs, n).mag);
      const expected = 20 * Math.log10(Math.abs(Math.sin(Math.PI * k * positions[0]!)) / Math.abs(Math.sin(Math.PI * k * positions[1]!)));
      expect(Math.abs(measured - expected), `harmonic ${k}: ${measured.toFixed(2)} dB against ${expected.toFixed(2)} dB`).toBeLessThan(0.5);
    }
  });

  it('peaks at the level asked for, over all tracks together', () => {
    const p = synthesizePhrase({ sampleRate: 22050, pickupPositions: [0.062, 0.25], peak: 0.5 });
    const peaks = p.tracks.map((t) => t.reduce((m, x) => Math.max(m, Math.abs(x)), 0));
    expect(Math.max(...peaks)).toBeCloseTo(0.5, 6);
    expect(Math.min(...peaks)).toBeLessThan(0.5);
  });
});

describe('overlap-add convolution', () => {
  it('equals the direct sum y[n] = Σ h[m]·x[n − m] (definition of discrete convolution), delay taken off', () => {
    const random = seededRandom(5);
    const x = Float32Array.from({ length: 5000 }, () => random() * 2 - 1);
    const h = Float64Array.from({ length: 300 }, (_, m) => Math.exp(-m / 40) * (random() - 0.5));
    const ir: ImpulseResponse = { samples: h, sampleRate: 48000, delay: 7 };
    const y = convolve(x, ir);
    expect(y.length).toBe(x.length);
    for (const n of [0, 1, 6, 7, 100, 299, 300, 1023, 1024, 2047, 2048, 4096, 4999]) {
      let want = 0;
      for (let m = 0; m < h.length; m++) {
        const i = n + ir.delay - m;
        if (i >= 0 && i < x.length) want += h[m]! * x[i]!;
      }
      expect(y[n]).toBeCloseTo(want, 5);
    }
  });

  it('a crossfade between two identical filters leaves the signal as one filter renders it', () => {
    const fs = 22050;
    const phrase = synthesizePhrase({ sampleRate: fs, seconds: 2 });
    const net = getPreset('bleed-cap')!.build(getPreset('bleed-cap')!.defaults);
    const ir = impulseResponse(harnessResponse(net, { volume: 5, tone: 7 }), fs);
    const one = convolve(phrase.tracks[0]!, ir);
    const two = renderSegments(
      phrase.tracks,
      [
        { at: 0, filters: [ir] },
        { at: fs, filters: [ir] },
      ],
      fs,
    );
    let worst = 0;
    for (let i = 0; i < one.length; i++) worst = Math.max(worst, Math.abs(one[i]! - two[i]!));
    expect(worst).toBeLessThan(1e-6);
  });
});

describe('no clicks when a knob moves (rendered offline, the change at t = 1 s)', () => {
  const fs = 48000;
  const phrase = synthesizePhrase({ sampleRate: fs, seed: DEFAULT_PHRASE_SEED });
  /** Largest step within ±50 ms of 1 s over the largest step elsewhere in the phrase. */
  const stepRatio = (y: Float32Array) => {
    let near = 0;
    let elsewhere = 0;
    for (let i = 1; i < y.length; i++) {
      const s = Math.abs(y[i]! - y[i - 1]!);
      if (Math.abs(i - fs) <= 0.05 * fs) near = Math.max(near, s);
      else elsewhere = Math.max(elsewhere, s);
    }
    return near / elsewhere;
  };
  const cases = [
    { id: 'independent-tone', from: { volume: 10, tone: 10 }, to: { volume: 10, tone: 0 } },
    { id: 'independent-tone', from: { volume: 10, tone: 10 }, to: { volume: 2, tone: 10 } },
    { id: 'bleed-cap', from: { volume: 10, tone: 10 }, to: { volume: 3, tone: 10 } },
    { id: 'dual-cap-tone', from: { volume: 7, tone: 10 }, to: { volume: 7, tone: 1 } },
  ] as const;
  for (const c of cases) {
    it(`${c.id}: ${c.from.volume}/${c.from.tone} to ${c.to.volume}/${c.to.tone}, the largest step near the change is at most 1.5 × the largest elsewhere`, () => {
      const net = getPreset(c.id)!.build(getPreset(c.id)!.defaults);
      const a = impulseResponse(harnessResponse(net, c.from), fs);
      const b = impulseResponse(harnessResponse(net, c.to), fs);
      const y = renderSegments(
        phrase.tracks,
        [
          { at: 0, filters: [a] },
          { at: fs, filters: [b] },
        ],
        fs,
      );
      expect(stepRatio(y)).toBeLessThanOrEqual(1.5);
    });
  }

  it('the criterion catches a click: the same tone change switched without a crossfade breaks it', () => {
    const net = getPreset('independent-tone')!.build(getPreset('independent-tone')!.defaults);
    const a = impulseResponse(harnessResponse(net, { volume: 10, tone: 10 }), fs);
    const b = impulseResponse(harnessResponse(net, { volume: 10, tone: 0 }), fs);
    const hard = renderSegments(
      phrase.tracks,
      [
        { at: 0, filters: [a] },
        { at: fs, filters: [b] },
      ],
      fs,
      0,
    );
    expect(stepRatio(hard)).toBeGreaterThan(1.5);
  });
});
