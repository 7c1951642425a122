import { eq, getTableColumns } from 'drizzle-orm';
import QRCode from 'qrcode';
import { z } from 'zod';
import { audit } from '@server/audit';
import type { AppContext } from '@server/context';
import { lots, parts, partStatusEvents, toleranceProfiles, users } from '@server/db/schema';
import { notFound, unprocessable } from '@server/http/errors';
import { ApiRouter } from '@server/http/router';
import { IdParamsSchema } from '@shared/schemas/common';
import { CreatePartInputSchema, nominalProblem, PartListQuerySchema, UpdatePartInputSchema, type PartDetail } from '@shared/schemas/parts';
import { jobsOfPart } from '@server/features/jobs/repository';
import { assertLabelFree, findPart, findPartByLabel, listParts, setPartStatus } from './repository';

export function partRoutes(ctx: AppContext) {
  const { db } = ctx;
  const api = new ApiRouter('/api/parts');
  /** The records a part may refer to must exist; the answer names the field. */
  const assertReferences = (body: { profileId?: number | null; lotId?: number | null }) => {
    if (
      body.profileId != null &&
      !db.select({ id: toleranceProfiles.id }).from(toleranceProfiles).where(eq(toleranceProfiles.id, body.profileId)).get()
    ) {
      throw unprocessable(`There is no tolerance profile ${body.profileId}.`, { profileId: 'No such tolerance profile.' });
    }
    if (body.lotId != null && !db.select({ id: lots.id }).from(lots).where(eq(lots.id, body.lotId)).get()) {
      throw unprocessable(`There is no lot ${body.lotId}.`, { lotId: 'No such lot.' });
    }
  };

  api.get('/', {
    schemas: { query: PartListQuerySchema },
    handle: ({ query }) => ({ parts: listParts(db, query) }),
  });

  api.post('/', {
    status: 201,
    schemas: { body: CreatePartInputSchema },
    handle: ({ body, user }) => {
      assertReferences(body);
      assertLabelFree(db, body.label);
      return db.transaction((tx) => {
        // A tolerance given as one number is the same on both sides.
        const tolerancePlusPct = body.tolerancePct == null ? null : (body.tolerancePlusPct ?? body.tolerancePct);
        const part = tx
          .insert(parts)
          .values({ ...body, tolerancePlusPct, createdBy: user.id })
          .returning()
          .get();
        tx.insert(partStatusEvents)
          .values({ partId: part.id, fromStatus: null, toStatus: part.status, reason: 'created', userId: user.id })
          .run();
        audit(tx, { userId: user.id, action: 'part.create', entity: 'part', entityId: part.id, detail: { ...body } });
        return part;
      });
    },
  });

  api.get('/:id', {
    schemas: { params: IdParamsSchema },
    handle: ({ params }): PartDetail => {
      const part = findPart(db, params.id);
      if (!part) throw notFound('That part');
      const statusHistory = db
        .select({ ...getTableColumns(partStatusEvents), userName: users.name })
        .from(partStatusEvents)
        .leftJoin(users, eq(partStatusEvents.userId, users.id))
        .where(eq(partStatusEvents.partId, part.id))
        .orderBy(partStatusEvents.id)
        .all();
      const lotCode = part.lotId ? (db.select({ code: lots.code }).from(lots).where(eq(lots.id, part.lotId)).get()?.code ?? null) : null;
      return { ...part, lotCode, statusHistory, installedIn: jobsOfPart(db, part.id) };
    },
  });

  api.get('/by-label/:label', {
    schemas: { params: z.object({ label: z.string().trim().min(1).max(60) }) },
    handle: ({ params }) => {
      const part = findPartByLabel(db, params.label);
      if (!part) throw notFound(`A part labelled "${params.label}"`);
      return part;
    },
  });

  // The printable label: the part's label as text plus a QR code of its page's address.
  api.get('/:id/label.svg', {
    schemas: { params: IdParamsSchema },
    handle: async ({ params, res }) => {
      const part = findPart(db, params.id);
      if (!part) throw notFound('That part');
      const qr = await QRCode.toString(`${ctx.config.publicUrl}/parts/${part.id}`, { type: 'svg', margin: 1, width: 160 });
      const inner = qr.replace(/^<svg[^>]*>/, '').replace(/<\/svg>\s*$/, '');
      const label = part.label.replace(/[<>&"]/g, '');
      res
        .type('image/svg+xml')
        .send(
          `<svg xmlns="http://www.w3.org/2000/svg" width="360" height="170" viewBox="0 0 360 170"><rect width="360" height="170" fill="#fff"/>` +
            `<svg x="5" y="5" width="160" height="160" viewBox="${qr.match(/viewBox="([^"]+)"/)?.[1] ?? '0 0 33 33'}">${inner}</svg>` +
            `<text x="175" y="80" font-family="monospace" font-size="24">${label}</text><text x="175" y="110" font-family="sans-serif" font-size="14">${part.kind}</text></svg>`,
        );
    },
  });

  api.patch('/:id', {
    schemas: { params: IdParamsSchema, body: UpdatePartInputSchema },
    handle: ({ params, body, user }) => {
      const part = findPart(db, params.id);
      if (!part) throw notFound('That part');
      assertReferences(body);
      if (body.label && body.label !== part.label) assertLabelFree(db, body.label, part.id);
      // The nominal's range depends on the part's kind, which the body does not carry.
      if (body.nominal != null) {
        const problem = nominalProblem(part.kind, body.nominal);
        if (problem) throw unprocessable(`The nominal is out of range: ${problem}`, { nominal: problem });
      }
      const { status, statusReason, ...fields } = body;
      // A tolerance changed as one number becomes symmetric; a plus side alone needs the stored minus side.
      if (fields.tolerancePct !== undefined && fields.tolerancePlusPct === undefined) fields.tolerancePlusPct = fields.tolerancePct;
      if (fields.tolerancePct === undefined && fields.tolerancePlusPct != null && part.tolerancePct == null)
        throw unprocessable('Give the side below nominal too.', { tolerancePct: 'Required with tolerancePlusPct.' });
      return db.transaction((tx) => {
        const changed = Object.fromEntries(Object.entries(fields).filter(([k, v]) => part[k as keyof typeof part] !== v));
        if (Object.keys(changed).length > 0)
          tx.update(parts)
            .set({ ...changed, updatedAt: Date.now() })
            .where(eq(parts.id, part.id))
            .run();
        if (status) setPartStatus(tx, part, status, statusReason ?? null, user.id);
        const before = Object.fromEntries(Object.keys(changed).map((k) => [k, part[k as keyof typeof part]]));
        audit(tx, {
          userId: user.id,
          action: status === 'retired' ? 'part.retire' : 'part.update',
          entity: 'part',
          entityId: part.id,
          detail: { before, after: changed, ...(status ? { status: { from: part.status, to: status } } : {}) },
        });
        return findPart(tx, part.id);
      });
    },
  });

  return api;
}
