// The request thread's writes take turns with the pool's (server/db/write-turns.ts): while a pool worker
// is inside a lot ingest's transaction (held there at a named pause point for 1.5 s, as a 100,000-row
// ingest takes about a second), a change sent to the request thread waits for it without blocking the
// event loop, and is written after the ingest commits. Before the turns, that write waited in SQLite's
// busy handler and the whole thread with it (/api/health measured at 450 ms during a 100,000-row upload).
import { afterEach, expect, test } from 'vitest';
import { closePausedApp, createTestApp, type TestApp } from '../support/app';

let t: TestApp | undefined;
afterEach(async () => {
  await closePausedApp(t);
  t = undefined;
});

function csv(rows: number): Buffer {
  const lines = ['Item,C (nF)'];
  for (let i = 1; i <= rows; i++) lines.push(`${i},${(47 * (1 + 0.02 * Math.sin(i))).toFixed(4)}`);
  return Buffer.from(lines.join('\n') + '\n');
}

const until = async (done: () => boolean, what: string) => {
  for (let i = 0; i < 2000 && !done(); i++) await new Promise((r) => setTimeout(r, 5));
  if (!done()) throw new Error(`gave up waiting for ${what}`);
};

test('a change sent while a worker writes waits for it without blocking the request thread', async () => {
  process.env.LUGBOOK_PAUSE_AT = 'lot-upload:mid-insert';
  process.env.LUGBOOK_PAUSE_MS = '1500';
  t = await createTestApp();
  const app = t;
  const qa = await app.as('qa');
  const lot = (await qa.post('/api/lots').send({ kind: 'capacitor', marking: '473J' })).body as { id: number };
  const readings = () => (app.ctx.sqlite.prepare('select count(*) as n from lot_readings where lot_id = ?').get(lot.id) as { n: number }).n;

  const upload = qa
    .post(`/api/lots/${lot.id}/readings`)
    .attach('file', csv(2000), 'lot.csv')
    .then((r) => r);
  await until(() => app.ctx.writeTurns.writing, 'the worker to enter its transaction');

  // The event loop's turns while the change waits: a blocked thread would count none.
  let turns = 0;
  const ticker = setInterval(() => turns++, 5);
  const change = await qa.post('/api/lots').send({ kind: 'capacitor', marking: '104K' });
  const readingsWhenWritten = readings();
  clearInterval(ticker);

  expect(change.status).toBe(201);
  // Written after the ingest's commit: all 2,000 rows were there.
  expect(readingsWhenWritten).toBe(2000);
  expect((await upload).status).toBe(201);
  // About 1.5 s of waiting at one tick per 5 ms; a thread held in SQLite's busy handler ticks once or not at all.
  expect(turns).toBeGreaterThan(20);
});
