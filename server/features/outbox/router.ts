import { desc } from 'drizzle-orm';
import type { AppContext } from '@server/context';
import { auditLog, outbox } from '@server/db/schema';
import { ApiRouter } from '@server/http/router';

export function outboxRoutes(ctx: AppContext) {
  const api = new ApiRouter('/api');
  api.get('/outbox', {
    handle: () => ({ messages: ctx.db.select().from(outbox).orderBy(desc(outbox.id)).limit(200).all() }),
  });
  api.get('/audit', {
    handle: () => ({ entries: ctx.db.select().from(auditLog).orderBy(desc(auditLog.id)).limit(500).all() }),
  });
  return api;
}
