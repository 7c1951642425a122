import { desc, eq } from 'drizzle-orm';
import { audit } from '@server/audit';
import { newId, newToken } from '@server/auth/tokens';
import type { AppContext } from '@server/context';
import { invitations, users } from '@server/db/schema';
import { labelClashes } from '@server/features/parts/repository';
import { HttpError, notFound } from '@server/http/errors';
import { ApiRouter } from '@server/http/router';
import { ChangeRoleInputSchema, InviteInputSchema, type Member } from '@shared/schemas/auth';
import { z } from 'zod';

const INVITATION_LIFETIME_MS = 7 * 24 * 3600 * 1000;
const UserIdParams = z.object({ id: z.string().min(1).max(64) });

export function teamRoutes(ctx: AppContext) {
  const { db, lucia } = ctx;
  const api = new ApiRouter('/api/team');

  api.get('/members', {
    handle: (): { members: Member[] } => ({
      members: db
        .select({
          id: users.id,
          email: users.email,
          name: users.name,
          role: users.role,
          disabledAt: users.disabledAt,
          createdAt: users.createdAt,
        })
        .from(users)
        .orderBy(users.email)
        .all(),
    }),
  });

  // Part labels that differ only in case (kept as they were when labels became case-insensitive).
  api.get('/label-clashes', { handle: () => ({ clashes: labelClashes(db) }) });

  api.patch('/members/:id', {
    schemas: { params: UserIdParams, body: ChangeRoleInputSchema },
    handle: async ({ params, body, user }) => {
      const member = db.select().from(users).where(eq(users.id, params.id)).get();
      if (!member) throw notFound('That member');
      if (body.role === undefined && body.disabled === undefined)
        throw new HttpError(422, 'invalid', 'Give a new role or disabled: true/false.', { role: 'Give a role or disabled.' });
      if (member.id === user.id && ((body.role !== undefined && body.role !== 'admin') || body.disabled)) {
        throw new HttpError(409, 'conflict', 'You cannot demote or disable yourself; ask another admin.');
      }
      const changes: Partial<typeof users.$inferInsert> = {};
      if (body.role) changes.role = body.role;
      if (body.disabled !== undefined) changes.disabledAt = body.disabled ? Date.now() : null;
      db.transaction((tx) => {
        tx.update(users).set(changes).where(eq(users.id, member.id)).run();
        audit(tx, {
          userId: user.id,
          action: 'member.update',
          entity: 'user',
          entityId: member.id,
          detail: { from: { role: member.role, disabled: member.disabledAt !== null }, to: body },
        });
      });
      // A disabled account or a changed role ends the member's sessions.
      if (body.disabled || (body.role && body.role !== member.role)) await lucia.invalidateUserSessions(member.id);
      return { ok: true };
    },
  });

  api.get('/invitations', {
    handle: () => ({
      invitations: db
        .select({
          id: invitations.id,
          email: invitations.email,
          role: invitations.role,
          expiresAt: invitations.expiresAt,
          acceptedAt: invitations.acceptedAt,
          revokedAt: invitations.revokedAt,
          createdAt: invitations.createdAt,
        })
        .from(invitations)
        .orderBy(desc(invitations.createdAt))
        .all(),
    }),
  });

  api.post('/invitations', {
    status: 201,
    schemas: { body: InviteInputSchema },
    handle: async ({ body, user }) => {
      if (db.select().from(users).where(eq(users.email, body.email)).get()) {
        throw new HttpError(409, 'conflict', `${body.email} is a member already.`, { email: 'Already a member.' });
      }
      const { token, hash } = newToken();
      const id = newId();
      const expiresAt = Date.now() + INVITATION_LIFETIME_MS;
      db.transaction((tx) => {
        tx.insert(invitations).values({ id, email: body.email, role: body.role, tokenHash: hash, invitedBy: user.id, expiresAt }).run();
        audit(tx, {
          userId: user.id,
          action: 'invitation.create',
          entity: 'invitation',
          entityId: id,
          detail: { email: body.email, role: body.role },
        });
      });
      await ctx.mailer.send({
        to: body.email,
        topic: 'invitation',
        subject: 'You are invited to Lugbook',
        text: `${user.name} invited you to join their Lugbook workshop as ${body.role}.\n\nChoose your name and password here (the link works once, for seven days):\n${ctx.config.publicUrl}/accept-invite?token=${token}\n`,
      });
      return { id, email: body.email, role: body.role, expiresAt };
    },
  });

  api.delete('/invitations/:id', {
    schemas: { params: UserIdParams },
    handle: ({ params, user }) => {
      const invite = db.select().from(invitations).where(eq(invitations.id, params.id)).get();
      if (!invite) throw notFound('That invitation');
      db.update(invitations).set({ revokedAt: Date.now() }).where(eq(invitations.id, invite.id)).run();
      audit(db, { userId: user.id, action: 'invitation.revoke', entity: 'invitation', entityId: invite.id });
      return { ok: true };
    },
  });

  return api;
}
