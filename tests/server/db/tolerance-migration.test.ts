// Tolerances stored before they had two sides keep their limits after migrations 0010 and 0011: on a populated
// database every part and lot tolerance is symmetric, so its upper side is its lower side, and the
// stored lot statistics (computed against those limits) stay in place instead of being recomputed.
import Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { afterAll, expect, test } from 'vitest';
import { applyMigrations, MIGRATIONS_DIR } from '@server/db/client';
import * as schema from '@server/db/schema';
import { migrationsUpTo, removeMigrationCopies } from '../../support/migrations';

afterAll(removeMigrationCopies);

test('existing part and lot tolerances become the same value on both sides; stored lot statistics are kept', () => {
  const sqlite = new Database(':memory:');
  const db = drizzle(sqlite, { schema });
  applyMigrations(sqlite, db, migrationsUpTo('0007_lot_stats'));
  sqlite.prepare("insert into users (id, email, name, role, password_hash) values ('u1', 'a@example.test', 'A', 'tech', 'x')").run();
  const lot = sqlite.prepare(
    "insert into lots (code, kind, quantity, nominal, tolerance_pct, created_by) values (?, 'capacitor', 'capacitance', ?, ?, 'u1')",
  );
  lot.run('L-1', 47e-9, 5);
  lot.run('L-2', 100e-9, 20);
  sqlite.prepare("insert into lot_readings (lot_id, item, value) values (1, '1', 47.1e-9), (2, '1', 99e-9)").run();
  sqlite
    .prepare(
      "insert into lot_stats (lot_id, engine_version, nominal, tolerance_pct, count, detail, columns, computed_at) values (1, 'v', 47e-9, 5, 1, '{}', '{}', 1)",
    )
    .run();
  const part = sqlite.prepare('insert into parts (kind, label, nominal, tolerance_pct, lot_id) values (?, ?, ?, ?, ?)');
  part.run('capacitor', 'C-1', 22e-9, 10, 1);
  part.run('pot', 'P-1', 500e3, null, null);
  part.run('resistor', 'R-1', 1e3, 1, null);
  sqlite.prepare("insert into readings (part_id, quantity, value) values (1, 'capacitance', 22e-9)").run();

  applyMigrations(sqlite, db, MIGRATIONS_DIR);

  const parts = sqlite.prepare('select label, tolerance_pct as minus, tolerance_plus_pct as plus from parts order by id').all();
  expect(parts).toEqual([
    { label: 'C-1', minus: 10, plus: 10 },
    { label: 'P-1', minus: null, plus: null },
    { label: 'R-1', minus: 1, plus: 1 },
  ]);
  const lots = sqlite.prepare('select code, tolerance_pct as minus, tolerance_plus_pct as plus from lots order by id').all();
  expect(lots).toEqual([
    { code: 'L-1', minus: 5, plus: 5 },
    { code: 'L-2', minus: 20, plus: 20 },
  ]);
  expect(sqlite.prepare('select lot_id, tolerance_pct, tolerance_plus_pct, detail from lot_stats').all()).toEqual([
    { lot_id: 1, tolerance_pct: 5, tolerance_plus_pct: 5, detail: '{}' },
  ]);
  // nothing else went: readings and the part's lot link survive
  expect((sqlite.prepare('select count(*) as n from lot_readings').get() as { n: number }).n).toBe(2);
  expect((sqlite.prepare('select count(*) as n from readings').get() as { n: number }).n).toBe(1);
  expect((sqlite.prepare("select lot_id from parts where label = 'C-1'").get() as { lot_id: number }).lot_id).toBe(1);
  sqlite.close();
});
