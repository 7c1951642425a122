// POST /api/harness/render: white noise through a design has a Welch PSD ratio (Welch 1967, see
// tests/support/welch.ts) equal to |H|² of the engine's own `simulate`; files of every accepted
// kind are read; oversized and unreadable ones are refused with the problem named; nothing is stored.
import fs from 'node:fs';
import path from 'node:path';
import type { Response } from 'supertest';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { readWav, writeWav } from '@shared/audio/wav';
import { simulate } from '@shared/circuit/metrics';
import { getPreset } from '@shared/circuit/presets';
import { seededNormals } from '@shared/random/seeded';
import { createTestApp, type TestApp } from '../support/app';
import { welchPsd } from '../support/welch';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

// supertest: keep an audio/wav answer as bytes
const binary = (res: Response, done: (err: Error | null, body: Buffer) => void) => {
  const stream = res as unknown as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(c));
  stream.on('end', () => done(null, Buffer.concat(chunks)));
};

async function render(file: Uint8Array | Buffer, design: unknown, chain?: unknown, name = 'take.wav'): Promise<Response> {
  const agent = await t.as('tech');
  let req = agent.post('/api/harness/render').field('design', typeof design === 'string' ? design : JSON.stringify(design));
  if (chain !== undefined) req = req.field('chain', typeof chain === 'string' ? chain : JSON.stringify(chain));
  return req.attach('file', Buffer.from(file), name).buffer(true).parse(binary);
}
const errorOf = (res: Response) =>
  JSON.parse((res.body as Buffer).toString('utf8')) as { error: { code: string; message: string; fields?: Record<string, string> } };

function noise(frames: number, seed: number, scale = 0.1): Float32Array {
  const g = seededNormals(seed);
  return Float32Array.from({ length: frames }, () => scale * g());
}

/** Largest |dB| difference between the Welch PSD ratio out/in and simulate's |H|², 50 Hz–10 kHz. */
function worstPsdError(
  input: Float32Array,
  output: Float32Array,
  fs: number,
  preset: string,
  knobs: { volume: number; tone: number },
): number {
  const seg = 4096;
  const pin = welchPsd(input, seg);
  const pout = welchPsd(output, seg);
  const ks: number[] = [];
  for (let k = 1; k < pin.length; k++) {
    const f = (k * fs) / seg;
    if (f >= 50 && f <= 10000) ks.push(k);
  }
  const p = getPreset(preset)!;
  const sim = simulate(
    p.build(p.defaults),
    knobs,
    Float64Array.from(ks, (k) => (k * fs) / seg),
  );
  let worst = 0;
  ks.forEach((k, j) => {
    worst = Math.max(worst, Math.abs(10 * Math.log10(pout[k]! / pin[k]!) - sim.magnitudeDb[j]!));
  });
  return worst;
}

/** A WAVE_FORMAT_EXTENSIBLE file built by hand from the layout of the format (40-byte fmt chunk, sub-format GUID). */
function extensibleWav(channels: number, rate: number, kind: 'pcm24' | 'float32', samples: number[]): Buffer {
  const bytesPer = kind === 'pcm24' ? 3 : 4;
  const data = Buffer.alloc(samples.length * bytesPer);
  samples.forEach((s, i) => {
    if (kind === 'pcm24') data.writeIntLE(s, i * 3, 3);
    else data.writeFloatLE(s, i * 4);
  });
  const fmt = Buffer.alloc(40);
  fmt.writeUInt16LE(0xfffe, 0);
  fmt.writeUInt16LE(channels, 2);
  fmt.writeUInt32LE(rate, 4);
  fmt.writeUInt32LE(rate * channels * bytesPer, 8);
  fmt.writeUInt16LE(channels * bytesPer, 12);
  fmt.writeUInt16LE(bytesPer * 8, 14);
  fmt.writeUInt16LE(22, 16); // cbSize
  fmt.writeUInt16LE(bytesPer * 8, 18); // valid bits
  fmt.writeUInt32LE(channels === 2 ? 3 : 4, 20); // channel mask: front left+right, or front centre
  // sub-format GUID: the format code (1 PCM, 3 IEEE float) then 0000-0010-8000-00AA00389B71
  Buffer.from([kind === 'pcm24' ? 1 : 3, 0, 0, 0, 0, 0, 0x10, 0, 0x80, 0, 0, 0xaa, 0, 0x38, 0x9b, 0x71]).copy(fmt, 24);
  const head = Buffer.alloc(12);
  head.write('RIFF', 0, 'latin1');
  head.writeUInt32LE(4 + 8 + 40 + 8 + data.length, 4);
  head.write('WAVE', 8, 'latin1');
  const chunk = (id: string, body: Buffer) => {
    const h = Buffer.alloc(8);
    h.write(id, 0, 'latin1');
    h.writeUInt32LE(body.length, 4);
    return Buffer.concat([h, body]);
  };
  return Buffer.concat([head, chunk('fmt ', fmt), chunk('data', data)]);
}

/** A file declaring 8-bit samples (bits per sample at byte 34: RIFF header 12 + chunk header 8 + 14). */
function eightBit(): Buffer {
  const b = extensibleWav(1, 48000, 'pcm24', [1, 2, 3]);
  b.writeUInt16LE(8, 34);
  return b;
}

/** Every file under the data folder (the database's own files aside). */
function filesUnder(dir: string): string[] {
  return (fs.readdirSync(dir, { recursive: true, encoding: 'utf8' }) as string[]).filter(
    (f) => !f.startsWith('lugbook.db') && fs.statSync(path.join(dir, f)).isFile(),
  );
}

describe('POST /api/harness/render', () => {
  test('white noise through a bleed network at volume 4: Welch PSD ratio within 0.5 dB of simulate, 50 Hz–10 kHz', async () => {
    const fs = 48000;
    const input = noise(fs * 10, 1967);
    const knobs = { volume: 4, tone: 10 };
    const res = await render(writeWav([input], fs, 'float32'), { preset: 'bleed-cap', knobs });
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^audio\/wav/);
    const out = readWav(new Uint8Array(res.body as Buffer));
    expect(out.format).toBe('float32');
    expect(out.sampleRate).toBe(fs);
    expect(out.channels).toHaveLength(1);
    expect(out.channels[0]!.length).toBe(input.length);
    expect(worstPsdError(input, out.channels[0]!, fs, 'bleed-cap', knobs)).toBeLessThan(0.5);
  });

  test('16-bit stereo at 44.1 kHz, dark tone setting: both channels follow simulate within 0.5 dB; the answer keeps rate, channels and length', async () => {
    const fs = 44100;
    const left = noise(fs * 6, 1);
    const right = noise(fs * 6, 2);
    const knobs = { volume: 10, tone: 2 };
    const sent = writeWav([left, right], fs, 'pcm16');
    const res = await render(sent, { preset: 'independent-tone', knobs });
    expect(res.status).toBe(200);
    const back = readWav(new Uint8Array(sent));
    const out = readWav(new Uint8Array(res.body as Buffer));
    expect(out.sampleRate).toBe(fs);
    expect(out.channels).toHaveLength(2);
    expect(out.channels[1]!.length).toBe(left.length);
    expect(worstPsdError(back.channels[0]!, out.channels[0]!, fs, 'independent-tone', knobs)).toBeLessThan(0.5);
    expect(worstPsdError(back.channels[1]!, out.channels[1]!, fs, 'independent-tone', knobs)).toBeLessThan(0.5);
  });

  test('WAVE_FORMAT_EXTENSIBLE 24-bit stereo, recorded through the design itself: H(design)/H(chain) = 1 gives the samples back', async () => {
    const samples = Array.from({ length: 2 * 22050 }, (_, i) => Math.round(Math.sin(i / 7) * 4e6) + (i % 2 === 0 ? 1000 : -2000));
    const design = { preset: 'interactive-tone', values: { ampR: 2e6, cableLength: 1 }, knobs: { volume: 10, tone: 10 } };
    const chain = { preset: 'interactive-tone', inputR: 2e6, cableLength: 1 };
    const res = await render(extensibleWav(2, 22050, 'pcm24', samples), design, chain);
    expect(res.status).toBe(200);
    const out = readWav(new Uint8Array(res.body as Buffer));
    expect(out.channels).toHaveLength(2);
    let worst = 0;
    for (let i = 0; i < 22050; i++) {
      worst = Math.max(
        worst,
        Math.abs(out.channels[0]![i]! - samples[2 * i]! / 8388608),
        Math.abs(out.channels[1]![i]! - samples[2 * i + 1]! / 8388608),
      );
    }
    expect(worst).toBeLessThan(1e-5);
  });

  test('a darker recording chain is undone, with the boost limited to +12 dB', async () => {
    const fs = 48000;
    const input = noise(fs * 4, 7);
    // recorded into a 20 kΩ input: the design (1 MΩ) needs up to tens of dB of treble back
    const res = await render(
      writeWav([input], fs),
      { preset: 'independent-tone', knobs: { volume: 10, tone: 10 } },
      { preset: 'independent-tone', inputR: 20e3 },
    );
    expect(res.status).toBe(200);
    const out = readWav(new Uint8Array(res.body as Buffer)).channels[0]!;
    const pin = welchPsd(input);
    const pout = welchPsd(out);
    const p = getPreset('independent-tone')!;
    const f = [200, 1000, 3000, 6000];
    const a = simulate(p.build(p.defaults), { volume: 10, tone: 10 }, f);
    const b = simulate(p.build({ ...p.defaults, ampR: 20e3 }), { volume: 10, tone: 10 }, f);
    f.forEach((fr, j) => {
      const k = Math.round((fr * 4096) / fs);
      const measured = 10 * Math.log10(pout[k]! / pin[k]!);
      expect(Math.abs(measured - Math.min(12, a.magnitudeDb[j]! - b.magnitudeDb[j]!)), `${fr} Hz`).toBeLessThan(0.5);
    });
    expect(a.magnitudeDb[3]! - b.magnitudeDb[3]!).toBeGreaterThan(12); // the limit is in play at 6 kHz
  });

  test('WAVE_FORMAT_EXTENSIBLE 32-bit float mono at 96 kHz is read as floating point', async () => {
    const samples = Array.from({ length: 9600 }, (_, i) => 0.25 * Math.sin(i / 30));
    const res = await render(extensibleWav(1, 96000, 'float32', samples), { preset: 'bleed-cap', knobs: { volume: 10, tone: 10 } });
    expect(res.status).toBe(200);
    const out = readWav(new Uint8Array(res.body as Buffer));
    expect(out.sampleRate).toBe(96000);
    expect(out.channels[0]!.length).toBe(9600);
    // a 509 Hz sine at full volume comes out near its own level (|H| within a dB or two of unity there), not as integer garbage
    const peak = out.channels[0]!.slice(4800).reduce((m, x) => Math.max(m, Math.abs(x)), 0);
    expect(peak).toBeGreaterThan(0.2);
    expect(peak).toBeLessThan(0.3);
  });

  test('over 60 s or over 20 MB: 413; nothing stored', async () => {
    const before = filesUnder(t.dataDir);
    const long = await render(writeWav([new Float32Array(22050 * 61)], 22050, 'pcm16'), {
      preset: 'bleed-cap',
      knobs: { volume: 5, tone: 5 },
    });
    expect(long.status).toBe(413);
    expect(errorOf(long).error.message).toMatch(/61\.0 s/);
    const big = await render(Buffer.alloc(20_000_100), { preset: 'bleed-cap', knobs: { volume: 5, tone: 5 } });
    expect(big.status).toBe(413);
    expect(filesUnder(t.dataDir)).toEqual(before);
  });

  test('422 names the problem: unreadable file, 8-bit, 8 kHz, three channels, design not JSON, knob out of range, bad chain, no file', async () => {
    const design = { preset: 'bleed-cap', knobs: { volume: 5, tone: 5 } };
    const cases: [Response, string, RegExp][] = [
      [await render(Buffer.from('not a wav file at all'), design), 'file', /not a WAV file/],
      [await render(eightBit(), design), 'file', /8-bit PCM/],
      [await render(writeWav([new Float32Array(100)], 8000), design), 'file', /8000 Hz/],
      [await render(writeWav([new Float32Array(10), new Float32Array(10), new Float32Array(10)], 48000), design), 'file', /3 channels/],
      [await render(writeWav([new Float32Array(100)], 48000), '{"preset": '), 'design', /JSON/],
      [
        await render(writeWav([new Float32Array(100)], 48000), { preset: 'bleed-cap', knobs: { volume: 11, tone: 5 } }),
        'design.knobs.volume',
        /0 to 10/,
      ],
      [await render(writeWav([new Float32Array(100)], 48000), design, { preset: 'bleed-cap', inputR: 5 }), 'chain.inputR', /1 kΩ/],
    ];
    for (const [res, field, message] of cases) {
      expect(res.status, field).toBe(422);
      const body = errorOf(res);
      expect(body.error.fields?.[field], `${field}: ${JSON.stringify(body.error)}`).toMatch(message);
    }
    const agent = await t.as('tech');
    const none = await agent.post('/api/harness/render').field('design', JSON.stringify(design));
    expect(none.status).toBe(422);
    expect(none.body.error.fields.file).toBeDefined();
  });

  test('viewers may listen (nothing is written); anonymous requests are refused', async () => {
    const viewer = await t.as('viewer');
    const ok = await viewer
      .post('/api/harness/render')
      .field('design', JSON.stringify({ preset: 'bleed-cap', knobs: { volume: 5, tone: 5 } }))
      .attach('file', Buffer.from(writeWav([noise(4800, 3)], 48000)), 'a.wav')
      .buffer(true)
      .parse(binary);
    expect(ok.status).toBe(200);
    const anon = await t.anon().post('/api/harness/render').field('design', '{}');
    expect(anon.status).toBe(401);
  });
});

describe('POST /api/harness/render with a whole-instrument layout', () => {
  async function renderPhrase(design: unknown, phrase: unknown = {}): Promise<Response> {
    const agent = await t.as('tech');
    return agent
      .post('/api/harness/render')
      .field('design', JSON.stringify(design))
      .field('phrase', JSON.stringify(phrase))
      .buffer(true)
      .parse(binary);
  }

  test('a layout body renders a recording through the summed transfer: Welch PSD ratio within 0.5 dB of simulate ("both", volumes 6)', async () => {
    const fs = 48000;
    const input = noise(fs * 6, 16);
    const design = { layout: 'two-pickups-3way', selector: 1, knobs: { 'neck.volume': 6, 'bridge.volume': 6 }, options: {}, values: {} };
    const res = await render(writeWav([input], fs, 'float32'), design);
    expect(res.status).toBe(200);
    const out = readWav(new Uint8Array(res.body as Buffer)).channels[0]!;
    expect(out.length).toBe(input.length);
    const sim = await (
      await t.as('tech')
    )
      .post('/api/harness/simulate')
      .send({ ...design, frequencies: Array.from({ length: 200 }, (_, i) => ((i + 2) * fs) / 4096).filter((f) => f >= 50 && f <= 10000) });
    expect(sim.status).toBe(200);
    const pin = welchPsd(input, 4096);
    const pout = welchPsd(out, 4096);
    let worst = 0;
    (sim.body.frequencies as number[]).forEach((f, j) => {
      const k = Math.round((f * 4096) / fs);
      worst = Math.max(worst, Math.abs(10 * Math.log10(pout[k]! / pin[k]!) - sim.body.magnitudeDb[j]));
    });
    expect(worst).toBeLessThan(0.5);
  });

  test('the built-in phrase through a combined position: reversed phase has less low-frequency energy than in phase (Welch PSD below 300 Hz)', async () => {
    // Reversed phase in a combined position thins the sound (the low notes, heard alike at both
    // pickups, cancel): common practice (no published source).
    const body = (phase: string) => ({ layout: 'two-pickups-3way', selector: 1, options: { phase }, values: {}, knobs: {} });
    const fs = 22050;
    const lowEnergy = async (phase: string) => {
      const res = await renderPhrase(body(phase), { sampleRate: fs });
      expect(res.status).toBe(200);
      const wav = readWav(new Uint8Array(res.body as Buffer));
      expect(wav.sampleRate).toBe(fs);
      expect(wav.channels).toHaveLength(1);
      const psd = welchPsd(wav.channels[0]!, 4096);
      let e = 0;
      for (let k = 1; (k * fs) / 4096 <= 300; k++) e += psd[k]!;
      return e;
    };
    const inPhase = await lowEnergy('in');
    const reversed = await lowEnergy('reversed');
    expect(inPhase).toBeGreaterThan(0);
    // the bridge's string signal is much weaker than the neck's at the fundamentals (its place is
    // nearer the string's end), so the cancellation is partial: about 1.5 dB here; at least 1 dB asked
    expect(10 * Math.log10(reversed / inPhase)).toBeLessThan(-1);
  });

  test('a layout body with an unknown value or a phrase beside a file answers 422 naming the field', async () => {
    const bad = await render(writeWav([noise(4800, 3)], 48000, 'float32'), { layout: 'two-pickups-3way', values: { 'neck.nope': 1 } });
    expect(bad.status).toBe(422);
    expect(Object.keys(errorOf(bad).error.fields ?? {}).join(' ')).toMatch(/neck\.nope/);
    const agent = await t.as('tech');
    const both = await agent
      .post('/api/harness/render')
      .field('design', JSON.stringify({ layout: 'one-pickup' }))
      .field('phrase', '{}')
      .attach('file', Buffer.from(writeWav([noise(4800, 3)], 48000, 'float32')), 'take.wav')
      .buffer(true)
      .parse(binary);
    expect(both.status).toBe(422);
    expect(errorOf(both).error.fields).toHaveProperty('phrase');
  });
});
