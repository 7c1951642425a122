// The one permission map: every API route, by method and path pattern, and who may call it.
// `public` routes need no session; every other entry names a capability of
// shared/auth/capabilities.ts. A route missing here is refused for everyone (see authorize()),
// and tests/server/permissions.test.ts fails when a registered route is not listed.
import type { Capability } from '@shared/auth/capabilities';

export type RoutePermission = 'public' | Capability;

export const ROUTE_PERMISSIONS: Record<string, RoutePermission> = {
  'GET /api/health': 'public',

  // Sign-in and accounts
  'GET /api/auth/me': 'public',
  'POST /api/auth/sign-in': 'public',
  'POST /api/auth/sign-out': 'public',
  'GET /api/auth/invitations/:token': 'public',
  'POST /api/auth/accept-invite': 'public',
  'POST /api/auth/request-reset': 'public',
  'POST /api/auth/reset-password': 'public',

  // Team, outbox, audit (admin)
  'GET /api/team/members': 'admin',
  'PATCH /api/team/members/:id': 'admin',
  'GET /api/team/invitations': 'admin',
  'POST /api/team/invitations': 'admin',
  'DELETE /api/team/invitations/:id': 'admin',
  'GET /api/outbox': 'admin',
  'GET /api/audit': 'admin',

  // Parts
  'GET /api/parts': 'read',
  'POST /api/parts': 'write',
  'GET /api/parts/:id': 'read',
  'PATCH /api/parts/:id': 'write',
};
