// Large answers go to the socket a slice per turn of the event loop (server/http/send-slices.ts): every
// byte arrives in order, no write is larger than a slice, the event loop goes round between two slices (a drain included), and a
// client that goes away mid-answer ends the sending instead of leaving it waiting for a drain.
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { afterEach, describe, expect, test } from 'vitest';
import { sendInSlices } from '@server/http/send-slices';

let server: http.Server | undefined;
afterEach(async () => {
  if (server) await new Promise((r) => server!.close(r));
  server = undefined;
});

/** Bytes that differ from slice to slice (a slice sent twice or skipped changes them). */
function pattern(n: number, seed: number): Buffer {
  const b = Buffer.alloc(n);
  for (let i = 0; i < n; i++) b[i] = (i * 31 + seed * 7 + (i >> 10)) & 0xff;
  return b;
}

/** A server that answers every request with `parts` through sendInSlices; reports its writes and how it ended. */
async function serve(parts: Buffer[], sliceBytes: number) {
  const writes: number[] = [];
  const separate: boolean[] = [];
  let settled: Promise<void> | undefined;
  server = http.createServer((_req, res) => {
    res.setHeader(
      'Content-Length',
      parts.reduce((s, p) => s + p.length, 0),
    );
    const write = res.write.bind(res) as (chunk: Uint8Array) => boolean;
    // Whether the event loop went round (a callback of its check phase ran) since the write before this one.
    let turned = true;
    let ticking = true;
    const tick = () => {
      turned = true;
      if (ticking) setImmediate(tick);
    };
    setImmediate(tick);
    res.write = ((chunk: Uint8Array) => {
      writes.push(chunk.length);
      separate.push(turned);
      turned = false;
      return write(chunk);
    }) as typeof res.write;
    settled = sendInSlices(res, parts, sliceBytes).finally(() => (ticking = false));
  });
  server.listen(0, '127.0.0.1');
  await new Promise((r) => server!.once('listening', r));
  const { port } = server.address() as AddressInfo;
  return { port, writes, separate, settled: () => settled! };
}

describe('sendInSlices', () => {
  test('sends every byte in order, no write larger than a slice, with other work between slices', async () => {
    const parts = [pattern(5, 1), pattern(700_000, 2), Buffer.alloc(0), pattern(123_457, 3)];
    const s = await serve(parts, 64 * 1024);
    const body = await new Promise<Buffer>((resolve, reject) => {
      http
        .get({ host: '127.0.0.1', port: s.port, path: '/' }, (res) => {
          const chunks: Buffer[] = [];
          res.on('data', (c: Buffer) => chunks.push(c));
          res.on('end', () => resolve(Buffer.concat(chunks)));
        })
        .on('error', reject);
    });
    await s.settled();
    expect(body.equals(Buffer.concat(parts))).toBe(true);
    expect(Math.max(...s.writes)).toBeLessThanOrEqual(64 * 1024);
    // 5 bytes, 11 slices of the 700,000, 2 of the 123,457 (the empty part writes nothing).
    expect(s.writes).toHaveLength(1 + 11 + 2);
    // Each write in a turn of the event loop of its own: a drain that comes in the nextTick of a write the
    // kernel took at once must not carry the next write into the same turn.
    expect(s.separate.every(Boolean)).toBe(true);
  });

  test('a client that goes away mid-answer ends the sending', async () => {
    const parts = [pattern(8_000_000, 4)];
    const s = await serve(parts, 64 * 1024);
    await new Promise<void>((resolve, reject) => {
      const req = http.get({ host: '127.0.0.1', port: s.port, path: '/' }, (res) => {
        res.once('data', () => {
          req.destroy();
          resolve();
        });
      });
      req.on('error', (err) => ((err as NodeJS.ErrnoException).code === 'ECONNRESET' ? undefined : reject(err)));
    });
    // Settles instead of waiting forever for a drain; and not every slice was written.
    await s.settled();
    expect(s.writes.reduce((a, b) => a + b, 0)).toBeLessThan(8_000_000);
  });
});
