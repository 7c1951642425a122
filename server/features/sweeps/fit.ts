// The server's fit of a stored sweep, with the part's nominal, tolerance and profile.
import { and, desc, eq } from 'drizzle-orm';
import type { DbLike } from '@server/db/client';
import { fits, readings, sweepPoints, sweeps } from '@server/db/schema';
import { setPartStatus, type PartRow } from '@server/features/parts/repository';
import { profileForPart } from '@server/features/profiles/repository';
import { coilFlags, fitCoil, type CoilFit, type CoilPoint, type CoilSpec } from '@shared/analysis/coil';
import { ANALYSIS_ENGINE_VERSION } from '@shared/analysis/engine-version';
import { fitTaper, type TaperFit, type TaperPoint } from '@shared/analysis/taper';
import type { ProfileRules } from '@shared/schemas/bench';
import type { Fit, Sweep } from '@shared/schemas/sweeps';
import type { RefitInput } from '@shared/schemas/sweeps';
import type { StoredPoint } from './store';

export type SweepRow = typeof sweeps.$inferSelect;
export type FitRow = typeof fits.$inferSelect;

/** A fit row as the API sends it: a row's kind and result are always written together (fitAndStore). */
export const asFit = (row: FitRow): Fit => row as Fit;
/** A sweep row with its points and current fit, as the API sends it: the points follow the row's kind (fitInput). */
export const asSweep = (row: SweepRow, points: TaperPoint[] | CoilPoint[], fit: Fit | null): Sweep => ({ ...row, points, fit }) as Sweep;
export type SweepFit = { kind: 'taper'; result: TaperFit } | { kind: 'coil'; result: CoilFit };

/** Stored-form points in the engine's input shape (taper rotation in percent of the full rotation). */
export function fitInput(kind: SweepRow['kind'], rows: StoredPoint[]): TaperPoint[] | CoilPoint[] {
  return kind === 'taper'
    ? rows.map((r) => ({
        rotation: r.x * 100,
        resistance: r.y,
        ...(r.z != null ? { resistanceW3: r.z } : {}),
        ...(r.total != null ? { total: r.total } : {}),
      }))
    : rows.map((r) => ({ frequency: r.x, re: r.y, im: r.z ?? 0 }));
}

/** Stored points back in the engine's input shape (see the sweep_points column comment). */
export function sweepInput(db: DbLike, sweep: SweepRow): TaperPoint[] | CoilPoint[] {
  const rows = db.select().from(sweepPoints).where(eq(sweepPoints.sweepId, sweep.id)).orderBy(sweepPoints.idx).all();
  return fitInput(sweep.kind, rows);
}

/**
 * The latest typed end-to-end reading of a pot: R13 for a taper fit only when the sweep itself
 * gives none (no R13 column, no reading of both halves, no reading at full rotation); the fit's
 * totalSource then says 'bench-reading'.
 */
function latestTotal(db: DbLike, partId: number): number | undefined {
  return db
    .select({ value: readings.value })
    .from(readings)
    .where(and(eq(readings.partId, partId), eq(readings.quantity, 'resistance')))
    .orderBy(desc(readings.id))
    .get()?.value;
}

/** Fits a sweep; `points` are the just-parsed points in stored form (else they are read back). */
export function computeFit(db: DbLike, part: PartRow, sweep: SweepRow, stored?: StoredPoint[], choices: RefitInput = {}): SweepFit {
  const points = stored ? fitInput(sweep.kind, stored) : sweepInput(db, sweep);
  const rules = (profileForPart(db, part)?.rules ?? {}) as ProfileRules;
  if (sweep.kind === 'taper') {
    const result = fitTaper({
      points: points as TaperPoint[],
      rotationUnit: 'percent',
      total: latestTotal(db, part.id),
      nominal: part.nominal ?? undefined,
      tolerancePct: part.tolerancePct ?? undefined,
      ...(choices.law ? { forceLaw: choices.law } : {}),
      profile: {
        law: rules.law ?? (part.taperClass as TaperFit['law'] | null) ?? undefined,
        mMin: rules.mMin,
        mMax: rules.mMax,
        maxEndResistance: rules.maxEndResistance,
      },
    });
    return { kind: 'taper', result };
  }
  const fit = fitCoil({ points: points as CoilPoint[], withRp: choices.withRp ?? 'auto' });
  return { kind: 'coil', result: { ...fit, flags: coilFlags(fit, coilSpec(db, part)) } };
}

/** What a coil fit is judged against: the part's DC resistance limits, its profile's inductance and Q. */
function coilSpec(db: DbLike, part: PartRow): CoilSpec {
  const rules = (profileForPart(db, part)?.rules ?? {}) as ProfileRules;
  return {
    dcr: part.nominal != null && part.tolerancePct != null ? { nominal: part.nominal, tolerancePct: part.tolerancePct } : undefined,
    inductance:
      rules.inductanceNominal && rules.inductanceTolerancePct
        ? { nominal: rules.inductanceNominal, tolerancePct: rules.inductanceTolerancePct }
        : undefined,
    minQ: rules.minQ,
  };
}

/**
 * Fits the sweep, stores the fit (older fits of the same sweep stay as history, marked
 * superseded) and sets the part's status by the flags.
 */
export function fitAndStore(
  db: DbLike,
  part: PartRow,
  sweep: SweepRow,
  userId: string | null,
  opts: { points?: StoredPoint[]; reasonPrefix?: string; choices?: RefitInput; fit?: SweepFit } = {},
): FitRow {
  // A fit computed beforehand (a coil fit from the pool) or now.
  const fit = opts.fit ?? computeFit(db, part, sweep, opts.points, opts.choices);
  const flags = fit.result.flags;
  const now = Date.now();
  db.update(fits)
    .set({ supersededAt: now })
    .where(and(eq(fits.sweepId, sweep.id), eq(fits.partId, part.id)))
    .run();
  const row = db
    .insert(fits)
    .values({
      partId: part.id,
      sweepId: sweep.id,
      kind: fit.kind,
      engineVersion: ANALYSIS_ENGINE_VERSION,
      result: fit.result,
      flagged: flags.length > 0,
    })
    .returning()
    .get();
  if (part.status === 'incoming' || part.status === 'passed' || part.status === 'flagged') {
    const what = fit.kind === 'taper' ? 'taper fit' : 'coil fit';
    const body = flags.length > 0 ? `${what}: ${flags.map((f) => f.message).join('; ')}` : `${what}: no flags`;
    const reason = opts.reasonPrefix ? `${opts.reasonPrefix}; ${body}` : body;
    setPartStatus(db, part, flags.length > 0 ? 'flagged' : 'passed', reason, userId);
  }
  return row;
}
