// Which lot items were promoted to parts: the part id for each item (by its lot link), or null.
import { and, eq, isNotNull } from 'drizzle-orm';
import type Database from 'better-sqlite3';
import type { DbLike } from '@server/db/client';
import { parts } from '@server/db/schema';

export function itemPartIds(db: DbLike, lotId: number, items: readonly string[]): (number | null)[] {
  const byItem = new Map<string, number>();
  for (const p of db
    .select({ id: parts.id, item: parts.lotItem })
    .from(parts)
    .where(and(eq(parts.lotId, lotId), isNotNull(parts.lotItem)))
    .all())
    byItem.set(p.item!, p.id);
  return items.map((item) => byItem.get(item) ?? null);
}

/** lotItemPartIds as JSON text; for a lot none of whose items became parts, without building the array. */
export function lotItemPartIdsJson(db: DbLike, sqlite: Database.Database, lotId: number, count: number): string {
  if (!anyPromoted(db, lotId)) return count === 0 ? '[]' : `[${'null,'.repeat(count - 1)}null]`;
  return JSON.stringify(lotItemPartIds(db, sqlite, lotId, count));
}

function anyPromoted(db: DbLike, lotId: number): boolean {
  return !!db
    .select({ id: parts.id })
    .from(parts)
    .where(and(eq(parts.lotId, lotId), isNotNull(parts.lotItem)))
    .limit(1)
    .get();
}

/** itemPartIds for the lot's readings in upload order; reads the item names only when some item became a part. */
export function lotItemPartIds(db: DbLike, sqlite: Database.Database, lotId: number, count: number): (number | null)[] {
  if (!anyPromoted(db, lotId)) return new Array<null>(count).fill(null);
  const items = sqlite.prepare('select item from lot_readings where lot_id = ? order by id').pluck().all(lotId) as string[];
  return itemPartIds(db, lotId, items);
}
