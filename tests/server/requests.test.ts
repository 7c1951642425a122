// Origin and Host checks, HSTS, compression, cache headers and structured request logs.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { Writable } from 'node:stream';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { createTestApp, HOST, ORIGIN, TEST_PASSWORD, type TestApp } from '../support/app';

let t: TestApp;
const logLines: string[] = [];
const clientDir = fs.mkdtempSync(path.join(os.tmpdir(), 'lugbook-client-'));
beforeAll(async () => {
  fs.mkdirSync(path.join(clientDir, 'assets'));
  fs.writeFileSync(path.join(clientDir, 'index.html'), '<!doctype html><title>Lugbook</title>');
  fs.writeFileSync(path.join(clientDir, 'assets', 'index-3f9a1c.js'), 'console.log(1);'.repeat(200));
  const sink = new Writable({
    write(chunk, _enc, done) {
      logLines.push(...String(chunk).split('\n').filter(Boolean));
      done();
    },
  });
  t = await createTestApp({ requestLog: sink, clientDir });
});
afterAll(() => {
  t.close();
  fs.rmSync(clientDir, { recursive: true, force: true });
});

describe('Origin is compared exactly (scheme, host, port)', () => {
  const cases: [string, number][] = [
    [ORIGIN, 401],
    ['https://lugbook.test', 403],
    ['http://evil@lugbook.test', 403],
    ['http://lugbook.test:8080', 403],
    ['http://lugbook.test/path', 403],
    ['http://lugbook.test.evil.test', 403],
    ['null', 403],
  ];
  for (const [origin, status] of cases) {
    test(`${origin} → ${status}`, async () => {
      // Past the Origin check, the route answers 401 (no session): that proves the origin passed.
      const res = await request(t.app).post('/api/jobs').set('Host', HOST).set('Origin', origin).send({});
      expect(res.status).toBe(status);
      if (status === 403) expect(res.body.error.code).toBe('bad_origin');
    });
  }
});

describe('Host names', () => {
  test('an unknown Host (DNS rebinding) is refused; listed and loopback names pass outside production', async () => {
    const evil = await request(t.app).get('/api/health').set('Host', 'rebind.evil.test');
    expect(evil.status).toBe(421);
    expect(evil.body.error.code).toBe('unknown_host');
    expect((await request(t.app).get('/api/health').set('Host', 'lugbook.test:3000')).status).toBe(200);
    expect((await request(t.app).get('/api/health').set('Host', 'localhost:3000')).status).toBe(200);
    expect((await request(t.app).get('/api/health').set('Host', '127.0.0.1')).status).toBe(200);
  });

  test('in production: loopback names pass only as PUBLIC_URL or listed, and HSTS is sent', async () => {
    const prod = await createTestApp({ production: true });
    try {
      // PUBLIC_URL is http://localhost:3000 here; 127.0.0.1 is neither it nor listed.
      expect((await request(prod.app).get('/api/health').set('Host', '127.0.0.1:3000')).status).toBe(421);
      const ok = await request(prod.app).get('/api/health').set('Host', HOST);
      expect(ok.status).toBe(200);
      expect(ok.headers['strict-transport-security']).toMatch(/max-age=31536000/);
    } finally {
      prod.close();
    }
    const dev = await request(t.app).get('/api/health').set('Host', HOST);
    expect(dev.headers['strict-transport-security']).toBeUndefined();
  });
});

describe('compression and caching', () => {
  test('large JSON is sent with brotli or gzip, as the client accepts', async () => {
    const viewer = await t.as('viewer');
    const br = await viewer.get('/api/parts').set('Accept-Encoding', 'br');
    expect(br.status).toBe(200);
    expect(br.headers['content-encoding']).toBe('br');
    const gz = await viewer.get('/api/parts').set('Accept-Encoding', 'gzip');
    expect(gz.headers['content-encoding']).toBe('gzip');
    expect(gz.body.parts.length).toBeGreaterThan(0);
  });

  test('hashed assets are immutable for a year; index.html is revalidated', async () => {
    const asset = await request(t.app).get('/assets/index-3f9a1c.js').set('Host', HOST);
    expect(asset.status).toBe(200);
    expect(asset.headers['cache-control']).toBe('public, max-age=31536000, immutable');
    const page = await request(t.app).get('/lots/3').set('Host', HOST);
    expect(page.status).toBe(200);
    expect(page.headers['cache-control']).toBe('no-cache');
    expect((await request(t.app).get('/assets/missing.js').set('Host', HOST)).status).toBe(404);
  });
});

describe('request logs', () => {
  test('one JSON line per request: method, route, status, duration, user id; no body, query, cookie or password', async () => {
    logLines.length = 0;
    const agent = request.agent(t.app).set('Origin', ORIGIN).set('Host', HOST);
    await agent.post('/api/auth/sign-in').send({ email: 'tech@lugbook.test', password: TEST_PASSWORD }).expect(200);
    await agent.get('/api/parts/by-label/POT-001?secret=query-value').expect((r) => expect([200, 404]).toContain(r.status));
    await agent.get('/api/auth/me').expect(200);
    const entries = logLines.map((l) => JSON.parse(l) as Record<string, unknown>);
    expect(entries).toHaveLength(3);
    expect(entries[0]).toMatchObject({ req: { method: 'POST' }, res: { status: 200 }, route: '/api/auth/sign-in' });
    expect(entries[1]).toMatchObject({ req: { method: 'GET' }, route: '/api/parts/by-label/:label' });
    expect(entries[2]!.userId).toEqual(expect.any(String));
    for (const e of entries) expect(e.durationMs).toEqual(expect.any(Number));
    // each key once per line (a JSON reader keeps only the last of a repeated key)
    for (const line of logLines) for (const key of ['"route":', '"userId":']) expect(line.split(key)).toHaveLength(2);
    const all = logLines.join('\n');
    expect(all).not.toContain(TEST_PASSWORD);
    expect(all).not.toContain('query-value');
    expect(all).not.toMatch(/cookie|auth_session/i);
  });
});
