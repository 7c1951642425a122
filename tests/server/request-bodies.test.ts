// A route reads its JSON body only after its permission check (server/http/router.ts), up to 256 kB
// unless it takes whole sweeps or lots of values; the analysis routes that take those run their engine
// in the job pool, so neither the parse of a refused request nor a 200,000-value computation holds the
// request thread.
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { lotStatistics } from '@shared/analysis/lot-stats';
import { createTestApp, type TestApp } from '../support/app';
import { withPoolRefusing } from '../support/pool-refusing';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

/** 200,000 invented capacitor values around 47 nF (about 4 MB of JSON). */
const values = Array.from({ length: 200_000 }, (_, i) => 47e-9 * (1 + 0.04 * Math.sin(i * 0.37) + 0.01 * Math.cos(i * 1.91)));

describe('request bodies', () => {
  test('a request refused by its permission check is refused before its body is read', async () => {
    // Not JSON at all: read first, it would have been a 400 "not valid JSON"; refused first, it is a 401.
    const res = await t.anon().post('/api/analysis/lot').set('Content-Type', 'application/json').send('{"values": [1, 2,');
    expect(res.status).toBe(401);
    // A viewer may not create a lot: 403, whatever the body.
    const viewer = await (await t.as('viewer')).post('/api/lots').set('Content-Type', 'application/json').send('{"kind":');
    expect(viewer.status).toBe(403);
  });

  test('a body over the route limit is 413 in words; the lot analysis takes 200,000 values', async () => {
    const big = { email: 'x'.repeat(300 * 1024), password: 'irrelevant' };
    const refused = await t.anon().post('/api/auth/sign-in').send(big);
    expect(refused.status).toBe(413);
    expect(refused.body.error).toEqual({ code: 'too_large', message: 'The request body is too large.' });
    const qa = await t.as('qa');
    const res = await qa.post('/api/analysis/lot').send({ values, nominal: 47e-9, tolerancePct: 5 });
    expect(res.status).toBe(200);
    const engine = lotStatistics({ values, nominal: 47e-9, tolerancePct: 5 });
    expect(res.body.n).toBe(200_000);
    expect(res.body.mean).toBe(engine.mean);
    expect(res.body.sd).toBe(engine.sd);
    expect(res.body.deviationsPct).toHaveLength(200_000);
    expect(res.body.deviationsPct[12_345]).toBe(engine.deviationsPct[12_345]);
  });
});

describe('a body parsed in the worker', () => {
  test('refuses as the request thread would: 400 for text that is not JSON, 422 naming the field', async () => {
    const qa = await t.as('qa');
    const notJson = await qa.post('/api/analysis/lot').set('Content-Type', 'application/json').send('{"values": [1, 2,');
    expect(notJson.status).toBe(400);
    expect(notJson.body.error).toEqual({ code: 'bad_request', message: 'The request body is not valid JSON.' });
    // The same text to a route that parses here answers the same.
    const here = await qa.post('/api/analysis/value').set('Content-Type', 'application/json').send('{"values": [1, 2,');
    expect(here.body.error).toEqual(notJson.body.error);
    const empty = await qa.post('/api/analysis/lot').send({ values: [], nominal: 47e-9, tolerancePct: 5 });
    expect(empty.status).toBe(422);
    expect(empty.body.error).toEqual({
      code: 'invalid',
      message: 'values: Give at least one value.',
      fields: { values: 'Give at least one value.' },
    });
    const taper = await qa.post('/api/analysis/taper').send({ points: [{ rotation: 0, resistance: 1 }], rotationUnit: 'sideways' });
    expect(taper.status).toBe(422);
    expect(Object.keys(taper.body.error.fields).sort()).toEqual(['points', 'rotationUnit']);
  });
});

describe('the analysis routes that take large inputs compute in the pool', () => {
  test('taper fit and lot statistics are refused (503) when the pool is, and their engine refusals stay 422', async () => {
    const qa = await t.as('qa');
    const points = Array.from({ length: 11 }, (_, i) => ({ rotation: i * 10, resistance: 10_000 * (i / 10) }));
    const { asked } = await withPoolRefusing(t.ctx.pool, async () => {
      expect((await qa.post('/api/analysis/taper').send({ points, rotationUnit: 'percent', total: 10_000 })).status).toBe(503);
      expect((await qa.post('/api/analysis/lot').send({ values: values.slice(0, 100), nominal: 47e-9, tolerancePct: 5 })).status).toBe(503);
    });
    expect(asked).toEqual(['taperFit', 'lotStatisticsJson']);
    // From the worker: the engine's refusal (bin edges out of order) is the same 422 naming the field.
    const edges = await qa.post('/api/analysis/lot').send({ values: [1, 2, 3], nominal: 2, tolerancePct: 5, binEdgesPct: [5, 1] });
    expect(edges.status).toBe(422);
    expect(edges.body.error.fields).toEqual({ values: 'binEdgesPct needs at least two finite, strictly ascending edges.' });
  });
});
