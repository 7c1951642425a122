// Items of a lot (chosen ones, a deviation bin or a matched set) become parts in the registry,
// keeping their lot link and their readings. Runs in a pool worker on its own connection
// (server/pool/tasks.ts `lotPromote`): finding a bin or a set takes the lot's statistics (a few hundred
// ms for 100,000 items), and 1,000 new parts with their readings about two seconds of writes, neither
// of which may hold the request thread. The statistics are read outside the write transaction; the
// transaction (IMMEDIATE) checks that the readings are still those and that no part has the labels yet.
import { inArray, sql } from 'drizzle-orm';
import { audit } from '@server/audit';
import type { Database_ } from '@server/db/client';
import { workerWrite } from '@server/db/write-turns';
import { parts, partStatusEvents } from '@server/db/schema';
import { recordReading } from '@server/features/readings/service';
import { conflict, unprocessable } from '@server/http/errors';
import type { PromoteInput } from '@shared/schemas/lots';
import { clearLotItemsEncoded } from './items-encoded';
import { lotStats, lotValues, type LotRow, type LotValues } from './repository';
import { readingsMark } from './stored-stats';

const SECOND_READING = { dissipation: 'dissipation', esr: 'esr' } as const;

export interface PromoteResult {
  created: number;
  partIds: number[];
}

/** What a promotion read: the lot's readings (and which state of them), and the items chosen. */
export interface PromotionPlan {
  mark: string;
  data: LotValues;
  indices: number[];
}

export function promoteToParts(database: Database_, lot: LotRow, input: PromoteInput, userId: string): PromoteResult {
  return writePromotion(database, lot, input, planPromotion(database.sqlite, lot, input), userId);
}

/** Reads the readings and picks the items (a bin or a set computed from them); refuses a selection that cannot be promoted. */
export function planPromotion(sqlite: Database_['sqlite'], lot: LotRow, input: PromoteInput): PromotionPlan {
  const { mark, data } = sqlite.transaction(() => ({ mark: readingsMark(sqlite, lot.id), data: lotValues(sqlite, lot.id) }))();
  let indices: number[];
  if (input.readingIds) {
    const wanted = new Set(input.readingIds);
    indices = [];
    data.ids.forEach((id, i) => wanted.has(id) && indices.push(i));
    if (indices.length !== wanted.size) throw unprocessable('Some readings are not in this lot.', { readingIds: 'Unknown reading.' });
  } else {
    const stats = lotStats(lot, data, { matchPct: input.matchPct, setSize: input.setSize, withBinIndices: true });
    const group = input.bin !== undefined ? stats?.bins[input.bin]?.indices : stats?.matchedSets[input.set!]?.indices;
    if (!group)
      throw unprocessable(input.bin !== undefined ? 'There is no such bin.' : 'There is no such matched set.', {
        [input.bin !== undefined ? 'bin' : 'set']: 'Not found.',
      });
    indices = group;
  }
  if (indices.length === 0) throw unprocessable('The selection is empty.', { readingIds: 'Nothing to promote.' });
  if (indices.length > 1000) throw unprocessable('Promote at most 1,000 items at once.', { readingIds: 'Too many.' });
  return { mark, data, indices };
}

/** Writes the planned parts, in one transaction that holds the write lock from its start. */
export function writePromotion(
  { db, sqlite }: Database_,
  lot: LotRow,
  input: PromoteInput,
  { mark, data, indices }: PromotionPlan,
  userId: string,
): PromoteResult {
  const labels = indices.map((i) => `${lot.code}-${data.items[i]}`.slice(0, 60));

  // In a write turn (server/db/write-turns.ts): the request thread's writes wait for it without blocking.
  return workerWrite(() =>
    db.transaction(
      (tx) => {
        if (readingsMark(sqlite, lot.id) !== mark)
          throw conflict("The lot's readings changed meanwhile; look at the lot again and repeat the promotion.");
        const taken = tx
          .select({ label: parts.label })
          .from(parts)
          .where(
            inArray(
              sql`lower(${parts.label})`,
              labels.map((l) => l.toLowerCase()),
            ),
          )
          .all();
        if (taken.length > 0) throw conflict(`Parts exist already for ${taken.length} of these items (e.g. ${taken[0]!.label}).`);
        const created = indices.map((i, k) => {
          const part = tx
            .insert(parts)
            .values({
              kind: lot.kind,
              label: labels[k]!,
              nominal: lot.nominal,
              tolerancePct: lot.tolerancePct,
              tolerancePlusPct: lot.tolerancePlusPct ?? lot.tolerancePct,
              marking: lot.marking,
              supplier: lot.supplier,
              lotId: lot.id,
              lotItem: data.items[i]!,
              createdBy: userId,
            })
            .returning()
            .get();
          tx.insert(partStatusEvents)
            .values({ partId: part.id, toStatus: 'incoming', reason: `promoted from lot ${lot.code}`, userId })
            .run();
          // The lot's meter and test frequency go with each reading, when the lot has them.
          const conditions = {
            ...(lot.instrumentId != null ? { instrumentId: lot.instrumentId } : {}),
            ...(lot.testFrequency != null ? { frequency: lot.testFrequency } : {}),
          };
          recordReading(
            tx,
            part,
            { quantity: lot.kind === 'capacitor' ? 'capacitance' : 'resistance', value: data.values[i]!, ...conditions },
            userId,
            'lot',
          );
          const second = data.second[i]!;
          const secondQuantity =
            lot.secondQuantity === 'dissipation' || lot.secondQuantity === 'esr' ? SECOND_READING[lot.secondQuantity] : null;
          if (secondQuantity && !Number.isNaN(second))
            recordReading(
              tx,
              tx
                .select()
                .from(parts)
                .where(inArray(parts.id, [part.id]))
                .get()!,
              { quantity: secondQuantity, value: second, ...conditions },
              userId,
              'lot',
            );
          return part.id;
        });
        // The items answer names each item's part: its compressed copies describe the lot before this promotion.
        clearLotItemsEncoded(sqlite, lot.id);
        audit(tx, { userId, action: 'lot.promote', entity: 'lot', entityId: lot.id, detail: { parts: created.length, selection: input } });
        return { created: created.length, partIds: created };
      },
      { behavior: 'immediate' },
    ),
  );
}
