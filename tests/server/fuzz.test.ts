// Fuzzing every route of the permission map with malformed bodies, queries and path values: wrong types,
// huge and tiny numbers, long strings, deep nesting, prototype keys. Sent one after another as an admin
// (so the permission check lets them through to validation and the handlers): no answer may be a 500 or a
// 503 (sequential requests never fill the pool), and every refusal carries the JSON error envelope.
// In CI: at least 5,000 requests from the fixed seed (tests/setup/fast-check.ts); locally fewer, new cases each run.
import type { AddressInfo } from 'node:net';
import type { Server } from 'node:http';
import fc from 'fast-check';
import { afterAll, beforeAll, expect, test } from 'vitest';
import { ROUTE_PERMISSIONS } from '@server/auth/permissions';
import { createTestApp, TEST_PASSWORD, type TestApp } from '../support/app';

const RUNS = process.env.CI ? 5_000 : 800;
// Signing out would end the fuzzing session; it is a route without input.
const SKIP = new Set(['POST /api/auth/sign-out']);
const ROUTES = Object.keys(ROUTE_PERMISSIONS).filter((k) => !SKIP.has(k));

let t: TestApp;
let server: Server;
let base: string;
let cookie = '';

async function signIn() {
  const res = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json', Origin: base },
    body: JSON.stringify({ email: 'admin@lugbook.test', password: TEST_PASSWORD }),
  });
  expect(res.status).toBe(200);
  cookie = (res.headers.get('set-cookie') ?? '').split(';')[0]!;
}

beforeAll(async () => {
  t = await createTestApp();
  server = t.app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  await signIn();
  // Something for the ids to find: a part, a lot with readings, a job.
  const tech = await t.as('tech');
  await tech.post('/api/parts').send({ kind: 'pot', label: 'POT-FUZZ', nominal: 500e3, tolerancePct: 20, taperClass: 'audio' });
  const lot = await tech.post('/api/lots').send({ kind: 'capacitor', marking: '473J' });
  await tech.post(`/api/lots/${lot.body.id}/readings`).attach('file', Buffer.from('Item,C (nF)\n1,47\n2,46\n3,48\n'), 'l.csv');
  await tech.post('/api/jobs').send({ customer: 'F. Example', instrument: 'Guitar' });
});
afterAll(() => {
  server?.close();
  t?.close();
});

const hugeOrTiny = fc.constantFrom(1e308, -1e308, 5e-324, -5e-324, 0, -0, 2 ** 53, -(2 ** 31), 1.7976931348623157e308, 4294967296);
const oddString = fc.oneof(
  fc.string({ maxLength: 20 }),
  fc.constantFrom('', ' ', '%', '../../etc/passwd', '=1+1', '<script>', '\u0000', '𝄞', 'NaN', 'Infinity', '1e999', 'true'),
  fc
    .tuple(fc.string({ minLength: 1, maxLength: 8 }), fc.integer({ min: 5_000, max: 20_000 }))
    .map(([s, n]) => s.repeat(Math.ceil(n / s.length)).slice(0, n)),
);
const leaf = fc.oneof(fc.integer(), fc.double(), hugeOrTiny, oddString, fc.boolean(), fc.constant(null));
const protoKey = fc.constantFrom('__proto__', 'constructor', 'prototype', 'toString', 'hasOwnProperty');
const deep = fc.integer({ min: 50, max: 3_000 }).map((n) => {
  let v: unknown = 1;
  for (let i = 0; i < n; i++) v = i % 2 ? [v] : { a: v };
  return v;
});
const value = fc.letrec((tie) => ({
  v: fc.oneof(
    { depthSize: 'small', withCrossShrink: true },
    leaf,
    fc.array(tie('v'), { maxLength: 5 }),
    fc.dictionary(fc.oneof(fc.string({ maxLength: 12 }), protoKey), tie('v'), { maxKeys: 6 }),
  ),
})).v;
// Bodies built on the field names routes use, so values reach the checks behind the first one.
const FIELDS = [
  'kind',
  'label',
  'nominal',
  'tolerancePct',
  'marking',
  'preset',
  'values',
  'knobs',
  'frequencies',
  'volume',
  'tone',
  'netlist',
  'points',
  'email',
  'password',
  'name',
  'role',
  'token',
  'status',
  'reason',
  'partId',
  'profileId',
  'harnessId',
  'userIds',
  'watcherIds',
  'customer',
  'instrument',
  'quantity',
  'value',
  'selection',
  'settings',
  'limits',
  'rotationUnit',
  'fullRotationDeg',
  'to',
  'position',
];
const body = fc.oneof(
  value,
  deep,
  fc.dictionary(fc.oneof(fc.constantFrom(...FIELDS), protoKey), value, { maxKeys: 8 }),
  fc.constant('{"a":'),
  fc.constant('__proto__'),
);
const pathValue = fc.oneof(
  fc.constantFrom('1', '2', '0', '-1', '999999', '1e308', 'abc', '%E0%A4%A', '%00', '..%2F..', 'POT-FUZZ', 'x'.repeat(300)),
  fc.integer({ min: 1, max: 5 }).map(String),
);
// Query values stay short: a URL past Node's header limit is refused by the HTTP server itself (431) before the app sees it.
const shortString = fc.oneof(
  fc.string({ maxLength: 40 }),
  fc.constantFrom('', '%', '=1+1', 'NaN', 'Infinity', '1e999', 'true', '-1', '1,2,x'),
);
const query = fc.dictionary(
  fc.constantFrom('kind', 'status', 'q', 'limit', 'offset', 'matchPct', 'setSize', 'binCount', 'partIds', 'lotIds', 'sets', 'x'),
  fc.oneof(shortString, hugeOrTiny.map(String)),
  { maxKeys: 4 },
);

function fill(pattern: string, values: string[]): string {
  let i = 0;
  return pattern.replace(/:[A-Za-z]+/g, () => values[i++ % values.length]!);
}

test(
  `${RUNS} malformed requests over every route of the permission map: no 500, no 503, always the error envelope`,
  { timeout: 300_000 },
  async () => {
    const statuses = new Map<number, number>();
    const perRoute = new Map<string, number>();
    const timeOf = new Map<string, number>();
    await fc.assert(
      fc.asyncProperty(
        fc.constantFrom(...ROUTES),
        fc.array(pathValue, { minLength: 2, maxLength: 2 }),
        query,
        body,
        fc.boolean(),
        async (route, params, q, b, rawText) => {
          const [method, pattern] = route.split(' ') as [string, string];
          const url = new URL(base + fill(pattern, params).replace(/%(?![0-9A-Fa-f]{2})/g, '%25'));
          for (const [k, v] of Object.entries(q)) url.searchParams.set(k, v);
          const init: RequestInit = { method, headers: { Origin: base, Cookie: cookie, 'Content-Type': 'application/json' } };
          if (method !== 'GET' && method !== 'DELETE') init.body = rawText && typeof b === 'string' ? b : JSON.stringify(b);
          const t0 = performance.now();
          let res = await fetch(url, init);
          if (res.status === 401 && !/auth\//.test(pattern)) {
            // A fuzzed member change may have ended the session (e.g. a role change): sign in again once.
            await signIn();
            (init.headers as Record<string, string>).Cookie = cookie;
            res = await fetch(url, init);
          }
          const text = await res.text();
          statuses.set(res.status, (statuses.get(res.status) ?? 0) + 1);
          perRoute.set(route, (perRoute.get(route) ?? 0) + 1);
          timeOf.set(route, (timeOf.get(route) ?? 0) + performance.now() - t0);
          const where = `${method} ${url.pathname}${url.search.slice(0, 200)} → ${res.status} ${text.slice(0, 300)}`;
          expect(res.status, where).not.toBe(500);
          expect(res.status, where).not.toBe(503);
          if (res.status >= 400) {
            let parsed: { error?: { code?: unknown; message?: unknown } } = {};
            try {
              parsed = JSON.parse(text) as typeof parsed;
            } catch {
              /* not JSON: the checks below fail with the answer in their message */
            }
            expect(typeof parsed.error?.code, where).toBe('string');
            expect(typeof parsed.error?.message, where).toBe('string');
          }
        },
      ),
      { numRuns: RUNS, endOnFailure: true },
    );
    const total = [...statuses.values()].reduce((a, b) => a + b, 0);
    expect(total).toBeGreaterThanOrEqual(RUNS);
    // Every route was reached (the sample is large enough for each of the ~80 routes to come up).
    expect(perRoute.size).toBe(ROUTES.length);
    if (process.env.LUGBOOK_FUZZ_REPORT)
      process.stdout.write(
        `fuzz: ${total} requests over ${perRoute.size} routes; statuses ${JSON.stringify(Object.fromEntries([...statuses].sort((a, b) => a[0] - b[0])))}; slowest ${JSON.stringify(
          [...timeOf]
            .sort((a, b) => b[1] - a[1])
            .slice(0, 6)
            .map(([r, ms]) => [r, Math.round(ms)]),
        )}\n`,
      );
  },
);
