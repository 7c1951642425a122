// Migration 0013 moves a lot's stored item columns and its compressed items answer out of lot_stats into
// tables of their own (lot_stats_columns, lot_items_encoded): every stored value arrives unchanged, a row
// without a compressed copy gets none, and lot_stats keeps its small fields.
import Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { afterAll, expect, test } from 'vitest';
import { applyMigrations, MIGRATIONS_DIR } from '@server/db/client';
import * as schema from '@server/db/schema';
import { migrationsUpTo, removeMigrationCopies } from '../../support/migrations';

afterAll(removeMigrationCopies);

test('stored columns and compressed copies move to their tables unchanged', () => {
  const sqlite = new Database(':memory:');
  const db = drizzle(sqlite, { schema });
  applyMigrations(sqlite, db, migrationsUpTo('0012_lot_items_encoded'));
  sqlite.prepare("insert into users (id, email, name, role, password_hash) values ('u1', 'a@example.test', 'A', 'tech', 'x')").run();
  const lot = sqlite.prepare(
    "insert into lots (code, kind, quantity, nominal, tolerance_pct, created_by) values (?, 'capacitor', 'capacitance', 47e-9, 5, 'u1')",
  );
  lot.run('L-1');
  lot.run('L-2');
  const stats = sqlite.prepare(
    `insert into lot_stats (lot_id, engine_version, nominal, tolerance_pct, count, detail, columns, computed_at, items_mark, items_gzip, items_br)
     values (?, 'v', 47e-9, 5, ?, ?, ?, ?, ?, ?, ?)`,
  );
  const gzip = Buffer.from([0x1f, 0x8b, 8, 0, 1, 2, 3]);
  const br = Buffer.from([0x0b, 0x02, 0x80, 9]);
  stats.run(1, 2, '{"n":2}', '{"ids":[1,2]}', 111, '111:2:0:0', gzip, br);
  stats.run(2, 1, '{"n":1}', '{"ids":[3]}', 222, null, null, null);

  applyMigrations(sqlite, db, MIGRATIONS_DIR);

  expect(sqlite.prepare('select lot_id, count, detail, computed_at from lot_stats order by lot_id').all()).toEqual([
    { lot_id: 1, count: 2, detail: '{"n":2}', computed_at: 111 },
    { lot_id: 2, count: 1, detail: '{"n":1}', computed_at: 222 },
  ]);
  const columnNames = (sqlite.prepare('pragma table_info(lot_stats)').all() as { name: string }[]).map((c) => c.name);
  expect(columnNames).not.toContain('columns');
  expect(columnNames).not.toContain('items_gzip');
  expect(sqlite.prepare('select lot_id, columns from lot_stats_columns order by lot_id').all()).toEqual([
    { lot_id: 1, columns: '{"ids":[1,2]}' },
    { lot_id: 2, columns: '{"ids":[3]}' },
  ]);
  const encoded = sqlite.prepare('select lot_id, mark, gzip, br from lot_items_encoded').all() as {
    lot_id: number;
    mark: string;
    gzip: Buffer;
    br: Buffer;
  }[];
  expect(encoded).toHaveLength(1);
  expect(encoded[0]!.lot_id).toBe(1);
  expect(encoded[0]!.mark).toBe('111:2:0:0');
  expect(encoded[0]!.gzip.equals(gzip)).toBe(true);
  expect(encoded[0]!.br.equals(br)).toBe(true);
  sqlite.close();
});
