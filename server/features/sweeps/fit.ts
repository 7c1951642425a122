// The server's fit of a stored sweep, with the part's nominal, tolerance and profile.
import { and, desc, eq } from 'drizzle-orm';
import type { DbLike } from '@server/db/client';
import { fits, readings, sweepPoints, sweeps } from '@server/db/schema';
import { setPartStatus, type PartRow } from '@server/features/parts/repository';
import { profileForPart } from '@server/features/profiles/repository';
import { coilFlags, fitCoil, type CoilFit, type CoilPoint } from '@shared/analysis/coil';
import { ANALYSIS_ENGINE_VERSION } from '@shared/analysis/engine-version';
import { fitTaper, type TaperFit, type TaperPoint } from '@shared/analysis/taper';
import type { ProfileRules } from '@shared/schemas/bench';
import type { Fit } from '@shared/schemas/sweeps';

export type SweepRow = typeof sweeps.$inferSelect;
export type FitRow = typeof fits.$inferSelect;

/** A fit row as the API sends it: a row's kind and result are always written together (fitAndStore). */
export const asFit = (row: FitRow): Fit => row as Fit;
export type SweepFit = { kind: 'taper'; result: TaperFit } | { kind: 'coil'; result: CoilFit };

/** Stored points back in the engine's input shape (see the sweep_points column comment). */
export function sweepInput(db: DbLike, sweep: SweepRow): TaperPoint[] | CoilPoint[] {
  const rows = db.select().from(sweepPoints).where(eq(sweepPoints.sweepId, sweep.id)).orderBy(sweepPoints.idx).all();
  return sweep.kind === 'taper'
    ? rows.map((r) => ({ rotation: r.x * 100, resistance: r.y, ...(r.z != null ? { resistanceW3: r.z } : {}) }))
    : rows.map((r) => ({ frequency: r.x, re: r.y, im: r.z ?? 0 }));
}

/** The latest typed end-to-end reading of a pot, used as R13 for its taper fits. */
function latestTotal(db: DbLike, partId: number): number | undefined {
  return db
    .select({ value: readings.value })
    .from(readings)
    .where(and(eq(readings.partId, partId), eq(readings.quantity, 'resistance')))
    .orderBy(desc(readings.id))
    .get()?.value;
}

export function computeFit(db: DbLike, part: PartRow, sweep: SweepRow): SweepFit {
  const points = sweepInput(db, sweep);
  const rules = (profileForPart(db, part)?.rules ?? {}) as ProfileRules;
  if (sweep.kind === 'taper') {
    const result = fitTaper({
      points: points as TaperPoint[],
      rotationUnit: 'percent',
      total: latestTotal(db, part.id),
      nominal: part.nominal ?? undefined,
      tolerancePct: part.tolerancePct ?? undefined,
      profile: { law: rules.law ?? (part.taperClass as TaperFit['law'] | null) ?? undefined, mMin: rules.mMin, mMax: rules.mMax, maxEndResistance: rules.maxEndResistance },
    });
    return { kind: 'taper', result };
  }
  const fit = fitCoil({ points: points as CoilPoint[], withRp: 'auto' });
  const flags = coilFlags(fit, {
    dcr: part.nominal != null && part.tolerancePct != null ? { nominal: part.nominal, tolerancePct: part.tolerancePct } : undefined,
    inductance: rules.inductanceNominal && rules.inductanceTolerancePct ? { nominal: rules.inductanceNominal, tolerancePct: rules.inductanceTolerancePct } : undefined,
    minQ: rules.minQ,
  });
  return { kind: 'coil', result: { ...fit, flags } };
}

/**
 * Fits the sweep, stores the fit (older fits of the same sweep stay as history, marked
 * superseded) and sets the part's status by the flags.
 */
export function fitAndStore(db: DbLike, part: PartRow, sweep: SweepRow, userId: string): FitRow {
  const fit = computeFit(db, part, sweep);
  const flags = fit.result.flags;
  const now = Date.now();
  db.update(fits).set({ supersededAt: now }).where(and(eq(fits.sweepId, sweep.id), eq(fits.partId, part.id))).run();
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
    const reason = flags.length > 0 ? `${what}: ${flags.map((f) => f.message).join('; ')}` : `${what}: no flags`;
    setPartStatus(db, part, flags.length > 0 ? 'flagged' : 'passed', reason, userId);
  }
  return row;
}
