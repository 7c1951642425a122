import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import Database from 'better-sqlite3';
import { drizzle, type BetterSQLite3Database } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import * as schema from './schema';

export type Db = BetterSQLite3Database<typeof schema>;
export interface Database_ {
  db: Db;
  sqlite: Database.Database;
}

export const MIGRATIONS_DIR = fileURLToPath(new URL('../../drizzle', import.meta.url));

/** Opens (creating if needed) the SQLite file with the project's pragmas and applies migrations. */
export function openDatabase(file: string): Database_ {
  if (file !== ':memory:') fs.mkdirSync(path.dirname(file), { recursive: true });
  const sqlite = new Database(file, { timeout: 5000 });
  sqlite.pragma('journal_mode = WAL');
  // No committed reading may be lost on power failure at the bench.
  sqlite.pragma('synchronous = FULL');
  const db = drizzle(sqlite, { schema });
  applyMigrations(sqlite, db);
  return { db, sqlite };
}

/**
 * drizzle-kit's table rebuilds emit `PRAGMA foreign_keys=OFF`, which does nothing inside the
 * migrator's transaction, so their DROP TABLE would cascade-delete child rows (drizzle-orm
 * issues #5782, #4938). Foreign keys are therefore off while migrating and checked afterwards.
 */
export function applyMigrations(sqlite: Database.Database, db: Db, migrationsFolder = MIGRATIONS_DIR): void {
  sqlite.pragma('foreign_keys = OFF');
  try {
    migrate(db, { migrationsFolder });
    const broken = sqlite.pragma('foreign_key_check') as unknown[];
    if (broken.length > 0) {
      throw new Error(`Migration left ${broken.length} rows with broken foreign keys: ${JSON.stringify(broken.slice(0, 5))}`);
    }
  } finally {
    sqlite.pragma('foreign_keys = ON');
  }
}

/** A transaction handle, as drizzle passes it to `db.transaction(fn)`. */
export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];
/** Either the database or an open transaction. */
export type DbLike = Db | Tx;
