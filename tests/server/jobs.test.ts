import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { createTestApp, type TestApp } from '../support/app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('jobs', () => {
  test('parts installed in a job are traceable both ways, and a part cannot be installed twice', async () => {
    const tech = await t.as('tech');
    const job = (await tech.post('/api/jobs').send({ customer: 'R. Example', customerEmail: 'r.example@lugbook.test', instrument: 'Solid-body six-string, sunburst' }).expect(201)).body;
    const pot = (await tech.post('/api/parts').send({ kind: 'pot', label: 'POT-JOB-1', nominal: 500e3, tolerancePct: 20, taperClass: 'audio' }).expect(201)).body;
    await tech.post(`/api/parts/${pot.id}/readings`).send({ quantity: 'resistance', value: 489e3 }).expect(201);
    const installed = await tech.post(`/api/jobs/${job.id}/parts`).send({ partId: pot.id, position: 'volume, neck' });
    expect(installed.status).toBe(201);
    expect(installed.body.parts).toEqual([expect.objectContaining({ partId: pot.id, position: 'volume, neck', status: 'installed' })]);
    const part = (await tech.get(`/api/parts/${pot.id}`)).body;
    expect(part.status).toBe('installed');
    expect(part.installedIn).toEqual([expect.objectContaining({ jobId: job.id, code: job.code, position: 'volume, neck' })]);
    const other = (await tech.post('/api/jobs').send({ customer: 'S. Other', instrument: 'Bass' }).expect(201)).body;
    expect((await tech.post(`/api/jobs/${other.id}/parts`).send({ partId: pot.id, position: 'volume' })).status).toBe(409);
    await tech.delete(`/api/jobs/${job.id}/parts/${pot.id}`).expect(200);
    expect((await tech.get(`/api/parts/${pot.id}`)).body.status).toBe('incoming');
  });

  test('the customer report lists the measured parts and the predicted wiring, and goes out by e-mail', async () => {
    const tech = await t.as('tech');
    const harness = (await tech.post('/api/harnesses').send({ name: 'Bleed for R.', preset: 'bleed-cap-parallel-r', values: {} }).expect(201)).body;
    const job = (await tech.post('/api/jobs').send({ customer: 'R. Example', customerEmail: 'r.example@lugbook.test', instrument: 'Solid-body six-string', harnessId: harness.id }).expect(201)).body;
    const pot = (await tech.post('/api/parts').send({ kind: 'pot', label: 'POT-JOB-2', nominal: 500e3, tolerancePct: 20 }).expect(201)).body;
    await tech.post(`/api/parts/${pot.id}/readings`).send({ quantity: 'resistance', value: 512e3 }).expect(201);
    await tech.post(`/api/jobs/${job.id}/parts`).send({ partId: pot.id, position: 'volume' }).expect(201);
    const preview = (await tech.get(`/api/jobs/${job.id}/report`)).body;
    expect(preview.text).toMatch(/volume: pot POT-JOB-2 500 kΩ, measured 512 kΩ \(pass\)/);
    expect(preview.text).toMatch(/volume 4: level -?\d+\.\d dB/);
    expect(preview.csv.split('\n')[0]).toBe('frequency_hz,volume_10_db,volume_8_db,volume_6_db,volume_4_db,volume_2_db');
    const sent = await tech.post(`/api/jobs/${job.id}/report`).send({ message: 'Thanks for waiting.' });
    expect(sent.status).toBe(200);
    const mail = t.ctx.sqlite.prepare("select * from outbox where topic = 'customer-report' order by id desc").get() as { to: string; raw: string };
    expect(mail.to).toBe('r.example@lugbook.test');
    expect(mail.raw).toMatch(/predicted-curves\.csv/);
    expect((await (await t.as('viewer')).post(`/api/jobs/${job.id}/report`).send({})).status).toBe(403);
  });
});
