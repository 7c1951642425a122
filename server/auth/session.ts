import { Lucia, TimeSpan } from 'lucia';
import type { Db } from '@server/db/client';
import type { WriteTurns } from '@server/db/write-turns';
import { SessionAdapter } from './session-adapter';
import type { Role } from '@shared/schemas/common';

export interface AuthUser {
  id: string;
  email: string;
  name: string;
  role: Role;
}

/** Idle lifetime (lucia extends it while the session is used) and absolute lifetime. */
export const SESSION_IDLE = new TimeSpan(12, 'h');
export const SESSION_ABSOLUTE_MS = 7 * 24 * 3600 * 1000;

export function createLucia(db: Db, opts: { production: boolean; writeTurns?: WriteTurns }) {
  const adapter = new SessionAdapter(db, opts.writeTurns);
  return new Lucia(adapter, {
    sessionExpiresIn: SESSION_IDLE,
    sessionCookie: {
      // The __Host- prefix binds the cookie to this host and path; browsers require Secure with it.
      name: opts.production ? '__Host-lugbook_session' : 'lugbook_session',
      attributes: { secure: opts.production, sameSite: 'lax' },
    },
    getSessionAttributes: (a) => ({ createdAt: a.createdAt }),
    getUserAttributes: (a) => ({ email: a.email, name: a.name, role: a.role, disabledAt: a.disabledAt }),
  });
}

export type AppLucia = ReturnType<typeof createLucia>;

declare module 'lucia' {
  interface Register {
    Lucia: AppLucia;
    DatabaseUserAttributes: { email: string; name: string; role: Role; disabledAt: number | null };
    DatabaseSessionAttributes: { createdAt: number };
  }
}
