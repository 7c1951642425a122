// A lot's statistics through the job pool (server/pool): the stored results when they are up to date,
// else computed in a worker (which keeps them, stored-stats.ts); another matching than the stored one is
// computed in a worker for its request only. One computation per lot at a time: reads that find the
// results missing while one runs wait for it.
import type { AppContext } from '@server/context';
import { findLot, type LotRow } from './repository';
import { ColumnCache, readStoredColumnBytes, readStoredLotStats, type StoredLotResults } from './stored-stats';

/**
 * A lot's statistics are bounded by the upload's 100,000 rows, not by anything a request chooses, and a
 * lot whose statistics were always stopped could never be read: they get six of the pool's budgets
 * (30 s by default) instead of one.
 */
const STATS_BUDGETS = 6;

const perContext = new WeakMap<AppContext, ReturnType<typeof makeLotStatsJobs>>();

/** The lot statistics jobs of an app (one per context, so reads and the start-up pass share their computations). */
export function lotStatsJobs(ctx: AppContext) {
  let jobs = perContext.get(ctx);
  if (!jobs) {
    jobs = makeLotStatsJobs(ctx);
    perContext.set(ctx, jobs);
  }
  return jobs;
}

/**
 * At start, in the background: computes the statistics of every lot with readings whose stored results
 * are missing or out of date (a new engine version, a lot seeded or uploaded before they were stored),
 * one lot at a time, so that no reader waits for them. Answers how many were computed.
 */
export async function computeMissingLotStats(ctx: AppContext): Promise<number> {
  const jobs = lotStatsJobs(ctx);
  const ids = ctx.sqlite.prepare('select distinct lot_id from lot_readings').pluck().all() as number[];
  let computed = 0;
  for (const id of ids) {
    const lot = findLot(ctx.db, id);
    if (!lot || readStoredLotStats(ctx.sqlite, lot, 'detail')) continue;
    await jobs.refresh(lot);
    computed++;
  }
  return computed;
}

function makeLotStatsJobs(ctx: AppContext) {
  const { sqlite, pool } = ctx;
  const budgetMs = pool.options.budgetMs * STATS_BUDGETS;
  const dbFile = sqlite.name;
  const computing = new Map<number, Promise<StoredLotResults>>();
  const columnCache = new ColumnCache();

  /**
   * Computes and keeps the lot's results when a read finds them missing, or (`changed`) after an upload
   * committed new readings: that one never waits for a computation begun before it.
   */
  function refresh(lot: LotRow, changed = false): Promise<StoredLotResults> {
    let job = changed ? undefined : computing.get(lot.id);
    if (!job) {
      const started = pool.run('lotStats', { dbFile, lot }, { budgetMs });
      job = started.finally(() => {
        if (computing.get(lot.id) === job) computing.delete(lot.id);
      });
      computing.set(lot.id, job);
    }
    return job;
  }

  return {
    refresh,
    /** The default matching's results: `part` says which JSON text the route sends. */
    async stored(lot: LotRow, part: 'detail' | 'columns'): Promise<StoredLotResults> {
      return readStoredLotStats(sqlite, lot, part) ?? (await refresh(lot));
    },
    /** The default matching's item columns as the bytes of their JSON text. */
    async columnBytes(lot: LotRow): Promise<{ count: number; bytes: Buffer }> {
      const stored = readStoredColumnBytes(sqlite, lot, columnCache);
      if (stored) return stored;
      const computed = await refresh(lot);
      return { count: computed.count, bytes: Buffer.from(computed.columnsJson) };
    },
    /** Another matching, computed for this request only. */
    fresh(lot: LotRow, matching: { matchPct?: number; setSize?: number }): Promise<StoredLotResults> {
      return pool.run('lotFreshResults', { dbFile, lot, matching }, { budgetMs });
    },
  };
}
