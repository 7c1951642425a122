// The customer report's before/after clips (issue: Listen, item 5): a job records its wiring before
// the work; the report e-mail carries two 16-bit mono WAV clips of at most 10 s, rendered through
// the before and after designs at the same knobs, from the job's own recording or else the built-in
// phrase. The clips' levels are checked against POST /api/harness/simulate (the engine, itself
// checked against ngspice in tests/shared/circuit): white noise through both wirings, the band-energy
// ratio of the two clips against the ratio of the predicted |H|² summed over the band (standard
// theory: for a flat input spectrum the output energy in a band is proportional to Σ|H(f)|²).
import { WaveFile } from 'wavefile';
import { RealFft } from '@shared/audio/fft';
import { readWav, writeWav } from '@shared/audio/wav';
import { seededNormals } from '@shared/random/seeded';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { createTestApp, type TestApp } from '../support/app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

interface MimePart {
  filename: string;
  contentType: string;
  data: Buffer;
}

/** The attachments of a message's RFC 5322 source as nodemailer writes it (multipart/mixed, base64 parts). */
function mimeAttachments(raw: string): MimePart[] {
  const boundary = /boundary="?([^"\n;]+)"?/.exec(raw)?.[1];
  if (!boundary) return [];
  return raw
    .split(`--${boundary}`)
    .slice(1, -1)
    .flatMap((part) => {
      const at = part.indexOf('\n\n');
      const head = part.slice(0, at).replace(/\n\s+/g, ' ');
      const body = part.slice(at + 2);
      const filename = /filename="?([^"\n;]+)"?/.exec(head)?.[1];
      if (!filename) return [];
      const contentType = /Content-Type:\s*([^;\s]+)/i.exec(head)?.[1] ?? '';
      const data = /Content-Transfer-Encoding:\s*base64/i.test(head) ? Buffer.from(body.replace(/\s+/g, ''), 'base64') : Buffer.from(body);
      return [{ filename, contentType, data }];
    });
}

/** Energy of x between f1 and f2 (one FFT of the whole clip, zero-padded to a power of two). */
function bandEnergy(x: Float32Array, rate: number, f1: number, f2: number): number {
  let n = 4;
  while (n < x.length) n *= 2;
  const fft = new RealFft(n);
  const re = new Float64Array(n / 2 + 1);
  const im = new Float64Array(n / 2 + 1);
  fft.forward(x, re, im);
  let e = 0;
  for (let k = Math.ceil((f1 * n) / rate); k <= Math.floor((f2 * n) / rate); k++) e += re[k]! ** 2 + im[k]! ** 2;
  return e;
}

async function setUp(tech: Awaited<ReturnType<TestApp['as']>>, label: string) {
  const knobs = { volume: 4, tone: 10 };
  const before = (
    await tech
      .post('/api/harnesses')
      .send({ name: `Plain ${label}`, preset: 'independent-tone', values: {}, knobs })
      .expect(201)
  ).body;
  const after = (
    await tech
      .post('/api/harnesses')
      .send({ name: `Bleed ${label}`, preset: 'bleed-cap', values: {}, knobs })
      .expect(201)
  ).body;
  const job = (
    await tech
      .post('/api/jobs')
      .send({ customer: 'C. Example', customerEmail: `c.${label}@lugbook.test`, instrument: 'Solid-body six-string', harnessId: after.id })
      .expect(201)
  ).body;
  return { before, after, job, knobs };
}

/**
 * Σ|H|² over the band from POST /api/harness/simulate (2000 points spread evenly); with `chain`, Σ|H/H(chain)|²
 * (a recording is taken to have come through the chain, so the clip is the recording times H/H(chain)).
 */
async function predictedEnergy(
  tech: Awaited<ReturnType<TestApp['as']>>,
  preset: string,
  knobs: object,
  f1: number,
  f2: number,
  chain?: { preset: string; knobs: object },
) {
  const frequencies = Array.from({ length: 2000 }, (_, i) => f1 + ((f2 - f1) * i) / 1999);
  const db = async (body: object) =>
    (
      (
        await tech
          .post('/api/harness/simulate')
          .send({ ...body, frequencies })
          .expect(200)
      ).body as { magnitudeDb: number[] }
    ).magnitudeDb;
  const h = await db({ preset, knobs });
  const c = chain ? await db(chain) : h.map(() => 0);
  return h.reduce((s, x, i) => s + 10 ** ((x - c[i]!) / 10), 0);
}

async function sentClips(tech: Awaited<ReturnType<TestApp['as']>>, jobId: number) {
  await tech.post(`/api/jobs/${jobId}/report`).send({}).expect(200);
  const mail = t.ctx.sqlite.prepare("select * from outbox where topic = 'customer-report' order by id desc").get() as {
    raw: string;
    text: string;
  };
  const wavs = mimeAttachments(mail.raw).filter((a) => a.filename.endsWith('.wav'));
  return { mail, wavs };
}

describe('report clips', () => {
  test('the before wiring is recorded as a saved design or a design body; bad ones get a 422 naming the field', async () => {
    const tech = await t.as('tech');
    const { before, job } = await setUp(tech, 'put');
    const both = await tech.put(`/api/jobs/${job.id}/before`).send({ harnessId: before.id, design: { preset: 'bleed-cap' } });
    expect(both.status).toBe(422);
    expect(both.body.error.fields).toHaveProperty('design');
    const unknown = await tech.put(`/api/jobs/${job.id}/before`).send({ harnessId: 999999 });
    expect(unknown.status).toBe(422);
    expect(unknown.body.error.fields).toHaveProperty('harnessId');
    const badValue = await tech.put(`/api/jobs/${job.id}/before`).send({ design: { layout: 'one-pickup', values: { nothing: 1 } } });
    expect(badValue.status).toBe(422);
    expect(badValue.body.error.fields).toHaveProperty(['design.values.nothing']);
    const badChain = await tech.put(`/api/jobs/${job.id}/before`).send({ recordingChain: { inputR: 10 } });
    expect(badChain.status).toBe(422);
    expect(badChain.body.error.fields).toHaveProperty(['recordingChain.inputR']);
    const body = await tech
      .put(`/api/jobs/${job.id}/before`)
      .send({ design: { name: 'As it came in', preset: 'interactive-tone' } })
      .expect(200);
    expect(body.body.beforeDesign).toMatchObject({ name: 'As it came in', layout: 'one-pickup', options: { toneWiring: 'interactive' } });
    const saved = await tech.put(`/api/jobs/${job.id}/before`).send({ harnessId: before.id, design: null }).expect(200);
    expect(saved.body).toMatchObject({ beforeHarnessId: before.id, beforeDesign: null, beforeHarnessName: before.name });
    expect((await (await t.as('viewer')).put(`/api/jobs/${job.id}/before`).send({ harnessId: null })).status).toBe(403);
    // the saved design named as the before wiring can still be deleted; the report then says why there are no clips
    await tech.delete(`/api/harnesses/${before.id}`).expect(200);
    expect((await tech.get(`/api/jobs/${job.id}`).expect(200)).body).toMatchObject({ beforeHarnessId: before.id, beforeHarnessName: null });
    const preview = (await tech.get(`/api/jobs/${job.id}/report`).expect(200)).body.text as string;
    expect(preview).toMatch(/Sound clips: none attached \(the saved design of the wiring before the work is no longer saved\)\./);
    expect((await sentClips(tech, job.id)).wavs).toHaveLength(0);
  });

  test('without a recording: two 16-bit mono WAV clips of the built-in phrase, named in the preview and the e-mail', async () => {
    const tech = await t.as('tech');
    const { before, job } = await setUp(tech, 'phrase');
    // no before wiring: no clips and no paragraph
    expect((await sentClips(tech, job.id)).wavs).toHaveLength(0);
    await tech.put(`/api/jobs/${job.id}/before`).send({ harnessId: before.id }).expect(200);
    const preview = (await tech.get(`/api/jobs/${job.id}/report`).expect(200)).body.text as string;
    expect(preview).toMatch(/JOB-\d+-1-before\.wav: the wiring before the work, Plain phrase .*knobs volume 4, tone 10/);
    expect(preview).toMatch(
      /JOB-\d+-2-after\.wav: the wiring after the work, Bleed phrase .*knobs volume 4, tone 10 \(the same settings\)/,
    );
    expect(preview).toMatch(/Source: a phrase of plucked strings synthesised by Lugbook/);
    expect(preview).toMatch(/Start quiet/);
    const { mail, wavs } = await sentClips(tech, job.id);
    expect(mail.text).toBe(preview);
    expect(wavs.map((w) => w.filename)).toEqual([`${job.code}-1-before.wav`, `${job.code}-2-after.wav`]);
    const clips = wavs.map((w) => {
      expect(w.contentType).toBe('audio/wav');
      // read back by the npm package (an independent reader) and by ours
      const pkg = new WaveFile(new Uint8Array(w.data));
      const fmt = pkg.fmt as { audioFormat: number; numChannels: number; bitsPerSample: number; sampleRate: number };
      expect(fmt).toMatchObject({ audioFormat: 1, numChannels: 1, bitsPerSample: 16, sampleRate: 48000 });
      const wav = readWav(new Uint8Array(w.data));
      expect(wav.format).toBe('pcm16');
      expect(wav.channels[0]!.length).toBeGreaterThan(48000);
      expect(wav.channels[0]!.length).toBeLessThanOrEqual(10 * 48000);
      return wav.channels[0]!;
    });
    // one common gain: the louder clip peaks at −6 dBFS (within a 16-bit step)
    const peak = Math.max(...clips.map((c) => c.reduce((m, x) => Math.max(m, Math.abs(x)), 0)));
    expect(peak).toBeCloseTo(10 ** (-6 / 20), 3);
    // the bleed keeps more treble at volume 4 than the plain wiring, as the engine predicts
    const knobs = { volume: 4, tone: 10 };
    const predicted =
      (await predictedEnergy(tech, 'bleed-cap', knobs, 2000, 5000)) / (await predictedEnergy(tech, 'independent-tone', knobs, 2000, 5000));
    const heard = bandEnergy(clips[1]!, 48000, 2000, 5000) / bandEnergy(clips[0]!, 48000, 2000, 5000);
    expect(predicted).toBeGreaterThan(2);
    expect(heard).toBeGreaterThan(2);
  });

  test("with the job's own recording: both clips from its first 10 s, their band energies as simulate predicts", async () => {
    const tech = await t.as('tech');
    const { before, job, knobs } = await setUp(tech, 'recording');
    await tech.put(`/api/jobs/${job.id}/before`).send({ harnessId: before.id }).expect(200);
    // 12 s of white noise at 44.1 kHz, 16-bit: the clips keep its rate and its first 10 s
    const rate = 44100;
    const g = seededNormals(16);
    const noise = Float32Array.from({ length: 12 * rate }, () => Math.max(-1, Math.min(1, 0.1 * g())));
    const wrong = await tech
      .post(`/api/jobs/${job.id}/attachments`)
      .field('purpose', 'recording')
      .attach('file', Buffer.from('RIFF0000WAVEjunk'), 'broken.wav');
    expect(wrong.status).toBe(422);
    expect(wrong.body.error.fields).toHaveProperty('file');
    await tech
      .post(`/api/jobs/${job.id}/attachments`)
      .field('purpose', 'recording')
      .attach('file', Buffer.from(writeWav([noise], rate, 'pcm16')), 'di-take.wav')
      .expect(201);
    const preview = (await tech.get(`/api/jobs/${job.id}/report`).expect(200)).body.text as string;
    expect(preview).toMatch(/Source: your own recording "di-take\.wav" \(its first 10 s\).*1 MΩ input through 3 m of cable/);
    const { wavs } = await sentClips(tech, job.id);
    expect(wavs).toHaveLength(2);
    const [b, a] = wavs.map((w) => {
      const wav = readWav(new Uint8Array(w.data));
      expect(wav).toMatchObject({ sampleRate: rate, format: 'pcm16' });
      expect(wav.channels).toHaveLength(1);
      expect(wav.channels[0]!.length).toBe(10 * rate);
      return wav.channels[0]!;
    });
    // both went through the same recording chain and gain, so their ratio is H(after)/H(before) in each band
    for (const [f1, f2] of [
      [100, 400],
      [2000, 5000],
      [5000, 9000],
    ] as const) {
      // the recording chain: the before wiring at full volume and tone into the default 1 MΩ through 3 m (the preset's own load)
      const chain = { preset: 'independent-tone', knobs: { volume: 10, tone: 10 } };
      const predictedDb =
        10 *
        Math.log10(
          (await predictedEnergy(tech, 'bleed-cap', knobs, f1, f2, chain)) /
            (await predictedEnergy(tech, 'independent-tone', knobs, f1, f2, chain)),
        );
      const heardDb = 10 * Math.log10(bandEnergy(a!, rate, f1, f2) / bandEnergy(b!, rate, f1, f2));
      expect(
        Math.abs(heardDb - predictedDb),
        `${f1}–${f2} Hz: heard ${heardDb.toFixed(3)} dB, predicted ${predictedDb.toFixed(3)} dB`,
      ).toBeLessThan(0.1);
    }
  });
});
