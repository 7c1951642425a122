// The lot's items answer (GET /api/lots/:id/items: partIds, then the stored item columns; ~9 MB of JSON
// for 100,000 items) compressed once, gzip and brotli, in a pool worker (server/pool/tasks.ts
// `lotItemsEncode`), and kept in lot_items_encoded beside the columns it was made from. The route sends the copy
// the client accepts as it is (Content-Encoding, Content-Length), so the compression middleware leaves it
// alone and the request thread never compresses megabytes.
//
// A copy is named by the state it was made from (`itemsKey`: the stored columns' computed_at and count,
// and the lot's promoted parts): an upload or a replace deletes it with the stored statistics, a refresh
// of the statistics deletes it, and a promotion deletes it (`clearLotItemsEncoded`, in the
// promotion's transaction). Whatever clears it, a copy of another state is never sent: the route compares
// the key it read with the copy's.
import type Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import * as schema from '@server/db/schema';
import { statement } from '@server/db/statements';
import { workerWrite } from '@server/db/write-turns';
import { compress, type Encoding } from '@server/http/encoded';
import { lotItemPartIdsJson } from './promoted';
import { lotValues, type LotRow } from './repository';
import { lotResults } from './stored-stats';

export type ItemsEncoding = Encoding;

/** The lot's promoted parts as they bear on its items answer (parts are never deleted; ids never reused). */
export function promotedMark(sqlite: Database.Database, lotId: number): string {
  const r = statement(
    sqlite,
    'select count(*) as n, coalesce(max(id), 0) as last from parts where lot_id = ? and lot_item is not null',
  ).get(lotId) as { n: number; last: number };
  return `${r.n}:${r.last}`;
}

/** Which state of a lot's items answer a copy was made from. */
export function itemsKey(sqlite: Database.Database, lotId: number, stored: { computedAt: number; count: number }): string {
  return `${stored.computedAt}:${stored.count}:${promotedMark(sqlite, lotId)}`;
}

/** The items answer: a LotItems (shared/schemas/lots.ts), partIds put in front of the columns object's first key. */
export function itemsAnswerParts(partIdsJson: string, columns: Buffer): [Buffer, Buffer] {
  return [Buffer.from(`{"partIds":${partIdsJson},`), columns.subarray(1)];
}

/** Forget a lot's compressed copies; call inside the transaction that promotes its items. */
export function clearLotItemsEncoded(sqlite: Database.Database, lotId: number): void {
  statement(sqlite, 'delete from lot_items_encoded where lot_id = ?').run(lotId);
}

/** The stored copy in that encoding when it was made from the state `key` names, else null. */
export function readLotItemsEncoded(sqlite: Database.Database, lotId: number, key: string, encoding: ItemsEncoding): Buffer | null {
  const row = statement(sqlite, `select mark, ${encoding === 'br' ? 'br' : 'gzip'} as bytes from lot_items_encoded where lot_id = ?`).get(
    lotId,
  ) as { mark: string | null; bytes: Buffer | null } | undefined;
  return row && row.mark === key && row.bytes ? row.bytes : null;
}

/**
 * The items answer for another matching than the stored one, computed and compressed for one request (run
 * in a pool worker): the request thread neither builds nor compresses its megabytes.
 */
export function freshItemsEncoded(
  sqlite: Database.Database,
  lot: LotRow,
  matching: { matchPct?: number; setSize?: number },
  encoding: ItemsEncoding,
): Buffer {
  const r = lotResults(lot, lotValues(sqlite, lot.id), matching);
  const db = drizzle(sqlite, { schema });
  const parts = itemsAnswerParts(lotItemPartIdsJson(db, sqlite, lot.id, r.count), Buffer.from(JSON.stringify(r.columns)));
  return compress(Buffer.concat(parts), encoding);
}

export interface EncodedItems {
  key: string;
  gzip: Uint8Array;
  br: Uint8Array;
  /** False when the lot changed while they were made (nothing kept; they describe the state `key` names). */
  kept: boolean;
}

/**
 * Makes and keeps a lot's compressed items answer from its stored columns (run in a pool worker, on the
 * worker's own connection). Null when the lot has no stored columns. The copy is kept only if the state
 * it was made from is still the lot's when it is written.
 */
export function encodeLotItems(sqlite: Database.Database, lotId: number): EncodedItems | null {
  const db = drizzle(sqlite, { schema });
  const read = sqlite.transaction(() => {
    const row = sqlite
      .prepare(
        'select s.computed_at as computedAt, s.count, cast(c.columns as blob) as columns from lot_stats s join lot_stats_columns c on c.lot_id = s.lot_id where s.lot_id = ?',
      )
      .get(lotId) as { computedAt: number; count: number; columns: Buffer } | undefined;
    if (!row) return null;
    return { key: itemsKey(sqlite, lotId, row), parts: itemsAnswerParts(lotItemPartIdsJson(db, sqlite, lotId, row.count), row.columns) };
  })();
  if (!read) return null;
  const answer = Buffer.concat(read.parts);
  const gzip = compress(answer, 'gzip');
  const br = compress(answer, 'br');
  const kept = workerWrite(() =>
    sqlite
      .transaction(() => {
        const now = sqlite.prepare('select computed_at as computedAt, count from lot_stats where lot_id = ?').get(lotId) as
          { computedAt: number; count: number } | undefined;
        if (!now || itemsKey(sqlite, lotId, now) !== read.key) return false;
        sqlite
          .prepare(
            'insert into lot_items_encoded (lot_id, mark, gzip, br) values (?, ?, ?, ?) on conflict (lot_id) do update set mark = excluded.mark, gzip = excluded.gzip, br = excluded.br',
          )
          .run(lotId, read.key, gzip, br);
        return true;
      })
      .immediate(),
  );
  return { key: read.key, gzip, br, kept };
}
