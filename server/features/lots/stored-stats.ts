// A lot's statistics, matched sets and per-item columns, computed once when its readings change and
// kept (lot_stats; the columns in lot_stats_columns), so the detail and items routes send stored JSON instead of recomputing
// (a 100,000-item lot costs ~150–230 ms of statistics and matched sets per read otherwise).
// The row is deleted in the transaction that changes the readings (an upload or a replace) and
// computed again right after it commits; a lot without a row (one from before the table existed),
// a row of another engine version, or one computed against other limits, is computed on its next read.
import type Database from 'better-sqlite3';
import { statement } from '@server/db/statements';
import { workerWrite } from '@server/db/write-turns';
import { ANALYSIS_ENGINE_VERSION } from '@shared/analysis/engine-version';
import { lotStats, lotValues, type LotRow, type LotValues } from './repository';

/** The detail route lists this many matched sets and counts them all. */
export const MAX_LISTED_SETS = 200;
/** The matching the lot page asks for when it gives none (the routes' defaults). */
export const DEFAULT_MATCHING = { matchPct: 1, setSize: 2 } as const;

export interface LotResults {
  count: number;
  /** The detail route's `stats` (null for a lot without readings). */
  stats: object | null;
  /** The items route's columns, all but partIds (read fresh: promotion changes them, not the readings). */
  columns: Record<string, unknown[]>;
}

/** Statistics and the items' columns of a lot's readings, as the detail and items routes send them. */
export function lotResults(lot: LotRow, data: LotValues, matching: { matchPct?: number; setSize?: number } = {}): LotResults {
  const stats = lotStats(lot, data, { ...matching, withBinIndices: true });
  const n = data.values.length;
  const bin = new Int32Array(n).fill(-1);
  stats?.bins.forEach((b, bi) => b.indices?.forEach((i) => (bin[i] = bi)));
  const set = new Int32Array(n).fill(-1);
  stats?.matchedSets.forEach((s, si) => s.indices.forEach((i) => (set[i] = si)));
  const outlier = new Uint8Array(n);
  stats?.outliers.indices.forEach((i) => (outlier[i] = 1));
  const secondFail = new Uint8Array(n);
  stats?.secondFailures?.forEach((i) => (secondFail[i] = 1));
  return {
    count: n,
    // The first sets only (a 100,000-item lot has ~50,000 pairs); the items route carries every item's set.
    // Bin indices stay out of the detail: the items route's `bin` column carries them.
    stats: stats && {
      ...stats,
      bins: stats.bins.map(({ indices: _, ...b }) => b),
      deviationsPct: undefined,
      matchedSets: stats.matchedSets.slice(0, MAX_LISTED_SETS),
      matchedSetCount: stats.matchedSets.length,
    },
    columns: {
      ids: Array.from(data.ids),
      items: data.items,
      values: Array.from(data.values),
      second: Array.from(data.second, (v) => (Number.isNaN(v) ? null : v)),
      deviationsPct: stats ? Array.from(stats.deviationsPct) : [],
      bin: Array.from(bin),
      set: Array.from(set),
      outlier: Array.from(outlier),
      secondFail: Array.from(secondFail),
    },
  };
}

/**
 * The stored results as JSON text: `stats` (or "null"), and the columns object as UTF-8 bytes when they
 * were asked for (~9 MB for 100,000 items: bytes cross from a worker without a copy, a string would not).
 */
export interface StoredLotResults {
  count: number;
  statsJson: string;
  columns: Uint8Array | null;
}

interface Row {
  engine_version: string;
  nominal: number;
  tolerance_pct: number;
  tolerance_plus_pct: number | null;
  second_limit: number | null;
  count: number;
  detail: string;
  columns: string;
}

/**
 * Forget a lot's stored results (the statistics, the items' columns and the compressed items answer);
 * call inside the transaction that changes its readings.
 */
export function invalidateLotStats(sqlite: Database.Database, lotId: number): void {
  for (const table of ['lot_items_encoded', 'lot_stats_columns', 'lot_stats'])
    statement(sqlite, `delete from ${table} where lot_id = ?`).run(lotId);
}

/** What identifies a lot's readings: an upload or a replace changes the count or the last row id. */
export function readingsMark(sqlite: Database.Database, lotId: number): string {
  const r = sqlite.prepare('select count(*) as n, coalesce(max(id), 0) as last from lot_readings where lot_id = ?').get(lotId) as {
    n: number;
    last: number;
  };
  return `${r.n}:${r.last}`;
}

/**
 * Compute a lot's results with the default matching from its stored readings and keep them. This runs
 * in a pool worker (server/pool/tasks.ts) on the worker's own connection, beside the main thread's
 * writes: the results are kept only when the readings are still those they were computed from
 * (`kept: false` when an upload or a replace committed meanwhile; its own refresh follows).
 */
export function refreshLotStats(sqlite: Database.Database, lot: LotRow): StoredLotResults & { kept: boolean } {
  const read = sqlite.transaction(() => ({ mark: readingsMark(sqlite, lot.id), data: lotValues(sqlite, lot.id) }))();
  const results = lotResults(lot, read.data, DEFAULT_MATCHING);
  const columnsJson = JSON.stringify(results.columns);
  const stored = { count: results.count, statsJson: JSON.stringify(results.stats), columns: new TextEncoder().encode(columnsJson) };
  const kept = workerWrite(() =>
    sqlite
      .transaction(() => {
        if (readingsMark(sqlite, lot.id) !== read.mark) return false;
        sqlite
          .prepare(
            `insert into lot_stats (lot_id, engine_version, nominal, tolerance_pct, tolerance_plus_pct, second_limit, count, detail, computed_at)
       values (?, ?, ?, ?, ?, ?, ?, ?, ?)
       on conflict (lot_id) do update set engine_version = excluded.engine_version, nominal = excluded.nominal,
         tolerance_pct = excluded.tolerance_pct, tolerance_plus_pct = excluded.tolerance_plus_pct, second_limit = excluded.second_limit, count = excluded.count,
         detail = excluded.detail, computed_at = excluded.computed_at`,
          )
          .run(
            lot.id,
            ANALYSIS_ENGINE_VERSION,
            lot.nominal,
            lot.tolerancePct,
            lot.tolerancePlusPct ?? lot.tolerancePct,
            lot.secondLimit,
            stored.count,
            stored.statsJson,
            Date.now(),
          );
        sqlite
          .prepare(
            'insert into lot_stats_columns (lot_id, columns) values (?, ?) on conflict (lot_id) do update set columns = excluded.columns',
          )
          .run(lot.id, columnsJson);
        // The compressed copy described the results replaced here.
        sqlite.prepare('delete from lot_items_encoded where lot_id = ?').run(lot.id);
        return true;
      })
      .immediate(),
  );
  return { ...stored, kept };
}

/**
 * The lot's stored results when they are there and up to date (engine version and limits), else null
 * (the caller has them computed in the pool: `refreshLotStats`). `part` says which JSON text to read
 * (the columns are ~9 MB for 100,000 items; the detail needs none of them); the columns come back null for the detail.
 */
export function readStoredLotStats(sqlite: Database.Database, lot: LotRow, part: 'detail' | 'columns'): StoredLotResults | null {
  const row = statement(
    sqlite,
    part === 'detail'
      ? "select engine_version, nominal, tolerance_pct, tolerance_plus_pct, second_limit, count, detail, '' as columns from lot_stats where lot_id = ?"
      : `select s.engine_version, s.nominal, s.tolerance_pct, s.tolerance_plus_pct, s.second_limit, s.count, '' as detail, cast(c.columns as blob) as columns
         from lot_stats s join lot_stats_columns c on c.lot_id = s.lot_id where s.lot_id = ?`,
  ).get(lot.id) as Row | undefined;
  if (
    row &&
    row.engine_version === ANALYSIS_ENGINE_VERSION &&
    row.nominal === lot.nominal &&
    row.tolerance_pct === lot.tolerancePct &&
    (row.tolerance_plus_pct ?? row.tolerance_pct) === (lot.tolerancePlusPct ?? lot.tolerancePct) &&
    row.second_limit === lot.secondLimit
  ) {
    return { count: row.count, statsJson: row.detail, columns: part === 'columns' ? (row.columns as unknown as Buffer) : null };
  }
  return null;
}

/** Bytes of stored item columns kept in memory by lot: reading 9 MB out of SQLite costs more than sending it. */
export class ColumnCache {
  private readonly entries = new Map<number, { key: string; count: number; bytes: Buffer }>();
  private size = 0;
  constructor(private readonly maxBytes = 64 * 1024 * 1024) {}

  get(lotId: number, key: string) {
    const hit = this.entries.get(lotId);
    if (!hit || hit.key !== key) return undefined;
    // most recently used last
    this.entries.delete(lotId);
    this.entries.set(lotId, hit);
    return hit;
  }

  set(lotId: number, key: string, count: number, bytes: Buffer) {
    this.drop(lotId);
    if (bytes.length > this.maxBytes) return;
    this.entries.set(lotId, { key, count, bytes });
    this.size += bytes.length;
    for (const [id] of this.entries) {
      if (this.size <= this.maxBytes) break;
      this.drop(id);
    }
  }

  private drop(lotId: number) {
    const old = this.entries.get(lotId);
    if (old) this.size -= old.bytes.length;
    this.entries.delete(lotId);
  }
}

/** The stored item columns' state (when they were computed, how many items), when up to date; else null. */
export function readStoredColumnsState(sqlite: Database.Database, lot: LotRow): { count: number; computedAt: number } | null {
  const row = statement(
    sqlite,
    'select engine_version, nominal, tolerance_pct, second_limit, count, computed_at from lot_stats where lot_id = ?',
  ).get(lot.id) as (Omit<Row, 'columns' | 'detail'> & { computed_at: number }) | undefined;
  if (
    !row ||
    row.engine_version !== ANALYSIS_ENGINE_VERSION ||
    row.nominal !== lot.nominal ||
    row.tolerance_pct !== lot.tolerancePct ||
    row.second_limit !== lot.secondLimit
  ) {
    return null;
  }
  return { count: row.count, computedAt: row.computed_at };
}

/** The stored item columns as the bytes of their JSON text, as kept (no string made of ~9 MB); null without a row. */
export function readColumnBytes(sqlite: Database.Database, lotId: number): { count: number; computedAt: number; bytes: Buffer } | null {
  const read = statement(
    sqlite,
    'select s.count, s.computed_at, cast(c.columns as blob) as columns from lot_stats s join lot_stats_columns c on c.lot_id = s.lot_id where s.lot_id = ?',
  ).get(lotId) as { count: number; computed_at: number; columns: Buffer } | undefined;
  return read ? { count: read.count, computedAt: read.computed_at, bytes: read.columns } : null;
}

/** True when a request asks for the default matching (so the stored results answer it). */
export function isDefaultMatching(query: { matchPct?: number; setSize?: number }): boolean {
  return (
    (query.matchPct ?? DEFAULT_MATCHING.matchPct) === DEFAULT_MATCHING.matchPct &&
    (query.setSize ?? DEFAULT_MATCHING.setSize) === DEFAULT_MATCHING.setSize
  );
}
