import { eq } from 'drizzle-orm';
import { audit } from '@server/audit';
import type { AppContext } from '@server/context';
import { instruments } from '@server/db/schema';
import { conflict, notFound } from '@server/http/errors';
import { ApiRouter } from '@server/http/router';
import { calibrationOverdue } from '@shared/analysis/reading-verdict';
import { InstrumentInputSchema } from '@shared/schemas/bench';
import { IdParamsSchema } from '@shared/schemas/common';

export function instrumentRoutes(ctx: AppContext) {
  const { db } = ctx;
  const api = new ApiRouter('/api/instruments');
  const byName = (name: string) => db.select().from(instruments).where(eq(instruments.name, name)).get();

  api.get('/', {
    handle: () => {
      const today = new Date();
      return {
        instruments: db
          .select()
          .from(instruments)
          .orderBy(instruments.name)
          .all()
          .map((i) => ({ ...i, calibrationOverdue: calibrationOverdue(i.calibrationDue, today) })),
      };
    },
  });

  api.post('/', {
    status: 201,
    schemas: { body: InstrumentInputSchema },
    handle: ({ body, user }) => {
      if (byName(body.name)) throw conflict(`An instrument named "${body.name}" exists already.`);
      return db.transaction((tx) => {
        const row = tx.insert(instruments).values(body).returning().get();
        audit(tx, { userId: user.id, action: 'instrument.create', entity: 'instrument', entityId: row.id, detail: body });
        return row;
      });
    },
  });

  api.put('/:id', {
    schemas: { params: IdParamsSchema, body: InstrumentInputSchema },
    handle: ({ params, body, user }) => {
      const before = db.select().from(instruments).where(eq(instruments.id, params.id)).get();
      if (!before) throw notFound('That instrument');
      const clash = byName(body.name);
      if (clash && clash.id !== before.id) throw conflict(`An instrument named "${body.name}" exists already.`);
      return db.transaction((tx) => {
        const row = tx.update(instruments).set(body).where(eq(instruments.id, params.id)).returning().get();
        audit(tx, {
          userId: user.id,
          action: 'instrument.update',
          entity: 'instrument',
          entityId: row.id,
          detail: { before, after: body },
        });
        return row;
      });
    },
  });

  return api;
}
