// A lot's statistics through the job pool (server/pool): the stored results when they are up to date,
// else computed in a worker (which keeps them, stored-stats.ts); another matching than the stored one is
// computed in a worker for its request only. One computation per lot at a time: reads that find the
// results missing while one runs wait for it.
import type { AppContext } from '@server/context';
import type { LotRow } from './repository';
import { ColumnCache, readStoredColumnBytes, readStoredLotStats, type StoredLotResults } from './stored-stats';

export function lotStatsJobs(ctx: AppContext) {
  const { sqlite, pool } = ctx;
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
      const started = pool.run('lotStats', { dbFile, lot });
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
      return pool.run('lotFreshResults', { dbFile, lot, matching });
    },
  };
}
