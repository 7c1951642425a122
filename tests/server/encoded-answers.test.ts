// Large answers compressed off the request thread (server/http/encoded.ts). The lot's items answer is
// compressed once in the pool and kept (server/features/lots/items-encoded.ts):
// a client that takes gzip or brotli gets that copy with its Content-Encoding and Content-Length, and it
// decodes to exactly the bytes of the uncompressed answer; an upload, a replace and a promotion make the
// kept copy go, and the next answer decodes to the lot's new state. A harness sweep's answer is serialised
// and compressed by its pool worker. Raw bytes are read with node:http (supertest and fetch would decode
// them on the way).
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import zlib from 'node:zlib';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, test, vi } from 'vitest';
import { DEMO_USERS } from '@server/demo/seed';
import { clearLotItemsEncoded } from '@server/features/lots/items-encoded';
import { HttpError } from '@server/http/errors';
import { createTestApp, HOST, ORIGIN, TEST_PASSWORD, type TestApp } from '../support/app';

let t: TestApp;
let server: http.Server;
let cookie: string;
beforeAll(async () => {
  t = await createTestApp();
  server = t.app.listen(0, '127.0.0.1');
  await new Promise((r) => server.once('listening', r));
  const qa = DEMO_USERS.find((u) => u.role === 'qa')!.email;
  const res = await request(t.app)
    .post('/api/auth/sign-in')
    .set('Origin', ORIGIN)
    .set('Host', HOST)
    .send({ email: qa, password: TEST_PASSWORD });
  cookie = String(res.headers['set-cookie']![0]).split(';')[0]!;
});
afterAll(async () => {
  await new Promise((r) => server.close(r));
  t.close();
});

interface Raw {
  status: number;
  headers: http.IncomingHttpHeaders;
  body: Buffer;
}

/** The items answer's bytes as they were sent. */
function getItems(lotId: number, acceptEncoding: string, query = ''): Promise<Raw> {
  return send('GET', `/api/lots/${lotId}/items${query}`, acceptEncoding);
}

/** A request's answer bytes as they were sent. */
function send(method: string, path: string, acceptEncoding: string, json?: unknown): Promise<Raw> {
  const { port } = server.address() as AddressInfo;
  return new Promise((resolve, reject) => {
    const headers: Record<string, string> = { Host: HOST, Cookie: cookie, 'Accept-Encoding': acceptEncoding };
    if (json !== undefined) Object.assign(headers, { 'Content-Type': 'application/json', Origin: ORIGIN });
    const req = http
      .request({ host: '127.0.0.1', port, method, path, headers }, (res) => {
        const chunks: Buffer[] = [];
        res.on('data', (c: Buffer) => chunks.push(c));
        res.on('end', () => resolve({ status: res.statusCode!, headers: res.headers, body: Buffer.concat(chunks) }));
        res.on('error', reject);
      })
      .on('error', reject);
    req.end(json === undefined ? undefined : JSON.stringify(json));
  });
}

function lotCsv(n: number, shift = 0): Buffer {
  const lines = ['Item,C (nF),D'];
  for (let i = 1; i <= n; i++) lines.push(`${i},${(47 * (1 + shift + 0.03 * Math.sin(i * 1.3))).toFixed(4)},0.0010`);
  return Buffer.from(lines.join('\n') + '\n');
}

const DECODE = { gzip: (b: Buffer) => zlib.gunzipSync(b), br: (b: Buffer) => zlib.brotliDecompressSync(b) };

/** Both encodings decode to exactly the uncompressed answer; answers the uncompressed bytes. */
async function expectEncodedEqualsPlain(lotId: number): Promise<Buffer> {
  const plain = await getItems(lotId, 'identity');
  expect(plain.status).toBe(200);
  expect(plain.headers['content-encoding']).toBeUndefined();
  expect(plain.body.length).toBe(Number(plain.headers['content-length']));
  for (const enc of ['gzip', 'br'] as const) {
    const res = await getItems(lotId, enc === 'gzip' ? 'gzip, deflate' : 'gzip, deflate, br');
    expect(res.status).toBe(200);
    expect(res.headers['content-encoding']).toBe(enc);
    expect(res.headers['content-type']).toMatch(/^application\/json/);
    expect(res.headers.vary).toMatch(/Accept-Encoding/i);
    expect(Number(res.headers['content-length'])).toBe(res.body.length);
    expect(DECODE[enc](res.body).equals(plain.body)).toBe(true);
  }
  return plain.body;
}

/** The copy kept in lot_items_encoded: the state it was made from, or null. */
const keptMark = (lotId: number) =>
  (t.ctx.sqlite.prepare('select mark as m from lot_items_encoded where lot_id = ?').get(lotId) as { m: string } | undefined)?.m ?? null;

async function newLot(): Promise<number> {
  const res = await (await t.as('qa')).post('/api/lots').send({ kind: 'capacitor', marking: '473J' });
  expect(res.status).toBe(201);
  return res.body.id as number;
}

describe('the compressed items answer', () => {
  test('decodes to exactly the uncompressed answer, gzip and brotli; kept beside the columns', async () => {
    const lotId = await newLot();
    await (await t.as('qa')).post(`/api/lots/${lotId}/readings`).attach('file', lotCsv(3000), 'lot.csv').expect(201);
    const plain = await expectEncodedEqualsPlain(lotId);
    expect(JSON.parse(plain.toString()).values).toHaveLength(3000);
    expect(keptMark(lotId)).not.toBeNull();
  });

  test('a replace and a promotion make the kept copy go; the next answer decodes to the new state', async () => {
    const lotId = await newLot();
    const qa = await t.as('qa');
    await qa.post(`/api/lots/${lotId}/readings`).attach('file', lotCsv(400), 'lot.csv').expect(201);
    const first = await expectEncodedEqualsPlain(lotId);
    const firstMark = keptMark(lotId);
    expect(firstMark).not.toBeNull();

    // A replace: other values, so another answer.
    await qa.post(`/api/lots/${lotId}/readings`).field('replace', 'true').attach('file', lotCsv(400, 0.01), 'lot.csv').expect(201);
    const replaced = await expectEncodedEqualsPlain(lotId);
    expect(replaced.equals(first)).toBe(false);
    expect(JSON.parse(replaced.toString()).values[0]).toBeCloseTo(Number((47 * (1 + 0.01 + 0.03 * Math.sin(1.3))).toFixed(4)) * 1e-9, 18);
    expect(keptMark(lotId)).not.toBe(firstMark);

    // A promotion: the same readings, but the first set's items now name their parts.
    const promoted = await qa.post(`/api/lots/${lotId}/promote`).send({ set: 0 });
    expect(promoted.status).toBe(201);
    expect(keptMark(lotId)).toBeNull();
    const after = await expectEncodedEqualsPlain(lotId);
    const partIds = JSON.parse(after.toString()).partIds as (number | null)[];
    expect(partIds.filter((id) => id !== null).sort()).toEqual([...(promoted.body.partIds as number[])].sort());
    expect(keptMark(lotId)).not.toBeNull();
  });

  test('another matching than the stored one is compressed for its request and decodes to its uncompressed answer', async () => {
    const lotId = await newLot();
    await (await t.as('qa')).post(`/api/lots/${lotId}/readings`).attach('file', lotCsv(600), 'lot.csv').expect(201);
    const query = '?matchPct=0.5&setSize=3';
    const plain = await getItems(lotId, 'identity', query);
    expect(plain.status).toBe(200);
    const stored = await getItems(lotId, 'identity');
    // Another matching: other sets than the stored answer.
    expect(plain.body.equals(stored.body)).toBe(false);
    for (const enc of ['gzip', 'br'] as const) {
      const res = await getItems(lotId, enc, query);
      expect(res.headers['content-encoding']).toBe(enc);
      expect(Number(res.headers['content-length'])).toBe(res.body.length);
      expect(DECODE[enc](res.body).equals(plain.body)).toBe(true);
    }
  });

  test('an upload to an empty lot is sent compressed from its first read', async () => {
    const lotId = await newLot();
    await (await t.as('qa')).post(`/api/lots/${lotId}/readings`).attach('file', lotCsv(50), 'lot.csv').expect(201);
    const res = await getItems(lotId, 'gzip');
    expect(res.headers['content-encoding']).toBe('gzip');
    expect(JSON.parse(zlib.gunzipSync(res.body).toString()).items).toHaveLength(50);
  });
});

describe('the items answer when no compressed copy can be had', () => {
  test('the pool refusing (busy): sent uncompressed and whole, marked no-transform, never compressed on the request thread', async () => {
    const lotId = await newLot();
    await (await t.as('qa')).post(`/api/lots/${lotId}/readings`).attach('file', lotCsv(800), 'lot.csv').expect(201);
    // The copy the upload has made in the background, then taken away (as a promotion does).
    await expect.poll(() => keptMark(lotId), { timeout: 15_000 }).not.toBeNull();
    const plain = await getItems(lotId, 'identity');
    clearLotItemsEncoded(t.ctx.sqlite, lotId);
    // The pool refuses the compression job as it does with every worker busy and its queue full.
    const run = t.ctx.pool.run.bind(t.ctx.pool);
    const refused: string[] = [];
    const spy = vi.spyOn(t.ctx.pool, 'run').mockImplementation(((name, input, opts) => {
      if (name !== 'lotItemsEncode') return run(name, input, opts);
      refused.push(name);
      return Promise.reject(new HttpError(503, 'busy', 'The server is busy.', undefined, undefined, { 'Retry-After': '5' }));
    }) as typeof t.ctx.pool.run);
    try {
      const res = await getItems(lotId, 'gzip, br');
      expect(refused).toEqual(['lotItemsEncode']);
      expect(res.status).toBe(200);
      expect(res.headers['content-encoding']).toBeUndefined();
      expect(res.headers['cache-control']).toMatch(/no-transform/);
      expect(Number(res.headers['content-length'])).toBe(res.body.length);
      expect(res.body.equals(plain.body)).toBe(true);
    } finally {
      spy.mockRestore();
    }
    // With the pool free again, the next read makes and sends the copy.
    const after = await getItems(lotId, 'gzip');
    expect(after.headers['content-encoding']).toBe('gzip');
    expect(zlib.gunzipSync(after.body).equals(plain.body)).toBe(true);
  });
});

describe('the harness sweep answer', () => {
  test('is serialised and compressed in the worker, and decodes to exactly the uncompressed answer', async () => {
    const body = { preset: 'bleed-cap' };
    const plain = await send('POST', '/api/harness/sweep', 'identity', body);
    expect(plain.status).toBe(200);
    expect(plain.headers['content-encoding']).toBeUndefined();
    const grid = JSON.parse(plain.body.toString());
    expect(grid.magnitudeDb.length).toBe(grid.volume.length * grid.tone.length * grid.frequencies.length);
    for (const enc of ['gzip', 'br'] as const) {
      const res = await send('POST', '/api/harness/sweep', enc, body);
      expect(res.status).toBe(200);
      expect(res.headers['content-encoding']).toBe(enc);
      expect(res.headers.vary).toMatch(/Accept-Encoding/i);
      expect(Number(res.headers['content-length'])).toBe(res.body.length);
      expect(DECODE[enc](res.body).equals(plain.body)).toBe(true);
    }
  });
});
