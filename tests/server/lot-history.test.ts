// Lot history, watchers and promotion trace: the history survives a reopen, a reopen e-mails the
// watchers, qa/admin choose watchers (a tech only themself), and promoted items carry the lot's
// meter and test frequency and are marked in the item columns.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { createTestApp, type TestApp } from '../support/app';

let t: TestApp;
let members: { id: string; role: string; email: string; name: string }[];
beforeAll(async () => {
  t = await createTestApp();
  members = (await (await t.as('admin')).get('/api/team/members')).body.members;
});
afterAll(() => t.close());

const byRole = (role: string) => members.find((m) => m.role === role)!;
const lotCsv = ['Item,C (nF),D', 'A1,47.10,0.0010', 'A2,46.80,0.0011', 'A3,47.40,0.0009', 'A4,47.05,0.0010'].join('\n') + '\n';

describe('lot history and watchers', () => {
  test('creation, upload, disposition and reopen are listed oldest first with who and why; the reopen e-mails the watchers', async () => {
    const qa = await t.as('qa');
    const viewer = byRole('viewer');
    const lot = (
      await qa
        .post('/api/lots')
        .send({ kind: 'capacitor', marking: '473J', watcherIds: [viewer.id] })
        .expect(201)
    ).body;
    await (await t.as('tech')).post(`/api/lots/${lot.id}/readings`).attach('file', Buffer.from(lotCsv), 'four-caps.csv').expect(201);
    await qa.post(`/api/lots/${lot.id}/disposition`).send({ status: 'rejected', reason: 'Drift above the sheet.' }).expect(200);
    const reopened = await (await t.as('admin')).post(`/api/lots/${lot.id}/reopen`).send({ reason: 'Meter was on the wrong range.' });
    expect(reopened.status).toBe(200);
    expect(reopened.body.notified).toBe(1);
    const mail = t.ctx.sqlite.prepare('select "to", subject, raw from outbox where topic = \'lot-reopen\' order by id desc').get() as {
      to: string;
      subject: string;
      raw: string;
    };
    expect(mail.to).toBe(viewer.email);
    expect(mail.subject).toBe(`Lot ${lot.code} reopened`);
    expect(mail.raw).toMatch(/Meter was on the wrong range/);

    const detail = (await (await t.as('viewer')).get(`/api/lots/${lot.id}`)).body;
    expect(detail.status).toBe('open');
    expect(detail.dispositionReason).toBeNull();
    const h = detail.history as {
      kind: string;
      at: number;
      by: string;
      file?: string;
      rows?: number;
      status?: string;
      was?: string;
      reason?: string;
    }[];
    expect(h.map((e) => e.kind)).toEqual(['created', 'upload', 'disposition', 'reopen']);
    expect(h[1]).toMatchObject({ file: 'four-caps.csv', rows: 4, by: byRole('tech').name });
    expect(h[2]).toMatchObject({ status: 'rejected', reason: 'Drift above the sheet.', by: byRole('qa').name });
    expect(h[3]).toMatchObject({ was: 'rejected', reason: 'Meter was on the wrong range.', by: byRole('admin').name });
    for (let i = 1; i < h.length; i++) expect(h[i]!.at).toBeGreaterThanOrEqual(h[i - 1]!.at);
  });

  test('qa and admin choose any member as a watcher; a tech may only add or remove themself', async () => {
    const qa = await t.as('qa');
    const tech = await t.as('tech');
    const lot = (await qa.post('/api/lots').send({ kind: 'capacitor', marking: '473J' }).expect(201)).body;
    const candidates = await qa.get('/api/lots/watcher-candidates');
    expect(candidates.status).toBe(200);
    expect(candidates.body.members.map((m: { id: string }) => m.id).sort()).toEqual(members.map((m) => m.id).sort());
    expect((await tech.get('/api/lots/watcher-candidates')).status).toBe(403);

    const everyone = members.map((m) => m.id);
    const set = await qa.put(`/api/lots/${lot.id}/watchers`).send({ userIds: everyone });
    expect(set.status).toBe(200);
    expect(set.body.watchers).toHaveLength(members.length);
    // A tech removing someone else is refused; removing themself is allowed.
    expect(
      (await tech.put(`/api/lots/${lot.id}/watchers`).send({ userIds: everyone.filter((id) => id !== byRole('viewer').id) })).status,
    ).toBe(403);
    const self = await tech.put(`/api/lots/${lot.id}/watchers`).send({ userIds: everyone.filter((id) => id !== byRole('tech').id) });
    expect(self.status).toBe(200);
    expect(self.body.watchers.map((w: { id: string }) => w.id)).not.toContain(byRole('tech').id);
    // A tech creating a lot may watch it themself, not name others.
    expect((await tech.post('/api/lots').send({ kind: 'capacitor', marking: '473J', watcherIds: [byRole('qa').id] })).status).toBe(403);
    expect((await tech.post('/api/lots').send({ kind: 'capacitor', marking: '473J', watcherIds: [byRole('tech').id] })).status).toBe(201);
  });

  test('promoted items carry the lot’s meter and test frequency and are marked with their part', async () => {
    const qa = await t.as('qa');
    const instrument = (
      await qa.post('/api/instruments').send({ name: 'Bench LCR meter 2', kind: 'analyser', calibrationDue: '2099-12-31' })
    ).body;
    expect(instrument.id).toEqual(expect.any(Number));
    const lot = (
      await qa
        .post('/api/lots')
        .send({
          kind: 'capacitor',
          marking: '473J',
          secondQuantity: 'dissipation',
          secondLimit: 0.01,
          instrumentId: instrument.id,
          testFrequency: 1000,
        })
        .expect(201)
    ).body;
    expect(lot).toMatchObject({ instrumentId: instrument.id, testFrequency: 1000 });
    await qa.post(`/api/lots/${lot.id}/readings`).attach('file', Buffer.from(lotCsv), 'four-caps.csv').expect(201);
    const before = (await qa.get(`/api/lots/${lot.id}/items`)).body;
    expect(before.partIds).toEqual([null, null, null, null]);
    const promoted = await qa.post(`/api/lots/${lot.id}/promote`).send({ readingIds: [before.ids[1]] });
    expect(promoted.status).toBe(201);
    const partId = promoted.body.partIds[0];
    const after = (await qa.get(`/api/lots/${lot.id}/items`)).body;
    expect(after.partIds).toEqual([null, partId, null, null]);
    const readings = (await qa.get(`/api/parts/${partId}/readings`)).body.readings as {
      quantity: string;
      instrumentId: number | null;
      frequency: number | null;
    }[];
    expect(readings.length).toBe(2);
    for (const r of readings) expect(r).toMatchObject({ instrumentId: instrument.id, frequency: 1000 });
    expect((await qa.post('/api/lots').send({ kind: 'capacitor', marking: '473J', instrumentId: 99999 })).status).toBe(422);
  });
});
