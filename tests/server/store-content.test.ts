// Stored files are named by the SHA-256 of their content (server/uploads/store.ts). The request thread's
// variant hashes a megabyte per turn of the event loop and writes through the thread pool: it must name
// and write exactly what the synchronous one does, and let the event loop go round while it hashes.
import crypto from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterEach, expect, test } from 'vitest';
import { contentPath, sha256InSlices, storeContent, storeContentAsync } from '@server/uploads/store';

const dirs: string[] = [];
afterEach(() => {
  for (const d of dirs.splice(0)) fs.rmSync(d, { recursive: true, force: true });
});
const tempDir = () => {
  const d = fs.mkdtempSync(path.join(os.tmpdir(), 'lugbook-store-'));
  dirs.push(d);
  return d;
};

test('the async store names, writes and reports a 5.5 MB file as the synchronous one does', async () => {
  const content = crypto.randomBytes(5.5 * 1024 * 1024);
  // The hash the file is named by, computed here independently (FIPS 180-4 SHA-256 through node:crypto).
  const expected = crypto.createHash('sha256').update(content).digest('hex');
  const [a, b] = [tempDir(), tempDir()];
  let turns = 0;
  let ticking = true;
  const tick = () => {
    turns++;
    if (ticking) setImmediate(tick);
  };
  setImmediate(tick);
  expect(await sha256InSlices(content)).toBe(expected);
  ticking = false;
  // Six slices of a megabyte: the loop went round between them.
  expect(turns).toBeGreaterThanOrEqual(5);
  const async = await storeContentAsync(a, content);
  const sync = storeContent(b, content);
  expect(async.contentHash).toBe(expected);
  expect(async).toEqual({ ...sync, path: contentPath(a, expected) });
  expect(async.created).toBe(true);
  expect(fs.readFileSync(async.path).equals(content)).toBe(true);
  // Stored once: the same content again is found, not written.
  expect((await storeContentAsync(a, content)).created).toBe(false);
  expect(fs.readdirSync(path.dirname(async.path))).toEqual([expected]);
});
