import { and, eq, gt, isNull } from 'drizzle-orm';
import { z } from 'zod';
import { audit } from '@server/audit';
import { hashPassword, passwordProblem, verifyPassword } from '@server/auth/password';
import { hashToken, newId, newToken } from '@server/auth/tokens';
import type { AppContext } from '@server/context';
import { invitations, passwordResets, users } from '@server/db/schema';
import { HttpError, unprocessable } from '@server/http/errors';
import { ApiRouter, takeWriteTurn } from '@server/http/router';
import { AcceptInviteInputSchema, RequestResetInputSchema, ResetPasswordInputSchema, SignInInputSchema } from '@shared/schemas/auth';
import { SignInBackoff, signInAddressLimiter, WindowCounter } from './sign-in-limiter';

const RESET_LIFETIME_MS = 60 * 60 * 1000;

export function authRoutes(ctx: AppContext) {
  const { db, lucia } = ctx;
  const api = new ApiRouter('/api/auth');
  const backoff = new SignInBackoff(ctx.config.signInLimits);
  // Reset requests: at most 3 per account and 10 per address in 15 minutes (each one sends an e-mail).
  const resetsPerAccount = new WindowCounter(3, 15 * 60_000);
  const resetsPerAddress = new WindowCounter(10, 15 * 60_000);
  // Unknown accounts are checked against this hash, so a refusal takes as long as for a known one.
  let dummyHash: Promise<string> | null = null;
  const tooMany = (res: import('express').Response, waitMs: number, message: string) => {
    res.setHeader('Retry-After', String(Math.max(1, Math.ceil(waitMs / 1000))));
    return new HttpError(429, 'rate_limited', message);
  };

  api.get('/me', { handle: ({ user }) => ({ user: user ?? null }) });

  api.post('/sign-in', {
    before: [signInAddressLimiter(ctx.config.signInLimits)],
    schemas: { body: SignInInputSchema },
    handle: async ({ body, req, res }) => {
      const refuse = (reason: string) => {
        ctx.log(`sign-in refused for ${body.email}: ${reason}`);
        audit(db, { userId: null, action: 'auth.sign-in-refused', entity: 'user', entityId: body.email, detail: { reason, ip: req.ip } });
      };
      const address = req.ip ?? 'unknown';
      const wait = backoff.waitMs(body.email, address);
      if (wait > 0) {
        refuse('repeated failures from this address: waiting');
        throw tooMany(res, wait, 'Too many failed sign-ins for this account from here. Wait and try again, or reset the password.');
      }
      const user = db.select().from(users).where(eq(users.email, body.email)).get();
      dummyHash ??= hashPassword(`no account ${newId()}`);
      const ok = await verifyPassword(user ? user.passwordHash : await dummyHash, body.password).then((r) => r && user !== undefined);
      // The hash took a while: what follows writes (the refusal's audit line, the session) after a turn.
      await takeWriteTurn(req);
      if (!user || !ok || user.disabledAt !== null) {
        backoff.recordFailure(body.email, address);
        refuse(!user ? 'unknown e-mail' : !ok ? 'wrong password' : 'account disabled');
        throw new HttpError(401, 'bad_credentials', 'That e-mail and password do not match an active account.');
      }
      backoff.clear(body.email, address);
      const session = await lucia.createSession(user.id, { createdAt: Date.now() });
      res.appendHeader('Set-Cookie', lucia.createSessionCookie(session.id).serialize());
      await takeWriteTurn(req);
      audit(db, { userId: user.id, action: 'auth.sign-in', entity: 'user', entityId: user.id, detail: { ip: req.ip } });
      return { user: { id: user.id, email: user.email, name: user.name, role: user.role } };
    },
  });

  api.post('/sign-out', {
    handle: async ({ req, res }) => {
      if (req.session) await lucia.invalidateSession(req.session.id);
      res.appendHeader('Set-Cookie', lucia.createBlankSessionCookie().serialize());
      return { ok: true };
    },
  });

  const openInvitation = (token: string) =>
    db
      .select()
      .from(invitations)
      .where(
        and(
          eq(invitations.tokenHash, hashToken(token)),
          isNull(invitations.acceptedAt),
          isNull(invitations.revokedAt),
          gt(invitations.expiresAt, Date.now()),
        ),
      )
      .get();

  api.get('/invitations/:token', {
    schemas: { params: z.object({ token: z.string().min(20).max(200) }) },
    handle: ({ params }) => {
      const invite = openInvitation(params.token);
      if (!invite)
        throw new HttpError(404, 'invitation_invalid', 'This invitation is unknown, used or expired. Ask an admin for a new one.');
      return { email: invite.email, role: invite.role, expiresAt: invite.expiresAt };
    },
  });

  api.post('/accept-invite', {
    schemas: { body: AcceptInviteInputSchema },
    handle: async ({ body, req, res }) => {
      const problem = passwordProblem(body.password);
      if (problem) throw unprocessable(problem, { password: problem });
      const invite = openInvitation(body.token);
      if (!invite)
        throw new HttpError(410, 'invitation_invalid', 'This invitation is unknown, used or expired. Ask an admin for a new one.');
      if (db.select().from(users).where(eq(users.email, invite.email)).get()) {
        throw new HttpError(409, 'conflict', 'An account with this e-mail exists already; sign in instead.');
      }
      const passwordHash = await hashPassword(body.password);
      const id = newId();
      // The hash took a while: the invitation is checked again and spent in the same transaction as the
      // insert, so two requests with one token give one account (the second finds it used: 410).
      await takeWriteTurn(req);
      db.transaction((tx) => {
        const spent = tx
          .update(invitations)
          .set({ acceptedAt: Date.now() })
          .where(and(eq(invitations.id, invite.id), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
          .run();
        if (spent.changes !== 1)
          throw new HttpError(410, 'invitation_invalid', 'This invitation is unknown, used or expired. Ask an admin for a new one.');
        if (tx.select({ id: users.id }).from(users).where(eq(users.email, invite.email)).get()) {
          throw new HttpError(409, 'conflict', 'An account with this e-mail exists already; sign in instead.');
        }
        tx.insert(users).values({ id, email: invite.email, name: body.name, role: invite.role, passwordHash }).run();
        audit(tx, { userId: id, action: 'auth.invitation-accepted', entity: 'user', entityId: id, detail: { role: invite.role } });
      });
      const session = await lucia.createSession(id, { createdAt: Date.now() });
      res.appendHeader('Set-Cookie', lucia.createSessionCookie(session.id).serialize());
      return { user: { id, email: invite.email, name: body.name, role: invite.role } };
    },
  });

  api.post('/request-reset', {
    schemas: { body: RequestResetInputSchema },
    handle: async ({ body, req, res }) => {
      const addressWait = resetsPerAddress.take(req.ip ?? 'unknown');
      if (addressWait > 0) throw tooMany(res, addressWait, 'Too many reset requests from here. Wait and try again.');
      // Counted by the address typed, whether or not it has an account, so the answer reveals nothing.
      const accountWait = resetsPerAccount.take(body.email.toLowerCase());
      if (accountWait > 0)
        throw tooMany(res, accountWait, 'Several reset links were sent to this address already; use the newest, or wait and try again.');
      const user = db.select().from(users).where(eq(users.email, body.email)).get();
      // The answer is the same whether or not the account exists, so it reveals no addresses.
      if (user && user.disabledAt === null) {
        const { token, hash } = newToken();
        db.insert(passwordResets)
          .values({ id: newId(), userId: user.id, tokenHash: hash, expiresAt: Date.now() + RESET_LIFETIME_MS })
          .run();
        await ctx.mailer.send({
          to: user.email,
          topic: 'password-reset',
          subject: 'Reset your Lugbook password',
          text: `Someone asked to reset the password of your Lugbook account (${user.email}).\n\nSet a new password within one hour:\n${ctx.config.publicUrl}/reset-password?token=${token}\n\nIf it was not you, ignore this message; your password stays as it is.`,
        });
        audit(db, { userId: user.id, action: 'auth.reset-requested', entity: 'user', entityId: user.id });
      }
      return { ok: true, message: 'If that address has an account, a reset link is on its way.' };
    },
  });

  api.post('/reset-password', {
    schemas: { body: ResetPasswordInputSchema },
    handle: async ({ body, req }) => {
      const problem = passwordProblem(body.password);
      if (problem) throw unprocessable(problem, { password: problem });
      const reset = db
        .select()
        .from(passwordResets)
        .where(
          and(eq(passwordResets.tokenHash, hashToken(body.token)), isNull(passwordResets.usedAt), gt(passwordResets.expiresAt, Date.now())),
        )
        .get();
      if (!reset) throw new HttpError(410, 'token_invalid', 'This reset link is unknown, used or expired. Ask for a new one.');
      const passwordHash = await hashPassword(body.password);
      await takeWriteTurn(req);
      db.transaction((tx) => {
        tx.update(users).set({ passwordHash }).where(eq(users.id, reset.userId)).run();
        // Using one link ends every other outstanding link of the account.
        tx.update(passwordResets)
          .set({ usedAt: Date.now() })
          .where(and(eq(passwordResets.userId, reset.userId), isNull(passwordResets.usedAt)))
          .run();
        audit(tx, { userId: reset.userId, action: 'auth.password-reset', entity: 'user', entityId: reset.userId });
      });
      // A new password ends every session of the account.
      await lucia.invalidateUserSessions(reset.userId);
      return { ok: true };
    },
  });

  return api;
}
