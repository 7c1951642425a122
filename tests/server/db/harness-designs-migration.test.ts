// Saved designs from before the layouts (a preset and its values) open after the migration as the
// one-pickup layout with the preset's options, on a populated database.
import Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { afterAll, expect, test } from 'vitest';
import { applyMigrations, MIGRATIONS_DIR } from '@server/db/client';
import * as schema from '@server/db/schema';
import { buildLayoutNetlist, getLayout, PRESET_AS_LAYOUT, resolveLayoutConfig } from '@shared/circuit/layouts';
import { simulate, simulateInstrument } from '@shared/circuit/metrics';
import { getPreset, HARNESS_PRESETS, type HarnessValues } from '@shared/circuit/presets';
import { migrationsUpTo, removeMigrationCopies } from '../../support/migrations';

afterAll(removeMigrationCopies);

test('designs saved with a preset become the one-pickup layout with the same network', () => {
  const sqlite = new Database(':memory:');
  const db = drizzle(sqlite, { schema });
  applyMigrations(sqlite, db, migrationsUpTo('0000_initial'));
  sqlite.prepare("insert into users (id, email, name, role, password_hash) values ('u1', 'a@example.test', 'A', 'tech', 'x')").run();
  const insert = sqlite.prepare('insert into harnesses (name, preset, "values", owner_id) values (?, ?, ?, ?)');
  HARNESS_PRESETS.forEach((p, i) => insert.run(`design ${i}`, p.id, JSON.stringify({ cableLength: 2 + i }), 'u1'));
  sqlite.prepare("insert into jobs (code, customer, instrument, status, harness_id) values ('J-1', 'C', 'I', 'open', 3)").run();

  applyMigrations(sqlite, db, MIGRATIONS_DIR);
  const rows = sqlite.prepare('select * from harnesses order by id').all() as {
    preset: string;
    layout: string;
    selector: number;
    options: string;
    values: string;
  }[];
  expect(rows).toHaveLength(HARNESS_PRESETS.length);
  for (const row of rows) {
    expect(row.layout).toBe('one-pickup');
    expect(row.selector).toBe(0);
    expect(JSON.parse(row.options)).toEqual(PRESET_AS_LAYOUT[row.preset]);
    // the migrated design gives the preset's curve
    const layout = getLayout(row.layout)!;
    const values = JSON.parse(row.values);
    const { config, problems } = resolveLayoutConfig(layout, { options: JSON.parse(row.options), values });
    expect(problems).toEqual([]);
    const preset = getPreset(row.preset)!;
    const a = simulateInstrument(buildLayoutNetlist(layout, config), { volume: 5, tone: 5 }).magnitudeDb;
    const b = simulate(preset.build({ ...preset.defaults, ...values } as HarnessValues), { volume: 5, tone: 5 }).magnitudeDb;
    a.forEach((v, k) => expect(Math.abs(v - b[k]!)).toBeLessThan(1e-9));
  }
  // the job still points at its design (the table rebuild kept the reference)
  expect((sqlite.prepare("select harness_id from jobs where code = 'J-1'").get() as { harness_id: number }).harness_id).toBe(3);
  sqlite.close();
});
