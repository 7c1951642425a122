// Uploading a lot's readings: the file goes to a temporary file under uploads/incoming, is read back
// as a stream into typed columns, and the rows go in through one prepared statement in one transaction.
import fs from 'node:fs';
import path from 'node:path';
import type { RequestHandler } from 'express';
import multer from 'multer';
import { z } from 'zod';
import { audit } from '@server/audit';
import type { AppContext } from '@server/context';
import { conflict, HttpError, unprocessable } from '@server/http/errors';
import type { ApiRouter } from '@server/http/router';
import type { AuthUser } from '@server/auth/session';
import { pausePoint } from '@server/http/pause-point';
import { guardedUpload } from '@server/uploads/multipart';
import { fileRefused } from '@server/uploads/refusal';
import { contentPath, incomingDir, storedName } from '@server/uploads/store';
import { IdParamsSchema } from '@shared/schemas/common';
import { MappingFieldSchema } from '@shared/schemas/sweeps';
import { lotFinder, lotKind, lotSummary, QUANTITY } from './common';
import { readLotFile } from './read-upload';
import { lotStats } from './repository';
import type { lotStatsJobs } from './stats-jobs';
import { invalidateLotStats } from './stored-stats';

const MAX_LOT_BYTES = 25 * 1024 * 1024;

const UploadFields = z.object({
  replace: z
    .enum(['true', 'false'])
    .default('false')
    .transform((v) => v === 'true'),
  mapping: MappingFieldSchema.optional(),
});

/**
 * multer to a temporary file. It is removed on every path: by the handler once it is done, by the
 * error handler before any refusal is sent (refused fields, a refused file, a missing lot), and
 * when the connection closes early; the stored copy was moved into place by then.
 */
function lotFileUpload(tmpDir: string): RequestHandler {
  const upload = multer({
    dest: tmpDir,
    defParamCharset: 'utf8',
    limits: { fileSize: MAX_LOT_BYTES, files: 1, fields: 10, parts: 12 },
  }).single('file');
  const guarded = guardedUpload(upload);
  return (req, res, next) => {
    res.on('close', () => {
      if (req.file?.path) fs.rm(req.file.path, { force: true }, () => undefined);
    });
    guarded(req, res, next);
  };
}

export function lotUploadRoutes(api: ApiRouter, ctx: AppContext, statsJobs: ReturnType<typeof lotStatsJobs>) {
  const { db, sqlite } = ctx;
  const mustFind = lotFinder(ctx);
  const tmpDir = incomingDir(ctx.config.uploadsDir);
  fs.mkdirSync(tmpDir, { recursive: true });

  api.post('/:id/readings', {
    status: 201,
    before: [lotFileUpload(tmpDir)],
    schemas: { params: IdParamsSchema, body: UploadFields },
    handle: async ({ params, body, req, user }) => {
      const file = req.file;
      try {
        return await ingest(params.id, body, file, user);
      } finally {
        if (file) fs.rmSync(file.path, { force: true });
      }
    },
  });

  async function ingest(id: number, body: z.output<typeof UploadFields>, file: Express.Multer.File | undefined, user: AuthUser) {
    const lot = mustFind(id);
    if (lot.status !== 'open') throw conflict(`The lot is ${lot.status}; an admin must reopen it before new readings.`);
    if (!file) throw unprocessable('Attach the lot export in the "file" field.', { file: 'No file was sent.' });
    if (!/\.(csv|tsv|txt)$/i.test(file.originalname))
      throw new HttpError(415, 'unsupported_type', 'Lot exports are CSV or TSV files.', { file: 'Use .csv or .tsv.' });
    const existing = (sqlite.prepare('select count(*) as n from lot_readings where lot_id = ?').get(lot.id) as { n: number }).n;
    if (existing > 0 && !body.replace) throw conflict(`The lot has ${existing} readings already; send replace=true to replace them.`);
    const started = performance.now();
    const read = await readLotFile(file.path, { quantity: QUANTITY[lotKind(lot)], mapping: body.mapping });
    if (!read.ok) throw fileRefused(read);
    const { data } = read;
    const parsedAt = performance.now();
    const stored = contentPath(ctx.config.uploadsDir, data.contentHash);
    let created = false;
    const insert = sqlite.prepare(
      'insert into lot_readings (lot_id, item, value, second_value, frequency, source_row) values (?, ?, ?, ?, ?, ?)',
    );
    try {
      // One transaction through one prepared statement: all rows or none. The file is moved into
      // place as the transaction's last step: a crash before the commit leaves an unreferenced file,
      // which the sweep at start removes (server/uploads/sweep.ts); a rollback removes it here.
      db.transaction((tx) => {
        if (body.replace) sqlite.prepare('delete from lot_readings where lot_id = ?').run(lot.id);
        // The stored statistics describe the old readings: gone with them, or not at all.
        invalidateLotStats(sqlite, lot.id);
        const half = Math.floor(data.n / 2);
        for (let i = 0; i < data.n; i++) {
          if (i === half) pausePoint('lot-upload:mid-insert');
          const s = data.second[i]!;
          const f = data.frequency[i]!;
          insert.run(lot.id, data.items[i]!, data.values[i]!, Number.isNaN(s) ? null : s, Number.isNaN(f) ? null : f, data.lines[i]!);
        }
        sqlite
          .prepare(
            "insert into attachments (owner_type, owner_id, purpose, original_name, content_hash, mime, size, created_by) values ('lot', ?, 'lot-readings', ?, ?, 'text/csv', ?, ?)",
          )
          .run(lot.id, storedName(file.originalname), data.contentHash, file.size, user.id);
        audit(tx, {
          userId: user.id,
          action: body.replace ? 'lot.readings-replaced' : 'lot.readings-uploaded',
          entity: 'lot',
          entityId: lot.id,
          detail: { rows: data.n, file: file.originalname, columns: data.columns, ignoredColumns: data.ignored },
        });
        if (!fs.existsSync(stored)) {
          fs.mkdirSync(path.dirname(stored), { recursive: true });
          fs.renameSync(file.path, stored);
          created = true;
        }
        pausePoint('lot-upload:file-moved');
      });
    } catch (err) {
      if (created) fs.rmSync(stored, { force: true });
      throw err;
    }
    pausePoint('lot-upload:committed');
    const storedAt = performance.now();
    // From the columns already in memory (a replace leaves exactly these rows); the lot page asks for sets itself.
    const stats = lotStats(lot, data, { sets: false });
    const done = performance.now();
    // The lot page's statistics, matched sets and item columns, kept for its reads (stored-stats.ts), computed
    // in the pool. The readings are committed whatever happens here: a busy pool or an overrun leaves the
    // results to the lot's next read.
    try {
      await statsJobs.refresh(lot, true);
    } catch (err) {
      if (!(err instanceof HttpError && err.status === 503)) throw err;
    }
    const keptAt = performance.now();
    return {
      lot: lotSummary(lot),
      rows: data.n,
      columns: data.columns,
      // Columns of the file that no role uses: listed back, never dropped silently (as sweeps do).
      ignoredColumns: data.ignored,
      stats: stats && { ...stats, deviationsPct: undefined },
      // Where the time went, for the benchmark and for anyone wondering about a large lot.
      timings: { parseMs: parsedAt - started, storeMs: storedAt - parsedAt, statsMs: done - storedAt, storedStatsMs: keptAt - done },
    };
  }
}
