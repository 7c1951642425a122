// Who watches a lot: qa and admin choose any member; a tech may only add or remove themself.
// Watchers get an e-mail when a disposition is recorded and when the lot is reopened.
import { isNull } from 'drizzle-orm';
import type { AuthUser } from '@server/auth/session';
import type { AppContext } from '@server/context';
import type { DbLike } from '@server/db/client';
import { users } from '@server/db/schema';
import { forbidden } from '@server/http/errors';
import type { ApiRouter } from '@server/http/router';
import { roleCan } from '@shared/auth/capabilities';
import { lotWatcherRows, type LotRow } from './repository';

/** The members a watcher can be chosen from (active accounts), for the lot form and page. */
export function watcherCandidates(db: DbLike) {
  return db
    .select({ id: users.id, name: users.name, email: users.email, role: users.role })
    .from(users)
    .where(isNull(users.disabledAt))
    .orderBy(users.name)
    .all();
}

/** Refuses (403) a change of other members' watching by someone without the qa capability. */
export function assertWatcherChange(user: AuthUser, before: string[], after: string[]): void {
  if (roleCan(user.role, 'qa')) return;
  const a = new Set(before);
  const b = new Set(after);
  const changed = [...b].filter((id) => !a.has(id)).concat([...a].filter((id) => !b.has(id)));
  if (changed.some((id) => id !== user.id))
    throw forbidden('Only QA leads and admins choose other members as watchers; you may add or remove yourself.');
}

/** Tells the watchers that a lot was reopened, by whom and why. Returns how many were told. */
export async function notifyReopen(ctx: AppContext, lot: LotRow, user: AuthUser, reason: string): Promise<number> {
  const watchers = lotWatcherRows(ctx.db, lot.id);
  for (const w of watchers) {
    await ctx.mailer.send({
      to: w.email,
      topic: 'lot-reopen',
      subject: `Lot ${lot.code} reopened`,
      text:
        `Lot ${lot.code} was reopened by ${user.name}; it was ${lot.status}${lot.dispositionReason ? ` ("${lot.dispositionReason}")` : ''}.\n\n` +
        `Reason for reopening: ${reason}\n\n` +
        `The earlier disposition stays in the lot's history.\n\n` +
        `${ctx.config.publicUrl}/lots/${lot.id}\n`,
    });
  }
  return watchers.length;
}

export function registerWatcherRoutes(api: ApiRouter, ctx: AppContext): void {
  api.get('/watcher-candidates', { handle: () => ({ members: watcherCandidates(ctx.db) }) });
}
