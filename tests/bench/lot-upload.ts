// A 100,000-row lot through the real HTTP route (multipart upload → streamed parse → one
// transaction → statistics), beside a bare better-sqlite3 prepared insert of the same rows in one
// transaction in the same process (docs/computation.md §7).
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { createTestApp } from '../support/app';
import type { BenchFigure } from './report';

const ROWS = 100_000;

function lotCsv(): { text: string; values: number[] } {
  const values: number[] = [];
  const lines = ['Item,C (nF),D'];
  for (let i = 1; i <= ROWS; i++) {
    const v = 22 * (1 + 0.03 * Math.sin(i * 0.7) + 0.01 * Math.cos(i * 1.3));
    values.push(v * 1e-9);
    lines.push(`${i},${v.toFixed(4)},0.0008`);
  }
  return { text: lines.join('\n') + '\n', values };
}

/** The same rows into the same table shape, bare: one prepared statement in one transaction. */
function bareInsertMs(values: number[]): number {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'lugbook-bench-'));
  const db = new Database(path.join(dir, 'bare.db'));
  db.pragma('journal_mode = WAL');
  db.pragma('synchronous = FULL');
  db.exec(
    'create table lot_readings (id integer primary key autoincrement, lot_id integer not null, item text not null, value real not null, second_value real, frequency real, source_row integer)',
  );
  db.exec('create index lot_readings_lot_idx on lot_readings (lot_id)');
  const insert = db.prepare(
    'insert into lot_readings (lot_id, item, value, second_value, frequency, source_row) values (?, ?, ?, ?, ?, ?)',
  );
  const t0 = performance.now();
  db.transaction(() => {
    for (let i = 0; i < values.length; i++) insert.run(1, String(i + 1), values[i]!, 0.0008, null, i + 2);
  })();
  const ms = performance.now() - t0;
  db.close();
  fs.rmSync(dir, { recursive: true, force: true });
  return ms;
}

export async function bench(): Promise<BenchFigure[]> {
  const t = await createTestApp();
  try {
    const { text, values } = lotCsv();
    const qa = await t.as('qa');
    const figures: { total: number; store: number; bare: number; parse: number; stats: number }[] = [];
    for (let run = 0; run < 3; run++) {
      const lot = (await qa.post('/api/lots').send({ kind: 'capacitor', nominal: 22e-9, tolerancePct: 10, code: `BENCH-${run}` })).body;
      const t0 = performance.now();
      const res = await qa.post(`/api/lots/${lot.id}/readings`).attach('file', Buffer.from(text), 'lot.csv');
      const total = performance.now() - t0;
      if (res.status !== 201 || res.body.rows !== ROWS || res.body.stats.n !== ROWS)
        throw new Error(`bench upload failed: ${res.status} ${JSON.stringify(res.body).slice(0, 300)}`);
      const store = res.body.timings.storeMs as number;
      figures.push({ total, store, bare: bareInsertMs(values), parse: res.body.timings.parseMs, stats: res.body.timings.statsMs });
    }
    figures.sort((a, b) => a.total - b.total);
    const mid = figures[1]!;
    const ratio = mid.bare / mid.store;
    return [
      {
        name: 'lot of 100,000 readings: CSV upload → stored → statistics, through the HTTP route',
        measured: `${mid.total.toFixed(0)} ms`,
        reference: `bare prepared insert of the same rows ${mid.bare.toFixed(0)} ms; in the route: parse ${mid.parse.toFixed(0)} ms, store ${mid.store.toFixed(0)} ms, statistics ${mid.stats.toFixed(0)} ms`,
        goal: '≤ 1000 ms',
        met: mid.total <= 1000,
      },
      {
        name: "lot storage rate in the route's transaction against a bare prepared insert",
        measured: `${(((ROWS / mid.store) * 1000) / 1e6).toFixed(2)} M rows/s`,
        reference: `bare ${(((ROWS / mid.bare) * 1000) / 1e6).toFixed(2)} M rows/s (ratio ${ratio.toFixed(2)})`,
        goal: 'ratio ≥ 0.5',
        met: ratio >= 0.5,
      },
    ];
  } finally {
    t.close();
  }
}
