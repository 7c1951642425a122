import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { outbox, sessions, users } from '@server/db/schema';
import { SESSION_ABSOLUTE_MS } from '@server/auth/session';
import { createTestApp, newAgent, TEST_PASSWORD, type TestApp } from '../support/app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp({ signInLimits: { perAddress: 1000, perAccount: 3, windowMs: 60_000 } });
});
afterAll(() => t.close());

/** A new member of the team, invited by the admin, with the invitation accepted; signed in. */
async function newMember(email: string, role: 'tech' | 'viewer' = 'tech') {
  const admin = await t.as('admin');
  await admin.post('/api/team/invitations').send({ email, role }).expect(201);
  const agent = t.anon();
  await agent
    .post('/api/auth/accept-invite')
    .send({ token: lastMailedToken(email), name: 'Bench Member', password: 'a-long-bench-passphrase' })
    .expect(200);
  return agent;
}

/** The token of the newest outbox message's link (`?token=…`). */
function lastMailedToken(to: string): string {
  const rows = t.ctx.db.select().from(outbox).where(eq(outbox.to, to)).all();
  const text = rows.at(-1)?.text ?? '';
  const token = text.match(/token=([A-Za-z0-9_-]+)/)?.[1];
  if (!token) throw new Error(`no token mailed to ${to}`);
  return token;
}

describe('sign-in and sessions', () => {
  test('sign-in sets an HttpOnly, SameSite=Lax session cookie; me answers the user; sign-out ends it', async () => {
    const agent = t.anon();
    const res = await agent.post('/api/auth/sign-in').send({ email: 'tech@lugbook.test', password: TEST_PASSWORD });
    expect(res.status).toBe(200);
    const cookie = String(res.headers['set-cookie']);
    expect(cookie).toMatch(/HttpOnly/i);
    expect(cookie).toMatch(/SameSite=Lax/i);
    expect((await agent.get('/api/auth/me')).body.user).toMatchObject({ email: 'tech@lugbook.test', role: 'tech' });
    await agent.post('/api/auth/sign-out').expect(200);
    expect((await agent.get('/api/auth/me')).body.user).toBeNull();
    expect((await agent.get('/api/parts')).status).toBe(401);
  });

  test('a wrong password is a 401 with one message for unknown e-mail and wrong password alike', async () => {
    const a = await t.anon().post('/api/auth/sign-in').send({ email: 'qa@lugbook.test', password: 'not-the-password' });
    const b = await t.anon().post('/api/auth/sign-in').send({ email: 'nobody@lugbook.test', password: 'not-the-password' });
    expect(a.status).toBe(401);
    expect(b.status).toBe(401);
    expect(a.body.error.message).toBe(b.body.error.message);
  });

  test('repeated failures lock the account (429) even with the right password, and are logged', async () => {
    for (let i = 0; i < 3; i++)
      await t
        .anon()
        .post('/api/auth/sign-in')
        .send({ email: 'viewer@lugbook.test', password: 'wrong-guess-' + i });
    const locked = await t.anon().post('/api/auth/sign-in').send({ email: 'viewer@lugbook.test', password: TEST_PASSWORD });
    expect(locked.status).toBe(429);
    const refusals = t.ctx.sqlite
      .prepare("select count(*) as n from audit_log where action = 'auth.sign-in-refused' and entity_id = 'viewer@lugbook.test'")
      .get() as { n: number };
    expect(refusals.n).toBe(4);
  });

  test('a state-changing request from another origin is refused (403)', async () => {
    const res = await newAgent(t.app)
      .set('Origin', 'http://evil.example')
      .post('/api/auth/sign-in')
      .send({ email: 'tech@lugbook.test', password: TEST_PASSWORD });
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('bad_origin');
  });

  test('a session past its absolute lifetime is ended although it was used recently', async () => {
    // Only this agent's session is aged, so other tests' admin sessions live on (any order).
    const admin = t.ctx.db.select().from(users).where(eq(users.email, 'admin@lugbook.test')).get()!;
    const before = new Set(
      t.ctx.db
        .select()
        .from(sessions)
        .where(eq(sessions.userId, admin.id))
        .all()
        .map((x) => x.id),
    );
    const agent = t.anon();
    await agent.post('/api/auth/sign-in').send({ email: 'admin@lugbook.test', password: TEST_PASSWORD }).expect(200);
    expect((await agent.get('/api/auth/me')).body.user).not.toBeNull();
    const mine = t.ctx.db
      .select()
      .from(sessions)
      .where(eq(sessions.userId, admin.id))
      .all()
      .filter((x) => !before.has(x.id));
    expect(mine).toHaveLength(1);
    t.ctx.db
      .update(sessions)
      .set({ createdAt: Date.now() - SESSION_ABSOLUTE_MS - 1000 })
      .where(eq(sessions.id, mine[0]!.id))
      .run();
    expect((await agent.get('/api/auth/me')).body.user).toBeNull();
    expect((await agent.get('/api/team/members')).status).toBe(401);
  });
});

describe('invitations and password reset', () => {
  test('an admin invites; the invitee sets a password once; the token cannot be used twice', async () => {
    const admin = await t.as('admin');
    const sent = await admin.post('/api/team/invitations').send({ email: 'new.tech@lugbook.test', role: 'tech' });
    expect(sent.status).toBe(201);
    const token = lastMailedToken('new.tech@lugbook.test');
    expect((await t.anon().get(`/api/auth/invitations/${token}`)).body).toMatchObject({ email: 'new.tech@lugbook.test', role: 'tech' });
    const weak = await t.anon().post('/api/auth/accept-invite').send({ token, name: 'New Tech', password: 'password' });
    expect(weak.status).toBe(422);
    const invitee = t.anon();
    const ok = await invitee.post('/api/auth/accept-invite').send({ token, name: 'New Tech', password: 'a-long-bench-passphrase' });
    expect(ok.status).toBe(200);
    expect((await invitee.get('/api/auth/me')).body.user).toMatchObject({ role: 'tech', name: 'New Tech' });
    const again = await t.anon().post('/api/auth/accept-invite').send({ token, name: 'Someone', password: 'another-long-passphrase' });
    expect(again.status).toBe(410);
  });

  test('an expired invitation is refused', async () => {
    const admin = await t.as('admin');
    await admin.post('/api/team/invitations').send({ email: 'late@lugbook.test', role: 'viewer' }).expect(201);
    const token = lastMailedToken('late@lugbook.test');
    t.ctx.sqlite.prepare("update invitations set expires_at = ? where email = 'late@lugbook.test'").run(Date.now() - 1);
    expect((await t.anon().get(`/api/auth/invitations/${token}`)).status).toBe(404);
    expect((await t.anon().post('/api/auth/accept-invite').send({ token, name: 'Late', password: 'a-long-bench-passphrase' })).status).toBe(
      410,
    );
  });

  test('password reset by e-mail sets a new password and ends the old sessions', async () => {
    const old = t.anon();
    await old.post('/api/auth/sign-in').send({ email: 'qa@lugbook.test', password: TEST_PASSWORD }).expect(200);
    const asked = await t.anon().post('/api/auth/request-reset').send({ email: 'qa@lugbook.test' });
    expect(asked.status).toBe(200);
    const unknown = await t.anon().post('/api/auth/request-reset').send({ email: 'nobody@lugbook.test' });
    expect(unknown.body).toEqual(asked.body);
    const token = lastMailedToken('qa@lugbook.test');
    await t.anon().post('/api/auth/reset-password').send({ token, password: 'fresh-bench-passphrase' }).expect(200);
    expect((await old.get('/api/auth/me')).body.user).toBeNull();
    expect((await t.anon().post('/api/auth/reset-password').send({ token, password: 'yet-another-passphrase' })).status).toBe(410);
    await t.anon().post('/api/auth/sign-in').send({ email: 'qa@lugbook.test', password: 'fresh-bench-passphrase' }).expect(200);
  });

  test('a disabled member is signed out and cannot sign in', async () => {
    const admin = await t.as('admin');
    await newMember('leaving.tech@lugbook.test');
    const victim = t.anon();
    await victim.post('/api/auth/sign-in').send({ email: 'leaving.tech@lugbook.test', password: 'a-long-bench-passphrase' }).expect(200);
    const member = t.ctx.db.select().from(users).where(eq(users.email, 'leaving.tech@lugbook.test')).get()!;
    await admin.patch(`/api/team/members/${member.id}`).send({ disabled: true }).expect(200);
    expect((await victim.get('/api/auth/me')).body.user).toBeNull();
    expect(
      (await t.anon().post('/api/auth/sign-in').send({ email: 'leaving.tech@lugbook.test', password: 'a-long-bench-passphrase' })).status,
    ).toBe(401);
  });
});

test('the outbox holds each message as nodemailer built it', async () => {
  await (await t.as('admin')).post('/api/team/invitations').send({ email: 'outbox.reader@lugbook.test', role: 'viewer' }).expect(201);
  const row = t.ctx.db.select().from(outbox).where(eq(outbox.to, 'outbox.reader@lugbook.test')).get()!;
  expect(row.transport).toBe('outbox');
  expect(row.raw).toMatch(/^Content-Type: text\/plain/m);
  expect(row.raw).toMatch(/^Subject: You are invited to Lugbook/m);
});
