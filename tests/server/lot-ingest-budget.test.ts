// A lot ingest (parse, insert, statistics) runs in a pool worker with its own time budget, six of the
// pool's (upload.ts). One still inside its transaction when the budget runs out is cancelled: its worker
// is terminated, the transaction rolls back, the temporary file and the file already moved into place are
// removed, and the answer is 503 over_budget with Retry-After; the database is free for the next write at
// once. One past its commit is not cancelled: its readings are stored, and it is answered 201.
// The worker is held at a named pause point (LUGBOOK_PAUSE_AT, read by the pool's workers from the
// environment they are given when the pool is made) for longer than the budget.
import fs from 'node:fs';
import path from 'node:path';
import Database from 'better-sqlite3';
import { afterEach, describe, expect, test } from 'vitest';
import type { PausePoint } from '@server/http/pause-point';
import { incomingDir } from '@server/uploads/store';
import { closePausedApp, createTestApp, type TestApp } from '../support/app';

let t: TestApp | undefined;
afterEach(async () => {
  await closePausedApp(t);
  t = undefined;
});

/** 200 ms per job: an ingest gets 1.2 s; the pause lasts 4 s. */
async function appPausedAt(point: PausePoint) {
  process.env.LUGBOOK_PAUSE_AT = point;
  process.env.LUGBOOK_PAUSE_MS = '4000';
  t = await createTestApp({ pool: { budgetMs: 200 } });
  return t;
}

function csv(rows: number): Buffer {
  const lines = ['Item,C (nF),D'];
  for (let i = 1; i <= rows; i++) lines.push(`${i},${(47 * (1 + 0.02 * Math.sin(i))).toFixed(4)},0.0010`);
  return Buffer.from(lines.join('\n') + '\n');
}

const count = (app: TestApp, sql: string, ...args: unknown[]) => (app.ctx.sqlite.prepare(sql).get(...args) as { n: number }).n;

/** Every file under uploads/ (incoming/ included), by path. */
function files(app: TestApp): string[] {
  const dir = app.ctx.config.uploadsDir;
  return fs
    .readdirSync(dir, { recursive: true, withFileTypes: true })
    .filter((e) => e.isFile())
    .map((e) => path.relative(dir, path.join(e.parentPath, e.name)));
}

describe('a lot ingest past its time budget', () => {
  const cancelled: { point: PausePoint; moment: string }[] = [
    { point: 'lot-upload:mid-insert', moment: 'half the rows inserted' },
    { point: 'lot-upload:file-moved', moment: 'every row inserted and the file moved into place, before the commit' },
  ];
  for (const c of cancelled) {
    test(`${c.moment}: cancelled, rolled back, no file left, 503 over_budget`, async () => {
      const app = await appPausedAt(c.point);
      const tech = await app.as('tech');
      const lotId = (await tech.post('/api/lots').send({ kind: 'capacitor', marking: '473J' }).expect(201)).body.id as number;
      const before = files(app);
      const audits = count(app, 'select count(*) as n from audit_log');

      const res = await tech.post(`/api/lots/${lotId}/readings`).attach('file', csv(2000), 'over-budget.csv');
      expect(res.status).toBe(503);
      expect(res.body.error.code).toBe('over_budget');
      expect(res.body.error.message).toMatch(/longer than 1\.2 s/);
      expect(Number(res.headers['retry-after'])).toBeGreaterThanOrEqual(1);

      expect(count(app, 'select count(*) as n from lot_readings where lot_id = ?', lotId)).toBe(0);
      // The lot list's stored count went back with the rows.
      expect(count(app, 'select reading_count as n from lots where id = ?', lotId)).toBe(0);
      expect(count(app, "select count(*) as n from attachments where owner_type = 'lot' and owner_id = ?", lotId)).toBe(0);
      expect(count(app, 'select count(*) as n from audit_log')).toBe(audits);
      expect(fs.readdirSync(incomingDir(app.ctx.config.uploadsDir))).toEqual([]);
      // Neither the temporary file nor the stored copy of the upload is left.
      expect(files(app)).toEqual(before);
      expect(app.ctx.sqlite.pragma('integrity_check', { simple: true })).toBe('ok');
      // The write lock was let go with the worker: the next write goes through at once.
      await tech.post('/api/lots').send({ kind: 'capacitor', marking: '473J' }).expect(201);
      expect(app.ctx.pool.pending).toBe(0);
    });
  }

  test('past its commit: not cancelled; the readings are stored and the upload is answered 201', async () => {
    const app = await appPausedAt('lot-upload:committed');
    const tech = await app.as('tech');
    const lotId = (await tech.post('/api/lots').send({ kind: 'capacitor', marking: '473J' }).expect(201)).body.id as number;
    const res = await tech.post(`/api/lots/${lotId}/readings`).attach('file', csv(2000), 'late.csv');
    expect(res.status).toBe(201);
    expect(res.body.rows).toBe(2000);
    expect(res.body.stats.n).toBe(2000);
    expect(count(app, 'select count(*) as n from lot_readings where lot_id = ?', lotId)).toBe(2000);
    expect(count(app, 'select reading_count as n from lots where id = ?', lotId)).toBe(2000);
    expect(fs.readdirSync(incomingDir(app.ctx.config.uploadsDir))).toEqual([]);
    const hash = (
      app.ctx.sqlite.prepare("select content_hash as h from attachments where owner_type = 'lot' and owner_id = ?").get(lotId) as {
        h: string;
      }
    ).h;
    expect(fs.existsSync(path.join(app.ctx.config.uploadsDir, hash.slice(0, 2), hash))).toBe(true);
  });
});

describe('a write on the request thread that finds the database locked', () => {
  test('past the busy timeout (5 s) it is 503 busy with Retry-After, not a fault', async () => {
    const app = (t = await createTestApp());
    const tech = await app.as('tech');
    // Another connection holds the write lock, as a pool worker does while it stores a lot.
    const other = new Database(app.ctx.sqlite.name);
    try {
      other.exec('BEGIN IMMEDIATE');
      const res = await tech.post('/api/lots').send({ kind: 'capacitor', marking: '473J' });
      expect(res.status).toBe(503);
      expect(res.body.error.code).toBe('busy');
      expect(res.headers['retry-after']).toBe('1');
      other.exec('ROLLBACK');
      await tech.post('/api/lots').send({ kind: 'capacitor', marking: '473J' }).expect(201);
    } finally {
      other.close();
    }
  });
});
