// A lot's statistics through the job pool (server/pool): the stored results when they are up to date,
// else computed in a worker (which keeps them, stored-stats.ts); another matching than the stored one is
// computed in a worker for its request only. One computation per lot at a time: reads that find the
// results missing while one runs wait for it.
import type { AppContext } from '@server/context';
import { findLot, type LotRow } from './repository';
import { HttpError } from '@server/http/errors';
import { itemsKey, readLotItemsEncoded, type EncodedItems, type ItemsEncoding } from './items-encoded';
import { ColumnCache, readStoredColumnsState, readStoredLotStats, type StoredLotResults } from './stored-stats';

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
    if (!lot) continue;
    if (readStoredLotStats(ctx.sqlite, lot, 'detail')) {
      // Statistics kept before their compressed items answer was (an older version): made now.
      const missing = !ctx.sqlite.prepare('select 1 from lot_items_encoded where lot_id = ?').pluck().get(id);
      if (missing) await jobs.encode(lot.id).catch(() => null);
      continue;
    }
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
  // The compressed items answers last sent, by lot (items-encoded.ts); keyed by the state they were made from.
  const encodedCache = { gzip: new ColumnCache(32 * 1024 * 1024), br: new ColumnCache(32 * 1024 * 1024) };
  const encoding = new Map<number, Promise<EncodedItems | null>>();

  /** Makes and keeps the lot's compressed items answer in the pool; one job per lot at a time. */
  function encode(lotId: number): Promise<EncodedItems | null> {
    let job = encoding.get(lotId);
    if (!job) {
      job = pool.run('lotItemsEncode', { dbFile, lotId }, { budgetMs }).finally(() => {
        if (encoding.get(lotId) === job) encoding.delete(lotId);
      });
      encoding.set(lotId, job);
    }
    return job;
  }

  /**
   * Computes and keeps the lot's results when a read finds them missing, or (`changed`) after an upload
   * committed new readings: that one never waits for a computation begun before it.
   */
  function refresh(lot: LotRow, changed = false): Promise<StoredLotResults> {
    let job = changed ? undefined : computing.get(lot.id);
    if (!job) {
      const started = pool.run('lotStats', { dbFile, lot }, { budgetMs });
      // The compressed items answer of the new columns, made in the background (nobody waits for it here;
      // an items read that comes first waits for this same job).
      void started.then((r) => (r.kept ? encode(lot.id) : null)).catch(() => null);
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
    encode,
    /** The state of the lot's stored item columns (null when missing or out of date). */
    columnsState: (lot: LotRow) => readStoredColumnsState(sqlite, lot),
    /**
     * The default matching's item columns as the bytes of their JSON text, for the state `state` names
     * (columnsState): from memory, else read in the pool (moved here, not copied); else computed.
     */
    async columnBytes(lot: LotRow, state: { count: number; computedAt: number } | null): Promise<{ count: number; bytes: Buffer }> {
      if (state) {
        const key = `${state.computedAt}:${state.count}`;
        const hit = columnCache.get(lot.id, key);
        if (hit) return hit;
        const read = await pool.run('lotColumnBytes', { dbFile, lotId: lot.id }, { budgetMs });
        if (read) {
          const bytes = toBuffer(read.bytes);
          columnCache.set(lot.id, `${read.computedAt}:${read.count}`, read.count, bytes);
          return { count: read.count, bytes };
        }
      }
      const computed = await refresh(lot);
      return { count: computed.count, bytes: toBuffer(computed.columns!) };
    },
    /**
     * The items answer for the stored columns read (`stored`), compressed in `enc`: from memory, else from
     * lot_items_encoded, else made in the pool (the request waits for it). Null when none of that state can be had
     * (the pool busy, or the lot changed meanwhile): the route then sends the answer uncompressed.
     */
    async encodedItems(lotId: number, stored: { computedAt: number; count: number }, enc: ItemsEncoding): Promise<Buffer | null> {
      const key = itemsKey(sqlite, lotId, stored);
      const hit = encodedCache[enc].get(lotId, key);
      if (hit) return hit.bytes;
      const kept = readLotItemsEncoded(sqlite, lotId, key, enc);
      if (kept) {
        encodedCache[enc].set(lotId, key, stored.count, kept);
        return kept;
      }
      let made: EncodedItems | null;
      try {
        made = await encode(lotId);
      } catch (err) {
        if (err instanceof HttpError && err.status === 503) return null;
        throw err;
      }
      if (!made || made.key !== key) return null;
      const bytes = { gzip: toBuffer(made.gzip), br: toBuffer(made.br) };
      encodedCache.gzip.set(lotId, key, stored.count, bytes.gzip);
      encodedCache.br.set(lotId, key, stored.count, bytes.br);
      return bytes[enc];
    },
    /** The items answer of another matching, computed and compressed for this request only. */
    async freshItemsEncoded(lot: LotRow, matching: { matchPct?: number; setSize?: number }, enc: ItemsEncoding): Promise<Buffer> {
      return toBuffer(await pool.run('lotFreshItemsEncoded', { dbFile, lot, matching, encoding: enc }, { budgetMs }));
    },
    /** Another matching, computed for this request only. */
    fresh(lot: LotRow, matching: { matchPct?: number; setSize?: number }, part: 'detail' | 'columns'): Promise<StoredLotResults> {
      return pool.run('lotFreshResults', { dbFile, lot, matching, part }, { budgetMs });
    },
  };
}

/** The bytes a worker sent (a Uint8Array once across the thread boundary), as a Buffer without a copy. */
function toBuffer(a: Uint8Array): Buffer {
  return Buffer.from(a.buffer, a.byteOffset, a.byteLength);
}
