// On start: stored taper fits made by an older engine version are fitted again, once, by the
// current engine. The old fit stays as history (superseded); a part whose status still follows its
// fits (incoming, passed, flagged) takes the new result, with the reason naming the engine version.
import { and, eq, isNull, ne } from 'drizzle-orm';
import type { Db } from '@server/db/client';
import { fits, sweeps } from '@server/db/schema';
import { findPart } from '@server/features/parts/repository';
import { ANALYSIS_ENGINE_VERSION } from '@shared/analysis/engine-version';
import { fitAndStore } from './fit';

export interface RefitSummary {
  refitted: number;
  /** Sweeps that the current engine cannot fit (kept with their old fit), with the reason. */
  failed: { sweepId: number; reason: string }[];
}

export function refitOutdatedTaperFits(db: Db): RefitSummary {
  const stale = db
    .select({ id: fits.id, partId: fits.partId, sweepId: fits.sweepId, engineVersion: fits.engineVersion })
    .from(fits)
    .where(and(eq(fits.kind, 'taper'), isNull(fits.supersededAt), ne(fits.engineVersion, ANALYSIS_ENGINE_VERSION)))
    .all();
  const summary: RefitSummary = { refitted: 0, failed: [] };
  for (const f of stale) {
    if (f.sweepId === null) continue;
    const sweep = db.select().from(sweeps).where(eq(sweeps.id, f.sweepId)).get();
    const part = findPart(db, f.partId);
    if (!sweep || !part) continue;
    try {
      db.transaction((tx) => {
        fitAndStore(tx, part, sweep, null, {
          reasonPrefix: `refitted by engine version ${ANALYSIS_ENGINE_VERSION} (was ${f.engineVersion})`,
        });
      });
      summary.refitted++;
    } catch (err) {
      if (!(err instanceof RangeError)) throw err;
      summary.failed.push({ sweepId: sweep.id, reason: err.message });
    }
  }
  return summary;
}
