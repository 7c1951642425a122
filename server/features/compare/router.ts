// Compare (docs/screens.md, Compare): taper overlays of selected pots with group statistics, and saved
// comparisons (a named selection with its settings) that anyone can open and export and the
// owner (or qa/admin) can change.
import { withConditions } from '@shared/csv/conditions';
import { desc, eq } from 'drizzle-orm';
import Papa from 'papaparse';
import { audit } from '@server/audit';
import { mayChangeOwned } from '@server/auth/ownership';
import type { AppContext } from '@server/context';
import { comparisons, users } from '@server/db/schema';
import { forbidden, notFound } from '@server/http/errors';
import { ApiRouter } from '@server/http/router';
import { compareTapers, groupOf } from '@shared/analysis/compare';
import { IdParamsSchema } from '@shared/schemas/common';
import {
  CompareTapersRequestSchema,
  ComparisonInputSchema,
  ComparisonUpdateSchema,
  GroupBySchema,
  type CompareSelection,
} from '@shared/schemas/compare';
import { compareCandidates, resolveSelection } from './repository';

const EXPORT_FIELDS = [
  'part',
  'group',
  'lot',
  'supplier',
  'nominal_ohm',
  'law',
  'm',
  'r2',
  'max_deviation_pct',
  'total_ohm',
  'total_deviation_pct',
  'end_resistance_start_ohm',
  'end_resistance_end_ohm',
];

export function compareRoutes(ctx: AppContext) {
  const { db } = ctx;
  const engine = new ApiRouter('/api/compare');

  engine.get('/candidates', { handle: () => compareCandidates(db) });

  engine.post('/tapers', {
    schemas: { body: CompareTapersRequestSchema },
    handle: ({ body }) => {
      const { pots, missing } = resolveSelection(db, body.selection);
      const result = compareTapers(pots, body.groupBy, body.gridPoints);
      return {
        groupBy: body.groupBy,
        grid: result.grid,
        pots: pots.map((p, i) => ({ ...p, group: groupOf(p, body.groupBy).key, gridCurve: result.gridCurves[i] })),
        groups: result.groups,
        missing,
      };
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

  // The fitted parameters of the saved selection's pots, one row per pot (formula-escaped CSV).
  saved.get('/:id/export.csv', {
    schemas: { params: IdParamsSchema },
    handle: ({ params, res }) => {
      const row = mustFind(params.id);
      const groupBy = GroupBySchema.catch('lot').parse((row.settings as { groupBy?: unknown } | null)?.groupBy);
      const { pots } = resolveSelection(db, row.selection as CompareSelection);
      const rows = pots.map((p) => ({
        part: p.label,
        group: groupOf(p, groupBy).label,
        lot: p.lotCode ?? '',
        supplier: p.supplier ?? '',
        nominal_ohm: p.nominal ?? '',
        law: p.fit.law,
        m: p.fit.m,
        r2: p.fit.r2,
        max_deviation_pct: p.fit.maxPct,
        total_ohm: p.fit.total,
        total_deviation_pct: p.fit.totalDeviationPct ?? '',
        end_resistance_start_ohm: p.fit.endResistance.start,
        end_resistance_end_ohm: p.fit.endResistance.end ?? '',
      }));
      const safeName =
        row.name
          .replace(/[^A-Za-z0-9._-]+/g, '-')
          .replace(/^-+|-+$/g, '')
          .slice(0, 60) || `comparison-${row.id}`;
      const conditions = withConditions(
        [
          { key: 'comparison', value: `${row.name} (#${row.id})` },
          { key: 'selection', value: JSON.stringify(row.selection ?? {}) },
          { key: 'grouped by', value: groupBy },
          { key: 'pots', value: pots.length },
          { key: 'exported', value: new Date().toISOString().replace(/\.\d{3}Z$/, 'Z') },
        ],
        `${Papa.unparse({ fields: EXPORT_FIELDS, data: rows }, { escapeFormulae: true, newline: '\n' })}\n`,
      );
      res.type('text/csv').attachment(`${safeName}.csv`).send(conditions);
      return undefined;
    },
  });

  return [engine, saved];
}
