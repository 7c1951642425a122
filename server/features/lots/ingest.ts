// A lot upload's heavy part, run in a pool worker (server/pool/tasks.ts `lotIngest`) on the worker's own
// better-sqlite3 connection: the received file is read as a stream into typed columns, the rows go in
// through one prepared statement in one transaction, whose last step moves the file into place, and the
// upload's statistics are computed from the columns in memory. The request thread only receives the file,
// checks the request, and answers.
//
// The transaction is IMMEDIATE: it holds SQLite's write lock from its start, so two ingests never
// interleave (one's check that the stored file exists sees the other's committed or rolled-back state).
// `progress` is memory shared with the main thread, readable even after the worker was terminated: the
// stage reached and the file's content hash, so that an ingest cancelled past its budget can be cleaned
// up (upload.ts) and one past its commit is not cancelled at all.
import fs from 'node:fs';
import path from 'node:path';
import Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { audit } from '@server/audit';
import * as schema from '@server/db/schema';
import { workerWrite } from '@server/db/write-turns';
import { pausePoint } from '@server/http/pause-point';
import { JobRefusalError } from '@server/pool/refusal';
import { contentPath, storedName } from '@server/uploads/store';
import type { ExplicitMapping } from '@shared/csv/columns';
import type { LotStatistics } from '@shared/analysis/lot-stats';
import { QUANTITY, lotKind } from './common';
import { readLotFile } from './read-upload';
import { lotStats, type LotRow } from './repository';
import { invalidateLotStats } from './stored-stats';

export interface LotIngestInput {
  dbFile: string;
  uploadsDir: string;
  lot: LotRow;
  /** The received file (multer's temporary file under uploads/incoming) and the name it was sent with. */
  file: { path: string; originalName: string; size: number };
  replace: boolean;
  mapping?: ExplicitMapping;
  userId: string;
  /** `ingestProgress()`: shared with the main thread. */
  progress: SharedArrayBuffer;
}

export interface LotIngestResult {
  rows: number;
  columns: Record<string, string>;
  ignoredColumns: string[];
  /** The upload's statistics, without matched sets and per-item deviations. */
  stats: (Omit<LotStatistics, 'deviationsPct'> & { deviationsPct: undefined }) | null;
  timings: { parseMs: number; storeMs: number; statsMs: number };
}

/** Stages an ingest reaches, in the shared progress memory. */
export const INGEST_STAGE = { reading: 0, writing: 1, committed: 2 } as const;
const HASH_BYTES = 64;

/** The memory an ingest shares with the main thread: the stage (one int32), then the content hash (64 hex digits). */
export function ingestProgress(): SharedArrayBuffer {
  return new SharedArrayBuffer(4 + HASH_BYTES);
}

/** What a (possibly cancelled) ingest had reached. */
export function readIngestProgress(progress: SharedArrayBuffer): { stage: number; contentHash: string | null } {
  const stage = Atomics.load(new Int32Array(progress, 0, 1), 0);
  if (stage === INGEST_STAGE.reading) return { stage, contentHash: null };
  return { stage, contentHash: Buffer.from(new Uint8Array(progress, 4, HASH_BYTES)).toString('latin1') };
}

function setStage(progress: SharedArrayBuffer, stage: number, contentHash?: string) {
  if (contentHash !== undefined) new Uint8Array(progress, 4, HASH_BYTES).set(Buffer.from(contentHash, 'latin1'));
  Atomics.store(new Int32Array(progress, 0, 1), 0, stage);
}

export async function ingestLot(input: LotIngestInput): Promise<LotIngestResult> {
  const { lot, file, progress } = input;
  const started = performance.now();
  const read = await readLotFile(file.path, { quantity: QUANTITY[lotKind(lot)], mapping: input.mapping });
  if (!read.ok)
    throw new JobRefusalError({ kind: 'file', issues: read.issues, ...(read.needsMapping ? { needsMapping: read.needsMapping } : {}) });
  const { data } = read;
  const parsedAt = performance.now();
  const stored = contentPath(input.uploadsDir, data.contentHash);
  // The hash is known to the main thread before anything is moved into place.
  setStage(progress, INGEST_STAGE.writing, data.contentHash);

  const sqlite = new Database(input.dbFile, { timeout: 5000, fileMustExist: true });
  try {
    sqlite.pragma('foreign_keys = ON');
    sqlite.pragma('synchronous = FULL');
    const db = drizzle(sqlite, { schema });
    const insert = sqlite.prepare(
      'insert into lot_readings (lot_id, item, value, second_value, frequency, source_row) values (?, ?, ?, ?, ?, ?)',
    );
    let created = false;
    try {
      // One transaction through one prepared statement: all rows or none. The file is moved into place as
      // the transaction's last step: a crash before the commit leaves an unreferenced file, which the sweep
      // at start removes (server/uploads/sweep.ts); a rollback removes it here; a cancel, upload.ts.
      // In a write turn: the request thread's writes wait for it without blocking (server/db/write-turns.ts).
      workerWrite(() =>
        sqlite
          .transaction(() => {
            // Checked again under the write lock (the request thread checked first): the lot may have been
            // closed, or been given readings by another upload, since.
            const now = sqlite.prepare('select status from lots where id = ?').get(lot.id) as { status: string } | undefined;
            if (!now) throw new JobRefusalError({ kind: 'conflict', message: 'The lot was deleted meanwhile.' });
            if (now.status !== 'open')
              throw new JobRefusalError({
                kind: 'conflict',
                message: `The lot is ${now.status}; an admin must reopen it before new readings.`,
              });
            if (!input.replace) {
              const existing = (sqlite.prepare('select count(*) as n from lot_readings where lot_id = ?').get(lot.id) as { n: number }).n;
              if (existing > 0)
                throw new JobRefusalError({
                  kind: 'conflict',
                  message: `The lot has ${existing} readings already; send replace=true to replace them.`,
                });
            } else sqlite.prepare('delete from lot_readings where lot_id = ?').run(lot.id);
            // The stored statistics describe the old readings: gone with them, or not at all.
            invalidateLotStats(sqlite, lot.id);
            const half = Math.floor(data.n / 2);
            for (let i = 0; i < data.n; i++) {
              if (i === half) pausePoint('lot-upload:mid-insert');
              const s = data.second[i]!;
              const f = data.frequency[i]!;
              insert.run(lot.id, data.items[i]!, data.values[i]!, Number.isNaN(s) ? null : s, Number.isNaN(f) ? null : f, data.lines[i]!);
            }
            // The lot list reads the count from here (an empty lot or a replace: exactly these rows).
            sqlite.prepare('update lots set reading_count = ? where id = ?').run(data.n, lot.id);
            sqlite
              .prepare(
                "insert into attachments (owner_type, owner_id, purpose, original_name, content_hash, mime, size, created_by) values ('lot', ?, 'lot-readings', ?, ?, 'text/csv', ?, ?)",
              )
              .run(lot.id, storedName(file.originalName), data.contentHash, file.size, input.userId);
            audit(db, {
              userId: input.userId,
              action: input.replace ? 'lot.readings-replaced' : 'lot.readings-uploaded',
              entity: 'lot',
              entityId: lot.id,
              detail: { rows: data.n, file: file.originalName, columns: data.columns, ignoredColumns: data.ignored },
            });
            if (!fs.existsSync(stored)) {
              fs.mkdirSync(path.dirname(stored), { recursive: true });
              fs.renameSync(file.path, stored);
              created = true;
            }
            pausePoint('lot-upload:file-moved');
          })
          .immediate(),
      );
    } catch (err) {
      if (created) fs.rmSync(stored, { force: true });
      throw err;
    }
    // From here on the readings are stored: the job is no longer cancelled (upload.ts).
    setStage(progress, INGEST_STAGE.committed);
    pausePoint('lot-upload:committed');
  } finally {
    sqlite.close();
  }
  const storedAt = performance.now();
  // From the columns already in memory (a replace leaves exactly these rows); the lot page asks for sets itself.
  const stats = lotStats(lot, data, { sets: false });
  const done = performance.now();
  return {
    rows: data.n,
    columns: data.columns,
    ignoredColumns: data.ignored,
    stats: stats && { ...stats, deviationsPct: undefined },
    timings: { parseMs: parsedAt - started, storeMs: storedAt - parsedAt, statsMs: done - storedAt },
  };
}
