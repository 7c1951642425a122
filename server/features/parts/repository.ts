import { and, desc, eq, like, or, sql, type SQL } from 'drizzle-orm';
import { conflict, HttpError } from '@server/http/errors';
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

/**
 * The part with this label, in any case (`pot-005` finds `POT-005`). Labels that differ only in
 * case may exist from before labels were compared without case; such a look-up is a 409 naming
 * every part it could mean, never a guess.
 */
export function findPartByLabel(db: DbLike, label: string): PartRow | undefined {
  const found = db
    .select()
    .from(parts)
    .where(sql`lower(${parts.label}) = lower(${label})`)
    .orderBy(parts.id)
    .all();
  if (found.length > 1) {
    throw new HttpError(
      409,
      'label_clash',
      `The label "${label}" names ${found.length} parts that differ only in case: ${found.map((p) => `${p.label} (id ${p.id})`).join(' and ')}. Rename one of them.`,
      undefined,
      {
        details: { parts: found.map((p) => ({ id: p.id, label: p.label })) },
      },
    );
  }
  return found[0];
}

/** Refuses (409) a label that another part holds already, in any case. */
export function assertLabelFree(db: DbLike, label: string, exceptId?: number): void {
  const holder = db
    .select({ id: parts.id, label: parts.label })
    .from(parts)
    .where(sql`lower(${parts.label}) = lower(${label})`)
    .all()
    .find((p) => p.id !== exceptId);
  if (holder)
    throw conflict(
      holder.label === label
        ? `A part labelled "${label}" exists already.`
        : `A part labelled "${holder.label}" exists already; labels are the same in any case.`,
    );
}

/** Labels held by more than one part when compared without case (from before the rule): each group with its parts. */
export function labelClashes(db: DbLike): { key: string; parts: { id: number; label: string }[] }[] {
  const rows = db
    .select({ id: parts.id, label: parts.label, key: sql<string>`lower(${parts.label})` })
    .from(parts)
    .where(sql`lower(${parts.label}) in (select lower(label) from parts group by lower(label) having count(*) > 1)`)
    .orderBy(sql`lower(${parts.label})`, parts.id)
    .all();
  const groups = new Map<string, { id: number; label: string }[]>();
  for (const r of rows) groups.set(r.key, [...(groups.get(r.key) ?? []), { id: r.id, label: r.label }]);
  return [...groups].map(([key, list]) => ({ key, parts: list }));
}

/** Changes a part's status and keeps the change in its status history. */
export function setPartStatus(db: DbLike, part: PartRow, status: PartRow['status'], reason: string | null, userId: string | null): void {
  if (part.status === status && part.statusReason === reason) return;
  db.update(parts).set({ status, statusReason: reason, updatedAt: Date.now() }).where(eq(parts.id, part.id)).run();
  db.insert(partStatusEvents).values({ partId: part.id, fromStatus: part.status, toStatus: status, reason, userId }).run();
}
