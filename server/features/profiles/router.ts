import { eq } from 'drizzle-orm';
import { audit } from '@server/audit';
import type { AppContext } from '@server/context';
import { toleranceProfiles } from '@server/db/schema';
import { conflict, notFound } from '@server/http/errors';
import { ApiRouter } from '@server/http/router';
import { ProfileInputSchema } from '@shared/schemas/bench';
import { IdParamsSchema } from '@shared/schemas/common';
import { listProfiles } from './repository';

export function profileRoutes(ctx: AppContext) {
  const { db } = ctx;
  const api = new ApiRouter('/api/profiles');
  const byName = (name: string) => db.select().from(toleranceProfiles).where(eq(toleranceProfiles.name, name)).get();

  api.get('/', { handle: () => ({ profiles: listProfiles(db) }) });

  api.post('/', {
    status: 201,
    schemas: { body: ProfileInputSchema },
    handle: ({ body, user }) => {
      if (byName(body.name)) throw conflict(`A profile named "${body.name}" exists already.`);
      return db.transaction((tx) => {
        const row = tx
          .insert(toleranceProfiles)
          .values({ ...body, createdBy: user.id })
          .returning()
          .get();
        audit(tx, { userId: user.id, action: 'profile.create', entity: 'profile', entityId: row.id, detail: body });
        return row;
      });
    },
  });

  api.put('/:id', {
    schemas: { params: IdParamsSchema, body: ProfileInputSchema },
    handle: ({ params, body, user }) => {
      const before = db.select().from(toleranceProfiles).where(eq(toleranceProfiles.id, params.id)).get();
      if (!before) throw notFound('That profile');
      const clash = byName(body.name);
      if (clash && clash.id !== before.id) throw conflict(`A profile named "${body.name}" exists already.`);
      return db.transaction((tx) => {
        const row = tx.update(toleranceProfiles).set(body).where(eq(toleranceProfiles.id, params.id)).returning().get();
        audit(tx, { userId: user.id, action: 'profile.update', entity: 'profile', entityId: row.id, detail: { before, after: body } });
        return row;
      });
    },
  });

  return api;
}
