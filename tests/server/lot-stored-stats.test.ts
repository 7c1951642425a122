// Stored lot statistics (server/features/lots/stored-stats.ts): what the detail and items routes send
// from lot_stats must equal a fresh computation by the measurement engine (shared/analysis/lot-stats.ts)
// over the lot's current readings, after an upload, a replace and a promotion, and after a row went missing
// or belongs to an older engine version.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { lotStatistics } from '@shared/analysis/lot-stats';
import { createTestApp, type TestApp } from '../support/app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const NOMINAL = 47e-9;
const TOL = 5;
const D_LIMIT = 0.01;

/** n readings around 47 nF (in nF in the file), shifted by `shift` (a replace sends other values); every 9th D fails 0.01. */
function lotFile(n: number, shift = 0): { csv: string; values: number[]; second: number[] } {
  const lines = ['Item,C (nF),D'];
  const values: number[] = [];
  const second: number[] = [];
  for (let i = 1; i <= n; i++) {
    const nf = Number((47 * (1 + shift + 0.04 * Math.sin(i * 1.7) + 0.01 * Math.cos(i * 0.3))).toFixed(4));
    const d = i % 9 === 0 ? 0.012 : 0.001;
    lines.push(`${i},${nf},${d}`);
    values.push(nf * 1e-9);
    second.push(d);
  }
  return { csv: lines.join('\n') + '\n', values, second };
}

async function newLot() {
  const res = await (
    await t.as('qa')
  )
    .post('/api/lots')
    .send({ kind: 'capacitor', nominal: NOMINAL, tolerancePct: TOL, secondQuantity: 'dissipation', secondLimit: D_LIMIT });
  expect(res.status).toBe(201);
  return res.body as { id: number };
}

async function upload(lotId: number, csv: string, replace = false) {
  const req = (await t.as('tech')).post(`/api/lots/${lotId}/readings`);
  if (replace) req.field('replace', 'true');
  const res = await req.attach('file', Buffer.from(csv), 'lot.csv');
  expect(res.status).toBe(201);
}

/** The engine's answer for these readings with the routes' default matching (1 %, pairs), as JSON would carry it. */
function fresh(values: number[], second: number[]) {
  const s = lotStatistics({
    values,
    nominal: NOMINAL,
    tolerancePct: TOL,
    matchPct: 1,
    setSize: 2,
    withBinIndices: true,
    second: { values: second, max: D_LIMIT },
  });
  return JSON.parse(JSON.stringify(s)) as typeof s & { deviationsPct: Record<string, number> };
}

/** The lot's readings as stored (value and D), in upload order. */
function readings(lotId: number) {
  const rows = t.ctx.sqlite.prepare('select value, second_value from lot_readings where lot_id = ? order by id').all(lotId) as {
    value: number;
    second_value: number;
  }[];
  return { values: rows.map((r) => r.value), second: rows.map((r) => r.second_value) };
}

/** Detail and items as sent, checked against the engine's answer for the lot's stored readings, which must be those of `file`. */
async function expectMatchesEngine(lotId: number, file: { values: number[]; second: number[] }) {
  const { values, second } = readings(lotId);
  expect(values).toHaveLength(file.values.length);
  values.forEach((v, i) => expect(v).toBeCloseTo(file.values[i]!, 20));
  expect(second).toEqual(file.second);
  const viewer = await t.as('viewer');
  const detail = (await viewer.get(`/api/lots/${lotId}`).expect(200)).body;
  const items = (await viewer.get(`/api/lots/${lotId}/items`).expect(200)).body;
  const e = fresh(values, second);
  expect(detail.count).toBe(values.length);
  for (const key of [
    'n',
    'mean',
    'sd',
    'median',
    'q1',
    'q3',
    'min',
    'max',
    'cp',
    'cpk',
    'countBelow',
    'countAbove',
    'lower',
    'upper',
  ] as const)
    expect(detail.stats[key]).toBe(e[key]);
  expect(detail.stats.outliers).toEqual(e.outliers);
  expect(detail.stats.histogram).toEqual(e.histogram);
  expect(detail.stats.secondFailures).toEqual(e.secondFailures);
  expect(detail.stats.bins).toEqual(e.bins.map(({ indices: _, ...b }) => b));
  expect(detail.stats.matchedSetCount).toBe(e.matchedSets.length);
  expect(detail.stats.matchedSets).toEqual(e.matchedSets.slice(0, 200));
  // Per item: value, deviation, bin, set and flags, in upload order.
  expect(items.values).toEqual(values);
  expect(items.deviationsPct).toEqual(Object.values(e.deviationsPct));
  const bin = new Array(values.length).fill(-1);
  e.bins.forEach((b, bi) => b.indices!.forEach((i) => (bin[i] = bi)));
  expect(items.bin).toEqual(bin);
  const set = new Array(values.length).fill(-1);
  e.matchedSets.forEach((s, si) => s.indices.forEach((i) => (set[i] = si)));
  expect(items.set).toEqual(set);
  expect(items.outlier).toEqual(values.map((_, i) => (e.outliers.indices.includes(i) ? 1 : 0)));
  expect(items.secondFail).toEqual(values.map((_, i) => (e.secondFailures!.includes(i) ? 1 : 0)));
  return { detail, items };
}

const storedRow = (lotId: number) =>
  t.ctx.sqlite.prepare('select engine_version, count, detail from lot_stats where lot_id = ?').get(lotId) as
    { engine_version: string; count: number; detail: string } | undefined;

describe('stored lot statistics', () => {
  test('an upload stores them, and the reads send what the engine computes for the readings', async () => {
    const lot = await newLot();
    const a = lotFile(400);
    await upload(lot.id, a.csv);
    // Computed by the upload itself, before any read.
    expect(storedRow(lot.id)?.count).toBe(400);
    expect(JSON.parse(storedRow(lot.id)!.detail).mean).toBe(fresh(readings(lot.id).values, a.second).mean);
    await expectMatchesEngine(lot.id, a);
  });

  test("a replace is never answered with the old readings' statistics", async () => {
    const lot = await newLot();
    const a = lotFile(300);
    await upload(lot.id, a.csv);
    await expectMatchesEngine(lot.id, a);
    const b = lotFile(250, 0.03);
    await upload(lot.id, b.csv, true);
    const { detail } = await expectMatchesEngine(lot.id, b);
    expect(detail.stats.n).toBe(250);
  });

  test("a promotion shows in the items' part links, and the statistics stay those of the readings", async () => {
    const lot = await newLot();
    const a = lotFile(120);
    await upload(lot.id, a.csv);
    const before = await expectMatchesEngine(lot.id, a);
    expect(before.items.partIds.every((p: number | null) => p === null)).toBe(true);
    const res = await (await t.as('tech')).post(`/api/lots/${lot.id}/promote`).send({ set: 0 });
    expect(res.status).toBe(201);
    const { items } = await expectMatchesEngine(lot.id, a);
    const e = fresh(readings(lot.id).values, a.second);
    const promotedAt = [...e.matchedSets[0]!.indices].sort((x, y) => x - y);
    expect(items.partIds.flatMap((p: number | null, i: number) => (p === null ? [] : [i]))).toEqual(promotedAt);
    expect(new Set(items.partIds.filter((p: number | null) => p !== null))).toEqual(new Set(res.body.partIds));
  });

  test("a lot without a stored row (from before the table) or with an older engine's row is computed on its next read", async () => {
    const lot = await newLot();
    const a = lotFile(90);
    await upload(lot.id, a.csv);
    t.ctx.sqlite.prepare('delete from lot_stats where lot_id = ?').run(lot.id);
    await expectMatchesEngine(lot.id, a);
    expect(storedRow(lot.id)?.count).toBe(90);
    // A row of another engine version holding wrong figures is not sent.
    t.ctx.sqlite
      .prepare("update lot_stats set engine_version = 'analysis-0.0.0', detail = replace(detail, '\"n\":90', '\"n\":1') where lot_id = ?")
      .run(lot.id);
    await expectMatchesEngine(lot.id, a);
    expect(storedRow(lot.id)?.engine_version).not.toBe('analysis-0.0.0');
  });

  test('another matching than the stored one is computed for that request', async () => {
    const lot = await newLot();
    const a = lotFile(200);
    await upload(lot.id, a.csv);
    const detail = (await (await t.as('viewer')).get(`/api/lots/${lot.id}?matchPct=0.2&setSize=3`).expect(200)).body;
    const e = lotStatistics({ values: readings(lot.id).values, nominal: NOMINAL, tolerancePct: TOL, matchPct: 0.2, setSize: 3 });
    expect(detail.stats.matchedSetCount).toBe(e.matchedSets.length);
    expect(detail.stats.matchedSets).toEqual(JSON.parse(JSON.stringify(e.matchedSets.slice(0, 200))));
    // The stored row still holds the default matching.
    expect(JSON.parse(storedRow(lot.id)!.detail).matchedSetCount).toBe(fresh(readings(lot.id).values, a.second).matchedSets.length);
  });
});
