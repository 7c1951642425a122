import { readConditions } from '@shared/csv/conditions';
import Database from 'better-sqlite3';
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, test, vi } from 'vitest';
import { parts } from '@server/db/schema';
import { comparisonCsv, taperComparison } from '@server/features/compare/compute';
import { summaryStatistics } from '@shared/analysis/lot-stats';
import { taperLawValue, type TaperLawKind } from '@shared/taper/law';
import { createTestApp, type TestApp } from '../support/app';
import { withPoolRefusing } from '../support/pool-refusing';

let t: TestApp;
const ids: Record<string, number> = {};
const lotIds: Record<string, number> = {};

function potCsv(law: TaperLawKind, m: number, total: number): string {
  const lines = ['Rotation (deg),R (kOhm)'];
  for (let deg = 0; deg <= 300; deg += 10)
    lines.push(`${deg},${((200 + (total - 200) * taperLawValue(law, m, deg / 300)) / 1e3).toFixed(4)}`);
  return lines.join('\n') + '\n';
}

interface PotSpec {
  label: string;
  lot: 'A' | 'B' | 'C';
  supplier: string;
  nominal: number;
  taperClass: TaperLawKind;
  law: TaperLawKind;
  m: number;
  total: number;
  tags?: string;
}

const SPECS: PotSpec[] = [
  {
    label: 'CMP-A1',
    lot: 'A',
    supplier: 'Alder Works',
    nominal: 500e3,
    taperClass: 'audio',
    law: 'audio',
    m: 0.12,
    total: 470e3,
    tags: 'study, bright',
  },
  { label: 'CMP-A2', lot: 'A', supplier: 'Alder Works', nominal: 500e3, taperClass: 'audio', law: 'audio', m: 0.15, total: 505e3 },
  {
    label: 'CMP-A3',
    lot: 'A',
    supplier: 'Alder Works',
    nominal: 500e3,
    taperClass: 'audio',
    law: 'audio',
    m: 0.18,
    total: 540e3,
    tags: 'study',
  },
  { label: 'CMP-B1', lot: 'B', supplier: 'Alder Works', nominal: 250e3, taperClass: 'audio', law: 'audio', m: 0.1, total: 240e3 },
  { label: 'CMP-B2', lot: 'B', supplier: 'Alder Works', nominal: 250e3, taperClass: 'audio', law: 'audio', m: 0.11, total: 262e3 },
  { label: 'CMP-C1', lot: 'C', supplier: '=SUM(1,2)', nominal: 500e3, taperClass: 'linear', law: 'linear', m: 0.5, total: 495e3 },
  { label: 'CMP-C2', lot: 'C', supplier: '=SUM(1,2)', nominal: 500e3, taperClass: 'linear', law: 'linear', m: 0.5, total: 515e3 },
];

beforeAll(async () => {
  t = await createTestApp();
  const tech = await t.as('tech');
  for (const code of ['A', 'B', 'C'] as const) {
    const spec = SPECS.find((s) => s.lot === code)!;
    const res = await tech
      .post('/api/lots')
      .send({ code: `CMP-LOT-${code}`, kind: 'pot', nominal: spec.nominal, tolerancePct: 20, supplier: spec.supplier });
    expect(res.status).toBe(201);
    lotIds[code] = res.body.id;
  }
  for (const s of SPECS) {
    const res = await tech.post('/api/parts').send({
      kind: 'pot',
      label: s.label,
      nominal: s.nominal,
      tolerancePct: 20,
      taperClass: s.taperClass,
      supplier: s.supplier,
      tags: s.tags,
    });
    expect(res.status).toBe(201);
    ids[s.label] = res.body.id;
    // The parts API has no lot field (parts join a lot by promotion from its readings); link directly.
    t.ctx.db.update(parts).set({ lotId: lotIds[s.lot] }).where(eq(parts.id, res.body.id)).run();
    const up = await tech
      .post(`/api/parts/${res.body.id}/sweeps`)
      .field('kind', 'taper')
      .attach('file', Buffer.from(potCsv(s.law, s.m, s.total)), `${s.label}.csv`);
    expect(up.status).toBe(201);
  }
  // A pot without a sweep: never part of a comparison.
  ids['CMP-NOSWEEP'] = (
    await tech
      .post('/api/parts')
      .send({ kind: 'pot', label: 'CMP-NOSWEEP', nominal: 500e3, tolerancePct: 20, taperClass: 'audio' })
      .expect(201)
  ).body.id;
  // Creation dates for the date filter.
  t.ctx.db
    .update(parts)
    .set({ createdAt: Date.parse('2001-03-10T12:00:00Z') })
    .where(eq(parts.id, ids['CMP-A1']!))
    .run();
  t.ctx.db
    .update(parts)
    .set({ createdAt: Date.parse('2001-03-12T23:30:00Z') })
    .where(eq(parts.id, ids['CMP-A2']!))
    .run();
});
afterAll(() => t.close());

type Pot = {
  partId: number;
  label: string;
  nominal: number | null;
  taperClass: string | null;
  group: string;
  fit: { m: number; total: number; r2: number; law: string };
  curve: { x: number[]; y: number[] };
  gridCurve: (number | null)[];
};
type Group = {
  key: string;
  label: string;
  partIds: number[];
  m: Record<string, number | null>;
  total: Record<string, number | null>;
  envelope: { mean: (number | null)[] };
};

async function tapers(selection: object, groupBy = 'lot') {
  const res = await (await t.as('viewer')).post('/api/compare/tapers').send({ selection, groupBy });
  expect(res.status).toBe(200);
  return res.body as { grid: number[]; pots: Pot[]; groups: Group[]; missing: number[] };
}
const labels = (body: { pots: Pot[] }) => body.pots.map((p) => p.label).sort();
/** The demo data has pots of its own; filter checks look at this file's pots (CMP-…). */
const mine = (body: { pots: Pot[] }) => labels(body).filter((l) => l.startsWith('CMP-'));
/** Pots with a current taper fit, counted straight from the tables. */
const fittedPotCount = () =>
  (
    t.ctx.sqlite
      .prepare(
        "select count(distinct f.part_id) as n from fits f join parts p on p.id = f.part_id where f.kind = 'taper' and f.superseded_at is null and p.kind = 'pot'",
      )
      .get() as { n: number }
  ).n;

describe('taper comparison', () => {
  test('with no filter: every pot with a current taper fit, grouped by lot, each curve normalised by the fit total', async () => {
    const body = await tapers({});
    expect(mine(body)).toEqual(SPECS.map((s) => s.label).sort());
    expect(body.pots).toHaveLength(fittedPotCount());
    expect(body.groups.map((g) => g.label)).toEqual(expect.arrayContaining(['CMP-LOT-A', 'CMP-LOT-B', 'CMP-LOT-C']));
    expect(body.groups.reduce((n, g) => n + g.partIds.length, 0)).toBe(body.pots.length);
    expect(body.grid).toHaveLength(101);
    const viewer = await t.as('viewer');
    const a1 = body.pots.find((p) => p.label === 'CMP-A1')!;
    const sweeps = (await viewer.get(`/api/parts/${a1.partId}/sweeps`)).body.sweeps;
    const fit = sweeps[0].fit.result;
    expect(a1.fit.m).toBe(fit.m);
    expect(a1.fit.total).toBe(fit.total);
    // y = R1W / R13 with the fit's total; x = rotation fraction (stored sweep points, docs/computation.md §3).
    sweeps[0].points.forEach((p: { rotation: number; resistance: number }, i: number) => {
      expect(a1.curve.x[i]).toBeCloseTo(p.rotation / 100, 12);
      expect(a1.curve.y[i]).toBeCloseTo(p.resistance / fit.total, 12);
    });
    expect(a1.gridCurve[50]).toBeCloseTo(a1.curve.y[15]!, 12); // 150° of 300° is grid point 0.5
  });

  test("each group's statistics equal the measurement engine's (summaryStatistics, /api/analysis/lot) on the same fits", async () => {
    const body = await tapers({});
    const viewer = await t.as('viewer');
    for (const g of body.groups) {
      const members = body.pots.filter((p) => g.partIds.includes(p.partId));
      const fits = await Promise.all(members.map(async (p) => (await viewer.get(`/api/parts/${p.partId}/fits`)).body.fits[0].result));
      const ms = fits.map((f: { m: number }) => f.m);
      const totals = fits.map((f: { total: number }) => f.total);
      expect(g.m).toEqual(JSON.parse(JSON.stringify(summaryStatistics(ms))));
      const engine = (await viewer.post('/api/analysis/lot').send({ values: totals, nominal: 500e3, tolerancePct: 20 })).body;
      for (const k of ['n', 'mean', 'sd', 'median', 'q1', 'q3', 'min', 'max']) expect(g.total[k]).toBe(engine[k]);
    }
    const a = body.groups.find((g) => g.label === 'CMP-LOT-A')!;
    expect(a.m.n).toBe(3);
    // Fitted m recovers what the sweeps were generated with, to the fit's accuracy.
    expect(a.m.mean!).toBeCloseTo((0.12 + 0.15 + 0.18) / 3, 2);
  });

  test('group by supplier and by nothing', async () => {
    const ours = { lotIds: [lotIds.A!, lotIds.B!, lotIds.C!] };
    expect((await tapers(ours, 'supplier')).groups.map((g) => [g.label, g.partIds.length])).toEqual([
      ['=SUM(1,2)', 2],
      ['Alder Works', 5],
    ]);
    expect((await tapers(ours, 'none')).groups.map((g) => g.partIds.length)).toEqual([7]);
  });

  test('filters: lot, supplier, nominal, taper class, tag, date range, one by one', async () => {
    expect(labels(await tapers({ lotIds: [lotIds.B] }))).toEqual(['CMP-B1', 'CMP-B2']);
    expect(labels(await tapers({ suppliers: ['=SUM(1,2)'] }))).toEqual(['CMP-C1', 'CMP-C2']);
    const at250k = await tapers({ nominal: 250e3 });
    expect(mine(at250k)).toEqual(['CMP-B1', 'CMP-B2']);
    expect(at250k.pots.every((p) => p.nominal === 250e3)).toBe(true);
    const linear = await tapers({ taperClasses: ['linear'] });
    expect(mine(linear)).toEqual(['CMP-C1', 'CMP-C2']);
    expect(linear.pots.every((p) => p.taperClass === 'linear')).toBe(true);
    expect(mine(await tapers({ tag: 'STUDY' }))).toEqual(['CMP-A1', 'CMP-A3']);
    expect(labels(await tapers({ createdFrom: '2001-03-10', createdTo: '2001-03-12' }))).toEqual(['CMP-A1', 'CMP-A2']);
    expect(labels(await tapers({ createdFrom: '2001-03-11', createdTo: '2001-03-11' }))).toEqual([]);
    // Filters of different kinds all hold.
    const both = await tapers({ nominal: 500e3, taperClasses: ['audio'] });
    expect(mine(both)).toEqual(['CMP-A1', 'CMP-A2', 'CMP-A3']);
    expect(both.pots.every((p) => p.nominal === 500e3 && p.taperClass === 'audio')).toBe(true);
    // One by one, and added to a filter; a pot without a sweep is reported missing, not compared.
    const picked = await tapers({ partIds: [ids['CMP-A1'], ids['CMP-C2'], ids['CMP-NOSWEEP']] });
    expect(labels(picked)).toEqual(['CMP-A1', 'CMP-C2']);
    expect(picked.missing).toEqual([ids['CMP-NOSWEEP']]);
    expect(labels(await tapers({ lotIds: [lotIds.B], partIds: [ids['CMP-C1']] }))).toEqual(['CMP-B1', 'CMP-B2', 'CMP-C1']);
  });

  test('bad input names the field', async () => {
    const viewer = await t.as('viewer');
    let res = await viewer.post('/api/compare/tapers').send({ selection: { lotIds: ['one'] } });
    expect(res.status).toBe(422);
    expect(Object.keys(res.body.error.fields)).toContain('selection.lotIds.0');
    res = await viewer.post('/api/compare/tapers').send({ selection: { createdFrom: '2026-03-12', createdTo: '2026-03-01' } });
    expect(res.status).toBe(422);
    expect(res.body.error.fields['selection.createdTo']).toMatch(/before/);
    res = await viewer.post('/api/compare/tapers').send({ selection: {}, groupBy: 'colour' });
    expect(res.body.error.fields).toHaveProperty('groupBy');
    const tech = await t.as('tech');
    res = await tech.post('/api/comparisons').send({ name: '  ', selection: {} });
    expect(res.status).toBe(422);
    expect(res.body.error.fields.name).toMatch(/name/);
    res = await tech.post('/api/comparisons').send({ name: 'x', selection: {}, settings: { toleranceDb: -1 } });
    expect(res.body.error.fields['settings.toleranceDb']).toMatch(/more than 0 dB/);
  });
});

describe('saved comparisons', () => {
  test('a tech saves a study; a viewer can open and export it but not change or delete it', async () => {
    const tech = await t.as('tech');
    const viewer = await t.as('viewer');
    const created = await tech
      .post('/api/comparisons')
      .send({ name: 'Lots A and C', selection: { lotIds: [lotIds.A, lotIds.C] }, settings: { groupBy: 'supplier', toleranceDb: 0.5 } });
    expect(created.status).toBe(201);
    const id = created.body.id;
    expect(created.body.ownerName).toBeTruthy();

    const list = (await viewer.get('/api/comparisons')).body.comparisons;
    expect(list.map((c: { id: number }) => c.id)).toContain(id);
    const opened = await viewer.get(`/api/comparisons/${id}`);
    expect(opened.status).toBe(200);
    expect(opened.body.settings).toEqual({ groupBy: 'supplier', toleranceDb: 0.5 });
    expect(labels(await tapers(opened.body.selection, opened.body.settings.groupBy))).toEqual([
      'CMP-A1',
      'CMP-A2',
      'CMP-A3',
      'CMP-C1',
      'CMP-C2',
    ]);

    const csv = await viewer.get(`/api/comparisons/${id}/export.csv`);
    expect(csv.status).toBe(200);
    expect(csv.headers['content-type']).toMatch(/text\/csv/);
    // The conditions first (`# key: value`), then the table.
    const conditions = Object.fromEntries(readConditions(csv.text).map((c) => [c.key, c.value]));
    expect(conditions).toMatchObject({ 'grouped by': 'supplier', pots: '5' });
    expect(conditions.comparison).toMatch(new RegExp(`\\(#${id}\\)$`));
    const lines = csv.text
      .trim()
      .split(/\r?\n/)
      .filter((l) => !l.startsWith('# '));
    expect(lines[0]).toMatch(/^part,group,lot,supplier,nominal_ohm,law,m,r2/);
    expect(lines).toHaveLength(6);
    // OWASP CSV injection: a cell starting with = is escaped with a leading quote.
    expect(csv.text).toContain(`"'=SUM(1,2)"`);
    expect(csv.text).not.toMatch(/(^|,)=SUM/m);

    expect((await viewer.patch(`/api/comparisons/${id}`).send({ name: 'Mine now' })).status).toBe(403);
    expect((await viewer.delete(`/api/comparisons/${id}`)).status).toBe(403);
    expect((await viewer.post('/api/comparisons').send({ name: 'Viewer study', selection: {} })).status).toBe(403);
    expect((await viewer.get(`/api/comparisons/${id}`)).body.name).toBe('Lots A and C');
  });

  test('the owner changes it; qa may too; delete removes it', async () => {
    const tech = await t.as('tech');
    const qa = await t.as('qa');
    const id = (await tech.post('/api/comparisons').send({ name: 'Draft', selection: {} }).expect(201)).body.id;
    const renamed = await tech.patch(`/api/comparisons/${id}`).send({ name: 'All pots', settings: { groupBy: 'none' } });
    expect(renamed.status).toBe(200);
    expect(renamed.body).toMatchObject({ name: 'All pots', selection: {}, settings: { groupBy: 'none' } });
    expect((await qa.patch(`/api/comparisons/${id}`).send({ selection: { taperClasses: ['linear'] } })).body.selection).toEqual({
      taperClasses: ['linear'],
    });
    expect((await tech.delete(`/api/comparisons/${id}`)).status).toBe(200);
    expect((await tech.get(`/api/comparisons/${id}`)).status).toBe(404);
  });

  test('the candidates list offers the fitted pots, their lots, suppliers and nominals', async () => {
    const body = (await (await t.as('viewer')).get('/api/compare/candidates')).body;
    const labelsHere = body.pots.map((p: { label: string }) => p.label);
    expect(labelsHere).toContain('CMP-A1');
    expect(labelsHere).not.toContain('CMP-NOSWEEP');
    expect(body.lots.filter((l: { code: string }) => l.code.startsWith('CMP-LOT')).map((l: { count: number }) => l.count)).toEqual([
      3, 2, 2,
    ]);
    expect(body.nominals).toEqual(expect.arrayContaining([250e3, 500e3]));
    expect(body.tags).toEqual(expect.arrayContaining(['study', 'bright']));
  });
});

describe('the work that grows with the sweeps runs in the pool', () => {
  test('the taper comparison is made in a worker: refused there, it is a 503; its answer is the comparison of the same pots', async () => {
    const viewer = await t.as('viewer');
    const request = { selection: { lotIds: [lotIds.A!, lotIds.C!] }, groupBy: 'supplier' as const, gridPoints: 501 };
    const refused = await withPoolRefusing(t.ctx.pool, async () => viewer.post('/api/compare/tapers').send(request));
    expect(refused.asked).toEqual(['compareTapersJson']);
    expect(refused.result.status).toBe(503);
    for (const encoding of ['identity', 'gzip']) {
      const res = await viewer.post('/api/compare/tapers').set('Accept-Encoding', encoding).send(request);
      expect(res.status).toBe(200);
      expect(res.headers['content-encoding']).toBe(encoding === 'gzip' ? 'gzip' : undefined);
      // The worker's answer is the comparison made here, on this thread's connection, of the same request.
      expect(res.body).toEqual(JSON.parse(JSON.stringify(taperComparison(t.ctx.sqlite, request))));
      expect(res.body.pots.map((p: Pot) => p.label).sort()).toEqual(['CMP-A1', 'CMP-A2', 'CMP-A3', 'CMP-C1', 'CMP-C2']);
      expect(res.body.grid).toHaveLength(501);
    }
  });

  test("a saved comparison's CSV is made in a worker from the fits alone, reading no sweep", async () => {
    const tech = await t.as('tech');
    const id = (
      await tech
        .post('/api/comparisons')
        .send({ name: 'Lot B', selection: { lotIds: [lotIds.B] } })
        .expect(201)
    ).body.id;
    const refused = await withPoolRefusing(t.ctx.pool, async () => tech.get(`/api/comparisons/${id}/export.csv`));
    expect(refused.asked).toEqual(['comparisonCsv']);
    expect(refused.result.status).toBe(503);
    const res = await tech.get(`/api/comparisons/${id}/export.csv`).set('Accept-Encoding', 'identity');
    expect(res.status).toBe(200);
    expect(res.headers['content-disposition']).toBe('attachment; filename=Lot-B.csv');
    expect(Number(res.headers['content-length'])).toBe(Buffer.byteLength(res.text));
    expect(res.text.split('\n').filter((l) => l.startsWith('CMP-B'))).toHaveLength(2);
    // The same file made on a connection of its own, every statement it prepares recorded.
    const sqlite = new Database(t.ctx.sqlite.name, { readonly: true });
    try {
      const prepare = vi.spyOn(sqlite, 'prepare');
      const csv = comparisonCsv(sqlite, {
        comparison: { id, name: 'Lot B', selection: { lotIds: [lotIds.B!] } },
        groupBy: 'lot',
        exportedAt: 0,
      });
      expect(csv.split('\n').filter((l) => l.startsWith('CMP-B'))).toHaveLength(2);
      const statements = prepare.mock.calls.map(([sql]) => String(sql));
      expect(statements.length).toBeGreaterThan(0);
      expect(statements.filter((sql) => /sweep_points/.test(sql))).toEqual([]);
    } finally {
      sqlite.close();
    }
  });
});
