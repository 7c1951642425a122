// The sweep routes' heavy parts, run in a pool worker on its own connection (server/pool/tasks.ts):
// a sweep upload (parse up to 20,000 rows, fit, store), a part's sweeps with their points, and a refit.
// On the request thread a 20,000-point taper upload took ~0.4 s (parse, one insert per point, the fit,
// the answer's JSON), and listing a part with three such sweeps about as long (60,000 rows read as objects).
// Answers go back as JSON text; writes are one transaction in a write turn (server/db/write-turns.ts).
import type Database from 'better-sqlite3';
import { and, desc, eq, inArray, isNull } from 'drizzle-orm';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { audit } from '@server/audit';
import type { Database_ } from '@server/db/client';
import * as schema from '@server/db/schema';
import { attachments, fits, sweeps } from '@server/db/schema';
import { workerWrite } from '@server/db/write-turns';
import { findPart } from '@server/features/parts/repository';
import { jsonBytes } from '@server/http/encoded';
import { notFound, unprocessable } from '@server/http/errors';
import { JobRefusalError } from '@server/pool/refusal';
import { withStoredFile, storedName } from '@server/uploads/store';
import type { CoilPoint } from '@shared/analysis/coil';
import type { TaperPoint } from '@shared/analysis/taper';
import { parseSweepCsv } from '@shared/csv/sweeps';
import type { ExplicitMapping } from '@shared/csv/columns';
import type { Fit, RefitInput, RefitResult, Sweep, SweepKind, SweepUploadResult } from '@shared/schemas/sweeps';
import { asFit, asSweep, computeFit, fitAndStore, fitInput, type SweepFit, type SweepRow } from './fit';
import { insertSweep, toStoredPoints, type StoredPoint } from './store';

function database(sqlite: Database.Database): Database_ {
  return { db: drizzle(sqlite, { schema }), sqlite };
}

/** A fit the engine refuses (too few usable points) is the file's fault: 422 naming it. */
function fitted(run: () => SweepFit): SweepFit {
  try {
    return run();
  } catch (err) {
    if (err instanceof RangeError) throw unprocessable(`The sweep could not be fitted: ${err.message}`, { file: err.message });
    throw err;
  }
}

/** A sweep's points in the stored form, read as rows of values (no row objects). */
export function storedPoints(sqlite: Database.Database, sweepId: number): StoredPoint[] {
  const rows = sqlite.prepare('select x, y, z, total from sweep_points where sweep_id = ? order by idx').raw().all(sweepId) as [
    number,
    number,
    number | null,
    number | null,
  ][];
  return rows.map(([x, y, z, total]) => ({ x, y, z, total }));
}

export interface SweepIngestInput {
  dbFile: string;
  uploadsDir: string;
  partId: number;
  kind: SweepKind;
  mapping?: ExplicitMapping;
  fullRotationDeg: number;
  file: { bytes: Uint8Array; originalName: string; mime: string };
  userId: string;
}

/** POST /api/parts/:id/sweeps: parse, fit, and store the file, the sweep, its points and the fit in one transaction. */
export function ingestSweep(sqlite: Database.Database, input: SweepIngestInput): Uint8Array {
  const { db } = database(sqlite);
  const content = Buffer.from(input.file.bytes.buffer, input.file.bytes.byteOffset, input.file.bytes.byteLength);
  const parsed = parseSweepCsv(content.toString('utf8'), input.kind, { mapping: input.mapping });
  if (!parsed.ok) {
    throw new JobRefusalError({
      kind: 'file',
      issues: parsed.issues,
      ...(parsed.needsMapping ? { needsMapping: parsed.needsMapping } : {}),
    });
  }
  const stored = toStoredPoints(
    input.kind,
    parsed.points,
    parsed.kind === 'taper' ? parsed.rotationUnit : 'percent',
    input.fullRotationDeg,
  );
  const part = findPart(db, input.partId);
  if (!part) throw notFound('That part');
  // The fit reads only the part's profile and readings: computed before the write transaction.
  const draft = { id: 0, kind: input.kind } as SweepRow;
  const fit = fitted(() => computeFit(db, part, draft, stored));
  const answer = workerWrite(() =>
    withStoredFile(input.uploadsDir, content, (file) =>
      db.transaction(
        (tx) => {
          const attachment = tx
            .insert(attachments)
            .values({
              ownerType: 'part',
              ownerId: part.id,
              purpose: 'sweep',
              originalName: storedName(input.file.originalName),
              contentHash: file.contentHash,
              mime: input.file.mime,
              size: file.size,
              createdBy: input.userId,
            })
            .returning()
            .get();
          const sweep = insertSweep(
            tx,
            sqlite,
            { partId: part.id, kind: input.kind, attachmentId: attachment.id, columns: parsed.columns, createdBy: input.userId },
            stored,
          );
          const row = fitAndStore(tx, part, sweep, input.userId, { points: stored, fit });
          audit(tx, {
            userId: input.userId,
            action: 'sweep.upload',
            entity: 'part',
            entityId: part.id,
            detail: { sweepId: sweep.id, kind: input.kind, points: stored.length, file: attachment.originalName, flagged: row.flagged },
          });
          const storedFit = asFit(row);
          return {
            ...asSweep(sweep, fitInput(sweep.kind, stored), storedFit),
            fit: storedFit,
            ignoredColumns: parsed.ignored,
            notes: parsed.notes,
            part: findPart(tx, part.id)!,
          } satisfies SweepUploadResult;
        },
        { behavior: 'immediate' },
      ),
    ),
  );
  return jsonBytes(answer);
}

/** GET /api/parts/:id/sweeps: every sweep of the part, newest first, with its points and current fit. */
export function partSweepsJson(sqlite: Database.Database, partId: number): Uint8Array {
  const { db } = database(sqlite);
  const list = db.select().from(sweeps).where(eq(sweeps.partId, partId)).orderBy(desc(sweeps.id)).all();
  const current =
    list.length === 0
      ? []
      : db
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
  const answer: { sweeps: Sweep[] } = {
    sweeps: list.map((s) =>
      asSweep(
        s,
        fitInput(s.kind, storedPoints(sqlite, s.id)) as TaperPoint[] | CoilPoint[],
        current.find((f) => f.sweepId === s.id) ?? null,
      ),
    ),
  };
  return jsonBytes(answer);
}

/** GET /api/parts/:id/fits: every fit of the part, newest first, superseded ones included. */
export function partFitsJson(sqlite: Database.Database, partId: number): Uint8Array {
  const { db } = database(sqlite);
  const answer: { fits: Fit[] } = { fits: db.select().from(fits).where(eq(fits.partId, partId)).orderBy(desc(fits.id)).all().map(asFit) };
  return jsonBytes(answer);
}

export interface SweepRefitInput {
  dbFile: string;
  partId: number;
  sweepId: number;
  choices: RefitInput;
  userId: string;
}

/** POST /api/parts/:id/sweeps/:sweepId/refit: the current engine over the stored points; older fits stay as history. */
export function refitSweep(sqlite: Database.Database, input: SweepRefitInput): RefitResult {
  const { db } = database(sqlite);
  const part = findPart(db, input.partId);
  const sweep = db
    .select()
    .from(sweeps)
    .where(and(eq(sweeps.id, input.sweepId), eq(sweeps.partId, input.partId)))
    .get();
  if (!part || !sweep) throw notFound('That sweep');
  const fit = fitted(() => computeFit(db, part, sweep, storedPoints(sqlite, sweep.id), input.choices));
  return workerWrite(() =>
    db.transaction(
      (tx) => {
        const row = fitAndStore(tx, part, sweep, input.userId, { choices: input.choices, fit });
        audit(tx, {
          userId: input.userId,
          action: 'fit.rerun',
          entity: 'part',
          entityId: part.id,
          detail: { sweepId: sweep.id, fitId: row.id, choices: input.choices },
        });
        return { fit: asFit(row), part: findPart(tx, part.id)! };
      },
      { behavior: 'immediate' },
    ),
  );
}
