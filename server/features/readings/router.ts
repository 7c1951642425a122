import { desc, eq } from 'drizzle-orm';
import { audit } from '@server/audit';
import type { AppContext } from '@server/context';
import { instruments, parts, readings, users } from '@server/db/schema';
import { findPart } from '@server/features/parts/repository';
import { notFound } from '@server/http/errors';
import { ApiRouter } from '@server/http/router';
import { CreateReadingInputSchema } from '@shared/schemas/bench';
import { IdParamsSchema } from '@shared/schemas/common';
import { z } from 'zod';
import { recordReading } from './service';

const readingColumns = {
  id: readings.id,
  partId: readings.partId,
  quantity: readings.quantity,
  value: readings.value,
  frequency: readings.frequency,
  instrumentId: readings.instrumentId,
  instrumentName: instruments.name,
  calibrationOverdue: readings.calibrationOverdue,
  uncertainty: readings.uncertainty,
  verdict: readings.verdict,
  verdictReason: readings.verdictReason,
  entry: readings.entry,
  takenBy: users.name,
  takenAt: readings.takenAt,
};

export function readingRoutes(ctx: AppContext) {
  const { db } = ctx;
  const api = new ApiRouter('/api');

  api.get('/parts/:id/readings', {
    schemas: { params: IdParamsSchema },
    handle: ({ params }) => {
      if (!findPart(db, params.id)) throw notFound('That part');
      return {
        readings: db
          .select(readingColumns)
          .from(readings)
          .leftJoin(instruments, eq(readings.instrumentId, instruments.id))
          .leftJoin(users, eq(readings.takenBy, users.id))
          .where(eq(readings.partId, params.id))
          .orderBy(desc(readings.id))
          .all(),
      };
    },
  });

  api.post('/parts/:id/readings', {
    status: 201,
    schemas: { params: IdParamsSchema, body: CreateReadingInputSchema },
    handle: ({ params, body, user }) => {
      const part = findPart(db, params.id);
      if (!part) throw notFound('That part');
      return db.transaction((tx) => {
        const reading = recordReading(tx, part, body, user.id);
        audit(tx, {
          userId: user.id,
          action: 'reading.create',
          entity: 'part',
          entityId: part.id,
          detail: { readingId: reading.id, ...body, verdict: reading.verdict },
        });
        return { reading, part: findPart(tx, part.id) };
      });
    },
  });

  api.get('/readings/recent', {
    schemas: { query: z.object({ limit: z.coerce.number().int().min(1).max(200).default(25) }) },
    handle: ({ query }) => ({
      readings: db
        .select({ ...readingColumns, partLabel: parts.label, partKind: parts.kind })
        .from(readings)
        .innerJoin(parts, eq(readings.partId, parts.id))
        .leftJoin(instruments, eq(readings.instrumentId, instruments.id))
        .leftJoin(users, eq(readings.takenBy, users.id))
        .orderBy(desc(readings.id))
        .limit(query.limit)
        .all(),
    }),
  });

  return api;
}
