import type Database from 'better-sqlite3';
import { eq, sql } from 'drizzle-orm';
import type { DbLike } from '@server/db/client';
import { preparedPer } from '@server/db/statements';
import { lots, lotWatchers, users } from '@server/db/schema';
import { lotStatistics, type LotStatistics } from '@shared/analysis/lot-stats';

export type LotRow = typeof lots.$inferSelect;

const lotById = preparedPer((db: DbLike) =>
  db
    .select()
    .from(lots)
    .where(eq(lots.id, sql.placeholder('id')))
    .prepare(),
);

export function findLot(db: DbLike, id: number): LotRow | undefined {
  return lotById(db).get({ id });
}

/** Every lot, newest first, with its readings' count as stored beside it (no count over lot_readings per request). */
const allLots = preparedPer((db: DbLike) =>
  db
    .select()
    .from(lots)
    .orderBy(sql`${lots.id} desc`)
    .prepare(),
);

export function listLots(db: DbLike) {
  return allLots(db)
    .all()
    .map((lot) => ({ ...lot, count: lot.readingCount }));
}

export function lotWatcherRows(db: DbLike, lotId: number) {
  return db
    .select({ id: users.id, email: users.email, name: users.name })
    .from(lotWatchers)
    .innerJoin(users, eq(lotWatchers.userId, users.id))
    .where(eq(lotWatchers.lotId, lotId))
    .all();
}

export interface LotValues {
  ids: Float64Array;
  items: string[];
  values: Float64Array;
  second: Float64Array;
}

/** The lot's readings as columns, in upload order (raw statement: 100,000 rows without row objects per column). */
export function lotValues(sqlite: Database.Database, lotId: number): LotValues {
  const rows = sqlite
    .prepare('select id, item, value, second_value from lot_readings where lot_id = ? order by id')
    .raw(true)
    .all(lotId) as [number, string, number, number | null][];
  const n = rows.length;
  const out: LotValues = {
    ids: new Float64Array(n),
    items: new Array<string>(n),
    values: new Float64Array(n),
    second: new Float64Array(n),
  };
  for (let i = 0; i < n; i++) {
    const r = rows[i]!;
    out.ids[i] = r[0];
    out.items[i] = r[1];
    out.values[i] = r[2];
    out.second[i] = r[3] ?? NaN;
  }
  return out;
}

/**
 * Statistics of a lot's readings by the measurement engine (the same as POST /api/analysis/lot).
 * Matched sets cost a sort with indices; `sets: false` leaves them out where nobody shows them.
 */
export function lotStats(
  lot: LotRow,
  data: Pick<LotValues, 'values' | 'second'>,
  opts: { matchPct?: number; setSize?: number; withBinIndices?: boolean; sets?: boolean } = {},
): LotStatistics | null {
  if (data.values.length === 0) return null;
  const hasSecond = lot.secondLimit != null && data.second.some((v) => !Number.isNaN(v));
  return lotStatistics({
    values: data.values,
    nominal: lot.nominal,
    tolerancePct: lot.tolerancePct,
    tolerancePlusPct: lot.tolerancePlusPct ?? lot.tolerancePct,
    ...(hasSecond ? { second: { values: data.second.map((v) => (Number.isNaN(v) ? 0 : v)), max: lot.secondLimit! } } : {}),
    ...(opts.sets === false ? {} : { matchPct: opts.matchPct ?? 1, setSize: opts.setSize ?? 2 }),
    withBinIndices: opts.withBinIndices ?? false,
  });
}
