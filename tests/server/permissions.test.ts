import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { ROUTE_PERMISSIONS } from '@server/auth/permissions';
import { CAPABILITIES } from '@shared/auth/capabilities';
import { ROLES, type Role } from '@shared/schemas/common';
import { createTestApp, TEST_PASSWORD, type TestApp } from '../support/app';
import { registeredRoutes } from '../support/routes';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const apiRoutes = () => registeredRoutes(t.app).filter((r) => r.path.startsWith('/api/'));

test('every registered API route is in the permission map, and every map entry is a route', () => {
  const registered = apiRoutes().map((r) => `${r.method} ${r.path}`);
  const unlisted = registered.filter((k) => !(k in ROUTE_PERMISSIONS));
  expect(unlisted).toEqual([]);
  const stale = Object.keys(ROUTE_PERMISSIONS).filter((k) => !registered.includes(k));
  expect(stale).toEqual([]);
  expect(registered.length).toBeGreaterThan(15);
});

/** A concrete URL for a route pattern (ids that do not exist; the check is about 401/403 only). */
const concrete = (path: string) => path.replace(/:token/g, 'x'.repeat(32)).replace(/:[a-zA-Z]+/g, '999999');

describe('role matrix: every route, every role and anonymous', () => {
  test.each(['anonymous', ...ROLES] as const)('%s', async (who) => {
    const agent = who === 'anonymous' ? t.anon() : await t.as(who as Role);
    const mismatches: string[] = [];
    for (const route of apiRoutes()) {
      const key = `${route.method} ${route.path}`;
      // Signing out would end the shared agent's session; it is public and covered in auth tests.
      if (key === 'POST /api/auth/sign-out' || key === 'POST /api/auth/sign-in') continue;
      const permission = ROUTE_PERMISSIONS[key]!;
      const allowed = permission === 'public' || (who !== 'anonymous' && (CAPABILITIES[permission] as readonly string[]).includes(who));
      const res = await agent[route.method.toLowerCase() as 'get'](concrete(route.path)).send({});
      // An allowed call must be answered, not crash: any 5xx is a mismatch too.
      const expected = allowed ? 'not 401/403 and below 500' : who === 'anonymous' ? '401' : '403';
      const ok = allowed ? res.status !== 401 && res.status !== 403 && res.status < 500 : res.status === (who === 'anonymous' ? 401 : 403);
      if (!ok) mismatches.push(`${key}: expected ${expected}, got ${res.status}`);
    }
    expect(mismatches).toEqual([]);
  });
});

test('a route missing from the map is refused for everyone, admin included', async () => {
  const { authorize } = await import('@server/auth/middleware');
  const calls: unknown[] = [];
  authorize('GET /api/not-in-the-map')({ user: { id: 'x', email: 'a', name: 'a', role: 'admin' } } as never, {} as never, (err?: unknown) =>
    calls.push(err),
  );
  expect(calls[0]).toMatchObject({ status: 403, code: 'not_permitted' });
});

test('failed sign-ins from one address are rate-limited (429), successful ones are not counted', async () => {
  const limited = await createTestApp({ signInLimits: { perAddress: 3, perAccount: 1000, windowMs: 60_000 } });
  try {
    for (let i = 0; i < 5; i++)
      await limited.anon().post('/api/auth/sign-in').send({ email: 'tech@lugbook.test', password: TEST_PASSWORD }).expect(200);
    const statuses: number[] = [];
    for (let i = 0; i < 4; i++)
      statuses.push(
        (
          await limited
            .anon()
            .post('/api/auth/sign-in')
            .send({ email: 'tech@lugbook.test', password: 'wrong-' + i })
        ).status,
      );
    expect(statuses).toEqual([401, 401, 401, 429]);
  } finally {
    limited.close();
  }
});
