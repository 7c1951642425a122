import { and, desc, eq, inArray, isNull } from 'drizzle-orm';
import { z } from 'zod';
import { audit } from '@server/audit';
import type { AppContext } from '@server/context';
import { attachments, fits, sweeps } from '@server/db/schema';
import { findPart } from '@server/features/parts/repository';
import { notFound, unprocessable } from '@server/http/errors';
import { ApiRouter, takeWriteTurn } from '@server/http/router';
import { fileRefused } from '@server/uploads/refusal';
import { checkFileType, singleFileUpload, withStoredFile, storedName } from '@server/uploads/store';
import { IdParamsSchema } from '@shared/schemas/common';
import {
  RefitInputSchema,
  SweepUploadFieldsSchema,
  type Fit,
  type RefitResult,
  type Sweep,
  type SweepUploadResult,
} from '@shared/schemas/sweeps';
import { parseSweepCsv } from '@shared/csv/sweeps';
import { asFit, asSweep, coilFitInPool, fitAndStore, fitInput, sweepInput, type SweepRow } from './fit';
import type { CoilPoint } from '@shared/analysis/coil';
import { insertSweep, toStoredPoints } from './store';

const MAX_SWEEP_BYTES = 2 * 1024 * 1024;
const DEFAULT_FULL_ROTATION_DEG = 300;

export function sweepRoutes(ctx: AppContext) {
  const { db } = ctx;
  const api = new ApiRouter('/api/parts/:id');

  const withFits = (list: SweepRow[]): Sweep[] => {
    if (list.length === 0) return [];
    const current = db
      .select()
      .from(fits)
      .where(
        and(
          inArray(
            fits.sweepId,
            list.map((s) => s.id),
          ),
          isNull(fits.supersededAt),
        ),
      )
      .all()
      .map(asFit);
    return list.map((s) => asSweep(s, sweepInput(db, s), current.find((f) => f.sweepId === s.id) ?? null));
  };

  api.get('/sweeps', {
    schemas: { params: IdParamsSchema },
    handle: ({ params }): { sweeps: Sweep[] } => {
      if (!findPart(db, params.id)) throw notFound('That part');
      return { sweeps: withFits(db.select().from(sweeps).where(eq(sweeps.partId, params.id)).orderBy(desc(sweeps.id)).all()) };
    },
  });

  api.post('/sweeps', {
    status: 201,
    before: [singleFileUpload(MAX_SWEEP_BYTES)],
    schemas: { params: IdParamsSchema, body: SweepUploadFieldsSchema },
    handle: async ({ params, body, req, user }): Promise<SweepUploadResult> => {
      const part = findPart(db, params.id);
      if (!part) throw notFound('That part');
      if (body.kind === 'taper' && part.kind !== 'pot')
        throw unprocessable('Rotation sweeps belong to pots.', { kind: `This part is a ${part.kind}.` });
      const { mime } = checkFileType(req.file, 'table');
      const file = req.file!;
      const parsed = parseSweepCsv(file.buffer.toString('utf8'), body.kind, { mapping: body.mapping });
      if (!parsed.ok) throw fileRefused(parsed);
      const stored = toStoredPoints(
        body.kind,
        parsed.points,
        parsed.kind === 'taper' ? parsed.rotationUnit : 'percent',
        body.fullRotationDeg ?? DEFAULT_FULL_ROTATION_DEG,
      );
      try {
        // A coil fit runs in the job pool before anything is stored; a taper fit (a millisecond) inside the transaction.
        const fitted =
          body.kind === 'impedance' ? await coilFitInPool(ctx.pool, db, part, fitInput('impedance', stored) as CoilPoint[]) : undefined;
        await takeWriteTurn(req);
        return withStoredFile(ctx.config.uploadsDir, file.buffer, (content) =>
          db.transaction((tx) => {
            const attachment = tx
              .insert(attachments)
              .values({
                ownerType: 'part',
                ownerId: part.id,
                purpose: 'sweep',
                originalName: storedName(file.originalname),
                contentHash: content.contentHash,
                mime,
                size: content.size,
                createdBy: user.id,
              })
              .returning()
              .get();
            const sweep = insertSweep(
              tx,
              ctx.sqlite,
              { partId: part.id, kind: body.kind, attachmentId: attachment.id, columns: parsed.columns, createdBy: user.id },
              stored,
            );
            const fit = fitAndStore(tx, part, sweep, user.id, { points: stored, ...(fitted ? { fit: fitted } : {}) });
            audit(tx, {
              userId: user.id,
              action: 'sweep.upload',
              entity: 'part',
              entityId: part.id,
              detail: { sweepId: sweep.id, kind: body.kind, points: stored.length, file: attachment.originalName, flagged: fit.flagged },
            });
            const storedFit = asFit(fit);
            return {
              ...asSweep(sweep, fitInput(sweep.kind, stored), storedFit),
              fit: storedFit,
              ignoredColumns: parsed.ignored,
              notes: parsed.notes,
              part: findPart(tx, part.id)!,
            };
          }),
        );
      } catch (err) {
        if (err instanceof RangeError) throw unprocessable(`The sweep could not be fitted: ${err.message}`, { file: err.message });
        throw err;
      }
    },
  });

  api.get('/fits', {
    schemas: { params: IdParamsSchema },
    handle: ({ params }): { fits: Fit[] } => {
      if (!findPart(db, params.id)) throw notFound('That part');
      return { fits: db.select().from(fits).where(eq(fits.partId, params.id)).orderBy(desc(fits.id)).all().map(asFit) };
    },
  });

  // Runs the current engine again over a stored sweep; the previous fit stays in the history.
  api.post('/sweeps/:sweepId/refit', {
    schemas: { params: IdParamsSchema.extend({ sweepId: z.coerce.number().int().positive() }), body: RefitInputSchema },
    handle: async ({ params, body, req, user }): Promise<RefitResult> => {
      const part = findPart(db, params.id);
      const sweep = db
        .select()
        .from(sweeps)
        .where(and(eq(sweeps.id, params.sweepId), eq(sweeps.partId, params.id)))
        .get();
      if (!part || !sweep) throw notFound('That sweep');
      const fitted =
        sweep.kind === 'impedance' ? await coilFitInPool(ctx.pool, db, part, sweepInput(db, sweep) as CoilPoint[], body) : undefined;
      await takeWriteTurn(req);
      return db.transaction((tx) => {
        const fit = fitAndStore(tx, part, sweep, user.id, { choices: body, ...(fitted ? { fit: fitted } : {}) });
        audit(tx, {
          userId: user.id,
          action: 'fit.rerun',
          entity: 'part',
          entityId: part.id,
          detail: { sweepId: sweep.id, fitId: fit.id, choices: body },
        });
        return { fit: asFit(fit), part: findPart(tx, part.id)! };
      });
    },
  });

  return api;
}
