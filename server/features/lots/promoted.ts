// Which lot items were promoted to parts: the part id for each item (by its lot link), or null.
import { and, eq, isNotNull } from 'drizzle-orm';
import type { DbLike } from '@server/db/client';
import { parts } from '@server/db/schema';

export function itemPartIds(db: DbLike, lotId: number, items: readonly string[]): (number | null)[] {
  const byItem = new Map<string, number>();
  for (const p of db.select({ id: parts.id, item: parts.lotItem }).from(parts).where(and(eq(parts.lotId, lotId), isNotNull(parts.lotItem))).all()) byItem.set(p.item!, p.id);
  return items.map((item) => byItem.get(item) ?? null);
}
