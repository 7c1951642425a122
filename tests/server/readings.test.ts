import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { createTestApp, type TestApp } from '../support/app';

let t: TestApp;
let meterId: number;
let overdueId: number;
beforeAll(async () => {
  t = await createTestApp();
  const list = (await (await t.as('tech')).get('/api/instruments')).body.instruments as {
    id: number;
    name: string;
    calibrationOverdue: boolean;
  }[];
  meterId = list.find((i) => i.name === 'Bench multimeter A')!.id;
  overdueId = list.find((i) => i.calibrationOverdue)!.id;
});
afterAll(() => t.close());

async function newPot(label: string) {
  const tech = await t.as('tech');
  return (await tech.post('/api/parts').send({ kind: 'pot', label, nominal: 500e3, tolerancePct: 20, taperClass: 'audio' }).expect(201))
    .body;
}

describe('readings with verdicts', () => {
  test('a reading inside the limits by more than its uncertainty passes, with the reason in words', async () => {
    const tech = await t.as('tech');
    const pot = await newPot('POT-R-1');
    const res = await tech.post(`/api/parts/${pot.id}/readings`).send({ quantity: 'resistance', value: 487e3, instrumentId: meterId });
    expect(res.status).toBe(201);
    // Demo meter: ±(0.5 % of reading + 2 counts of 100 Ω) → U = 2435 Ω + 200 Ω (guard band as in ILAC-G8).
    expect(res.body.reading.uncertainty).toBeCloseTo(2635, 6);
    expect(res.body.reading.verdict).toBe('pass');
    expect(res.body.reading.verdictReason).toMatch(/487 kΩ is 2\.6 % under nominal 500 kΩ/);
    expect(res.body.part.status).toBe('passed');
  });

  test('a reading whose uncertainty straddles a limit is marginal and flags the part', async () => {
    const tech = await t.as('tech');
    const pot = await newPot('POT-R-2');
    // 598 kΩ ± 3.19 kΩ reaches past the upper limit 600 kΩ of 500 kΩ ±20 %.
    const res = await tech.post(`/api/parts/${pot.id}/readings`).send({ quantity: 'resistance', value: 598e3, instrumentId: meterId });
    expect(res.body.reading.verdict).toBe('marginal');
    expect(res.body.part.status).toBe('flagged');
    const simple = await tech.post(`/api/parts/${pot.id}/readings`).send({ quantity: 'resistance', value: 598e3 });
    expect(simple.body.reading.verdict).toBe('pass');
    expect(simple.body.reading.verdictReason).toMatch(/simple acceptance/);
  });

  test('a reading taken with an overdue instrument is marked', async () => {
    const tech = await t.as('tech');
    const pot = await newPot('POT-R-3');
    const res = await tech.post(`/api/parts/${pot.id}/readings`).send({ quantity: 'resistance', value: 510e3, instrumentId: overdueId });
    expect(res.body.reading.calibrationOverdue).toBe(true);
    const history = await tech.get(`/api/parts/${pot.id}/readings`);
    expect(history.body.readings[0]).toMatchObject({
      instrumentName: 'Handheld meter (spare)',
      calibrationOverdue: true,
      takenBy: 'Tam Bench',
    });
  });

  test('a capacitor dissipation factor is judged against its profile limit', async () => {
    const tech = await t.as('tech');
    const cap = (await tech.post('/api/parts').send({ kind: 'capacitor', label: 'CAP-R-1', nominal: 22e-9, tolerancePct: 10 }).expect(201))
      .body;
    const res = await tech.post(`/api/parts/${cap.id}/readings`).send({ quantity: 'dissipation', value: 0.02, frequency: 1000 });
    expect(res.body.reading.verdict).toBe('fail');
    expect(res.body.reading.verdictReason).toMatch(/Film capacitors/);
  });

  test('bad readings are refused naming the field; viewers cannot write readings', async () => {
    const tech = await t.as('tech');
    const pot = await newPot('POT-R-4');
    const neg = await tech.post(`/api/parts/${pot.id}/readings`).send({ quantity: 'resistance', value: -5 });
    expect(neg.status).toBe(422);
    expect(neg.body.error.fields).toHaveProperty('value');
    const unknown = await tech.post(`/api/parts/${pot.id}/readings`).send({ quantity: 'smell', value: 5 });
    expect(unknown.status).toBe(422);
    expect(unknown.body.error.fields).toHaveProperty('quantity');
    const viewer = await t.as('viewer');
    expect((await viewer.post(`/api/parts/${pot.id}/readings`).send({ quantity: 'resistance', value: 5 })).status).toBe(403);
    expect((await viewer.get(`/api/parts/${pot.id}/readings`)).status).toBe(200);
  });

  test('the recent readings list the bench across parts, newest first', async () => {
    const recent = await (await t.as('viewer')).get('/api/readings/recent?limit=3');
    expect(recent.body.readings).toHaveLength(3);
    expect(recent.body.readings[0].id).toBeGreaterThan(recent.body.readings[2].id);
    expect(recent.body.readings[0]).toHaveProperty('partLabel');
  });
});

describe('instruments and profiles', () => {
  test('qa adds an instrument and a profile; a tech may not', async () => {
    const qa = await t.as('qa');
    const tech = await t.as('tech');
    const instrument = {
      name: 'Sweep analyser 2',
      kind: 'analyser',
      accuracy: { inductance: { pctOfReading: 1, counts: 5, resolution: 1e-3 } },
      calibrationDue: '2027-12-31',
    };
    expect((await tech.post('/api/instruments').send(instrument)).status).toBe(403);
    expect((await qa.post('/api/instruments').send(instrument)).status).toBe(201);
    const badDate = await qa.post('/api/instruments').send({ ...instrument, name: 'X', calibrationDue: '31/12/2027' });
    expect(badDate.status).toBe(422);
    expect(badDate.body.error.fields).toHaveProperty('calibrationDue');
    const profile = {
      name: 'Pots, 250k audio strict',
      kind: 'pot',
      nominalMin: 200e3,
      nominalMax: 300e3,
      tolerancePct: 10,
      rules: { law: 'audio', mMin: 0.1, mMax: 0.18 },
    };
    expect((await tech.post('/api/profiles').send(profile)).status).toBe(403);
    expect((await qa.post('/api/profiles').send(profile)).status).toBe(201);
    const inverted = await qa.post('/api/profiles').send({ ...profile, name: 'Inverted', rules: { mMin: 0.3, mMax: 0.1 } });
    expect(inverted.status).toBe(422);
    expect(inverted.body.error.fields).toHaveProperty(['rules.mMax']);
  });

  test('a part without its own tolerance follows the most specific matching profile', async () => {
    const tech = await t.as('tech');
    // this test's own profile (the one of the test above has another name)
    const profile = {
      name: 'Pots, 250k audio strict (own)',
      kind: 'pot',
      nominalMin: 200e3,
      nominalMax: 300e3,
      tolerancePct: 10,
      rules: { law: 'audio', mMin: 0.1, mMax: 0.18 },
    };
    expect((await (await t.as('qa')).post('/api/profiles').send(profile)).status).toBe(201);
    const pot = (await tech.post('/api/parts').send({ kind: 'pot', label: 'POT-R-250', nominal: 250e3, taperClass: 'audio' }).expect(201))
      .body;
    // 280 kΩ is +12 %: inside the general ±20 % pot profile, outside the 250k ±10 % one.
    const res = await tech.post(`/api/parts/${pot.id}/readings`).send({ quantity: 'resistance', value: 280e3 });
    expect(res.body.reading.verdict).toBe('fail');
    expect(res.body.reading.verdictReason).toMatch(/250k audio strict/);
  });
});

test("an instrument with display counts sizes its counts by each reading's range", async () => {
  // A 6000-count meter, ±(0.5 % + 2 counts): 100 Ω counts at 487 kΩ (600 kΩ range), 1 Ω at 4.87 kΩ
  // (6 kΩ range). Arithmetic by hand; the range rule is common practice.
  const qa = await t.as('qa');
  const meter = await qa.post('/api/instruments').send({
    name: 'Counts meter',
    kind: 'multimeter',
    displayCounts: 6000,
    accuracy: { resistance: { pctOfReading: 0.5, counts: 2, resolution: 0 } },
  });
  expect(meter.status).toBe(201);
  expect(meter.body.displayCounts).toBe(6000);
  const tech = await t.as('tech');
  const pot = await newPot('POT-COUNTS');
  const big = await tech.post(`/api/parts/${pot.id}/readings`).send({ quantity: 'resistance', value: 487e3, instrumentId: meter.body.id });
  expect(big.body.reading.uncertainty).toBeCloseTo(2435 + 200, 6);
  const small = await tech
    .post(`/api/parts/${pot.id}/readings`)
    .send({ quantity: 'resistance', value: 4.87e3, instrumentId: meter.body.id });
  expect(small.body.reading.uncertainty).toBeCloseTo(24.35 + 2, 6);
});
