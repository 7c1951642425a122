// Uploading a lot's readings: the file goes to a temporary file under uploads/incoming; the request is
// checked here, and the parse, the insert (one transaction) and the statistics run in a pool worker
// (ingest.ts), so this thread only receives the file and answers.
import fs from 'node:fs';
import type { RequestHandler } from 'express';
import multer from 'multer';
import { z } from 'zod';
import type { AppContext } from '@server/context';
import { conflict, HttpError, unprocessable } from '@server/http/errors';
import type { ApiRouter } from '@server/http/router';
import type { AuthUser } from '@server/auth/session';
import { guardedUpload } from '@server/uploads/multipart';
import { contentPath, incomingDir } from '@server/uploads/store';
import { IdParamsSchema } from '@shared/schemas/common';
import { MappingFieldSchema } from '@shared/schemas/sweeps';
import { lotFinder, lotSummary } from './common';
import { ingestProgress, INGEST_STAGE, readIngestProgress, type LotIngestResult } from './ingest';
import type { lotStatsJobs } from './stats-jobs';

const MAX_LOT_BYTES = 25 * 1024 * 1024;
/**
 * An ingest's size is bounded by the 100,000-row upload limit, not by anything a request chooses: it gets
 * six of the pool's budgets (30 s by default), as lot statistics do (stats-jobs.ts). One that is still
 * reading or inserting when they run out is cancelled: its worker is terminated (its transaction rolls
 * back), the file is removed (`removeUncommittedFile`, and the temporary file by the handler), and the
 * answer is 503 over_budget with Retry-After.
 */
const INGEST_BUDGETS = 6;

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
  const { sqlite } = ctx;
  const mustFind = lotFinder(ctx);
  const tmpDir = incomingDir(ctx.config.uploadsDir);
  fs.mkdirSync(tmpDir, { recursive: true });
  const ingestBudgetMs = ctx.pool.options.budgetMs * INGEST_BUDGETS;

  /**
   * After an ingest failed or was cancelled before its commit: the worker rolled back (a terminated worker's
   * connection closes, which rolls its transaction back), but a cancelled one may have moved the file into
   * place already. It is removed unless a committed row names its content (the same file uploaded before).
   * The check and the removal hold the write lock, so no other ingest can meanwhile find the file and
   * commit a row for it.
   */
  function removeUncommittedFile(progress: SharedArrayBuffer) {
    const { stage, contentHash } = readIngestProgress(progress);
    if (stage !== INGEST_STAGE.writing || !contentHash) return;
    sqlite
      .transaction(() => {
        const named = sqlite.prepare('select 1 from attachments where content_hash = ? limit 1').get(contentHash);
        if (!named) fs.rmSync(contentPath(ctx.config.uploadsDir, contentHash), { force: true });
      })
      .immediate();
  }

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
    // The stored count (lots.reading_count), not a count of 100,000 rows here; the worker checks again under the write lock.
    const existing = lot.readingCount;
    if (existing > 0 && !body.replace) throw conflict(`The lot has ${existing} readings already; send replace=true to replace them.`);
    const started = performance.now();
    // Parse, insert and statistics in a worker (ingest.ts); this thread waits without work.
    const progress = ingestProgress();
    let result: LotIngestResult;
    try {
      result = await ctx.pool.run(
        'lotIngest',
        {
          dbFile: sqlite.name,
          uploadsDir: ctx.config.uploadsDir,
          lot,
          file: { path: file.path, originalName: file.originalname, size: file.size },
          replace: body.replace,
          ...(body.mapping ? { mapping: body.mapping } : {}),
          userId: user.id,
          progress,
        },
        // Past its commit an ingest is finished and answered, never cancelled.
        { budgetMs: ingestBudgetMs, cancellable: () => readIngestProgress(progress).stage !== INGEST_STAGE.committed },
      );
    } catch (err) {
      removeUncommittedFile(progress);
      throw err;
    }
    const ingestedAt = performance.now();
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
      rows: result.rows,
      columns: result.columns,
      // Columns of the file that no role uses: listed back, never dropped silently (as sweeps do).
      ignoredColumns: result.ignoredColumns,
      stats: result.stats,
      // Where the time went, for the benchmark and for anyone wondering about a large lot: in the worker
      // (parse, store, stats), the whole ingest job as this thread waited for it (queue and transfer
      // included), and the stored statistics.
      timings: { ...result.timings, ingestMs: ingestedAt - started, storedStatsMs: keptAt - ingestedAt },
    };
  }
}
