// Reset links, reset-request limits, and sign-in refusals per account and address.
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { outbox } from '@server/db/schema';
import { SignInBackoff } from '@server/features/auth/sign-in-limiter';
import { createTestApp, TEST_PASSWORD, type TestApp } from '../support/app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ signInLimits: { perAddress: 1000, perAccount: 3, windowMs: 15 * 60_000 } });
});
afterAll(() => t.close());

const mailsTo = (to: string) => t.ctx.db.select().from(outbox).where(eq(outbox.to, to)).all();
const tokenOf = (text: string) => text.match(/token=([A-Za-z0-9_-]+)/)![1]!;

describe('password resets', () => {
  test('using one reset link ends every other outstanding link of the account', async () => {
    await t.anon().post('/api/auth/request-reset').send({ email: 'qa@lugbook.test' }).expect(200);
    await t.anon().post('/api/auth/request-reset').send({ email: 'qa@lugbook.test' }).expect(200);
    const [first, second] = mailsTo('qa@lugbook.test').map((m) => tokenOf(m.text));
    expect(first).not.toBe(second);
    await t.anon().post('/api/auth/reset-password').send({ token: second, password: 'a-new-bench-passphrase' }).expect(200);
    const stale = await t.anon().post('/api/auth/reset-password').send({ token: first, password: 'another-bench-passphrase' });
    expect(stale.status).toBe(410);
  });

  test('30 reset requests at once send at most 3 e-mails; the rest are 429 with Retry-After', async () => {
    const before = mailsTo('tech@lugbook.test').length;
    const answers = await Promise.all(
      Array.from({ length: 30 }, () =>
        t.anon().post('/api/auth/request-reset').set('X-Forwarded-For', '10.0.0.9').send({ email: 'tech@lugbook.test' }),
      ),
    );
    expect(mailsTo('tech@lugbook.test').length - before).toBe(3);
    const refused = answers.filter((a) => a.status === 429);
    // 3 for the account; the address allows 10, so the other 27 are refused by one limit or the other.
    expect(refused).toHaveLength(27);
    for (const r of refused) expect(Number(r.headers['retry-after'])).toBeGreaterThan(0);
  });

  test('an address is limited across accounts (10 requests in the window)', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 12; i++)
      statuses.push(
        (
          await t
            .anon()
            .post('/api/auth/request-reset')
            .set('X-Forwarded-For', '10.0.0.10')
            .send({ email: `nobody${i}@lugbook.test` })
        ).status,
      );
    expect(statuses.filter((s) => s === 200)).toHaveLength(10);
    expect(statuses.slice(10)).toEqual([429, 429]);
  });
});

describe('sign-in refusals', () => {
  test('failures from one address do not lock the account for another address; the refusal is 429 with Retry-After', async () => {
    const from = (ip: string) => t.anon().set('X-Forwarded-For', ip);
    for (let i = 0; i < 3; i++)
      expect(
        (
          await from('10.0.1.1')
            .post('/api/auth/sign-in')
            .send({ email: 'viewer@lugbook.test', password: `wrong-${i}` })
        ).status,
      ).toBe(401);
    const waiting = await from('10.0.1.1').post('/api/auth/sign-in').send({ email: 'viewer@lugbook.test', password: TEST_PASSWORD });
    expect(waiting.status).toBe(429);
    expect(Number(waiting.headers['retry-after'])).toBeGreaterThan(0);
    const elsewhere = await from('10.0.1.2').post('/api/auth/sign-in').send({ email: 'viewer@lugbook.test', password: TEST_PASSWORD });
    expect(elsewhere.status).toBe(200);
  });

  test('the wait grows with each failure past the limit and ends by itself (never a hard lock)', () => {
    let now = 0;
    const b = new SignInBackoff({ perAddress: 100, perAccount: 3, windowMs: 15 * 60_000 }, () => now);
    for (let i = 0; i < 3; i++) b.recordFailure('a@x.test', '1.1.1.1');
    const first = b.waitMs('a@x.test', '1.1.1.1');
    expect(first).toBe(30_000);
    now += first;
    expect(b.waitMs('a@x.test', '1.1.1.1')).toBe(0);
    b.recordFailure('a@x.test', '1.1.1.1');
    expect(b.waitMs('a@x.test', '1.1.1.1')).toBe(60_000);
    expect(b.waitMs('a@x.test', '2.2.2.2')).toBe(0);
    now += 15 * 60_000;
    expect(b.waitMs('a@x.test', '1.1.1.1')).toBe(0);
  });

  test('an unknown account is refused like a known one (same status and message)', async () => {
    const unknown = await t
      .anon()
      .set('X-Forwarded-For', '10.0.2.1')
      .post('/api/auth/sign-in')
      .send({ email: 'ghost@lugbook.test', password: 'whatever-pass' });
    const known = await t
      .anon()
      .set('X-Forwarded-For', '10.0.2.1')
      .post('/api/auth/sign-in')
      .send({ email: 'admin@lugbook.test', password: 'whatever-pass' });
    expect(unknown.status).toBe(401);
    expect(unknown.body).toEqual(known.body);
  });
});
