// The committed migrations up to and including one of them, for tests that build a database as an
// older version left it and then apply the rest. Each call copies the migrations folder and cuts
// its journal; `removeMigrationCopies` (in the test file's afterAll) deletes the copies.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { MIGRATIONS_DIR } from '@server/db/client';

const copies: string[] = [];

/** A migrations folder whose journal ends at the migration tagged `lastTag` (which must exist). */
export function migrationsUpTo(lastTag: string): string {
  const folder = fs.mkdtempSync(path.join(os.tmpdir(), 'lugbook-migrations-'));
  copies.push(folder);
  fs.cpSync(MIGRATIONS_DIR, folder, { recursive: true });
  const journalFile = path.join(folder, 'meta', '_journal.json');
  const journal = JSON.parse(fs.readFileSync(journalFile, 'utf8')) as { entries: { tag: string }[] };
  const end = journal.entries.findIndex((e) => e.tag === lastTag);
  if (end < 0) throw new Error(`no migration tagged ${lastTag}`);
  journal.entries = journal.entries.slice(0, end + 1);
  fs.writeFileSync(journalFile, JSON.stringify(journal));
  return folder;
}

export function removeMigrationCopies(): void {
  for (const d of copies.splice(0)) fs.rmSync(d, { recursive: true, force: true });
}
