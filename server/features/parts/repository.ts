import { and, desc, eq, like, or, type SQL } from 'drizzle-orm';
import type { DbLike } from '@server/db/client';
import { parts, partStatusEvents } from '@server/db/schema';
import type { PartListQuery } from '@shared/schemas/parts';

export type PartRow = typeof parts.$inferSelect;

export function listParts(db: DbLike, q: PartListQuery): PartRow[] {
  const where: SQL[] = [];
  if (q.kind) where.push(eq(parts.kind, q.kind));
  if (q.status) where.push(eq(parts.status, q.status));
  if (q.lotId) where.push(eq(parts.lotId, q.lotId));
  if (q.q) {
    const pattern = `%${q.q.replace(/[%_]/g, '')}%`;
    where.push(or(like(parts.label, pattern), like(parts.supplier, pattern), like(parts.tags, pattern), like(parts.marking, pattern))!);
  }
  return db
    .select()
    .from(parts)
    .where(where.length ? and(...where) : undefined)
    .orderBy(desc(parts.id))
    .limit(q.limit)
    .all();
}

export function findPart(db: DbLike, id: number): PartRow | undefined {
  return db.select().from(parts).where(eq(parts.id, id)).get();
}

export function findPartByLabel(db: DbLike, label: string): PartRow | undefined {
  return db.select().from(parts).where(eq(parts.label, label)).get();
}

/** Changes a part's status and keeps the change in its status history. */
export function setPartStatus(db: DbLike, part: PartRow, status: PartRow['status'], reason: string | null, userId: string | null): void {
  if (part.status === status && part.statusReason === reason) return;
  db.update(parts).set({ status, statusReason: reason, updatedAt: Date.now() }).where(eq(parts.id, part.id)).run();
  db.insert(partStatusEvents).values({ partId: part.id, fromStatus: part.status, toStatus: status, reason, userId }).run();
}
