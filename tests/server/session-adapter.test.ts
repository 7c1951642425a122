// The session read with prepared queries (server/auth/session-adapter.ts) answers exactly what lucia's
// Drizzle adapter answers: for a live session, for one whose user was disabled, and for an unknown id.
import { DrizzleSQLiteAdapter } from '@lucia-auth/adapter-drizzle';
import { afterAll, beforeAll, describe, expect, test } from 'vitest';
import { SessionAdapter } from '@server/auth/session-adapter';
import { sessions, users } from '@server/db/schema';
import { createTestApp, type TestApp } from '../support/app';

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

describe('SessionAdapter', () => {
  test('answers as the library adapter does', async () => {
    await t.as('qa');
    await t.as('viewer');
    const ids = (t.ctx.sqlite.prepare('select id from sessions').pluck().all() as string[]).slice(0, 2);
    expect(ids).toHaveLength(2);
    const ours = new SessionAdapter(t.ctx.db);
    const theirs = new DrizzleSQLiteAdapter(t.ctx.db, sessions, users);
    for (const id of [...ids, 'no-such-session']) {
      expect(await ours.getSessionAndUser(id)).toEqual(await theirs.getSessionAndUser(id));
    }
    const [session, user] = await ours.getSessionAndUser(ids[0]!);
    expect(session!.id).toBe(ids[0]);
    expect(session!.expiresAt).toBeInstanceOf(Date);
    expect(session!.expiresAt.getTime()).toBeGreaterThan(Date.now());
    expect(user!.id).toBe(session!.userId);
    expect(await ours.getSessionAndUser('no-such-session')).toEqual([null, null]);

    // A disabled user: the attributes carry it, as the library's do.
    t.ctx.sqlite.prepare('update users set disabled_at = ? where id = ?').run(Date.now(), user!.id);
    expect(await ours.getSessionAndUser(ids[0]!)).toEqual(await theirs.getSessionAndUser(ids[0]!));
  });
});
