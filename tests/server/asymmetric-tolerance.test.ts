// Parts and lots keep a tolerance per side. IEC 60062 letter Z is −20 %/+80 % (so 104Z: 100 nF,
// limits 80 nF and 180 nF); a reading on a limit conforms, as for symmetric tolerances.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { readConditions } from '@shared/csv/conditions';
import { createTestApp, type TestApp } from '../support/app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

// nF values of a Z lot: one below 80 nF, one exactly on each limit, one above 180 nF, and values
// between +20 % and +80 % that a ±20 % reading would call out of tolerance.
const VALUES_NF = [79, 80, 95, 110, 130, 150, 165, 180, 181];
const lotFile = `Item,C (nF)\n${VALUES_NF.map((v, i) => `${i + 1},${v}`).join('\n')}\n`;

describe('a Z lot (IEC 60062: −20 %/+80 %)', () => {
  test('104Z gives 100 nF −20 %/+80 %; counts, limits and Cp/Cpk use 80 nF and 180 nF', async () => {
    const qa = await t.as('qa');
    const created = await qa.post('/api/lots').send({ kind: 'capacitor', marking: '104Z' });
    expect(created.status).toBe(201);
    expect(created.body).toMatchObject({ tolerancePct: 20, tolerancePlusPct: 80 });
    expect(created.body.nominal).toBeCloseTo(100e-9, 20);
    const lotId = created.body.id as number;

    const up = await (await t.as('tech')).post(`/api/lots/${lotId}/readings`).attach('file', Buffer.from(lotFile), 'z-lot.csv');
    expect(up.status).toBe(201);
    const { stats } = (await (await t.as('viewer')).get(`/api/lots/${lotId}`)).body;
    expect(stats.lower).toBe(80e-9);
    expect(stats.upper).toBe(180e-9);
    expect(stats.countBelow).toBe(1); // 79 nF; 80 nF is on the limit and conforms
    expect(stats.countAbove).toBe(1); // 181 nF; 180 nF conforms
    expect(stats.asymmetric).toBe(true);
    expect(stats.midpoint).toBeCloseTo(130e-9, 20);
    // Cp = (USL − LSL)/(6s), Cpk = min(USL − mean, mean − LSL)/(3s): NIST/SEMATECH e-Handbook §6.1.6,
    // worked here from the values themselves with the sample SD.
    const x = VALUES_NF.map((v) => v * 1e-9);
    const mean = x.reduce((a, b) => a + b, 0) / x.length;
    const s = Math.sqrt(x.reduce((a, b) => a + (b - mean) ** 2, 0) / (x.length - 1));
    expect(stats.cp).toBeCloseTo((180e-9 - 80e-9) / (6 * s), 10);
    expect(stats.cpk).toBeCloseTo(Math.min(180e-9 - mean, mean - 80e-9) / (3 * s), 10);
    // the outer deviation bins sit at each side's own limit
    expect(stats.bins[0].label).toBe('< −20 %');
    expect(stats.bins[stats.bins.length - 1].label).toBe('> +80 %');

    const items = (await (await t.as('viewer')).get(`/api/lots/${lotId}/export.csv`)).text;
    expect(Object.fromEntries(readConditions(items).map((c) => [c.key, c.value])).tolerance).toBe('−20 %/+80 %');
    const verdicts = items
      .trim()
      .split('\n')
      .filter((l) => !l.startsWith('#'))
      .slice(1)
      .map((l) => l.split(',').at(-1));
    expect(verdicts).toEqual(['fail', 'pass', 'pass', 'pass', 'pass', 'pass', 'pass', 'pass', 'fail']);
  });

  test('a typed tolerance wins over the letter; one number is symmetric; a promoted part keeps both sides', async () => {
    const qa = await t.as('qa');
    const typed = await qa.post('/api/lots').send({ kind: 'capacitor', marking: '104Z', tolerancePct: 10 });
    expect(typed.body).toMatchObject({ tolerancePct: 10, tolerancePlusPct: 10 });
    const sides = await qa.post('/api/lots').send({ kind: 'capacitor', nominal: 47e-6, tolerancePct: 10, tolerancePlusPct: 50 });
    expect(sides.body).toMatchObject({ tolerancePct: 10, tolerancePlusPct: 50 });
    const plusAlone = await qa.post('/api/lots').send({ kind: 'capacitor', nominal: 47e-6, tolerancePlusPct: 50 });
    expect(plusAlone.status).toBe(422);
    expect(plusAlone.body.error.fields).toHaveProperty('tolerancePct');

    const z = (await qa.post('/api/lots').send({ kind: 'capacitor', marking: '104Z' })).body;
    await (await t.as('tech')).post(`/api/lots/${z.id}/readings`).attach('file', Buffer.from(lotFile), 'z.csv').expect(201);
    // bin 7 is +20 … +40 %: the 130 nF item
    const promoted = await qa.post(`/api/lots/${z.id}/promote`).send({ bin: 7 });
    expect(promoted.status).toBe(201);
    const part = (await qa.get(`/api/parts`).query({ lotId: z.id })).body.parts[0];
    expect(part).toMatchObject({ tolerancePct: 20, tolerancePlusPct: 80 });
  });
});

describe('a part with −20 %/+80 %', () => {
  test('readings are judged against each side; the reason says −20 %/+80 %; a PATCH of one number makes it symmetric', async () => {
    const tech = await t.as('tech');
    const part = await tech
      .post('/api/parts')
      .send({ kind: 'capacitor', label: 'CAP-Z-1', nominal: 100e-9, tolerancePct: 20, tolerancePlusPct: 80 });
    expect(part.status).toBe(201);
    expect(part.body).toMatchObject({ tolerancePct: 20, tolerancePlusPct: 80 });
    const read = (value: number) => tech.post(`/api/parts/${part.body.id}/readings`).send({ quantity: 'capacitance', value });
    const high = await read(150e-9); // +50 %: inside −20 %/+80 %, outside a ±20 % reading
    expect(high.status).toBe(201);
    expect(high.body.reading.verdict).toBe('pass');
    expect(high.body.reading.verdictReason).toMatch(/−20 %\/\+80 %/);
    expect((await read(180e-9)).body.reading.verdict).toBe('pass'); // on the upper limit
    expect((await read(79e-9)).body.reading.verdict).toBe('fail');
    expect((await read(181e-9)).body.reading.verdict).toBe('fail');

    const sym = await tech.patch(`/api/parts/${part.body.id}`).send({ tolerancePct: 10 });
    expect(sym.status).toBe(200);
    expect(sym.body).toMatchObject({ tolerancePct: 10, tolerancePlusPct: 10 });
    const none = await tech.patch(`/api/parts/${part.body.id}`).send({ tolerancePct: null });
    expect(none.body).toMatchObject({ tolerancePct: null, tolerancePlusPct: null });
    const plusOnly = await tech.patch(`/api/parts/${part.body.id}`).send({ tolerancePlusPct: 80 });
    expect(plusOnly.status).toBe(422);
    expect(plusOnly.body.error.fields).toHaveProperty('tolerancePct');
    // a part made with one number is symmetric
    const one = await tech.post('/api/parts').send({ kind: 'resistor', label: 'RES-SYM-1', nominal: 1e3, tolerancePct: 1 });
    expect(one.body).toMatchObject({ tolerancePct: 1, tolerancePlusPct: 1 });
  });
});
