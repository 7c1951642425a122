// Compare (docs/screens.md, Compare): taper overlays of selected pots with group statistics, and saved
// comparisons (a named selection with its settings) that anyone can open and export and the
// owner (or qa/admin) can change.
import { desc, eq } from 'drizzle-orm';
import { audit } from '@server/audit';
import { mayChangeOwned } from '@server/auth/ownership';
import type { AppContext } from '@server/context';
import { comparisons, users } from '@server/db/schema';
import { acceptedEncoding, sendDownload, sendJsonBytes } from '@server/http/encoded';
import { forbidden, notFound } from '@server/http/errors';
import { ApiRouter } from '@server/http/router';
import { IdParamsSchema } from '@shared/schemas/common';
import {
  CompareTapersRequestSchema,
  ComparisonInputSchema,
  ComparisonUpdateSchema,
  GroupBySchema,
  type CompareSelection,
} from '@shared/schemas/compare';
import { compareCandidates } from './repository';

export function compareRoutes(ctx: AppContext) {
  const { db, sqlite, pool } = ctx;
  const engine = new ApiRouter('/api/compare');

  engine.get('/candidates', { handle: () => compareCandidates(db) });

  // In a worker (compute.ts): the selected pots' sweeps are read, compared, and the answer serialised and
  // compressed there (a few megabytes with 20,000-point sweeps); this thread only sends it.
  engine.post('/tapers', {
    schemas: { body: CompareTapersRequestSchema },
    handle: async ({ body, req, res }) => {
      const encoding = acceptedEncoding(req);
      const bytes = await pool.run('compareTapersJson', { dbFile: sqlite.name, request: body, encoding });
      await sendJsonBytes(res, bytes, encoding);
    },
  });

  const saved = new ApiRouter('/api/comparisons');
  const withOwner = () =>
    db
      .select({
        id: comparisons.id,
        name: comparisons.name,
        selection: comparisons.selection,
        settings: comparisons.settings,
        notes: comparisons.notes,
        ownerId: comparisons.ownerId,
        ownerName: users.name,
        createdAt: comparisons.createdAt,
        updatedAt: comparisons.updatedAt,
      })
      .from(comparisons)
      .leftJoin(users, eq(comparisons.ownerId, users.id));
  const mustFind = (id: number) => {
    const row = withOwner().where(eq(comparisons.id, id)).get();
    if (!row) throw notFound('That comparison');
    return row;
  };

  saved.get('/', { handle: () => ({ comparisons: withOwner().orderBy(desc(comparisons.id)).all() }) });
  saved.get('/:id', { schemas: { params: IdParamsSchema }, handle: ({ params }) => mustFind(params.id) });

  saved.post('/', {
    status: 201,
    schemas: { body: ComparisonInputSchema },
    handle: ({ body, user }) => {
      const id = db.transaction((tx) => {
        const row = tx
          .insert(comparisons)
          .values({
            name: body.name,
            selection: body.selection as Record<string, unknown>,
            settings: (body.settings ?? {}) as Record<string, unknown>,
            notes: body.notes || null,
            ownerId: user.id,
          })
          .returning()
          .get();
        audit(tx, { userId: user.id, action: 'comparison.create', entity: 'comparison', entityId: row.id, detail: { name: body.name } });
        return row.id;
      });
      return mustFind(id);
    },
  });

  saved.patch('/:id', {
    schemas: { params: IdParamsSchema, body: ComparisonUpdateSchema },
    handle: ({ params, body, user }) => {
      const before = mustFind(params.id);
      if (!mayChangeOwned(before.ownerId, user)) throw forbidden("Only the comparison's owner (or qa/admin) may change it.");
      db.transaction((tx) => {
        tx.update(comparisons)
          .set({
            ...(body.name !== undefined ? { name: body.name } : {}),
            ...(body.selection !== undefined ? { selection: body.selection as Record<string, unknown> } : {}),
            ...(body.settings !== undefined ? { settings: body.settings as Record<string, unknown> } : {}),
            ...(body.notes !== undefined ? { notes: body.notes || null } : {}),
            updatedAt: Date.now(),
          })
          .where(eq(comparisons.id, params.id))
          .run();
        audit(tx, {
          userId: user.id,
          action: 'comparison.update',
          entity: 'comparison',
          entityId: params.id,
          detail: { before: { name: before.name, selection: before.selection, settings: before.settings }, after: body },
        });
      });
      return mustFind(params.id);
    },
  });

  saved.delete('/:id', {
    schemas: { params: IdParamsSchema },
    handle: ({ params, user }) => {
      const before = mustFind(params.id);
      if (!mayChangeOwned(before.ownerId, user)) throw forbidden("Only the comparison's owner (or qa/admin) may delete it.");
      db.transaction((tx) => {
        tx.delete(comparisons).where(eq(comparisons.id, params.id)).run();
        audit(tx, {
          userId: user.id,
          action: 'comparison.delete',
          entity: 'comparison',
          entityId: params.id,
          detail: { name: before.name },
        });
      });
      return { ok: true };
    },
  });

  // The fitted parameters of the saved selection's pots, one row per pot (formula-escaped CSV), made in a
  // worker (compute.ts) from the fits alone.
  saved.get('/:id/export.csv', {
    schemas: { params: IdParamsSchema },
    handle: async ({ params, res }) => {
      const row = mustFind(params.id);
      const groupBy = GroupBySchema.catch('lot').parse((row.settings as { groupBy?: unknown } | null)?.groupBy);
      const bytes = await pool.run('comparisonCsv', {
        dbFile: sqlite.name,
        comparison: { id: row.id, name: row.name, selection: row.selection as CompareSelection },
        groupBy,
        exportedAt: Date.now(),
      });
      const safeName =
        row.name
          .replace(/[^A-Za-z0-9._-]+/g, '-')
          .replace(/^-+|-+$/g, '')
          .slice(0, 60) || `comparison-${row.id}`;
      await sendDownload(res, bytes, 'text/csv', `${safeName}.csv`);
      return undefined;
    },
  });

  return [engine, saved];
}
