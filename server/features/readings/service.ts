import { eq } from 'drizzle-orm';
import type { DbLike } from '@server/db/client';
import { instruments, readings } from '@server/db/schema';
import { profileForPart, toProfileSpec } from '@server/features/profiles/repository';
import { setPartStatus, type PartRow } from '@server/features/parts/repository';
import { HttpError, unprocessable } from '@server/http/errors';
import { calibrationOverdue, judgeReading } from '@shared/analysis/reading-verdict';
import type { Accuracy } from '@shared/analysis/verdict';
import type { CreateReadingInput } from '@shared/schemas/bench';
import { NON_NEGATIVE_QUANTITIES } from '@shared/units/quantities';

export type ReadingRow = typeof readings.$inferSelect;

/** Statuses a new verdict may move a part out of; installed, rejected and retired parts stay put. */
const JUDGED_STATUSES = new Set<PartRow['status']>(['incoming', 'passed', 'flagged']);

/**
 * Stores one reading with its verdict (limits from the part or its profile, guard band from the
 * instrument's accuracy) and moves the part to passed or flagged by that verdict.
 */
export function recordReading(
  db: DbLike,
  part: PartRow,
  input: CreateReadingInput,
  userId: string,
  entry: 'typed' | 'file' | 'lot' = 'typed',
): ReadingRow {
  if (NON_NEGATIVE_QUANTITIES.has(input.quantity) && input.value < 0) {
    throw unprocessable(`A ${input.quantity} reading cannot be negative.`, { value: 'Must be zero or more.' });
  }
  const instrument = input.instrumentId ? db.select().from(instruments).where(eq(instruments.id, input.instrumentId)).get() : undefined;
  if (input.instrumentId && !instrument)
    throw new HttpError(422, 'invalid', 'That instrument does not exist.', { instrumentId: 'Unknown instrument.' });
  const accuracy = (instrument?.accuracy as Partial<Record<string, Accuracy>> | undefined)?.[input.quantity] ?? null;
  const judgement = judgeReading(part, input, {
    profile: toProfileSpec(profileForPart(db, part)),
    accuracy,
    displayCounts: instrument?.displayCounts ?? null,
  });

  const row = db
    .insert(readings)
    .values({
      partId: part.id,
      quantity: input.quantity,
      value: input.value,
      frequency: input.frequency ?? null,
      instrumentId: instrument?.id ?? null,
      calibrationOverdue: calibrationOverdue(instrument?.calibrationDue, new Date()),
      uncertainty: judgement?.uncertainty ?? null,
      verdict: judgement?.verdict ?? null,
      verdictReason: judgement ? `${judgement.reason} [${judgement.source}]` : null,
      entry,
      takenBy: userId,
    })
    .returning()
    .get();

  if (judgement && JUDGED_STATUSES.has(part.status)) {
    const status = judgement.verdict === 'pass' ? 'passed' : 'flagged';
    setPartStatus(db, part, status, `${judgement.verdict}: ${judgement.reason}`, userId);
  }
  return row;
}
