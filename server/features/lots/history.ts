// A lot's history, oldest first: its creation, each readings upload (file, rows, who), each
// disposition and each reopen with who, when and the reason. Read from the audit log, which is
// append-only, so a reopen (which clears the lot's current disposition) loses nothing.
import { and, asc, eq, inArray } from 'drizzle-orm';
import type { DbLike } from '@server/db/client';
import { auditLog, users } from '@server/db/schema';
import type { LotHistoryEvent, LotHistoryKind } from '@shared/schemas/lots';
import type { LotRow } from './repository';

export type { LotHistoryEvent, LotHistoryKind } from '@shared/schemas/lots';

const KIND: Record<string, LotHistoryKind> = {
  'lot.create': 'created',
  'lot.readings-uploaded': 'upload',
  'lot.readings-replaced': 'upload',
  'lot.disposition': 'disposition',
  'lot.reopen': 'reopen',
  'lot.watchers': 'watchers',
  'lot.promote': 'promote',
};

export function lotHistory(db: DbLike, lot: Pick<LotRow, 'id' | 'createdAt' | 'createdBy'>): LotHistoryEvent[] {
  const lotId = lot.id;
  const rows = db
    .select({ id: auditLog.id, action: auditLog.action, at: auditLog.at, detail: auditLog.detail, by: users.name })
    .from(auditLog)
    .leftJoin(users, eq(auditLog.userId, users.id))
    .where(and(eq(auditLog.entity, 'lot'), eq(auditLog.entityId, String(lotId)), inArray(auditLog.action, Object.keys(KIND))))
    .orderBy(asc(auditLog.at), asc(auditLog.id))
    .all();
  const events = rows.map((r): LotHistoryEvent => {
    const d = (r.detail ?? {}) as Record<string, unknown>;
    const kind = KIND[r.action]!;
    const base: LotHistoryEvent = { kind, at: r.at, by: r.by ?? null };
    switch (kind) {
      case 'upload':
        return {
          ...base,
          file: typeof d.file === 'string' ? d.file : undefined,
          rows: typeof d.rows === 'number' ? d.rows : undefined,
          replaced: r.action === 'lot.readings-replaced',
        };
      case 'disposition':
        return { ...base, status: String(d.status ?? ''), reason: typeof d.reason === 'string' ? d.reason : undefined };
      case 'reopen':
        return { ...base, was: typeof d.was === 'string' ? d.was : undefined, reason: typeof d.reason === 'string' ? d.reason : undefined };
      case 'promote':
        return { ...base, parts: typeof d.parts === 'number' ? d.parts : undefined };
      default:
        return base;
    }
  });
  // Lots made before their creation was audited (the demo seed) still start with their creation.
  if (!events.some((e) => e.kind === 'created')) {
    const by = lot.createdBy ? (db.select({ name: users.name }).from(users).where(eq(users.id, lot.createdBy)).get()?.name ?? null) : null;
    events.unshift({ kind: 'created', at: lot.createdAt, by });
  }
  return events;
}
