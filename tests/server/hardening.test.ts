// Bad input answers a 4xx that names the problem, never a 500; stored files are never served as pages;
// uploads leave no temporary or unreferenced files behind.
import fs from 'node:fs';
import path from 'node:path';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { harnesses, outbox } from '@server/db/schema';
import { incomingDir } from '@server/uploads/store';
import { sweepUploads } from '@server/uploads/sweep';
import { createTestApp, type TestApp } from '../support/app';

let t: TestApp;
let lotId: number;
let partId: number;
beforeAll(async () => {
  t = await createTestApp();
  const tech = await t.as('tech');
  lotId = (await tech.post('/api/lots').send({ kind: 'capacitor', marking: '473J' }).expect(201)).body.id;
  partId = (
    await tech
      .post('/api/parts')
      .send({ kind: 'pot', label: 'POT-HARD-1', nominal: 500e3, tolerancePct: 20, taperClass: 'audio' })
      .expect(201)
  ).body.id;
});
afterAll(() => t.close());

const PNG = Buffer.from(
  '89504e470d0a1a0a0000000d49484452000000010000000108060000001f15c4890000000d49444154789c6360000002000154a24f5d0000000049454e44ae426082',
  'hex',
);
const incomingFiles = () =>
  fs.existsSync(incomingDir(t.ctx.config.uploadsDir)) ? fs.readdirSync(incomingDir(t.ctx.config.uploadsDir)) : [];
const expectEnvelope = (body: unknown) => expect(body).toMatchObject({ error: { code: expect.any(String), message: expect.any(String) } });

describe('malformed multipart on every upload route answers 400', () => {
  const routes = () => [
    `/api/lots/${lotId}/readings`,
    `/api/parts/${partId}/sweeps`,
    `/api/parts/${partId}/attachments`,
    `/api/lots/${lotId}/attachments`,
  ];
  const part =
    '--zzz\r\nContent-Disposition: form-data; name="file"; filename="a.csv"\r\nContent-Type: text/csv\r\n\r\nItem,C (nF)\r\n1,47\r\n';
  const cases: [string, Record<string, string>, string][] = [
    ['no boundary', { 'Content-Type': 'multipart/form-data' }, part + '--zzz--\r\n'],
    ['a boundary the body does not use', { 'Content-Type': 'multipart/form-data; boundary=yyy' }, part + '--zzz--\r\n'],
    ['a body that breaks off', { 'Content-Type': 'multipart/form-data; boundary=zzz' }, part],
    ['a gzip-encoded body', { 'Content-Type': 'multipart/form-data; boundary=zzz', 'Content-Encoding': 'gzip' }, part + '--zzz--\r\n'],
  ];
  for (const [name, headers, body] of cases) {
    test(name, async () => {
      const tech = await t.as('tech');
      for (const url of routes()) {
        const res = await tech.post(url).set(headers).send(body);
        expect(res.status, `${url}: ${JSON.stringify(res.body)}`).toBe(400);
        expectEnvelope(res.body);
        expect(res.body.error.code).toBe('bad_multipart');
      }
      expect(incomingFiles()).toEqual([]);
    });
  }
});

describe('reproduced 500s answer 4xx', () => {
  test('PATCH a member with {} is 422', async () => {
    const admin = await t.as('admin');
    const member = (await admin.get('/api/team/members')).body.members.find((m: { email: string }) => m.email.startsWith('tech'));
    const res = await admin.patch(`/api/team/members/${member.id}`).send({});
    expect(res.status).toBe(422);
    expect(res.body.error.fields).toHaveProperty('role');
  });

  test('a part with an unknown tolerance profile is 422 naming profileId, on create and on change', async () => {
    const tech = await t.as('tech');
    const created = await tech
      .post('/api/parts')
      .send({ kind: 'pot', label: 'POT-HARD-2', nominal: 500e3, tolerancePct: 20, profileId: 99_999 });
    expect(created.status).toBe(422);
    expect(created.body.error.fields).toHaveProperty('profileId');
    const changed = await tech.patch(`/api/parts/${partId}`).send({ profileId: 99_999 });
    expect(changed.status).toBe(422);
    expect(changed.body.error.fields).toHaveProperty('profileId');
  });

  // The physical ranges of harness values belong to the shared range table; this is the engine's backstop.
  test('harness values the engine cannot solve are 422 (bleedC 1e308, a frequency of 5e-324 Hz)', async () => {
    const viewer = await t.as('viewer');
    const sweep = await viewer.post('/api/harness/sweep').send({ preset: 'bleed-cap', values: { bleedC: 1e308 } });
    expect(sweep.status).toBe(422);
    expectEnvelope(sweep.body);
    const sim = await viewer
      .post('/api/harness/simulate')
      .send({ preset: 'bleed-cap', knobs: { volume: 10, tone: 10 }, values: { bleedC: 1e308 } });
    expect(sim.status).toBe(422);
    const tiny = await viewer
      .post('/api/harness/simulate')
      .send({ preset: 'bleed-cap', knobs: { volume: 10, tone: 10 }, frequencies: [5e-324, 1000] });
    expect(tiny.status, JSON.stringify(tiny.body)).toBe(422);
  });

  test('a saved design holding such values no longer breaks the job report', async () => {
    const tech = await t.as('tech');
    const design = await tech.post('/api/harnesses').send({ name: 'Far out', preset: 'bleed-cap', values: {} });
    expect(design.status).toBe(201);
    // Written straight to the table: the state of a design saved before the ranges were checked.
    t.ctx.db
      .update(harnesses)
      .set({ values: { bleedC: 1e308 } })
      .where(eq(harnesses.id, design.body.id))
      .run();
    const job = await tech
      .post('/api/jobs')
      .send({ customer: 'R. Example', customerEmail: 'r@example.test', instrument: 'Bass', harnessId: design.body.id });
    expect(job.status, JSON.stringify(job.body)).toBe(201);
    const report = await tech.get(`/api/jobs/${job.body.id}/report`);
    expect(report.status, JSON.stringify(report.body)).toBe(200);
    expect(JSON.stringify(report.body)).toMatch(/could not be computed/);
  });

  test('fullRotationDeg=5e-324 is 422 naming the field', async () => {
    const res = await (
      await t.as('tech')
    )
      .post(`/api/parts/${partId}/sweeps`)
      .field('kind', 'taper')
      .field('fullRotationDeg', '5e-324')
      .attach('file', Buffer.from('Rotation (deg),R (ohm)\n0,10\n150,50000\n300,500000\n'), 's.csv');
    expect(res.status).toBe(422);
    expect(res.body.error.fields).toHaveProperty('fullRotationDeg');
  });

  test('bad percent-encoding in a path is 400', async () => {
    const res = await (await t.as('viewer')).get('/api/parts/by-label/%E0%A4%A');
    expect(res.status).toBe(400);
    expectEnvelope(res.body);
  });

  test('two concurrent accept-invite calls with one token: one 200, one 410', async () => {
    const admin = await t.as('admin');
    await admin.post('/api/team/invitations').send({ email: 'twice@lugbook.test', role: 'tech' }).expect(201);
    const text = t.ctx.db.select().from(outbox).where(eq(outbox.to, 'twice@lugbook.test')).all().at(-1)!.text;
    const token = text.match(/token=([A-Za-z0-9_-]+)/)![1];
    const [a, b] = await Promise.all([
      t.anon().post('/api/auth/accept-invite').send({ token, name: 'First', password: 'a-long-bench-passphrase' }),
      t.anon().post('/api/auth/accept-invite').send({ token, name: 'Second', password: 'another-long-passphrase' }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 410]);
    expect((t.ctx.sqlite.prepare("select count(*) as n from users where email = 'twice@lugbook.test'").get() as { n: number }).n).toBe(1);
  });
});

describe('stored files are never served as pages', () => {
  test('a PNG named "a"×195 + ".html.png" keeps its .png name and is served as an inline PNG, never HTML', async () => {
    const name = 'a'.repeat(195) + '.html.png';
    const up = await (await t.as('tech')).post(`/api/parts/${partId}/attachments`).attach('file', PNG, name);
    expect(up.status).toBe(201);
    expect(up.body.originalName).toHaveLength(200);
    expect(up.body.originalName.endsWith('.png')).toBe(true);
    const back = await (await t.as('viewer')).get(`/api/attachments/${up.body.id}/file`);
    expect(back.status).toBe(200);
    expect(back.headers['content-type']).toBe('image/png');
    expect(back.headers['content-disposition']).toMatch(/^inline;/);
    expect(back.headers['x-content-type-options']).toBe('nosniff');
  });

  test('a PDF downloads (attachment) and its UTF-8 name survives (RFC 6266/5987)', async () => {
    const pdf = Buffer.from('%PDF-1.4\n1 0 obj<<>>endobj\ntrailer<<>>\n%%EOF\n');
    const up = await (
      await t.as('tech')
    )
      .post(`/api/parts/${partId}/attachments`)
      .field('purpose', 'certificate')
      .attach('file', pdf, 'résumé.pdf');
    expect(up.status).toBe(201);
    expect(up.body.originalName).toBe('résumé.pdf');
    const back = await (await t.as('viewer')).get(`/api/attachments/${up.body.id}/file`);
    expect(back.headers['content-type']).toBe('application/pdf');
    expect(back.headers['content-disposition']).toMatch(/^attachment;/);
    expect(back.headers['content-disposition']).toContain("filename*=UTF-8''r%C3%A9sum%C3%A9.pdf");
  });

  test('a lot export stored as CSV is never served as text/html, and downloads', async () => {
    const res = await (
      await t.as('tech')
    )
      .post(`/api/lots/${lotId}/readings`)
      .attach('file', Buffer.from('Item,C (nF)\n1,47\n2,47.5\n'), 'x.html.csv');
    expect(res.status).toBe(201);
    const list = (await (await t.as('viewer')).get(`/api/lots/${lotId}/attachments`)).body.attachments;
    const back = await (await t.as('viewer')).get(`/api/attachments/${list[0].id}/file`);
    expect(back.headers['content-type']).toMatch(/^text\/csv/);
    expect(back.headers['content-disposition']).toMatch(/^attachment;/);
  });
});

describe('no leftover files', () => {
  test('refused lot uploads leave nothing in uploads/incoming (bad field, missing lot, bad file)', async () => {
    const tech = await t.as('tech');
    const csv = Buffer.from('Item,C (nF)\n1,47\n');
    expect((await tech.post(`/api/lots/${lotId}/readings`).field('replace', 'maybe').attach('file', csv, 'l.csv')).status).toBe(422);
    expect((await tech.post('/api/lots/99999/readings').attach('file', csv, 'l.csv')).status).toBe(404);
    expect(
      (
        await tech
          .post(`/api/lots/${lotId}/readings`)
          .field('replace', 'true')
          .attach('file', Buffer.from('Item,C (nF)\n1,forty\n'), 'l.csv')
      ).status,
    ).toBe(422);
    expect((await tech.post(`/api/lots/${lotId}/readings`).attach('file', csv, 'l.pdf')).status).toBe(415);
    expect(incomingFiles()).toEqual([]);
  });

  test('the sweep at start removes temporary files and stored files no row names, and keeps the rest', () => {
    const dir = t.ctx.config.uploadsDir;
    const kept = fs.readdirSync(dir, { recursive: true, withFileTypes: true }).filter((e) => e.isFile()).length;
    fs.mkdirSync(incomingDir(dir), { recursive: true });
    fs.writeFileSync(path.join(incomingDir(dir), 'abandoned'), 'x');
    const orphan = 'f'.repeat(64);
    fs.mkdirSync(path.join(dir, 'ff'), { recursive: true });
    fs.writeFileSync(path.join(dir, 'ff', orphan), 'x');
    fs.writeFileSync(path.join(dir, 'ff', `${orphan}.123.456.tmp`), 'x');
    expect(sweepUploads(t.ctx.sqlite, dir)).toEqual({ incoming: 1, orphans: 2 });
    expect(fs.readdirSync(dir, { recursive: true, withFileTypes: true }).filter((e) => e.isFile()).length).toBe(kept);
    const hashes = (t.ctx.sqlite.prepare('select content_hash as h from attachments').all() as { h: string }[]).map((r) => r.h);
    for (const h of hashes) expect(fs.existsSync(path.join(dir, h.slice(0, 2), h))).toBe(true);
  });
});

describe('job reports', () => {
  test("go only to the job's customer address or a member's address", async () => {
    const tech = await t.as('tech');
    const job = (
      await tech.post('/api/jobs').send({ customer: 'S. Example', customerEmail: 's@example.test', instrument: 'Guitar' }).expect(201)
    ).body;
    const stranger = await tech.post(`/api/jobs/${job.id}/report`).send({ to: 'someone@elsewhere.test' });
    expect(stranger.status).toBe(422);
    expect(stranger.body.error.fields).toHaveProperty('to');
    expect((await tech.post(`/api/jobs/${job.id}/report`).send({})).status).toBe(200);
    expect((await tech.post(`/api/jobs/${job.id}/report`).send({ to: 'QA@lugbook.test' })).status).toBe(200);
  });
});

describe('bounds on work size', () => {
  test("a harness sweep beyond the bounds is 422 with the limit in words; the screen's own sweep passes", async () => {
    const viewer = await t.as('viewer');
    const grid = Array.from({ length: 41 }, (_, i) => i / 4);
    const frequencies = Array.from({ length: 2000 }, (_, i) => 20 * 1.0035 ** i);
    const big = await viewer.post('/api/harness/sweep').send({ preset: 'bleed-cap', volume: grid, tone: grid, frequencies });
    expect(big.status).toBe(422);
    expect(big.body.error.message).toMatch(/at most 48,400 points/);
    const parts = Array.from({ length: 61 }, (_, i) => ({
      kind: 'resistor',
      id: `R${i}`,
      a: i === 0 ? 'hot' : `n${i}`,
      b: `n${i + 1}`,
      R: 1000,
    }));
    const many = await viewer.post('/api/harness/simulate').send({ netlist: { parts }, knobs: { volume: 10, tone: 10 } });
    expect(many.status).toBe(422);
    expect(many.body.error.message).toMatch(/at most 60 parts/);
    expect((await viewer.post('/api/harness/sweep').send({ preset: 'bleed-cap' })).status).toBe(200);
  });
});
