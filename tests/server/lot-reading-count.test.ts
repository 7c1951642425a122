// The lot list's reading counts come from lots.reading_count, kept by the transaction that inserts or
// replaces a lot's readings, so GET /api/lots never counts 100,000 rows per lot. Each count must equal the
// rows stored after an upload, a replace, and uploads that are refused.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { createTestApp, type TestApp } from '../support/app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

/** A file of `n` capacitor readings around 47 nF (invented values); `badAt` spoils one row's value. */
function lotCsv(n: number, badAt?: number): Buffer {
  const lines = ['Item,C (nF)'];
  for (let i = 1; i <= n; i++) lines.push(i === badAt ? `${i},forty-seven` : `${i},${(47 * (1 + 0.02 * Math.sin(i))).toFixed(4)}`);
  return Buffer.from(lines.join('\n') + '\n');
}

const stored = (lotId: number) =>
  (t.ctx.sqlite.prepare('select count(*) as n from lot_readings where lot_id = ?').get(lotId) as { n: number }).n;

/** The count GET /api/lots gives for the lot. */
async function listed(lotId: number): Promise<number> {
  const res = await (await t.as('viewer')).get('/api/lots');
  expect(res.status).toBe(200);
  const row = (res.body.lots as { id: number; count: number }[]).find((l) => l.id === lotId);
  expect(row).toBeDefined();
  return row!.count;
}

describe("the lot list's reading counts", () => {
  test('follow an upload, a refused upload and a replace with fewer rows', async () => {
    const tech = await t.as('tech');
    const lotId = (await tech.post('/api/lots').send({ kind: 'capacitor', marking: '473J' }).expect(201)).body.id as number;
    expect(await listed(lotId)).toBe(0);

    await tech.post(`/api/lots/${lotId}/readings`).attach('file', lotCsv(1234), 'first.csv').expect(201);
    expect(stored(lotId)).toBe(1234);
    expect(await listed(lotId)).toBe(1234);

    // Refused: readings exist and no replace was asked; a bad row in a replace. Nothing changes.
    const again = await tech.post(`/api/lots/${lotId}/readings`).attach('file', lotCsv(10), 'again.csv');
    expect(again.status).toBe(409);
    expect(again.body.error.message).toBe('The lot has 1234 readings already; send replace=true to replace them.');
    const bad = await tech.post(`/api/lots/${lotId}/readings`).field('replace', 'true').attach('file', lotCsv(50, 20), 'bad.csv');
    expect(bad.status).toBe(422);
    expect(await listed(lotId)).toBe(1234);

    await tech.post(`/api/lots/${lotId}/readings`).field('replace', 'true').attach('file', lotCsv(321), 'fewer.csv').expect(201);
    expect(stored(lotId)).toBe(321);
    expect(await listed(lotId)).toBe(321);
  });

  test('are the stored counts, not counted per request', async () => {
    const tech = await t.as('tech');
    const lotId = (await tech.post('/api/lots').send({ kind: 'capacitor', marking: '473J' }).expect(201)).body.id as number;
    await tech.post(`/api/lots/${lotId}/readings`).attach('file', lotCsv(40), 'lot.csv').expect(201);
    // A count that differs from the rows on purpose: the list must answer what lots.reading_count says.
    t.ctx.sqlite.prepare('update lots set reading_count = 7 where id = ?').run(lotId);
    expect(await listed(lotId)).toBe(7);
    t.ctx.sqlite.prepare('update lots set reading_count = 40 where id = ?').run(lotId);
    // The column is the list's `count`, never a field of the lot itself.
    const detail = await (await t.as('viewer')).get(`/api/lots/${lotId}`);
    expect(detail.body.count).toBe(40);
    expect(detail.body).not.toHaveProperty('readingCount');
  });
});
