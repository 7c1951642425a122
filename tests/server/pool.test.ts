// The job pool (server/pool): heavy routes answer from a worker; a job past its time budget is cancelled
// and answered 503 with Retry-After, and so is a request that finds the pool's queue full. Budgets and
// queue are made tiny through the app's pool options, so nothing here waits on a timer.
import { afterEach, describe, expect, test } from 'vitest';
import { coilImpedance, fitCoil } from '@shared/analysis/coil';
import { MAX_SWEEP_POINTS } from '@shared/schemas/sweeps';
import { createJobPool } from '@server/pool';
import { createTestApp, type TestApp } from '../support/app';

let t: TestApp | undefined;
afterEach(() => {
  t?.close();
  t = undefined;
});

/** A pickup-like coil curve (R 8 kΩ, L 4.4 H, C 120 pF; common practice, no published source). */
function coilPoints(n: number) {
  return Array.from({ length: n }, (_, i) => {
    const frequency = 10 * 10 ** ((4 * i) / (n - 1));
    const z = coilImpedance({ R: 8000, L: 4.4, C: 120e-12 }, frequency);
    return { frequency, re: z.re, im: z.im };
  });
}

function expectRefusal(res: { status: number; headers: Record<string, string>; body: { error?: { code: string } } }, code: string) {
  expect(res.status).toBe(503);
  expect(res.body.error?.code).toBe(code);
  expect(Number(res.headers['retry-after'])).toBeGreaterThanOrEqual(1);
}

describe('job pool', () => {
  test('a job past its time budget is cancelled: 503 over_budget with Retry-After', async () => {
    // 1 ms once a worker has started the job: the bleed finder sweeps hundreds of networks and cannot finish.
    t = await createTestApp({ pool: { budgetMs: 1 } });
    const agent = await t.as('viewer');
    const res = await agent.post('/api/harness/bleed-finder').send({ layout: 'one-pickup' });
    expectRefusal(res, 'over_budget');
    expect(res.body.error.message).toMatch(/longer than 0\.001 s/);
    expect(t.ctx.pool.pending).toBe(0);
  });

  test('the same job inside its budget answers from the worker', async () => {
    t = await createTestApp();
    const res = await (await t.as('viewer')).post('/api/harness/bleed-finder').send({ layout: 'one-pickup' });
    expect(res.status).toBe(200);
    expect(res.body.candidates.length).toBeGreaterThan(0);
  });

  test('a request that finds the queue full gets 503 busy with Retry-After; the running job still answers', async () => {
    // One worker, no queue: while one job runs (the worker's start alone takes a moment), a second is refused at once.
    t = await createTestApp({ pool: { threads: 1, maxQueue: 0 } });
    const agent = await t.as('viewer');
    const first = agent
      .post('/api/harness/bleed-finder')
      .send({ layout: 'one-pickup' })
      .then((r) => r);
    while (t.ctx.pool.pending === 0) await new Promise((r) => setImmediate(r));
    const second = await agent.post('/api/analysis/coil').send({ points: coilPoints(50) });
    expectRefusal(second, 'busy');
    expect((await first).status).toBe(200);
    // With the worker free again, the refused request goes through.
    const again = await agent.post('/api/analysis/coil').send({ points: coilPoints(50) });
    expect(again.status).toBe(200);
  });

  test("the engine's refusal inside a worker comes back as the engine's error, not a fault", async () => {
    const pool = createJobPool({ threads: 1, maxQueue: 4, budgetMs: 60_000 });
    try {
      // Two points: the engine refuses (RangeError), which the routes answer as 422 naming the field.
      const failed = await pool.run('coilFit', { points: coilPoints(2) }).catch((e: unknown) => e);
      expect(failed).toBeInstanceOf(RangeError);
      expect((failed as Error).message).toBe('A coil fit needs at least 4 points with a positive frequency.');
    } finally {
      await pool.close();
    }
  });
});

describe('coil fit bound', () => {
  test(`a coil fit takes at most ${MAX_SWEEP_POINTS.impedance} points, as an impedance sweep upload; beyond, 422 in words`, async () => {
    t = await createTestApp();
    const agent = await t.as('viewer');
    const over = await agent.post('/api/analysis/coil').send({ points: coilPoints(MAX_SWEEP_POINTS.impedance + 1) });
    expect(over.status).toBe(422);
    expect(over.body.error.fields.points).toBe(
      `A coil fit takes at most 5,000 points, as many as an impedance sweep upload; this one has 5,001.`,
    );
    const points = coilPoints(MAX_SWEEP_POINTS.impedance);
    const at = await agent.post('/api/analysis/coil').send({ points });
    expect(at.status).toBe(200);
    // The worker's answer is the engine's, run here on the same points.
    expect(at.body.L).toBe(fitCoil({ points, withRp: 'auto' }).L);
  });

  test('an impedance sweep upload over the same bound is refused with the limit in words', async () => {
    t = await createTestApp();
    const agent = await t.as('tech');
    const part = await agent.post('/api/parts').send({ kind: 'pickup', label: 'PU-BOUND-1' });
    expect(part.status).toBe(201);
    const rows = coilPoints(MAX_SWEEP_POINTS.impedance + 1).map((p) => `${p.frequency},${p.re},${p.im}`);
    const csv = `Frequency (Hz),Re(Z) (ohm),Im(Z) (ohm)\n${rows.join('\n')}\n`;
    const res = await agent
      .post(`/api/parts/${part.body.id}/sweeps`)
      .field('kind', 'impedance')
      .attach('file', Buffer.from(csv), 'coil.csv');
    expect(res.status).toBe(422);
    expect(JSON.stringify(res.body.error)).toContain('an impedance sweep may have at most 5,000');
  });
});
