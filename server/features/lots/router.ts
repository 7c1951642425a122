// The lot routes: list, create, detail, items, watchers and promotion here; the upload of readings,
// the CSV export and dispositions in their own modules (upload.ts, export.ts, disposition.ts).
import { eq, sql } from 'drizzle-orm';
import { audit } from '@server/audit';
import type { AppContext } from '@server/context';
import { instruments, lots, lotWatchers, users } from '@server/db/schema';
import { conflict, unprocessable } from '@server/http/errors';
import { acceptedEncoding, sendJsonBytes } from '@server/http/encoded';
import { ApiRouter } from '@server/http/router';
import { sendInSlices } from '@server/http/send-slices';
import { lotHistory } from './history';
import { itemsAnswerParts } from './items-encoded';
import { lotItemPartIdsJson } from './promoted';
import { assertWatcherChange, registerWatcherRoutes } from './watchers';
import { decodeMarking } from '@shared/markings/decode';
import { MarkingError } from '@shared/markings/tolerance-letters';
import { IdParamsSchema } from '@shared/schemas/common';
import {
  CreateLotInputSchema,
  lotNominalProblem,
  LotStatsQuerySchema,
  PromoteInputSchema,
  WatchersInputSchema,
  type LotDetail,
  type LotListRow,
} from '@shared/schemas/lots';
import { lotFinder, lotSummary, QUANTITY } from './common';
import { lotDispositionRoutes } from './disposition';
import { lotExportRoutes } from './export';
import { listLots, lotWatcherRows } from './repository';
import { lotStatsJobs } from './stats-jobs';
import { isDefaultMatching } from './stored-stats';
import { lotUploadRoutes } from './upload';

/** A promotion writes at most 1,000 parts with their readings (about two seconds): two of the pool's budgets. */
const PROMOTE_BUDGETS = 2;

export function lotRoutes(ctx: AppContext) {
  const { db, sqlite } = ctx;
  const api = new ApiRouter('/api/lots');
  /** Watchers must be members; the field names where the stranger was given. */
  const assertMembers = (ids: string[], field: string) => {
    const known = new Set(
      db
        .select({ id: users.id })
        .from(users)
        .all()
        .map((u) => u.id),
    );
    const stranger = ids.find((id) => !known.has(id));
    if (stranger) throw unprocessable('A watcher is not a member.', { [field]: `Unknown member ${stranger}.` });
  };
  const mustFind = lotFinder(ctx);
  const statsJobs = lotStatsJobs(ctx);

  registerWatcherRoutes(api, ctx);
  api.get('/', { handle: (): { lots: LotListRow[] } => ({ lots: listLots(db).map((l) => ({ ...lotSummary(l), count: l.count })) }) });

  api.post('/', {
    status: 201,
    schemas: { body: CreateLotInputSchema },
    handle: ({ body, user }) => {
      let { nominal, tolerancePct, tolerancePlusPct } = body;
      if (tolerancePct != null) tolerancePlusPct ??= tolerancePct;
      if (body.marking) {
        try {
          const decoded = decodeMarking(body.marking);
          nominal ??= decoded.nominal;
          const t = decoded.tolerance;
          // The marking's tolerance letter, both sides (Z: −20 %/+80 %, IEC 60062), unless one was typed.
          if (tolerancePct == null && t?.kind === 'percent') [tolerancePct, tolerancePlusPct] = [t.pct, t.pct];
          if (tolerancePct == null && t?.kind === 'asymmetric') [tolerancePct, tolerancePlusPct] = [t.minusPct, t.plusPct];
        } catch (err) {
          if (err instanceof MarkingError) throw unprocessable(err.message, { marking: err.message });
          throw err;
        }
      }
      if (tolerancePct == null)
        throw unprocessable('Give the tolerance, or a marking with a tolerance letter.', {
          tolerancePct: 'Required without a tolerance letter.',
        });
      const nominalOff = lotNominalProblem(body.kind, nominal!);
      if (nominalOff) throw unprocessable(`The marking's value is out of range: ${nominalOff}`, { marking: nominalOff });
      const code =
        body.code ??
        `LOT-${new Date().toISOString().slice(0, 10).replace(/-/g, '')}-${
          (db
            .select({ n: sql<number>`count(*)` })
            .from(lots)
            .get()?.n ?? 0) + 1
        }`;
      if (db.select().from(lots).where(eq(lots.code, code)).get()) throw conflict(`A lot with code ${code} exists already.`);
      assertMembers(body.watcherIds, 'watcherIds');
      assertWatcherChange(user, [], body.watcherIds);
      if (
        body.instrumentId != null &&
        !db.select({ id: instruments.id }).from(instruments).where(eq(instruments.id, body.instrumentId)).get()
      ) {
        throw unprocessable('That instrument does not exist.', { instrumentId: 'Unknown instrument.' });
      }
      return db.transaction((tx) => {
        const lot = tx
          .insert(lots)
          .values({
            code,
            kind: body.kind,
            quantity: QUANTITY[body.kind],
            nominal: nominal!,
            tolerancePct,
            tolerancePlusPct: tolerancePlusPct ?? tolerancePct,
            marking: body.marking ?? null,
            supplier: body.supplier ?? null,
            receivedOn: body.receivedOn ?? null,
            expectedCount: body.expectedCount ?? null,
            secondQuantity: body.secondQuantity ?? null,
            secondLimit: body.secondLimit ?? null,
            instrumentId: body.instrumentId ?? null,
            testFrequency: body.testFrequency ?? null,
            notes: body.notes ?? null,
            createdBy: user.id,
          })
          .returning()
          .get();
        for (const userId of new Set(body.watcherIds)) tx.insert(lotWatchers).values({ lotId: lot.id, userId }).run();
        audit(tx, {
          userId: user.id,
          action: 'lot.create',
          entity: 'lot',
          entityId: lot.id,
          detail: { ...body, nominal, tolerancePct, tolerancePlusPct },
        });
        return lotSummary(lot);
      });
    },
  });

  api.get('/:id', {
    schemas: { params: IdParamsSchema, query: LotStatsQuerySchema },
    handle: async ({ params, query, res }) => {
      const lot = mustFind(params.id);
      // The default matching is stored (stored-stats.ts); another matching is computed for this request.
      const results = isDefaultMatching(query) ? await statsJobs.stored(lot, 'detail') : await statsJobs.fresh(lot, query, 'detail');
      const disposedByName = lot.disposedBy
        ? (db.select({ name: users.name }).from(users).where(eq(users.id, lot.disposedBy)).get()?.name ?? null)
        : null;
      // Every field of LotDetail but `stats`, which is spliced in below as stored text.
      const head: Omit<LotDetail, 'stats'> = {
        ...lotSummary(lot),
        disposedByName,
        count: results.count,
        watchers: lotWatcherRows(db, lot.id),
        history: lotHistory(db, lot),
      };
      // The stored `stats` text goes in as it is, after the fields read now.
      res.type('json').send(`${JSON.stringify(head).slice(0, -1)},"stats":${results.statsJson}}`);
    },
  });

  // Every item with what the table needs, as columns (compact for 100,000 rows).
  api.get('/:id/items', {
    schemas: { params: IdParamsSchema, query: LotStatsQuerySchema },
    handle: async ({ params, query, req, res }) => {
      const lot = mustFind(params.id);
      const fresh = !isDefaultMatching(query);
      let state = fresh ? null : statsJobs.columnsState(lot);
      if (!fresh && !state) {
        await statsJobs.refresh(lot);
        state = statsJobs.columnsState(lot);
      }
      // The whole answer compressed once in the pool (items-encoded.ts), when the client takes brotli or gzip.
      const enc = acceptedEncoding(req);
      if (enc && (state || fresh)) {
        // The stored state's copy, or (another matching) one made for this request.
        const encoded = state ? await statsJobs.encodedItems(lot.id, state, enc) : await statsJobs.freshItemsEncoded(lot, query, enc);
        if (encoded) {
          await sendJsonBytes(res, encoded, enc);
          return;
        }
        // None to be had now: the answer goes out uncompressed rather than compressed on this thread.
        res.setHeader('Cache-Control', 'no-transform');
      }
      // The stored columns' bytes go out as they are kept (no 9 MB string parsed, built or hashed for an ETag).
      const { count, bytes: columns } = fresh
        ? await statsJobs
            .fresh(lot, query, 'columns')
            .then((r) => ({ count: r.count, bytes: Buffer.from(r.columns!.buffer, r.columns!.byteOffset, r.columns!.byteLength) }))
        : await statsJobs.columnBytes(lot, state);
      // Which items became parts is read on every request: a promotion changes it, not the readings.
      // The answer is a LotItems (shared/schemas/lots.ts): partIds, then the stored columns.
      const partIdsJson = lotItemPartIdsJson(db, sqlite, lot.id, count);
      // The columns object, with partIds put in front of its first key.
      const [head, rest] = itemsAnswerParts(partIdsJson, columns);
      res
        .status(200)
        .type('json')
        .setHeader('Content-Length', head.length + rest.length);
      await sendInSlices(res, [head, rest]);
    },
  });

  api.put('/:id/watchers', {
    schemas: { params: IdParamsSchema, body: WatchersInputSchema },
    handle: ({ params, body, user }) => {
      const lot = mustFind(params.id);
      assertMembers(body.userIds, 'userIds');
      assertWatcherChange(
        user,
        lotWatcherRows(db, lot.id).map((w) => w.id),
        body.userIds,
      );
      db.transaction((tx) => {
        tx.delete(lotWatchers).where(eq(lotWatchers.lotId, lot.id)).run();
        for (const userId of new Set(body.userIds)) tx.insert(lotWatchers).values({ lotId: lot.id, userId }).run();
        audit(tx, { userId: user.id, action: 'lot.watchers', entity: 'lot', entityId: lot.id, detail: { userIds: body.userIds } });
      });
      return { watchers: lotWatcherRows(db, lot.id) };
    },
  });

  lotUploadRoutes(api, ctx, statsJobs);
  lotDispositionRoutes(api, ctx);
  lotExportRoutes(api, ctx);

  api.post('/:id/promote', {
    status: 201,
    schemas: { params: IdParamsSchema, body: PromoteInputSchema },
    // In the pool (promote.ts); its writes are bounded by 1,000 items: two of the pool's budgets.
    handle: async ({ params, body, user }) => {
      const lot = mustFind(params.id);
      return ctx.pool.run(
        'lotPromote',
        { dbFile: sqlite.name, lot, input: body, userId: user.id },
        { budgetMs: ctx.pool.options.budgetMs * PROMOTE_BUDGETS },
      );
    },
  });

  return api;
}
