import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { coilImpedance, fitCoil } from '@shared/analysis/coil';
import { lotStatistics } from '@shared/analysis/lot-stats';
import { fitTaper } from '@shared/analysis/taper';
import { taperLawValue } from '@shared/taper/law';
import { createTestApp, type TestApp } from '../support/app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('stateless analysis routes (any signed-in role)', () => {
  test('value: engineering notation and RKM codes; ambiguous input is a 422 naming the field', async () => {
    const viewer = await t.as('viewer');
    expect((await viewer.post('/api/analysis/value').send({ text: '4k7', quantity: 'resistance' })).body).toEqual({
      value: 4700,
      unit: 'Ω',
    });
    expect((await viewer.post('/api/analysis/value').send({ text: '0,022 µF' })).body.value).toBeCloseTo(22e-9, 20);
    const ambiguous = await viewer.post('/api/analysis/value').send({ text: '1m', quantity: 'resistance' });
    expect(ambiguous.status).toBe(422);
    expect(ambiguous.body.error.fields.text).toMatch(/milli|mega/i);
    expect((await t.anon().post('/api/analysis/value').send({ text: '4k7' })).status).toBe(401);
  });

  test('marking: IEC 60062 three-digit code with tolerance letter (473J = 47 nF ±5 %)', async () => {
    const res = await (await t.as('tech')).post('/api/analysis/marking').send({ code: '473J' });
    expect(res.status).toBe(200);
    expect(res.body.nominal).toBeCloseTo(47e-9, 20);
    expect(res.body).toMatchObject({ unit: 'F', tolerancePct: 5 });
    expect((await (await t.as('tech')).post('/api/analysis/marking').send({ code: 'zz9' })).status).toBe(422);
  });

  test('taper: the route answers exactly what the engine computes for the same points', async () => {
    const points = Array.from({ length: 31 }, (_, i) => ({
      rotation: i * 10,
      resistance: 480e3 * taperLawValue('audio', 0.15, i / 30) + 250,
    }));
    const body = { points, rotationUnit: 'deg' as const, nominal: 500e3, tolerancePct: 20 };
    const res = await (await t.as('tech')).post('/api/analysis/taper').send(body);
    expect(res.status).toBe(200);
    expect(res.body).toEqual(JSON.parse(JSON.stringify(fitTaper(body))));
    expect(res.body.law).toBe('audio');
    expect(res.body.m).toBeCloseTo(0.15, 2);
  });

  test('taper: a bad point is a 422 naming its row and field', async () => {
    const points = [
      { rotation: 0, resistance: 100 },
      { rotation: 150, resistance: 70e3 },
      { rotation: 300, resistance: -1 },
    ];
    const res = await (await t.as('tech')).post('/api/analysis/taper').send({ points, rotationUnit: 'deg' });
    expect(res.status).toBe(422);
    expect(Object.keys(res.body.error.fields)).toContain('points.2.resistance');
  });

  test('coil: recovers R, L, C of a model curve and matches the engine', async () => {
    const truth = { R: 7800, L: 4.3, C: 130e-12 };
    const points = Array.from({ length: 200 }, (_, i) => {
      const frequency = 20 * Math.pow(1000, i / 199);
      const z = coilImpedance(truth, frequency);
      return { frequency, re: z.re, im: z.im };
    });
    const res = await (await t.as('viewer')).post('/api/analysis/coil').send({ points });
    expect(res.status).toBe(200);
    expect(res.body.R / truth.R).toBeCloseTo(1, 4);
    expect(res.body.L / truth.L).toBeCloseTo(1, 4);
    expect(res.body.C / truth.C).toBeCloseTo(1, 4);
    expect(res.body.L).toBeCloseTo(fitCoil({ points }).L, 10);
  });

  test('coil: a point of the other kind or out of range is a 422 in the words the route always used', async () => {
    const viewer = await t.as('viewer');
    const points = Array.from({ length: 20 }, (_, i) => ({ frequency: 100 * (i + 1), re: 6000, im: 10 * i }));
    const mixed = await viewer
      .post('/api/analysis/coil')
      .send({ points: points.map((p, i) => (i === 12 ? { frequency: p.frequency, magnitude: 6000, phaseDeg: 5 } : p)) });
    expect(mixed.status).toBe(422);
    expect(mixed.body.error).toEqual({ code: 'invalid', message: 'points: Invalid input', fields: { points: 'Invalid input' } });
    const high = await viewer.post('/api/analysis/coil').send({ points: points.map((p, i) => (i === 5 ? { ...p, frequency: 2e6 } : p)) });
    expect(high.status).toBe(422);
    expect(high.body.error.fields).toEqual({ 'points.5.frequency': 'Must be a frequency from 1 Hz to 1 MHz.' });
  });

  test('value: a bare decimal capacitance is µF and says so; a bare 100 is refused with a hint (common practice)', async () => {
    const viewer = await t.as('viewer');
    const ok = await viewer.post('/api/analysis/value').send({ text: '.022', quantity: 'capacitance' });
    expect(ok.status).toBe(200);
    expect(ok.body).toMatchObject({ value: 22e-9, unit: 'F' });
    expect(ok.body.readAs).toMatch(/read as 22 nF/);
    const bare = await viewer.post('/api/analysis/value').send({ text: '100', quantity: 'capacitance' });
    expect(bare.status).toBe(422);
    expect(bare.body.error.fields.text).toMatch(/add a unit: 100p, 100n, 100u/);
  });

  test('coil: without withRp the route fits with the loss resistance on "auto", as uploads do', async () => {
    // A pickup with eddy-current loss (Rp = 60 kΩ, invented values); the model is the textbook coil:
    // R and L in series, C and Rp in parallel (common practice).
    const truth = { R: 6500, L: 2.6, C: 110e-12, Rp: 60e3 };
    const points = Array.from({ length: 200 }, (_, i) => {
      const frequency = 20 * Math.pow(1000, i / 199);
      const z = coilImpedance(truth, frequency);
      return { frequency, re: z.re, im: z.im };
    });
    const res = await (await t.as('viewer')).post('/api/analysis/coil').send({ points });
    expect(res.status).toBe(200);
    expect(res.body.Rp).not.toBeNull();
    expect(res.body.L / truth.L).toBeCloseTo(1, 3);
    expect(res.body.C / truth.C).toBeCloseTo(1, 3);
    expect(res.body.L).toBe(fitCoil({ points, withRp: 'auto' }).L);
  });

  test("lot: statistics equal the engine's; a second quantity of the wrong length is refused", async () => {
    const values = Array.from({ length: 500 }, (_, i) => 47e-9 * (1 + 0.03 * Math.sin(i * 1.7)));
    const res = await (await t.as('qa')).post('/api/analysis/lot').send({ values, nominal: 47e-9, tolerancePct: 5 });
    expect(res.status).toBe(200);
    const engine = lotStatistics({ values, nominal: 47e-9, tolerancePct: 5 });
    expect(res.body).toMatchObject({ n: 500, mean: engine.mean, sd: engine.sd, median: engine.median, cp: engine.cp, cpk: engine.cpk });
    const bad = await (
      await t.as('qa')
    )
      .post('/api/analysis/lot')
      .send({ values, nominal: 47e-9, tolerancePct: 5, second: { values: [0.001], max: 0.01 } });
    expect(bad.status).toBe(422);
    expect(bad.body.error.fields).toHaveProperty(['second.values']);
  });
});
