import { readConditions } from '@shared/csv/conditions';
import { readTable } from '@shared/csv/read-table';
import { taperLawValue } from '@shared/taper/law';
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
    const job = (
      await tech
        .post('/api/jobs')
        .send({ customer: 'R. Example', customerEmail: 'r.example@lugbook.test', instrument: 'Solid-body six-string, sunburst' })
        .expect(201)
    ).body;
    const pot = (
      await tech
        .post('/api/parts')
        .send({ kind: 'pot', label: 'POT-JOB-1', nominal: 500e3, tolerancePct: 20, taperClass: 'audio' })
        .expect(201)
    ).body;
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

  test('a design that took values from measured parts says so in the report, and calls the rest typical', async () => {
    const tech = await t.as('tech');
    const pot = (await tech.post('/api/parts').send({ kind: 'pot', label: 'POT-REF-1', nominal: 250e3, tolerancePct: 20 }).expect(201))
      .body;
    const harness = (
      await tech
        .post('/api/harnesses')
        .send({ name: 'With a measured pot', preset: 'independent-tone', values: { volumeR: 247e3 }, partRefs: { volumeR: pot.id } })
        .expect(201)
    ).body;
    const job = (
      await tech.post('/api/jobs').send({ customer: 'S. Example', instrument: 'Solid-body four-string', harnessId: harness.id }).expect(201)
    ).body;
    const text = (await tech.get(`/api/jobs/${job.id}/report`)).body.text as string;
    expect(text).toMatch(/resistance 247 kΩ \(the design.s value, taken from POT-REF-1 when the design was saved\)/);
    expect(text).not.toMatch(/with the design's typical part values/);
  });

  test('the customer report lists the measured parts and the predicted wiring, and goes out by e-mail', async () => {
    const tech = await t.as('tech');
    const harness = (
      await tech.post('/api/harnesses').send({ name: 'Bleed for R.', preset: 'bleed-cap-parallel-r', values: {} }).expect(201)
    ).body;
    const job = (
      await tech
        .post('/api/jobs')
        .send({
          customer: 'R. Example',
          customerEmail: 'r.example@lugbook.test',
          instrument: 'Solid-body six-string',
          harnessId: harness.id,
        })
        .expect(201)
    ).body;
    const pot = (await tech.post('/api/parts').send({ kind: 'pot', label: 'POT-JOB-2', nominal: 500e3, tolerancePct: 20 }).expect(201))
      .body;
    await tech.post(`/api/parts/${pot.id}/readings`).send({ quantity: 'resistance', value: 512e3 }).expect(201);
    await tech.post(`/api/jobs/${job.id}/parts`).send({ partId: pot.id, position: 'volume' }).expect(201);
    const preview = (await tech.get(`/api/jobs/${job.id}/report`)).body;
    expect(preview.text).toMatch(/volume: pot POT-JOB-2 500 kΩ: passed\.\n\s+evidence: latest resistance 512 kΩ \(pass\)/);
    // The design carries typical values only (no part is assigned to a slot): the report must not claim measured parts.
    expect(preview.text).not.toMatch(/with the measured parts/);
    expect(preview.text).toMatch(/typical part values/);
    expect(preview.text).toMatch(/volume 4: level -?\d+\.\d dB/);
    // The curves' conditions as `# key: value` lines, then the table, read back by the upload's table reader.
    const conditions = Object.fromEntries(readConditions(preview.csv).map((c) => [c.key, c.value]));
    expect(conditions.computed).toMatch(/not measured/);
    expect(conditions.knobs).toBeTruthy();
    expect(conditions.load).toBeTruthy();
    const table = readTable(preview.csv);
    if (!table.ok) throw new Error(JSON.stringify(table.issues));
    expect(table.header.join(',')).toBe('frequency_hz,volume_10_db,volume_8_db,volume_6_db,volume_4_db,volume_2_db');
    const sent = await tech.post(`/api/jobs/${job.id}/report`).send({ message: 'Thanks for waiting.' });
    expect(sent.status).toBe(200);
    const mail = t.ctx.sqlite.prepare("select * from outbox where topic = 'customer-report' order by id desc").get() as {
      to: string;
      raw: string;
    };
    expect(mail.to).toBe('r.example@lugbook.test');
    expect(mail.raw).toMatch(/predicted-curves\.csv/);
    expect((await (await t.as('viewer')).post(`/api/jobs/${job.id}/report`).send({})).status).toBe(403);
  });

  test('a flagged or never-judged part is refused (409) unless an override reason is given; the override is kept on the line and in the audit log', async () => {
    const tech = await t.as('tech');
    const job = (await tech.post('/api/jobs').send({ customer: 'T. Override', instrument: 'Semi-hollow' }).expect(201)).body;
    // Never judged: no reading, no fit.
    const fresh = (
      await tech.post('/api/parts').send({ kind: 'capacitor', label: 'CAP-JOB-NEW', nominal: 22e-9, tolerancePct: 10 }).expect(201)
    ).body;
    const refused = await tech.post(`/api/jobs/${job.id}/parts`).send({ partId: fresh.id, position: 'tone cap' });
    expect(refused.status).toBe(409);
    expect(refused.body.error.code).toBe('needs_override');
    expect(refused.body.error.message).toMatch(/CAP-JOB-NEW is incoming/);
    expect(refused.body.error.details.status).toBe('incoming');
    // Too short a reason is a 422 naming the field.
    const short = await tech.post(`/api/jobs/${job.id}/parts`).send({ partId: fresh.id, position: 'tone cap', overrideReason: 'ok' });
    expect(short.status).toBe(422);
    expect(short.body.error.fields).toHaveProperty('overrideReason');
    expect(
      (await tech.post(`/api/jobs/${job.id}/parts`).send({ partId: fresh.id, position: 'tone cap', overrideReason: 'x'.repeat(301) }))
        .status,
    ).toBe(422);

    // A pot whose resistance passes after its taper fit flagged it: its status says passed, the evidence says flagged.
    const pot = (
      await tech
        .post('/api/parts')
        .send({ kind: 'pot', label: 'POT-JOB-LIN', nominal: 500e3, tolerancePct: 20, taperClass: 'audio' })
        .expect(201)
    ).body;
    const lines = ['Rotation (deg),R (kOhm)'];
    for (let deg = 0; deg <= 300; deg += 10)
      lines.push(`${deg},${((500e3 * taperLawValue('linear', 0.5, deg / 300) + 300) / 1e3).toFixed(4)}`);
    const sweep = await tech
      .post(`/api/parts/${pot.id}/sweeps`)
      .field('kind', 'taper')
      .attach('file', Buffer.from(lines.join('\n') + '\n'), 'linear.csv');
    expect(sweep.status).toBe(201);
    expect(sweep.body.fit.result.flags.map((f: { code: string }) => f.code)).toContain('law-outside-profile');
    await tech.post(`/api/parts/${pot.id}/readings`).send({ quantity: 'resistance', value: 497e3 }).expect(201);
    expect((await tech.get(`/api/parts/${pot.id}`)).body.status).toBe('passed');
    const potRefused = await tech.post(`/api/jobs/${job.id}/parts`).send({ partId: pot.id, position: 'volume' });
    expect(potRefused.status).toBe(409);
    expect(potRefused.body.error.details.status).toBe('flagged');
    expect(potRefused.body.error.details.reasons.join(' ')).toMatch(/taper fit: Best-fitting law is linear/);
    expect((await tech.get(`/api/jobs/${job.id}`)).body.parts).toHaveLength(0);

    const ok = await tech
      .post(`/api/jobs/${job.id}/parts`)
      .send({ partId: pot.id, position: 'volume', overrideReason: 'Customer asked for a linear volume pot.' });
    expect(ok.status).toBe(201);
    expect(ok.body.parts).toEqual([expect.objectContaining({ partId: pot.id, overrideReason: 'Customer asked for a linear volume pot.' })]);
    const entry = t.ctx.sqlite
      .prepare("select detail from audit_log where action = 'job.install-override' and entity_id = ? order by id desc")
      .get(String(job.id)) as { detail: string };
    expect(JSON.parse(entry.detail)).toMatchObject({
      partId: pot.id,
      overrideReason: 'Customer asked for a linear volume pot.',
      previousStatus: 'passed',
    });

    // The report never calls it a pass: it states the flag, the latest verdict, the fit and the override.
    const report = (await tech.get(`/api/jobs/${job.id}/report`)).body.text as string;
    expect(report).toMatch(/volume: pot POT-JOB-LIN 500 kΩ: flagged: law outside profile[,.]/);
    expect(report).toMatch(/latest resistance 497 kΩ \(pass\)/);
    expect(report).toMatch(/taper fit law linear, mid-rotation 50\.\d %: Best-fitting law is linear/);
    expect(report).toMatch(/reason given: Customer asked for a linear volume pot\./);
    expect(report).not.toMatch(/POT-JOB-LIN[^\n]*\(pass\)\.?$/m);
    // No design on this job: no sentence about predictions at all.
    expect(report).not.toMatch(/Predictions/);

    // A part with no readings installed with an override is "not checked" and "not measured".
    await tech
      .post(`/api/jobs/${job.id}/parts`)
      .send({ partId: fresh.id, position: 'tone cap', overrideReason: 'Only one in stock; checked by ear.' })
      .expect(201);
    const report2 = (await tech.get(`/api/jobs/${job.id}/report`)).body.text as string;
    expect(report2).toMatch(/tone cap: capacitor CAP-JOB-NEW 22 nF: not checked\.\n\s+evidence: not measured/);

    // Rejected parts stay refused, override or not.
    const bad = (await tech.post('/api/parts').send({ kind: 'resistor', label: 'R-JOB-REJ', nominal: 1e3, tolerancePct: 5 }).expect(201))
      .body;
    t.ctx.sqlite.prepare("update parts set status = 'rejected' where id = ?").run(bad.id);
    const rej = await tech.post(`/api/jobs/${job.id}/parts`).send({ partId: bad.id, position: 'bleed', overrideReason: 'Please let me.' });
    expect(rej.status).toBe(409);
    expect(rej.body.error.message).toMatch(/rejected/);
  });
});
