// Lucia's Drizzle adapter with the one read every signed-in request makes (its session and its user)
// kept as prepared queries: the adapter builds and prepares that query anew on each call, which was
// the largest part of a small request's time on the request thread. Every other call is the adapter's own,
// its writes after a write turn (server/db/write-turns.ts): a session's renewal comes on any request.
import { DrizzleSQLiteAdapter } from '@lucia-auth/adapter-drizzle';
import { eq, getTableColumns, sql } from 'drizzle-orm';
import type { DatabaseSession, DatabaseUser } from 'lucia';
import type { Db } from '@server/db/client';
import type { WriteTurns } from '@server/db/write-turns';
import { sessions, users } from '@server/db/schema';

export class SessionAdapter extends DrizzleSQLiteAdapter {
  private readonly sessionById;
  private readonly userBySessionId;

  constructor(
    db: Db,
    private readonly writeTurns?: WriteTurns,
  ) {
    super(db, sessions, users);
    this.sessionById = db
      .select()
      .from(sessions)
      .where(eq(sessions.id, sql.placeholder('id')))
      .prepare();
    this.userBySessionId = db
      .select(getTableColumns(users))
      .from(sessions)
      .innerJoin(users, eq(sessions.userId, users.id))
      .where(eq(sessions.id, sql.placeholder('id')))
      .prepare();
  }

  override async setSession(session: DatabaseSession): Promise<void> {
    await this.writeTurns?.take();
    return super.setSession(session);
  }
  override async updateSessionExpiration(sessionId: string, expiresAt: Date): Promise<void> {
    await this.writeTurns?.take();
    return super.updateSessionExpiration(sessionId, expiresAt);
  }
  override async deleteSession(sessionId: string): Promise<void> {
    await this.writeTurns?.take();
    return super.deleteSession(sessionId);
  }
  override async deleteUserSessions(userId: string): Promise<void> {
    await this.writeTurns?.take();
    return super.deleteUserSessions(userId);
  }
  override async deleteExpiredSessions(): Promise<void> {
    await this.writeTurns?.take();
    return super.deleteExpiredSessions();
  }

  override async getSessionAndUser(sessionId: string): Promise<[session: DatabaseSession | null, user: DatabaseUser | null]> {
    // Each looked up on its own, as the adapter does: lucia ends a session whose user is gone.
    const s = this.sessionById.all({ id: sessionId });
    const u = this.userBySessionId.all({ id: sessionId });
    let session: DatabaseSession | null = null;
    if (s.length === 1) {
      const { id, userId, expiresAt, ...attributes } = s[0]!;
      session = { id, userId, expiresAt: new Date(expiresAt * 1000), attributes };
    }
    let user: DatabaseUser | null = null;
    if (u.length === 1) {
      const { id, ...attributes } = u[0]!;
      user = { id, attributes };
    }
    return [session, user];
  }
}
