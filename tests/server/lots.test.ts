import fs from 'node:fs';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { lotStatistics } from '@shared/analysis/lot-stats';
import { readConditions } from '@shared/csv/conditions';
import { parseLotRows } from '@shared/csv/lots';
import { createTestApp, type TestApp } from '../support/app';

let t: TestApp;
let watcherIds: string[];
beforeAll(async () => {
  t = await createTestApp();
  const members = (await (await t.as('admin')).get('/api/team/members')).body.members as { id: string; role: string }[];
  watcherIds = members.filter((m) => m.role === 'qa' || m.role === 'admin').map((m) => m.id);
});
afterAll(() => t.close());

const sample = fs.readFileSync(new URL('../../samples/capacitor-lot-473J.csv', import.meta.url), 'utf8');
const count = (table: string) => (t.ctx.sqlite.prepare(`select count(*) as n from ${table}`).get() as { n: number }).n;

async function newLot(body: Record<string, unknown> = {}) {
  const res = await (await t.as('qa')).post('/api/lots').send({
    kind: 'capacitor',
    marking: '473J',
    supplier: 'Alvane Parts Co.',
    secondQuantity: 'dissipation',
    secondLimit: 0.01,
    watcherIds,
    ...body,
  });
  expect(res.status).toBe(201);
  return res.body as { id: number; nominal: number; tolerancePct: number; code: string };
}

function generatedLot(n: number, badAt?: number): string {
  const lines = ['Item,C (nF),D'];
  for (let i = 1; i <= n; i++)
    lines.push(i === badAt ? `${i},forty-seven,0.001` : `${i},${(47 * (1 + 0.02 * Math.sin(i))).toFixed(4)},0.0010`);
  return lines.join('\n') + '\n';
}

describe('lots', () => {
  test('a lot from a marking code: 473J decodes to 47 nF ±5 % (IEC 60062)', async () => {
    const lot = await newLot();
    expect(lot.nominal).toBeCloseTo(47e-9, 20);
    expect(lot.tolerancePct).toBe(5);
  });

  test("an uploaded lot has the measurement engine's statistics for the same values", async () => {
    const lot = await newLot();
    const up = await (
      await t.as('tech')
    )
      .post(`/api/lots/${lot.id}/readings`)
      .attach('file', Buffer.from(sample), 'capacitor-lot-473J.csv');
    expect(up.status).toBe(201);
    const parsed = parseLotRows(sample, { quantity: 'capacitance' });
    if (!parsed.ok) throw new Error('sample does not parse');
    expect(up.body.rows).toBe(parsed.rows.length);
    const engine = lotStatistics({
      values: parsed.rows.map((r) => r.value),
      nominal: 47e-9,
      tolerancePct: 5,
      matchPct: 1,
      setSize: 2,
      second: { values: parsed.rows.map((r) => r.second ?? 0), max: 0.01 },
    });
    const detail = (await (await t.as('viewer')).get(`/api/lots/${lot.id}`)).body;
    for (const key of ['n', 'mean', 'sd', 'median', 'q1', 'q3', 'min', 'max', 'cp', 'cpk', 'countBelow', 'countAbove'] as const)
      expect(detail.stats[key]).toBe(engine[key]);
    expect(detail.stats.secondFailures).toEqual(engine.secondFailures);
    const items = (await (await t.as('viewer')).get(`/api/lots/${lot.id}/items`)).body;
    expect(items.values).toHaveLength(parsed.rows.length);
    expect(items.deviationsPct[0]).toBeCloseTo(engine.deviationsPct[0]!, 12);
  });

  test('an upload that fails at row 73,412 of 100,000 leaves no rows of that lot behind', async () => {
    const lot = await newLot();
    const before = { rows: count('lot_readings'), files: fs.readdirSync(t.ctx.config.uploadsDir, { recursive: true }).length };
    const res = await (
      await t.as('tech')
    )
      .post(`/api/lots/${lot.id}/readings`)
      .attach('file', Buffer.from(generatedLot(100_000, 73_412)), 'lot.csv');
    expect(res.status).toBe(422);
    // Line 73,413 of the file: the header is line 1.
    expect(res.body.error.message).toMatch(/Line 73413/);
    expect(res.body.error.message).toMatch(/C \(nF\)/);
    expect(count('lot_readings')).toBe(before.rows);
    expect(fs.readdirSync(t.ctx.config.uploadsDir, { recursive: true }).length).toBe(before.files);
    const ok = await (
      await t.as('tech')
    )
      .post(`/api/lots/${lot.id}/readings`)
      .attach('file', Buffer.from(generatedLot(100_000)), 'lot.csv');
    expect(ok.status).toBe(201);
    expect(ok.body.rows).toBe(100_000);
    expect(count('lot_readings')).toBe(before.rows + 100_000);
    const again = await (await t.as('tech')).post(`/api/lots/${lot.id}/readings`).attach('file', Buffer.from(generatedLot(10)), 'lot.csv');
    expect(again.status).toBe(409);
  });

  test('a tech cannot record a disposition; qa can, once, and each watcher gets one message', async () => {
    const lot = await newLot();
    await (await t.as('tech')).post(`/api/lots/${lot.id}/readings`).attach('file', Buffer.from(sample), 'lot.csv').expect(201);
    const tech = await t.as('tech');
    expect((await tech.post(`/api/lots/${lot.id}/disposition`).send({ status: 'accepted', reason: 'all good' })).status).toBe(403);
    const qa = await t.as('qa');
    expect((await qa.post(`/api/lots/${lot.id}/disposition`).send({ status: 'accepted' })).status).toBe(422);
    const outboxBefore = count('outbox');
    const res = await qa
      .post(`/api/lots/${lot.id}/disposition`)
      .send({ status: 'sorted', reason: 'Two parts out of tolerance; sorted into bins.' });
    expect(res.status).toBe(200);
    expect(res.body.notified).toBe(watcherIds.length);
    expect(count('outbox') - outboxBefore).toBe(watcherIds.length);
    const mail = t.ctx.sqlite
      .prepare("select subject, text from outbox where topic = 'lot-disposition' order by id desc limit 1")
      .get() as { subject: string; text: string };
    expect(mail.subject).toMatch(new RegExp(`${lot.code} sorted`));
    expect(mail.text).toMatch(/Two parts out of tolerance/);
    expect((await qa.post(`/api/lots/${lot.id}/disposition`).send({ status: 'accepted', reason: 'changed my mind' })).status).toBe(409);
    expect((await qa.post(`/api/lots/${lot.id}/reopen`).send({ reason: 'recount' })).status).toBe(403);
    expect((await (await t.as('admin')).post(`/api/lots/${lot.id}/reopen`).send({ reason: 'recount' })).status).toBe(200);
    const auditRows = t.ctx.sqlite
      .prepare("select action from audit_log where entity = 'lot' and entity_id = ? order by id")
      .all(String(lot.id)) as { action: string }[];
    expect(auditRows.map((r) => r.action)).toEqual(['lot.create', 'lot.readings-uploaded', 'lot.disposition', 'lot.reopen']);
  });

  test('the CSV export escapes formulae and carries deviation, bin, set and verdict', async () => {
    const lot = await newLot();
    const csv = 'Item,C (nF),D\n=HYPERLINK("x"),47.1,0.001\n2,47.2,0.001\n3,52,0.001\n';
    await (await t.as('tech')).post(`/api/lots/${lot.id}/readings`).attach('file', Buffer.from(csv), 'lot.csv').expect(201);
    const res = await (await t.as('viewer')).get(`/api/lots/${lot.id}/export.csv`);
    expect(res.status).toBe(200);
    const lines = res.text
      .trim()
      .split(/\r?\n/)
      .filter((l) => !l.startsWith('# '));
    expect(lines[0]).toBe('item,value,deviation_pct,bin,set,verdict');
    expect(lines[1]).toMatch(/^"'=HYPERLINK/);
    expect(lines[3]).toMatch(/,fail$/);
  });

  test('the CSV export starts with its conditions, which the lot reader skips and readConditions reads back', async () => {
    const lot = await newLot();
    const csv = 'Item,C (nF),D\n1,47.1,0.001\n2,47.2,0.001\n3,52,0.001\n';
    await (await t.as('tech')).post(`/api/lots/${lot.id}/readings`).attach('file', Buffer.from(csv), 'lot.csv').expect(201);
    const res = await (await t.as('viewer')).get(`/api/lots/${lot.id}/export.csv?matchPct=0.5&setSize=3`);
    expect(res.status).toBe(200);
    const lines = res.text.split('\n');
    // The file opens with `# key: value` lines, then the header.
    const firstData = lines.findIndex((l) => !l.startsWith('# '));
    expect(firstData).toBeGreaterThan(5);
    expect(lines[firstData]).toBe('item,value,deviation_pct,bin,set,verdict');
    const conditions = Object.fromEntries(readConditions(res.text).map((c) => [c.key, c.value]));
    expect(conditions.lot).toBe(lot.code);
    expect(conditions.quantity).toBe('capacitance');
    expect(conditions.nominal).toBe('47 nF');
    expect(conditions.tolerance).toBe(`±${lot.tolerancePct} %`);
    expect(conditions.readings).toBe('3');
    // The matching options of this request, not the defaults.
    expect(conditions['matched sets']).toBe('within ±0.5 % of each other, 3 parts a set');
    // The lot has no test frequency: said so, not left out.
    expect(conditions['test frequency']).toBe('not set');
    expect(Date.parse(conditions.exported!)).toBeGreaterThan(Date.now() - 60_000);
    // Round trip: the export read by the same reader an upload uses gives the same values.
    const back = parseLotRows(res.text, {
      quantity: 'capacitance',
      mapping: { item: { column: 'item' }, value: { column: 'value', unit: 'F' } },
    });
    if (!back.ok) throw new Error(JSON.stringify(back.issues));
    expect(back.rows.map((r) => r.item)).toEqual(['1', '2', '3']);
    expect(back.rows.map((r) => r.value)).toEqual([47.1e-9, 47.2e-9, 52e-9].map((v) => expect.closeTo(v, 18)));
  });

  test('a matched set becomes parts that keep their readings and lot link', async () => {
    const lot = await newLot();
    await (await t.as('tech')).post(`/api/lots/${lot.id}/readings`).attach('file', Buffer.from(sample), 'lot.csv').expect(201);
    const tech = await t.as('tech');
    const res = await tech.post(`/api/lots/${lot.id}/promote`).send({ set: 0, matchPct: 0.5, setSize: 2 });
    expect(res.status).toBe(201);
    expect(res.body.created).toBe(2);
    const part = (await tech.get(`/api/parts/${res.body.partIds[0]}`)).body;
    expect(part.lotId).toBe(lot.id);
    const readings = (await tech.get(`/api/parts/${part.id}/readings`)).body.readings;
    expect(readings.map((r: { entry: string }) => r.entry)).toEqual(['lot', 'lot']);
    expect((await tech.post(`/api/lots/${lot.id}/promote`).send({ set: 0, matchPct: 0.5, setSize: 2 })).status).toBe(409);
  });
});

test("the lot list counts each lot's own readings", async () => {
  const a = await newLot();
  const b = await newLot();
  await (
    await t.as('tech')
  )
    .post(`/api/lots/${a.id}/readings`)
    .attach('file', Buffer.from(generatedLot(7)), 'lot.csv')
    .expect(201);
  await (
    await t.as('tech')
  )
    .post(`/api/lots/${b.id}/readings`)
    .attach('file', Buffer.from(generatedLot(3)), 'lot.csv')
    .expect(201);
  const list = (await (await t.as('viewer')).get('/api/lots')).body.lots as { id: number; count: number }[];
  expect(list.find((l) => l.id === a.id)!.count).toBe(7);
  expect(list.find((l) => l.id === b.id)!.count).toBe(3);
});
