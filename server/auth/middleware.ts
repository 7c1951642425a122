import type { RequestHandler } from 'express';
import type { Session } from 'lucia';
import { hostName } from '@server/http/hosts';
import { HttpError } from '@server/http/errors';
import { roleCan } from '@shared/auth/capabilities';
import { ROUTE_PERMISSIONS } from './permissions';
import { SESSION_ABSOLUTE_MS, type AppLucia, type AuthUser } from './session';

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace -- Express declares its Request type in a global namespace; augmenting it needs one
  namespace Express {
    interface Request {
      user: AuthUser | null;
      session: Session | null;
    }
  }
}

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * State-changing requests must come from the app's own origin (lucia's CSRF guidance), compared exactly:
 * scheme, host and port of the Origin header against this request's own (no user info, no path).
 */
export const originCheck: RequestHandler = (req, _res, next) => {
  if (SAFE_METHODS.has(req.method)) return next();
  const origin = req.headers.origin;
  const host = req.headers.host;
  if (!origin || !host || !sameOrigin(origin, `${req.protocol}://${host}`)) {
    return next(new HttpError(403, 'bad_origin', 'This request did not come from the Lugbook page itself.'));
  }
  next();
};

function sameOrigin(origin: string, own: string): boolean {
  let a: URL;
  let b: URL;
  try {
    a = new URL(origin);
    b = new URL(own);
  } catch {
    return false;
  }
  // An Origin header is scheme://host[:port] only; anything more (user info, a path) is not one.
  return origin === a.origin && a.origin === b.origin;
}

/**
 * Requests for a host name the app does not serve are refused (a DNS rebinding page reaches a
 * local install under its own name): PUBLIC_URL's host, LUGBOOK_ALLOWED_HOSTS, and outside production
 * localhost and 127.0.0.1.
 */
export function hostCheck(allowed: string[]): RequestHandler {
  const names = new Set(allowed);
  return (req, res, next) => {
    const host = req.headers.host;
    if (host && names.has(hostName(host))) return next();
    res.status(421).json({
      error: { code: 'unknown_host', message: 'This server does not answer to that host name; add it to LUGBOOK_ALLOWED_HOSTS.' },
    });
  };
}

/** Reads the session cookie and sets req.user / req.session; ends sessions past their absolute lifetime. */
export function authenticate(lucia: AppLucia, now: () => number = Date.now): RequestHandler {
  return async (req, res, next) => {
    req.user = null;
    req.session = null;
    const sessionId = lucia.readSessionCookie(req.headers.cookie ?? '');
    if (!sessionId) return next();
    const { session, user } = await lucia.validateSession(sessionId);
    if (!session || !user || user.disabledAt !== null || now() - session.createdAt > SESSION_ABSOLUTE_MS) {
      if (session) await lucia.invalidateSession(session.id);
      res.appendHeader('Set-Cookie', lucia.createBlankSessionCookie().serialize());
      return next();
    }
    if (session.fresh) res.appendHeader('Set-Cookie', lucia.createSessionCookie(session.id).serialize());
    req.session = session;
    req.user = { id: user.id, email: user.email, name: user.name, role: user.role };
    next();
  };
}

/** Guards one route by its entry in the permission map; a route not in the map is refused. */
export function authorize(routeKey: string): RequestHandler {
  const permission = ROUTE_PERMISSIONS[routeKey];
  return (req, _res, next) => {
    if (permission === undefined) {
      return next(new HttpError(403, 'not_permitted', `The route ${routeKey} is not in the permission map.`));
    }
    if (permission === 'public') return next();
    if (!req.user) return next(new HttpError(401, 'unauthenticated', 'Sign in first.'));
    if (!roleCan(req.user.role, permission)) {
      return next(new HttpError(403, 'forbidden', `The ${req.user.role} role may not do this.`));
    }
    next();
  };
}
