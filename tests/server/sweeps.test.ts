import fs from 'node:fs';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { coilImpedance, fitCoil } from '@shared/analysis/coil';
import { fitTaper } from '@shared/analysis/taper';
import { taperLawValue } from '@shared/taper/law';
import { createTestApp, type TestApp } from '../support/app';

let t: TestApp;
let potId: number;
let pickupId: number;
beforeAll(async () => {
  t = await createTestApp();
  const tech = await t.as('tech');
  potId = (await tech.post('/api/parts').send({ kind: 'pot', label: 'POT-SW-1', nominal: 500e3, tolerancePct: 20, taperClass: 'audio' }).expect(201)).body.id;
  pickupId = (await tech.post('/api/parts').send({ kind: 'pickup', label: 'PU-SW-1', nominal: 7.8e3, tolerancePct: 8 }).expect(201)).body.id;
});
afterAll(() => t.close());

function potCsv(): string {
  const lines = ['Rotation (deg),R (kOhm)'];
  for (let deg = 0; deg <= 300; deg += 10) lines.push(`${deg},${((490e3 * taperLawValue('audio', 0.15, deg / 300) + 300) / 1e3).toFixed(4)}`);
  return lines.join('\n') + '\n';
}

function coilCsv(): string {
  const lines = ['Freq (Hz),Re (ohm),Im (ohm)'];
  for (let i = 0; i < 120; i++) {
    const f = 20 * Math.pow(1000, i / 119);
    const z = coilImpedance({ R: 7800, L: 4.3, C: 130e-12 }, f);
    lines.push(`${f.toPrecision(8)},${z.re.toPrecision(10)},${z.im.toPrecision(10)}`);
  }
  return lines.join('\n');
}

function snapshot() {
  const count = (table: string) => (t.ctx.sqlite.prepare(`select count(*) as n from ${table}`).get() as { n: number }).n;
  const files = fs.existsSync(t.ctx.config.uploadsDir) ? fs.readdirSync(t.ctx.config.uploadsDir, { recursive: true }).length : 0;
  return { sweeps: count('sweeps'), points: count('sweep_points'), fits: count('fits'), attachments: count('attachments'), audit: count('audit_log'), files };
}

async function upload(partId: number, kind: string, content: string | Buffer, name = 'sweep.csv') {
  const tech = await t.as('tech');
  return tech.post(`/api/parts/${partId}/sweeps`).field('kind', kind).attach('file', Buffer.isBuffer(content) ? content : Buffer.from(content), name);
}

describe('sweep uploads', () => {
  test('a pot rotation sweep is stored with its taper fit, equal to the engine on the same points', async () => {
    const res = await upload(potId, 'taper', potCsv());
    expect(res.status).toBe(201);
    expect(res.body.pointCount).toBe(31);
    expect(res.body.fit.kind).toBe('taper');
    expect(res.body.fit.engineVersion).toMatch(/^analysis-/);
    const engine = fitTaper({ points: res.body.points, rotationUnit: 'percent', nominal: 500e3, tolerancePct: 20, profile: { law: 'audio-any', mMin: 0.08, mMax: 0.2, maxEndResistance: 500 } });
    expect(res.body.fit.result).toEqual(JSON.parse(JSON.stringify(engine)));
    expect(res.body.fit.result.law).toBe('audio');
    expect(res.body.part.status).toBe('passed');
    const files = fs.readdirSync(t.ctx.config.uploadsDir, { recursive: true, encoding: 'utf8' }).filter((f) => /^[0-9a-f]{2}\/[0-9a-f]{64}$/.test(f));
    expect(files.length).toBe(1);
  });

  test('a coil impedance sweep gets the coil fit; a refit keeps the old fit as history', async () => {
    const res = await upload(pickupId, 'impedance', coilCsv());
    expect(res.status).toBe(201);
    expect(res.body.fit.result.L / 4.3).toBeCloseTo(1, 3);
    expect(res.body.fit.result.C / 130e-12).toBeCloseTo(1, 3);
    expect(res.body.fit.result.L).toBeCloseTo(fitCoil({ points: res.body.points, withRp: 'auto' }).L, 9);
    const tech = await t.as('tech');
    await tech.post(`/api/parts/${pickupId}/sweeps/${res.body.id}/refit`).expect(200);
    const fits = (await tech.get(`/api/parts/${pickupId}/fits`)).body.fits;
    expect(fits).toHaveLength(2);
    expect(fits.filter((f: { supersededAt: number | null }) => f.supersededAt !== null)).toHaveLength(1);
  });

  test('a viewer can read sweeps and fits but not upload', async () => {
    const viewer = await t.as('viewer');
    expect((await viewer.get(`/api/parts/${potId}/sweeps`)).body.sweeps[0].fit.kind).toBe('taper');
    expect((await viewer.get(`/api/parts/${potId}/fits`)).status).toBe(200);
    const res = await viewer.post(`/api/parts/${potId}/sweeps`).field('kind', 'taper').attach('file', Buffer.from(potCsv()), 'sweep.csv');
    expect(res.status).toBe(403);
  });

  const header = 'Rotation (deg),R (kOhm)';
  const good = (n: number) => Array.from({ length: n }, (_, i) => `${i * 30},${(i * 50 + 0.3).toFixed(1)}`);
  const malformed: { name: string; kind?: string; content: string | Buffer; file?: string; status: number; mentions?: RegExp }[] = [
    { name: 'text in a number column', content: [header, ...good(5), '180,12k7x', ...good(3).slice(1)].join('\n'), status: 422, mentions: /line 7.*R \(kOhm\)|R \(kOhm\).*line 7/i },
    { name: 'negative resistance', content: [header, '0,0.3', '30,5', '60,-12', '90,20'].join('\n'), status: 422, mentions: /line 4/i },
    { name: 'duplicate rotation points', content: [header, '0,0.3', '30,5', '30,6', '90,20'].join('\n'), status: 422, mentions: /duplicate|twice|again/i },
    { name: 'missing column', content: ['Rotation (deg)', '0', '30', '60', '90'].join('\n'), status: 422 },
    { name: 'wrong delimiter mix', content: [header, '0;0,3', '30;5', '60;12', '90;20'].join('\n'), status: 422 },
    { name: 'a binary file named .csv', content: Buffer.from([0x50, 0x4b, 0x03, 0x04, 0, 0, 0, 8, 0, 0, 1, 2, 3, 0, 0, 0]), status: 415 },
    { name: 'an empty file', content: '', status: 422 },
    { name: 'a header only', content: header + '\n', status: 422 },
    { name: 'one data row', content: [header, '0,0.3'].join('\n'), status: 422 },
    { name: 'ragged rows', content: [header, '0,0.3', '30,5,7', '60,12', '90,20'].join('\n'), status: 422, mentions: /line 3/i },
    { name: 'rotation beyond a full turn', content: [header, '0,0.3', '100,5', '200,12', '900,20'].join('\n'), status: 422, mentions: /line 5/i },
    { name: 'a spreadsheet file', content: 'PK', file: 'sweep.xlsx', status: 415 },
    { name: 'no file extension', content: potCsv(), file: 'sweep', status: 415 },
    { name: 'an unknown sweep kind', kind: 'spectrum', content: potCsv(), status: 422 },
    { name: 'unrecognised headers (needs a column mapping)', content: ['alpha,beta', ...good(5)].join('\n'), status: 422, mentions: /columns/i },
    { name: 'a taper sweep for a pickup', content: potCsv(), status: 422 },
    { name: 'an impedance sweep with a zero frequency', kind: 'impedance', content: ['Freq (Hz),|Z| (ohm),Phase (deg)', '0,100,1', '10,200,2', '20,300,3', '40,400,4', '80,500,5'].join('\n'), status: 422, mentions: /line 2/i },
  ];

  test.each(malformed)('refused whole, leaving no rows and no files: $name', async ({ kind, content, file, status, mentions, name }) => {
    const before = snapshot();
    const target = name === 'a taper sweep for a pickup' ? pickupId : kind === 'impedance' ? pickupId : potId;
    const res = await upload(target, kind ?? 'taper', content, file);
    expect(res.status).toBe(status);
    expect(res.body.error.message.length).toBeGreaterThan(10);
    if (mentions) expect(JSON.stringify(res.body.error)).toMatch(mentions);
    expect(snapshot()).toEqual(before);
  });

  test('an oversized file is a 413 and leaves nothing behind', async () => {
    const before = snapshot();
    const big = header + '\n' + '1,1\n'.repeat(600_000);
    const res = await upload(potId, 'taper', big);
    expect(res.status).toBe(413);
    expect(snapshot()).toEqual(before);
  });

  test('a photo must really be an image; a real PNG is kept and served back', async () => {
    const tech = await t.as('tech');
    const fake = await tech.post(`/api/parts/${potId}/attachments`).field('purpose', 'photo').attach('file', Buffer.from('not an image'), 'meter.png');
    expect(fake.status).toBe(415);
    const png = Buffer.from('89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d49444154789c6360000002000154a24f5d0000000049454e44ae426082', 'hex');
    const ok = await tech.post(`/api/parts/${potId}/attachments`).field('purpose', 'photo').attach('file', png, '../../etc/meter.png');
    expect(ok.status).toBe(201);
    // The client's path is never used: only the base name is kept, as a label.
    expect(ok.body.originalName).toBe('meter.png');
    expect(fs.existsSync(path.join(t.ctx.config.uploadsDir, ok.body.contentHash.slice(0, 2), ok.body.contentHash))).toBe(true);
    const back = await (await t.as('viewer')).get(`/api/attachments/${ok.body.id}/file`);
    expect(back.status).toBe(200);
    expect(back.headers['content-type']).toBe('image/png');
  });
});
