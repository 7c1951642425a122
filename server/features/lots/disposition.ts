// Recording a lot's disposition (with the watchers' e-mails) and reopening a disposed lot.
import { toleranceWords } from '@shared/analysis/tolerance';
import { and, eq } from 'drizzle-orm';
import { audit } from '@server/audit';
import type { AppContext } from '@server/context';
import { lots } from '@server/db/schema';
import { conflict } from '@server/http/errors';
import type { ApiRouter } from '@server/http/router';
import { IdParamsSchema } from '@shared/schemas/common';
import { DispositionInputSchema, ReopenInputSchema, type LotStats } from '@shared/schemas/lots';
import { formatValue } from '@shared/units/format';
import { lotFinder, lotKind, lotSummary, UNIT } from './common';
import { lotWatcherRows } from './repository';
import { lotStatsJobs } from './stats-jobs';
import { notifyReopen } from './watchers';

export function lotDispositionRoutes(api: ApiRouter, ctx: AppContext) {
  const { db } = ctx;
  const mustFind = lotFinder(ctx);
  const statsJobs = lotStatsJobs(ctx);

  api.post('/:id/disposition', {
    schemas: { params: IdParamsSchema, body: DispositionInputSchema },
    handle: async ({ params, body, user }) => {
      const lot = mustFind(params.id);
      if (lot.status !== 'open') throw conflict(`The lot was ${lot.status} already; an admin must reopen it first.`);
      // The stored statistics (computed in the pool when missing), not a 100,000-item computation here.
      const stored = await statsJobs.stored(lot, 'detail');
      const stats = JSON.parse(stored.statsJson) as LotStats | null;
      if (stored.count === 0 || !stats) throw conflict('The lot has no readings yet.');
      await ctx.writeTurns.take();
      db.transaction((tx) => {
        // Still open: another disposition may have come first while the statistics were read.
        const changed = tx
          .update(lots)
          .set({ status: body.status, dispositionReason: body.reason, disposedBy: user.id, disposedAt: Date.now() })
          .where(and(eq(lots.id, lot.id), eq(lots.status, 'open')))
          .run();
        if (changed.changes !== 1) throw conflict('The lot was disposed meanwhile; an admin must reopen it first.');
        audit(tx, {
          userId: user.id,
          action: 'lot.disposition',
          entity: 'lot',
          entityId: lot.id,
          detail: { status: body.status, reason: body.reason, n: stats.n, cpk: stats.cpk },
        });
      });
      const unit = UNIT[lotKind(lot)];
      const watchers = lotWatcherRows(db, lot.id);
      for (const w of watchers) {
        await ctx.mailer.send({
          to: w.email,
          topic: 'lot-disposition',
          subject: `Lot ${lot.code} ${body.status}`,
          text:
            `Lot ${lot.code} (${lot.kind}, ${formatValue(lot.nominal, unit)} ${toleranceWords(lot.tolerancePct, lot.tolerancePlusPct)}${lot.supplier ? `, from ${lot.supplier}` : ''}) was ${body.status} by ${user.name}.\n\n` +
            `Reason: ${body.reason}\n\n` +
            `n = ${stats.n}, mean ${formatValue(stats.mean, unit)}, SD ${formatValue(stats.sd, unit)}, Cpk ${stats.cpk?.toFixed(2) ?? '—'}${stats.asymmetric ? ' (limits not symmetric about nominal: Cpk from the mean to the nearer limit)' : ''}; ` +
            `${stats.countBelow + stats.countAbove} outside the tolerance, ${stats.outliers.indices.length} outliers.\n\n` +
            `${ctx.config.publicUrl}/lots/${lot.id}\n`,
        });
      }
      return { lot: lotSummary(mustFind(lot.id)), notified: watchers.length };
    },
  });

  api.post('/:id/reopen', {
    schemas: { params: IdParamsSchema, body: ReopenInputSchema },
    handle: async ({ params, body, user }) => {
      const lot = mustFind(params.id);
      if (lot.status === 'open') throw conflict('The lot is open already.');
      db.transaction((tx) => {
        tx.update(lots)
          .set({ status: 'open', dispositionReason: null, disposedBy: null, disposedAt: null })
          .where(eq(lots.id, lot.id))
          .run();
        audit(tx, {
          userId: user.id,
          action: 'lot.reopen',
          entity: 'lot',
          entityId: lot.id,
          detail: { was: lot.status, previousReason: lot.dispositionReason, reason: body.reason },
        });
      });
      const notified = await notifyReopen(ctx, lot, user, body.reason);
      return { lot: lotSummary(mustFind(lot.id)), notified };
    },
  });
}
