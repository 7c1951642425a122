import fs from 'node:fs';
import path from 'node:path';
import { eq, sql } from 'drizzle-orm';
import multer from 'multer';
import Papa from 'papaparse';
import { z } from 'zod';
import { audit } from '@server/audit';
import type { AppContext } from '@server/context';
import { instruments, lots, lotWatchers, users } from '@server/db/schema';
import { conflict, HttpError, notFound, unprocessable } from '@server/http/errors';
import { ApiRouter } from '@server/http/router';
import { lotHistory } from './history';
import { itemPartIds } from './promoted';
import { assertWatcherChange, notifyReopen, registerWatcherRoutes } from './watchers';
import { fileRefused } from '@server/uploads/refusal';
import { contentPath } from '@server/uploads/store';
import { decodeMarking } from '@shared/markings/decode';
import { MarkingError } from '@shared/markings/tolerance-letters';
import { IdParamsSchema } from '@shared/schemas/common';
import { LOT_KINDS, CreateLotInputSchema, DispositionInputSchema, LotStatsQuerySchema, PromoteInputSchema, ReopenInputSchema, WatchersInputSchema } from '@shared/schemas/lots';
import { MappingFieldSchema } from '@shared/schemas/sweeps';
import { formatValue } from '@shared/units/format';
import { findLot, listLots, lotStats, lotValues, lotWatcherRows, type LotRow } from './repository';
import { readLotFile } from './read-upload';
import { promoteToParts } from './promote';

const MAX_LOT_BYTES = 25 * 1024 * 1024;
const MAX_LISTED_SETS = 200;
type LotKind = (typeof LOT_KINDS)[number];
const UNIT: Record<LotKind, string> = { capacitor: 'F', pot: 'Ω', resistor: 'Ω' };
const QUANTITY = { capacitor: 'capacitance', pot: 'resistance', resistor: 'resistance' } as const satisfies Record<LotKind, string>;
/** Lots hold capacitors, pots or resistors only (the lot kinds of shared/schemas/lots.ts). */
const lotKind = (lot: LotRow) => lot.kind as LotKind;

const UploadFields = z.object({
  replace: z.enum(['true', 'false']).default('false').transform((v) => v === 'true'),
  mapping: MappingFieldSchema.optional(),
});

function lotSummary(lot: LotRow) {
  return { ...lot, unit: UNIT[lotKind(lot)] };
}

export function lotRoutes(ctx: AppContext) {
  const { db, sqlite } = ctx;
  const api = new ApiRouter('/api/lots');
  const tmpDir = path.join(ctx.config.uploadsDir, 'incoming');
  fs.mkdirSync(tmpDir, { recursive: true });
  // Lot files go to a temporary file on disk and are read back as a stream.
  const lotUpload = multer({ dest: tmpDir, limits: { fileSize: MAX_LOT_BYTES, files: 1, fields: 10, parts: 12 } }).single('file');
  /** Watchers must be members; the field names where the stranger was given. */
  const assertMembers = (ids: string[], field: string) => {
    const known = new Set(db.select({ id: users.id }).from(users).all().map((u) => u.id));
    const stranger = ids.find((id) => !known.has(id));
    if (stranger) throw unprocessable('A watcher is not a member.', { [field]: `Unknown member ${stranger}.` });
  };
  const mustFind = (id: number) => {
    const lot = findLot(db, id);
    if (!lot) throw notFound('That lot');
    return lot;
  };

  registerWatcherRoutes(api, ctx);
  api.get('/', { handle: () => ({ lots: listLots(db).map((l) => ({ ...lotSummary(l), count: l.count })) }) });

  api.post('/', {
    status: 201,
    schemas: { body: CreateLotInputSchema },
    handle: ({ body, user }) => {
      let { nominal, tolerancePct } = body;
      if (body.marking) {
        try {
          const decoded = decodeMarking(body.marking);
          nominal ??= decoded.nominal;
          tolerancePct ??= decoded.tolerancePct ?? undefined;
        } catch (err) {
          if (err instanceof MarkingError) throw unprocessable(err.message, { marking: err.message });
          throw err;
        }
      }
      if (tolerancePct == null) throw unprocessable('Give the tolerance, or a marking with a tolerance letter.', { tolerancePct: 'Required without a tolerance letter.' });
      const code = body.code ?? `LOT-${new Date().toISOString().slice(0, 10).replace(/-/g, '')}-${(db.select({ n: sql<number>`count(*)` }).from(lots).get()?.n ?? 0) + 1}`;
      if (db.select().from(lots).where(eq(lots.code, code)).get()) throw conflict(`A lot with code ${code} exists already.`);
      assertMembers(body.watcherIds, 'watcherIds');
      assertWatcherChange(user, [], body.watcherIds);
      if (body.instrumentId != null && !db.select({ id: instruments.id }).from(instruments).where(eq(instruments.id, body.instrumentId)).get()) {
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
        audit(tx, { userId: user.id, action: 'lot.create', entity: 'lot', entityId: lot.id, detail: { ...body, nominal, tolerancePct } });
        return lotSummary(lot);
      });
    },
  });

  api.get('/:id', {
    schemas: { params: IdParamsSchema, query: LotStatsQuerySchema },
    handle: ({ params, query }) => {
      const lot = mustFind(params.id);
      const data = lotValues(sqlite, lot.id);
      const stats = lotStats(lot, data, query);
      const disposedByName = lot.disposedBy ? (db.select({ name: users.name }).from(users).where(eq(users.id, lot.disposedBy)).get()?.name ?? null) : null;
      return {
        ...lotSummary(lot),
        disposedByName,
        count: data.values.length,
        watchers: lotWatcherRows(db, lot.id),
        history: lotHistory(db, lot),
        // The first sets only (a 100,000-item lot has ~50,000 pairs); the items route carries every item's set.
        stats: stats && { ...stats, deviationsPct: undefined, matchedSets: stats.matchedSets.slice(0, MAX_LISTED_SETS), matchedSetCount: stats.matchedSets.length },
      };
    },
  });

  // Every item with what the table needs, as columns (compact for 100,000 rows).
  api.get('/:id/items', {
    schemas: { params: IdParamsSchema, query: LotStatsQuerySchema },
    handle: ({ params, query }) => {
      const lot = mustFind(params.id);
      const data = lotValues(sqlite, lot.id);
      const stats = lotStats(lot, data, { ...query, withBinIndices: true });
      const n = data.values.length;
      const bin = new Int32Array(n).fill(-1);
      stats?.bins.forEach((b, bi) => b.indices?.forEach((i) => (bin[i] = bi)));
      const set = new Int32Array(n).fill(-1);
      stats?.matchedSets.forEach((s, si) => s.indices.forEach((i) => (set[i] = si)));
      const outlier = new Uint8Array(n);
      stats?.outliers.indices.forEach((i) => (outlier[i] = 1));
      const secondFail = new Uint8Array(n);
      stats?.secondFailures?.forEach((i) => (secondFail[i] = 1));
      return {
        ids: Array.from(data.ids),
        items: data.items,
        values: Array.from(data.values),
        second: Array.from(data.second, (v) => (Number.isNaN(v) ? null : v)),
        deviationsPct: stats ? Array.from(stats.deviationsPct) : [],
        bin: Array.from(bin),
        set: Array.from(set),
        outlier: Array.from(outlier),
        partIds: itemPartIds(db, lot.id, data.items),
        secondFail: Array.from(secondFail),
      };
    },
  });

  api.post('/:id/readings', {
    status: 201,
    before: [lotUpload],
    schemas: { params: IdParamsSchema, body: UploadFields },
    handle: async ({ params, body, req, user }) => {
      const file = req.file;
      try {
        const lot = mustFind(params.id);
        if (lot.status !== 'open') throw conflict(`The lot is ${lot.status}; an admin must reopen it before new readings.`);
        if (!file) throw unprocessable('Attach the lot export in the "file" field.', { file: 'No file was sent.' });
        if (!/\.(csv|tsv|txt)$/i.test(file.originalname)) throw new HttpError(415, 'unsupported_type', 'Lot exports are CSV or TSV files.', { file: 'Use .csv or .tsv.' });
        const existing = (sqlite.prepare('select count(*) as n from lot_readings where lot_id = ?').get(lot.id) as { n: number }).n;
        if (existing > 0 && !body.replace) throw conflict(`The lot has ${existing} readings already; send replace=true to replace them.`);
        const started = performance.now();
        const read = await readLotFile(file.path, { quantity: QUANTITY[lotKind(lot)], mapping: body.mapping });
        if (!read.ok) throw fileRefused(read);
        const { data } = read;
        const parsedAt = performance.now();
        const stored = contentPath(ctx.config.uploadsDir, data.contentHash);
        const created = !fs.existsSync(stored);
        const insert = sqlite.prepare('insert into lot_readings (lot_id, item, value, second_value, frequency, source_row) values (?, ?, ?, ?, ?, ?)');
        try {
          if (created) {
            fs.mkdirSync(path.dirname(stored), { recursive: true });
            fs.renameSync(file.path, stored);
          }
          // One transaction through one prepared statement: all rows or none.
          db.transaction((tx) => {
            if (body.replace) sqlite.prepare('delete from lot_readings where lot_id = ?').run(lot.id);
            for (let i = 0; i < data.n; i++) {
              const s = data.second[i]!;
              const f = data.frequency[i]!;
              insert.run(lot.id, data.items[i]!, data.values[i]!, Number.isNaN(s) ? null : s, Number.isNaN(f) ? null : f, data.lines[i]!);
            }
            sqlite
              .prepare("insert into attachments (owner_type, owner_id, purpose, original_name, content_hash, mime, size, created_by) values ('lot', ?, 'lot-readings', ?, ?, 'text/csv', ?, ?)")
              .run(lot.id, file.originalname.slice(0, 200), data.contentHash, file.size, user.id);
            audit(tx, { userId: user.id, action: body.replace ? 'lot.readings-replaced' : 'lot.readings-uploaded', entity: 'lot', entityId: lot.id, detail: { rows: data.n, file: file.originalname, columns: data.columns } });
          });
        } catch (err) {
          if (created) fs.rmSync(stored, { force: true });
          throw err;
        }
        const storedAt = performance.now();
        // From the columns already in memory (a replace leaves exactly these rows); the lot page asks for sets itself.
        const stats = lotStats(lot, data, { sets: false });
        const done = performance.now();
        return {
          lot: lotSummary(lot),
          rows: data.n,
          columns: data.columns,
          stats: stats && { ...stats, deviationsPct: undefined },
          // Where the time went, for the benchmark and for anyone wondering about a large lot.
          timings: { parseMs: parsedAt - started, storeMs: storedAt - parsedAt, statsMs: done - storedAt },
        };
      } finally {
        if (file && fs.existsSync(file.path)) fs.rmSync(file.path, { force: true });
      }
    },
  });

  api.post('/:id/disposition', {
    schemas: { params: IdParamsSchema, body: DispositionInputSchema },
    handle: async ({ params, body, user }) => {
      const lot = mustFind(params.id);
      if (lot.status !== 'open') throw conflict(`The lot was ${lot.status} already; an admin must reopen it first.`);
      const data = lotValues(sqlite, lot.id);
      if (data.values.length === 0) throw conflict('The lot has no readings yet.');
      const stats = lotStats(lot, data, { sets: false })!;
      db.transaction((tx) => {
        tx.update(lots).set({ status: body.status, dispositionReason: body.reason, disposedBy: user.id, disposedAt: Date.now() }).where(eq(lots.id, lot.id)).run();
        audit(tx, { userId: user.id, action: 'lot.disposition', entity: 'lot', entityId: lot.id, detail: { status: body.status, reason: body.reason, n: stats.n, cpk: stats.cpk } });
      });
      const unit = UNIT[lotKind(lot)];
      const watchers = lotWatcherRows(db, lot.id);
      for (const w of watchers) {
        await ctx.mailer.send({
          to: w.email,
          topic: 'lot-disposition',
          subject: `Lot ${lot.code} ${body.status}`,
          text:
            `Lot ${lot.code} (${lot.kind}, ${formatValue(lot.nominal, unit)} ±${lot.tolerancePct} %${lot.supplier ? `, from ${lot.supplier}` : ''}) was ${body.status} by ${user.name}.\n\n` +
            `Reason: ${body.reason}\n\n` +
            `n = ${stats.n}, mean ${formatValue(stats.mean, unit)}, SD ${formatValue(stats.sd, unit)}, Cpk ${stats.cpk?.toFixed(2) ?? '—'}; ` +
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
        tx.update(lots).set({ status: 'open', dispositionReason: null, disposedBy: null, disposedAt: null }).where(eq(lots.id, lot.id)).run();
        audit(tx, { userId: user.id, action: 'lot.reopen', entity: 'lot', entityId: lot.id, detail: { was: lot.status, previousReason: lot.dispositionReason, reason: body.reason } });
      });
      const notified = await notifyReopen(ctx, lot, user, body.reason);
      return { lot: lotSummary(mustFind(lot.id)), notified };
    },
  });

  api.put('/:id/watchers', {
    schemas: { params: IdParamsSchema, body: WatchersInputSchema },
    handle: ({ params, body, user }) => {
      const lot = mustFind(params.id);
      assertMembers(body.userIds, 'userIds');
      assertWatcherChange(user, lotWatcherRows(db, lot.id).map((w) => w.id), body.userIds);
      db.transaction((tx) => {
        tx.delete(lotWatchers).where(eq(lotWatchers.lotId, lot.id)).run();
        for (const userId of new Set(body.userIds)) tx.insert(lotWatchers).values({ lotId: lot.id, userId }).run();
        audit(tx, { userId: user.id, action: 'lot.watchers', entity: 'lot', entityId: lot.id, detail: { userIds: body.userIds } });
      });
      return { watchers: lotWatcherRows(db, lot.id) };
    },
  });

  api.get('/:id/export.csv', {
    schemas: { params: IdParamsSchema, query: LotStatsQuerySchema },
    handle: ({ params, query, res }) => {
      const lot = mustFind(params.id);
      const data = lotValues(sqlite, lot.id);
      const stats = lotStats(lot, data, { ...query, withBinIndices: true });
      const n = data.values.length;
      const binOf = new Array<string>(n).fill('');
      stats?.bins.forEach((b) => b.indices?.forEach((i) => (binOf[i] = b.label)));
      const setOf = new Array<string>(n).fill('');
      stats?.matchedSets.forEach((s, si) => s.indices.forEach((i) => (setOf[i] = `S${si + 1}`)));
      const rows = Array.from({ length: n }, (_, i) => {
        const v = data.values[i]!;
        const verdict = stats ? (v < stats.lower || v > stats.upper ? 'fail' : 'pass') : '';
        return { item: data.items[i], value: v, deviation_pct: stats ? Number(stats.deviationsPct[i]!.toFixed(4)) : '', bin: binOf[i], set: setOf[i], verdict };
      });
      res.type('text/csv').attachment(`${lot.code}.csv`).send(Papa.unparse(rows, { escapeFormulae: true }));
      return undefined;
    },
  });

  api.post('/:id/promote', {
    status: 201,
    schemas: { params: IdParamsSchema, body: PromoteInputSchema },
    handle: ({ params, body, user }) => {
      const lot = mustFind(params.id);
      return promoteToParts(ctx, lot, body, user.id);
    },
  });

  return api;
}
