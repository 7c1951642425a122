// A part's sweeps (rotation and impedance) and their fits: the heavy work runs in the pool (jobs.ts).
import { z } from 'zod';
import type { AppContext } from '@server/context';
import { findPart } from '@server/features/parts/repository';
import { sendJsonBytes } from '@server/http/encoded';
import { notFound, unprocessable } from '@server/http/errors';
import { ApiRouter } from '@server/http/router';
import { checkFileType, singleFileUpload } from '@server/uploads/store';
import { IdParamsSchema } from '@shared/schemas/common';
import { RefitInputSchema, SweepUploadFieldsSchema, type RefitResult } from '@shared/schemas/sweeps';

const MAX_SWEEP_BYTES = 2 * 1024 * 1024;
const DEFAULT_FULL_ROTATION_DEG = 300;

/** A sweep's parse, fit and writes are bounded by its 20,000 points (MAX_SWEEP_POINTS): two of the pool's budgets. */
const SWEEP_BUDGETS = 2;

export function sweepRoutes(ctx: AppContext) {
  const { db, sqlite, pool } = ctx;
  const api = new ApiRouter('/api/parts/:id');

  // Listing, uploading and refitting work with up to 20,000 points per sweep: in the pool (jobs.ts).
  api.get('/sweeps', {
    schemas: { params: IdParamsSchema },
    handle: async ({ params, res }) => {
      if (!findPart(db, params.id)) throw notFound('That part');
      await sendJsonBytes(res, await pool.run('partSweeps', { dbFile: sqlite.name, partId: params.id }), null);
      return undefined;
    },
  });

  api.post('/sweeps', {
    status: 201,
    before: [singleFileUpload(MAX_SWEEP_BYTES)],
    schemas: { params: IdParamsSchema, body: SweepUploadFieldsSchema },
    handle: async ({ params, body, req, res, user }) => {
      const part = findPart(db, params.id);
      if (!part) throw notFound('That part');
      if (body.kind === 'taper' && part.kind !== 'pot')
        throw unprocessable('Rotation sweeps belong to pots.', { kind: `This part is a ${part.kind}.` });
      const { mime } = checkFileType(req.file, 'table');
      const file = req.file!;
      const answer = await pool.run(
        'sweepIngest',
        {
          dbFile: sqlite.name,
          uploadsDir: ctx.config.uploadsDir,
          partId: part.id,
          kind: body.kind,
          ...(body.mapping ? { mapping: body.mapping } : {}),
          fullRotationDeg: body.fullRotationDeg ?? DEFAULT_FULL_ROTATION_DEG,
          file: { bytes: file.buffer, originalName: file.originalname, mime },
          userId: user.id,
        },
        { budgetMs: pool.options.budgetMs * SWEEP_BUDGETS },
      );
      await sendJsonBytes(res, answer, null, 201);
      return undefined;
    },
  });

  // Every fit with its history: a coil fit carries its curves, and refits add up, so read in the pool too.
  api.get('/fits', {
    schemas: { params: IdParamsSchema },
    handle: async ({ params, res }) => {
      if (!findPart(db, params.id)) throw notFound('That part');
      await sendJsonBytes(res, await pool.run('partFits', { dbFile: sqlite.name, partId: params.id }), null);
      return undefined;
    },
  });

  // Runs the current engine again over a stored sweep; the previous fit stays in the history.
  api.post('/sweeps/:sweepId/refit', {
    schemas: { params: IdParamsSchema.extend({ sweepId: z.coerce.number().int().positive() }), body: RefitInputSchema },
    handle: ({ params, body, user }): Promise<RefitResult> =>
      pool.run(
        'sweepRefit',
        { dbFile: sqlite.name, partId: params.id, sweepId: params.sweepId, choices: body, userId: user.id },
        { budgetMs: pool.options.budgetMs * SWEEP_BUDGETS },
      ),
  });

  return api;
}
