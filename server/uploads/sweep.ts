// Run once at start, before the server listens: removes what an interrupted upload may have left
// behind — every temporary file in uploads/incoming, and every stored file no attachment row names
// (a crash between moving a file into place and the commit of its rows).
import fs from 'node:fs';
import path from 'node:path';
import type Database from 'better-sqlite3';
import { incomingDir } from './store';

export interface SweepResult {
  incoming: number;
  orphans: number;
}

const STORED_NAME = /^[0-9a-f]{64}$/;

export function sweepUploads(sqlite: Database.Database, uploadsDir: string): SweepResult {
  const result: SweepResult = { incoming: 0, orphans: 0 };
  const incoming = incomingDir(uploadsDir);
  if (fs.existsSync(incoming)) {
    for (const name of fs.readdirSync(incoming)) {
      fs.rmSync(path.join(incoming, name), { force: true, recursive: true });
      result.incoming++;
    }
  }
  if (!fs.existsSync(uploadsDir)) return result;
  const referenced = new Set(
    (sqlite.prepare('select distinct content_hash as h from attachments').all() as { h: string }[]).map((r) => r.h),
  );
  for (const dir of fs.readdirSync(uploadsDir, { withFileTypes: true })) {
    if (!dir.isDirectory() || !/^[0-9a-f]{2}$/.test(dir.name)) continue;
    const folder = path.join(uploadsDir, dir.name);
    for (const name of fs.readdirSync(folder)) {
      // Stored files are named by their hash; anything else here is a temporary name from storeContent.
      if (STORED_NAME.test(name) && referenced.has(name)) continue;
      fs.rmSync(path.join(folder, name), { force: true });
      result.orphans++;
    }
  }
  return result;
}
