import type { DbLike } from '@server/db/client';
import { auditLog } from '@server/db/schema';

export interface AuditEntry {
  userId: string | null;
  action: string;
  entity: string;
  entityId?: string | number | null;
  detail?: Record<string, unknown>;
}

/** Writes one audit row: who did what to which record. Call inside the same transaction as the change. */
export function audit(db: DbLike, entry: AuditEntry): void {
  db.insert(auditLog)
    .values({
      userId: entry.userId,
      action: entry.action,
      entity: entry.entity,
      entityId: entry.entityId == null ? null : String(entry.entityId),
      detail: entry.detail ?? null,
    })
    .run();
}
