// Guards the silent data-loss trap of drizzle-kit table rebuilds on SQLite (drizzle-orm issues
// #5782 and #4938; decision in DEVELOPERS.md, "Database and migrations"): a rebuild's `PRAGMA foreign_keys=OFF` is ignored
// inside the migrator's transaction, so its DROP TABLE would cascade-delete child rows.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { afterAll, describe, expect, test } from 'vitest';
import { createContext } from '@server/bootstrap';
import { applyMigrations, MIGRATIONS_DIR, openDatabase } from '@server/db/client';
import * as schema from '@server/db/schema';
import { seedDemo } from '@server/db/seed';

const dirs: string[] = [];
const tempDir = () => {
  const d = fs.mkdtempSync(path.join(os.tmpdir(), 'lugbook-migrate-'));
  dirs.push(d);
  return d;
};
afterAll(() => dirs.forEach((d) => fs.rmSync(d, { recursive: true, force: true })));

function rowCounts(sqlite: Database.Database): Record<string, number> {
  const tables = sqlite.prepare("select name from sqlite_master where type = 'table' and name not like 'sqlite_%' and name not like '__drizzle%'").all() as { name: string }[];
  return Object.fromEntries(tables.map(({ name }) => [name, (sqlite.prepare(`select count(*) as n from "${name}"`).get() as { n: number }).n]));
}

async function populatedDatabase(): Promise<string> {
  const dir = tempDir();
  const ctx = createContext({ dbFile: path.join(dir, 'lugbook.db'), uploadsDir: path.join(dir, 'uploads') });
  // The bench part of the demo: its child rows all cascade from parts (job_parts would restrict).
  await seedDemo(ctx, { password: 'a-long-demo-passphrase', studies: false });
  // A child row that cascades from parts, so a dropped parts table would take it along.
  ctx.sqlite.prepare("insert into readings (part_id, quantity, value) select id, 'resistance', nominal from parts").run();
  ctx.sqlite.close();
  return path.join(dir, 'lugbook.db');
}

/** The committed migrations plus one that rebuilds `parts` the way drizzle-kit writes a rebuild. */
function foldersWithRebuild(sqlite: Database.Database): string {
  const folder = tempDir();
  fs.cpSync(MIGRATIONS_DIR, folder, { recursive: true });
  const create = (sqlite.prepare("select sql from sqlite_master where name = 'parts'").get() as { sql: string }).sql;
  const columns = (sqlite.prepare("select name from pragma_table_info('parts')").all() as { name: string }[]).map((c) => `\`${c.name}\``).join(', ');
  const statements = [
    'PRAGMA foreign_keys=OFF;',
    `${create.replace(/CREATE TABLE [`"]?parts[`"]?/, 'CREATE TABLE `__new_parts`')};`,
    `INSERT INTO \`__new_parts\`(${columns}) SELECT ${columns} FROM \`parts\`;`,
    'DROP TABLE `parts`;',
    'ALTER TABLE `__new_parts` RENAME TO `parts`;',
    'CREATE UNIQUE INDEX `parts_label_unique` ON `parts` (`label`);',
    'PRAGMA foreign_keys=ON;',
  ];
  fs.writeFileSync(path.join(folder, '9999_rebuild_parts.sql'), statements.join('--> statement-breakpoint\n'));
  const journalFile = path.join(folder, 'meta', '_journal.json');
  const journal = JSON.parse(fs.readFileSync(journalFile, 'utf8'));
  journal.entries.push({ idx: journal.entries.length, version: '6', when: Date.now(), tag: '9999_rebuild_parts', breakpoints: true });
  fs.writeFileSync(journalFile, JSON.stringify(journal));
  return folder;
}

describe('migrations keep every row', () => {
  test('re-opening a populated database applies the migrations and loses nothing', async () => {
    const file = await populatedDatabase();
    const before = rowCounts(new Database(file, { readonly: true }));
    const { sqlite } = openDatabase(file);
    expect(rowCounts(sqlite)).toEqual(before);
    expect(before.parts).toBeGreaterThan(50);
    sqlite.close();
  });

  test('a table-rebuild migration keeps the child rows when run through applyMigrations', async () => {
    const file = await populatedDatabase();
    const sqlite = new Database(file);
    const before = rowCounts(sqlite);
    expect(before.readings).toBeGreaterThan(50);
    applyMigrations(sqlite, drizzle(sqlite, { schema }), foldersWithRebuild(sqlite));
    expect(rowCounts(sqlite)).toEqual(before);
    expect(sqlite.pragma('foreign_keys', { simple: true })).toBe(1);
    sqlite.close();
  });

  test('the same migration through the bare migrator with foreign keys on loses them (the trap is real)', async () => {
    const file = await populatedDatabase();
    const sqlite = new Database(file);
    sqlite.pragma('foreign_keys = ON');
    const before = rowCounts(sqlite);
    migrate(drizzle(sqlite, { schema }), { migrationsFolder: foldersWithRebuild(sqlite) });
    expect(rowCounts(sqlite).readings).toBeLessThan(before.readings!);
    sqlite.close();
  });
});

test('the full demo scenario seeds: lots with sweeps and fits, a 100,000-item lot, designs and jobs', async () => {
  const dir = tempDir();
  const ctx = createContext({ dbFile: path.join(dir, 'lugbook.db'), uploadsDir: path.join(dir, 'uploads') });
  expect(await seedDemo(ctx, { password: 'a-long-demo-passphrase' })).toBe(true);
  const counts = rowCounts(ctx.sqlite);
  expect(counts.lot_readings).toBeGreaterThan(100_000);
  expect(counts.fits).toBeGreaterThanOrEqual(40);
  expect(counts.jobs).toBe(2);
  const suppliers = ctx.sqlite.prepare("select count(distinct supplier) as n from lots where kind = 'pot'").get() as { n: number };
  expect(suppliers.n).toBe(2);
  // Seeding twice does nothing: the demo goes only into an empty database.
  expect(await seedDemo(ctx, { password: 'a-long-demo-passphrase' })).toBe(false);
  ctx.sqlite.close();
});
