// A lot file whose capacitance column names no unit and holds 47 (not farads) opens the mapping
// step; columns no role uses are listed back; part updates, lot nominals and bench readings outside
// the physical ranges of shared/schemas/ranges.ts are 422s naming the field (common practice).
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { createTestApp, type TestApp } from '../support/app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const count = (sql: string, ...args: unknown[]) => (t.ctx.sqlite.prepare(sql).get(...args) as { n: number }).n;

async function newLot() {
  const res = await (await t.as('qa')).post('/api/lots').send({ kind: 'capacitor', marking: '473J' });
  expect(res.status).toBe(201);
  return res.body as { id: number };
}

describe('lot uploads', () => {
  test('a unit-less capacitance column with values ≥ 1e-3 opens the mapping step; the stated unit then reads it', async () => {
    const lot = await newLot();
    const file = Buffer.from('Item,C,Operator\n1,47.1,ab\n2,46.8,ab\n3,47.4,cd\n');
    const tech = await t.as('tech');
    const first = await tech.post(`/api/lots/${lot.id}/readings`).attach('file', file, 'lot.csv');
    expect(first.status).toBe(422);
    expect(first.body.error.code).toBe('needs_mapping');
    expect(first.body.error.message).toMatch(/"C" names no unit/);
    const needs = first.body.error.details.needsMapping;
    expect(needs.header).toEqual(['Item', 'C', 'Operator']);
    expect(needs.missing).toEqual([]);
    expect(needs.detected.item.index).toBe(0);
    expect(needs.detected.value.index).toBe(1);
    expect(needs.unitNeeded).toEqual([expect.objectContaining({ role: 'value', index: 1, header: 'C' })]);
    expect(count('select count(*) as n from lot_readings where lot_id = ?', lot.id)).toBe(0);

    const mapped = await tech
      .post(`/api/lots/${lot.id}/readings`)
      .field('mapping', JSON.stringify({ item: { column: 0 }, value: { column: 1, unit: 'nF' } }))
      .attach('file', file, 'lot.csv');
    expect(mapped.status).toBe(201);
    expect(mapped.body.rows).toBe(3);
    expect(mapped.body.stats.mean).toBeCloseTo(47.1e-9, 18);
    // the unused column is listed back
    expect(mapped.body.ignoredColumns).toEqual(['Operator']);
  });

  test('a clean file lists no ignored columns; one with extra columns lists each', async () => {
    const tech = await t.as('tech');
    const a = await newLot();
    const clean = await tech.post(`/api/lots/${a.id}/readings`).attach('file', Buffer.from('Item,C (nF),D\n1,47,0.001\n'), 'a.csv');
    expect(clean.status).toBe(201);
    expect(clean.body.ignoredColumns).toEqual([]);
    const b = await newLot();
    const extra = await tech
      .post(`/api/lots/${b.id}/readings`)
      .attach('file', Buffer.from('Batch,Item,C (nF),Bin\nX,1,47,A\nX,2,47.2,B\n'), 'b.csv');
    expect(extra.status).toBe(201);
    expect(extra.body.ignoredColumns).toEqual(['Batch', 'Bin']);
  });
});

describe('value ranges', () => {
  test('PATCH of a part: a capacitance of 1e308 F or a resistance of 1 GΩ is refused naming nominal', async () => {
    const tech = await t.as('tech');
    const cap = (await tech.post('/api/parts').send({ kind: 'capacitor', label: 'CAP-PATCH-R', nominal: 22e-9 })).body;
    const huge = await tech.patch(`/api/parts/${cap.id}`).send({ nominal: 1e308 });
    expect(huge.status).toBe(422);
    expect(huge.body.error.fields.nominal).toMatch(/100 fF to 10 mF/);
    // a value fine for a resistor is not for a capacitor: the part's own kind decides
    expect((await tech.patch(`/api/parts/${cap.id}`).send({ nominal: 4.7e3 })).status).toBe(422);
    const pot = (await tech.post('/api/parts').send({ kind: 'pot', label: 'POT-PATCH-R', nominal: 500e3 })).body;
    const giga = await tech.patch(`/api/parts/${pot.id}`).send({ nominal: 1e9 });
    expect(giga.status).toBe(422);
    expect(giga.body.error.fields.nominal).toMatch(/1 mΩ to 100 MΩ/);
    expect((await tech.patch(`/api/parts/${pot.id}`).send({ nominal: -250e3 })).status).toBe(422);
    expect((await tech.patch(`/api/parts/${pot.id}`).send({ tolerancePct: 150 })).body.error.fields).toHaveProperty('tolerancePct');
    // nothing was changed by the refusals
    expect((await tech.get(`/api/parts/${cap.id}`)).body.nominal).toBe(22e-9);
    expect((await tech.get(`/api/parts/${pot.id}`)).body.nominal).toBe(500e3);
    expect((await tech.patch(`/api/parts/${pot.id}`).send({ nominal: 250e3 })).status).toBe(200);
  });

  test('a lot nominal outside the range of its kind is refused naming nominal', async () => {
    const qa = await t.as('qa');
    const cap = await qa.post('/api/lots').send({ kind: 'capacitor', nominal: 1e308, tolerancePct: 5 });
    expect(cap.status).toBe(422);
    expect(cap.body.error.fields.nominal).toMatch(/100 fF to 10 mF/);
    const cap47 = await qa.post('/api/lots').send({ kind: 'capacitor', nominal: 47, tolerancePct: 5 }); // 47 F: a bare number taken as farads
    expect(cap47.status).toBe(422);
    const res = await qa.post('/api/lots').send({ kind: 'resistor', nominal: 1e-6, tolerancePct: 1 });
    expect(res.status).toBe(422);
    expect(res.body.error.fields.nominal).toMatch(/1 mΩ to 100 MΩ/);
    expect((await qa.post('/api/lots').send({ kind: 'resistor', nominal: 10e3, tolerancePct: 1 })).status).toBe(201);
  });

  test('bench readings: negative, 1e308 F, or an out-of-range test frequency are refused naming the field', async () => {
    const tech = await t.as('tech');
    const cap = (await tech.post('/api/parts').send({ kind: 'capacitor', label: 'CAP-READ-R', nominal: 22e-9, tolerancePct: 10 })).body;
    const post = (body: Record<string, unknown>) => tech.post(`/api/parts/${cap.id}/readings`).send(body);
    const before = count('select count(*) as n from readings where part_id = ?', cap.id);
    const huge = await post({ quantity: 'capacitance', value: 1e308 });
    expect(huge.status).toBe(422);
    expect(huge.body.error.fields.value).toMatch(/capacitance from 0 to 10 mF/);
    const negR = await post({ quantity: 'resistance', value: -10 });
    expect(negR.status).toBe(422);
    expect(negR.body.error.fields.value).toMatch(/resistance/);
    expect((await post({ quantity: 'esr', value: -0.1 })).body.error.fields).toHaveProperty('value');
    expect((await post({ quantity: 'dissipation', value: 50 })).body.error.fields).toHaveProperty('value');
    expect((await post({ quantity: 'inductance', value: 1e3 })).body.error.fields).toHaveProperty('value');
    const freq = await post({ quantity: 'capacitance', value: 22e-9, frequency: 1e9 });
    expect(freq.status).toBe(422);
    expect(freq.body.error.fields).toHaveProperty('frequency');
    expect(count('select count(*) as n from readings where part_id = ?', cap.id)).toBe(before);
    // a reading of 0 (an open capacitor, a short) is a real reading and is kept
    expect((await post({ quantity: 'capacitance', value: 0 })).status).toBe(201);
    expect((await post({ quantity: 'capacitance', value: 21.8e-9, frequency: 1e3 })).status).toBe(201);
  });
});
