// Migrations 0014 and 0015 add lots.reading_count (what the lot list shows) and fill it for the lots
// stored before: each lot's count is its readings' count, 0 for a lot without readings.
import Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { afterAll, expect, test } from 'vitest';
import { applyMigrations, MIGRATIONS_DIR } from '@server/db/client';
import * as schema from '@server/db/schema';
import { migrationsUpTo, removeMigrationCopies } from '../../support/migrations';

afterAll(removeMigrationCopies);

test("every stored lot's reading count is filled from its readings", () => {
  const sqlite = new Database(':memory:');
  const db = drizzle(sqlite, { schema });
  applyMigrations(sqlite, db, migrationsUpTo('0013_lot_stats_large_values_apart'));
  sqlite.prepare("insert into users (id, email, name, role, password_hash) values ('u1', 'a@example.test', 'A', 'tech', 'x')").run();
  const lot = sqlite.prepare(
    "insert into lots (code, kind, quantity, nominal, tolerance_pct, created_by) values (?, 'capacitor', 'capacitance', 47e-9, 5, 'u1')",
  );
  for (const code of ['L-1', 'L-2', 'L-3']) lot.run(code);
  const reading = sqlite.prepare('insert into lot_readings (lot_id, item, value) values (?, ?, 47.1e-9)');
  for (let i = 1; i <= 250; i++) reading.run(1, String(i));
  for (let i = 1; i <= 3; i++) reading.run(3, String(i));

  applyMigrations(sqlite, db, MIGRATIONS_DIR);

  expect(sqlite.prepare('select code, reading_count as n from lots order by id').all()).toEqual([
    { code: 'L-1', n: 250 },
    { code: 'L-2', n: 0 },
    { code: 'L-3', n: 3 },
  ]);
  // The readings themselves are untouched.
  expect((sqlite.prepare('select count(*) as n from lot_readings').get() as { n: number }).n).toBe(253);
  sqlite.close();
});
