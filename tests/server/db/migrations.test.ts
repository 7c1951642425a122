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
import { seedDemo } from '@server/demo/seed';
import { lawValue, type TaperLaw } from '@shared/taper/law';
import { migrationsUpTo, removeMigrationCopies } from '../../support/migrations';

afterAll(removeMigrationCopies);

const dirs: string[] = [];
const tempDir = () => {
  const d = fs.mkdtempSync(path.join(os.tmpdir(), 'lugbook-migrate-'));
  dirs.push(d);
  return d;
};
afterAll(() => dirs.forEach((d) => fs.rmSync(d, { recursive: true, force: true })));

function rowCounts(sqlite: Database.Database): Record<string, number> {
  const tables = sqlite
    .prepare("select name from sqlite_master where type = 'table' and name not like 'sqlite_%' and name not like '__drizzle%'")
    .all() as { name: string }[];
  return Object.fromEntries(
    tables.map(({ name }) => [name, (sqlite.prepare(`select count(*) as n from "${name}"`).get() as { n: number }).n]),
  );
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
  const columns = (sqlite.prepare("select name from pragma_table_info('parts')").all() as { name: string }[])
    .map((c) => `\`${c.name}\``)
    .join(', ');
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

describe('0001: the reverse law’s m becomes its mid-rotation value y(0.5)', () => {
  // Before 0001 a saved design's reverse law {kind: 'reverse', m} meant y = 1 − f(1 − x), f the
  // audio law of mid value m (so y(0.5) = 1 − m). Written out here, independent of shared/taper/law.ts.
  const audio = (m: number, x: number) => (((1 - m) / m) ** (2 * x) - 1) / (((1 - m) / m) ** 2 - 1);
  const oldReverse = (m: number, x: number) => 1 - audio(m, 1 - x);

  test('saved designs keep their curves and every other row is untouched', () => {
    const sqlite = new Database(path.join(tempDir(), 'lugbook.db'));
    migrate(drizzle(sqlite, { schema }), { migrationsFolder: migrationsUpTo('0000_initial') });
    sqlite.prepare("insert into users (id, email, name, role, password_hash) values ('u1', 'a@example.org', 'A', 'tech', 'x')").run();
    const designs: [string, Record<string, unknown>][] = [
      ['reverse volume', { volumeR: 500e3, volumeLaw: { kind: 'reverse', m: 0.15 }, toneLaw: { kind: 'audio', m: 0.2 } }],
      ['reverse tone', { toneLaw: { kind: 'reverse', m: 0.3 }, volumeLaw: { kind: 'linear' } }],
      ['both reverse', { volumeLaw: { kind: 'reverse', m: 0.1 }, toneLaw: { kind: 'reverse', m: 0.25 }, toneC: 22e-9 }],
      ['no laws', { toneC: 47e-9 }],
      ['two-segment', { volumeLaw: { kind: 'two-segment', m: 0.12 } }],
    ];
    const insert = sqlite.prepare("insert into harnesses (name, preset, \"values\", owner_id) values (?, 'independent-tone', ?, 'u1')");
    for (const [name, values] of designs) insert.run(name, JSON.stringify(values));
    sqlite.prepare("insert into parts (kind, label, taper_class, taper_m) values ('pot', 'POT-1', 'reverse', 0.85)").run();
    const before = rowCounts(sqlite);

    applyMigrations(sqlite, drizzle(sqlite, { schema }));

    // Tables that later migrations add (lot_stats, …) start empty; every table that was there keeps its rows.
    const afterCounts = rowCounts(sqlite);
    expect(Object.fromEntries(Object.keys(before).map((k) => [k, afterCounts[k]]))).toEqual(before);
    for (const [k, n] of Object.entries(afterCounts)) if (!(k in before)) expect(n).toBe(0);
    const after = new Map(
      (sqlite.prepare('select name, "values" as v from harnesses').all() as { name: string; v: string }[]).map((r) => [
        r.name,
        JSON.parse(r.v) as Record<string, TaperLaw | number>,
      ]),
    );
    for (const [name, old] of designs) {
      const now = after.get(name)!;
      for (const key of ['volumeLaw', 'toneLaw'] as const) {
        const was = old[key] as TaperLaw | undefined;
        if (was === undefined) {
          expect(now[key]).toBeUndefined();
          continue;
        }
        const law = now[key] as TaperLaw;
        expect(law.kind).toBe(was.kind);
        for (let k = 0; k <= 20; k++) {
          const x = k / 20;
          const oldY = was.kind === 'reverse' ? oldReverse(was.m, x) : lawValue(was, x);
          expect(lawValue(law, x)).toBeCloseTo(oldY, 12);
        }
        if (was.kind === 'reverse') expect((law as { m: number }).m).toBeCloseTo(1 - was.m, 15);
        else expect(law).toEqual(was);
      }
      // The other values are left as they were.
      for (const [k, v] of Object.entries(old)) if (k !== 'volumeLaw' && k !== 'toneLaw') expect(now[k]).toEqual(v);
    }
    // A part's taper class m was always the mid-rotation figure: not touched.
    expect(sqlite.prepare("select taper_m as m from parts where label = 'POT-1'").get()).toEqual({ m: 0.85 });
    sqlite.close();
  });
});

describe('0009: jobs record the wiring before the work', () => {
  test('existing jobs keep every column and start with no before wiring; a design named as before can still be deleted', () => {
    const sqlite = new Database(path.join(tempDir(), 'lugbook.db'));
    migrate(drizzle(sqlite, { schema }), { migrationsFolder: migrationsUpTo('0007_lot_stats') });
    sqlite.prepare("insert into users (id, email, name, role, password_hash) values ('u1', 'a@example.org', 'A', 'tech', 'x')").run();
    sqlite
      .prepare(
        "insert into harnesses (name, layout, preset, \"values\", owner_id) values ('Plain', 'one-pickup', 'independent-tone', '{}', 'u1')",
      )
      .run();
    sqlite.prepare("insert into harnesses (name, layout, \"values\", owner_id) values ('Bleed', 'one-pickup', '{}', 'u1')").run();
    const insertJob = sqlite.prepare(
      "insert into jobs (code, customer, customer_email, instrument, status, harness_id, notes, created_by) values (?, ?, ?, ?, ?, ?, ?, 'u1')",
    );
    insertJob.run('JOB-0001', 'A. Customer', 'a.customer@example.org', 'Six-string', 'open', 2, 'new bleed');
    insertJob.run('JOB-0002', 'B. Customer', null, 'Four-string', 'delivered', null, null);
    sqlite.prepare("insert into parts (kind, label) values ('pot', 'POT-9')").run();
    sqlite.prepare("insert into job_parts (job_id, part_id, position) values (1, 1, 'volume')").run();
    sqlite
      .prepare(
        "insert into attachments (owner_type, owner_id, purpose, original_name, content_hash, mime, size) values ('job', 1, 'photo', 'a.png', 'ab', 'image/png', 3)",
      )
      .run();
    const before = rowCounts(sqlite);
    const jobsBefore = sqlite.prepare('select * from jobs order by id').all() as Record<string, unknown>[];

    applyMigrations(sqlite, drizzle(sqlite, { schema }));

    const afterCounts = rowCounts(sqlite);
    expect(Object.fromEntries(Object.keys(before).map((k) => [k, afterCounts[k]]))).toEqual(before);
    const jobsAfter = sqlite.prepare('select * from jobs order by id').all() as Record<string, unknown>[];
    jobsAfter.forEach((row, i) => {
      expect(row).toEqual({ ...jobsBefore[i], before_harness_id: null, before_design: null, recording_chain: null });
    });
    // The new column carries no foreign key, so naming a design as the before wiring never blocks deleting it.
    sqlite.prepare('update jobs set before_harness_id = 1 where id = 1').run();
    sqlite.prepare('delete from harnesses where id = 1').run();
    expect(sqlite.prepare('select before_harness_id as b, harness_id as h from jobs where id = 1').get()).toEqual({ b: 1, h: 2 });
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
  // Every seeded lot's stored reading count (the lot list's) is its readings' count.
  const miscounted = ctx.sqlite
    .prepare('select code from lots where reading_count != (select count(*) from lot_readings r where r.lot_id = lots.id)')
    .all();
  expect(miscounted).toEqual([]);
  expect((ctx.sqlite.prepare('select max(reading_count) as n from lots').get() as { n: number }).n).toBe(100_000);
  // Seeding twice does nothing: the demo goes only into an empty database.
  expect(await seedDemo(ctx, { password: 'a-long-demo-passphrase' })).toBe(false);
  ctx.sqlite.close();
});

describe('0008: job parts get a slot, outbox messages their attachments', () => {
  test('installed parts and messages keep their rows; slots start empty and one part fills a slot', () => {
    const sqlite = new Database(path.join(tempDir(), 'lugbook.db'));
    migrate(drizzle(sqlite, { schema }), { migrationsFolder: migrationsUpTo('0007_lot_stats') });
    sqlite.prepare("insert into users (id, email, name, role, password_hash) values ('u1', 'a@example.org', 'A', 'tech', 'x')").run();
    const part = sqlite.prepare('insert into parts (kind, label, nominal) values (?, ?, ?)');
    part.run('pot', 'POT-1', 500e3);
    part.run('capacitor', 'CAP-1', 22e-9);
    part.run('capacitor', 'CAP-2', 47e-9);
    sqlite.prepare("insert into jobs (code, customer, instrument, created_by) values ('JOB-0001', 'C', 'Bass', 'u1')").run();
    const install = sqlite.prepare("insert into job_parts (job_id, part_id, position, installed_by) values (1, ?, ?, 'u1')");
    install.run(1, 'volume');
    install.run(2, 'tone cap');
    install.run(3, 'spare');
    sqlite
      .prepare(
        "insert into outbox (\"to\", subject, text, topic, raw, transport) values ('c@example.org', 'Report', 'x', 'customer-report', 'raw', 'outbox')",
      )
      .run();
    const before = rowCounts(sqlite);
    const jobPartsBefore = sqlite.prepare('select * from job_parts order by part_id').all();

    applyMigrations(sqlite, drizzle(sqlite, { schema }));

    const after = rowCounts(sqlite);
    expect(Object.fromEntries(Object.keys(before).map((k) => [k, after[k]]))).toEqual(before);
    expect(after.outbox_attachments).toBe(0);
    const rows = sqlite.prepare('select * from job_parts order by part_id').all() as Record<string, unknown>[];
    expect(rows.map(({ slot: _, ...r }) => r)).toEqual(jobPartsBefore);
    expect(rows.map((r) => r.slot)).toEqual([null, null, null]);
    // One part per slot of a job; any number without a slot.
    sqlite.prepare("update job_parts set slot = 'toneC' where part_id = 2").run();
    expect(() => sqlite.prepare("update job_parts set slot = 'toneC' where part_id = 3").run()).toThrow(/UNIQUE/);
    // Deleting a message takes its attachments along.
    sqlite
      .prepare(
        "insert into outbox_attachments (message_id, filename, content_type, size, content) values (1, 'a.csv', 'text/csv', 1, x'41')",
      )
      .run();
    sqlite.prepare('delete from outbox where id = 1').run();
    expect(rowCounts(sqlite).outbox_attachments).toBe(0);
    sqlite.close();
  });
});
