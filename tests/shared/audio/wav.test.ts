// WAV files written by shared/audio/wav.ts, read back by the npm package wavefile (an independent
// reader of the RIFF WAVE layout), and the package's files read by ours.
import wavefileModule from 'wavefile';
import { describe, expect, it } from 'vitest';
import { readWav, writeWav } from '@shared/audio/wav';

const { WaveFile } = wavefileModule as unknown as typeof import('wavefile');

describe('WAV files', () => {
  const left = Float32Array.from({ length: 1000 }, (_, i) => Math.sin(i / 5) * 0.9);
  const right = Float32Array.from({ length: 1000 }, (_, i) => (i % 7) / 7 - 0.5);

  it('32-bit float stereo: the package reads our header and samples', () => {
    const w = new WaveFile(writeWav([left, right], 44100, 'float32'));
    const fmt = (w as unknown as { fmt: { audioFormat: number; numChannels: number; sampleRate: number; bitsPerSample: number } }).fmt;
    expect(fmt).toMatchObject({ audioFormat: 3, numChannels: 2, sampleRate: 44100, bitsPerSample: 32 });
    const s = w.getSamples(false, Float64Array) as unknown as Float64Array[];
    for (let i = 0; i < 1000; i++) {
      expect(s[0]![i]).toBe(left[i]);
      expect(s[1]![i]).toBe(right[i]);
    }
  });

  it('16-bit PCM mono: rounded to the nearest of 32767 steps, clipped at full scale', () => {
    const x = Float32Array.of(0, 0.25, -0.25, 1.5, -2, 1 / 32767);
    const w = new WaveFile(writeWav([x], 22050, 'pcm16'));
    expect(Array.from(w.getSamples(false, Float64Array))).toEqual([0, 8192, -8192, 32767, -32767, 1]);
  });

  it('reads files the package wrote: 16-bit, 24-bit and 32-bit float', () => {
    for (const [depth, full, format] of [
      ['16', 32768, 'pcm16'],
      ['24', 8388608, 'pcm24'],
    ] as const) {
      const w = new WaveFile();
      w.fromScratch(2, 48000, depth, [
        [0, 100, -full, full - 1],
        [5, -5, 1, 2],
      ]);
      const r = readWav(w.toBuffer());
      expect(r.format).toBe(format);
      expect(Array.from(r.channels[0]!)).toEqual([0, 100 / full, -1, (full - 1) / full].map(Math.fround));
      expect(Array.from(r.channels[1]!)).toEqual([5 / full, -5 / full, 1 / full, 2 / full].map(Math.fround));
    }
    const f = new WaveFile();
    f.fromScratch(1, 96000, '32f', [0.25, -0.75]);
    expect(Array.from(readWav(f.toBuffer()).channels[0]!)).toEqual([0.25, -0.75]);
  });
});
