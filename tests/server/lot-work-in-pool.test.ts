// A lot's export, its promotions and the statistics of a disposition are work the size of the lot
// (a 100,000-item lot: about a second each), so they run in the job pool, never on the request thread:
// with the pool refusing every job, each of them is refused (503) and nothing is written. A refusal a
// promotion makes inside its worker comes back as the same 4xx, and a promotion whose readings changed
// between its reading and its writing is refused instead of writing parts from readings no longer there.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { HttpError } from '@server/http/errors';
import { findLot } from '@server/features/lots/repository';
import { planPromotion, writePromotion } from '@server/features/lots/promote';
import { invalidateLotStats } from '@server/features/lots/stored-stats';
import { createTestApp, type TestApp } from '../support/app';
import { withPoolRefusing } from '../support/pool-refusing';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const count = (sql: string, ...args: unknown[]) => (t.ctx.sqlite.prepare(sql).get(...args) as { n: number }).n;

/** A capacitor lot with `n` readings around 47 nF (invented values). */
async function lotWithReadings(n: number) {
  const qa = await t.as('qa');
  const lot = (await qa.post('/api/lots').send({ kind: 'capacitor', marking: '473J' })).body as { id: number; code: string };
  const csv = ['Item,C (nF)', ...Array.from({ length: n }, (_, i) => `${i + 1},${(47 * (1 + 0.03 * Math.sin(i * 1.7))).toFixed(3)}`)].join(
    '\n',
  );
  const up = await qa.post(`/api/lots/${lot.id}/readings`).attach('file', Buffer.from(csv), 'lot.csv');
  expect(up.status).toBe(201);
  return lot;
}

describe('lot work that grows with the lot runs in the pool', () => {
  test('the CSV export is built in a worker', async () => {
    const lot = await lotWithReadings(40);
    const refused = await withPoolRefusing(t.ctx.pool, async () => (await t.as('viewer')).get(`/api/lots/${lot.id}/export.csv`));
    expect(refused.asked).toEqual(['lotExportCsv']);
    expect(refused.result.status).toBe(503);
    // From the worker, the whole file, its length declared.
    const res = await (await t.as('viewer')).get(`/api/lots/${lot.id}/export.csv?matchPct=2&setSize=3`).set('Accept-Encoding', 'identity');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^text\/csv/);
    expect(res.headers['content-disposition']).toBe(`attachment; filename=${lot.code}.csv`);
    expect(Number(res.headers['content-length'])).toBe(Buffer.byteLength(res.text));
    const lines = res.text.trimEnd().split('\n');
    expect(lines.filter((l) => l.startsWith('# ')).some((l) => /match/i.test(l) && l.includes('2'))).toBe(true);
    expect(lines.filter((l) => !l.startsWith('#'))).toHaveLength(1 + 40);
  });

  test('a promotion (chosen readings, a bin, a set) is planned and written in a worker; refused, it writes nothing', async () => {
    const lot = await lotWithReadings(30);
    const qa = await t.as('qa');
    const ids = (await qa.get(`/api/lots/${lot.id}/items`)).body.ids as number[];
    const partsBefore = count('select count(*) as n from parts');
    for (const body of [{ readingIds: ids.slice(0, 3) }, { bin: 0 }, { set: 0 }]) {
      const refused = await withPoolRefusing(t.ctx.pool, async () => qa.post(`/api/lots/${lot.id}/promote`).send(body));
      expect(refused.asked).toEqual(['lotPromote']);
      expect(refused.result.status).toBe(503);
    }
    expect(count('select count(*) as n from parts')).toBe(partsBefore);
    const res = await qa.post(`/api/lots/${lot.id}/promote`).send({ readingIds: ids.slice(0, 3) });
    expect(res.status).toBe(201);
    expect(res.body.created).toBe(3);
    expect(count('select count(*) as n from parts where lot_id = ?', lot.id)).toBe(3);
  });

  test("a promotion's refusals inside the worker come back as the same 4xx with their fields", async () => {
    const lot = await lotWithReadings(10);
    const qa = await t.as('qa');
    const noBin = await qa.post(`/api/lots/${lot.id}/promote`).send({ bin: 999 });
    expect(noBin.status).toBe(422);
    expect(noBin.body.error).toEqual({ code: 'invalid', message: 'There is no such bin.', fields: { bin: 'Not found.' } });
    const ids = (await qa.get(`/api/lots/${lot.id}/items`)).body.ids as number[];
    expect((await qa.post(`/api/lots/${lot.id}/promote`).send({ readingIds: ids.slice(0, 2) })).status).toBe(201);
    const again = await qa.post(`/api/lots/${lot.id}/promote`).send({ readingIds: ids.slice(0, 2) });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe('conflict');
    expect(again.body.error.message).toMatch(/^Parts exist already for 2 of these items/);
  });

  test("a disposition reads the lot's stored statistics, computed in a worker when missing", async () => {
    const lot = await lotWithReadings(25);
    invalidateLotStats(t.ctx.sqlite, lot.id);
    const body = { status: 'accepted', reason: 'Within tolerance on the incoming check.' };
    const refused = await withPoolRefusing(t.ctx.pool, async () => (await t.as('qa')).post(`/api/lots/${lot.id}/disposition`).send(body));
    expect(refused.asked).toEqual(['lotStats']);
    expect(refused.result.status).toBe(503);
    expect(findLot(t.ctx.db, lot.id)!.status).toBe('open');
    const res = await (await t.as('qa')).post(`/api/lots/${lot.id}/disposition`).send(body);
    expect(res.status).toBe(200);
    expect(res.body.lot.status).toBe('accepted');
    // The audit line carries the statistics of all 25 readings.
    const detail = JSON.parse(
      (
        t.ctx.sqlite
          .prepare("select detail from audit_log where action = 'lot.disposition' and entity_id = ? order by id desc")
          .get(String(lot.id)) as { detail: string }
      ).detail,
    );
    expect(detail.n).toBe(25);
  });
});

describe('two dispositions of one lot at once', () => {
  test('one is recorded; the other, which waited for the same statistics, is refused (409)', async () => {
    const lot = await lotWithReadings(15);
    invalidateLotStats(t.ctx.sqlite, lot.id);
    const qa = await t.as('qa');
    const admin = await t.as('admin');
    const [a, b] = await Promise.all([
      qa.post(`/api/lots/${lot.id}/disposition`).send({ status: 'accepted', reason: 'Within tolerance on the incoming check.' }),
      admin.post(`/api/lots/${lot.id}/disposition`).send({ status: 'rejected', reason: 'Too many outliers in the sample.' }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
    const refused = a.status === 409 ? a : b;
    expect(refused.body.error.message).toBe('The lot was disposed meanwhile; an admin must reopen it first.');
    const lines = count("select count(*) as n from audit_log where action = 'lot.disposition' and entity_id = ?", String(lot.id));
    expect(lines).toBe(1);
    expect(findLot(t.ctx.db, lot.id)!.status).toBe(a.status === 200 ? 'accepted' : 'rejected');
  });
});

describe('a promotion whose readings change between its plan and its writes', () => {
  test('is refused (409) and writes no part', async () => {
    const lot = await lotWithReadings(12);
    const row = findLot(t.ctx.db, lot.id)!;
    const ids = (await (await t.as('qa')).get(`/api/lots/${lot.id}/items`)).body.ids as number[];
    const input = { readingIds: ids.slice(0, 2) };
    const plan = planPromotion(t.ctx.sqlite, row, input);
    expect(plan.indices).toEqual([0, 1]);
    // Another upload commits meanwhile (one more reading).
    t.ctx.sqlite.prepare('insert into lot_readings (lot_id, item, value) values (?, ?, ?)').run(lot.id, '13', 47.1e-9);
    const partsBefore = count('select count(*) as n from parts');
    let refusal: unknown;
    try {
      writePromotion({ db: t.ctx.db, sqlite: t.ctx.sqlite }, row, input, plan, 'nobody');
    } catch (err) {
      refusal = err;
    }
    expect(refusal).toBeInstanceOf(HttpError);
    expect((refusal as HttpError).status).toBe(409);
    expect((refusal as HttpError).message).toMatch(/readings changed meanwhile/);
    expect(count('select count(*) as n from parts')).toBe(partsBefore);
  });
});
