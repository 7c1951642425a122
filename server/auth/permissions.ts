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
  'GET /api/team/label-clashes': 'admin',
  'GET /api/team/invitations': 'admin',
  'POST /api/team/invitations': 'admin',
  'DELETE /api/team/invitations/:id': 'admin',
  'GET /api/outbox': 'admin',
  'GET /api/outbox/:id/attachments/:attachmentId': 'admin',
  'GET /api/audit': 'admin',

  // Parts
  'GET /api/parts': 'read',
  'POST /api/parts': 'write',
  'GET /api/parts/:id': 'read',
  'PATCH /api/parts/:id': 'write',
  'GET /api/parts/by-label/:label': 'read',
  'GET /api/parts/:id/label.svg': 'read',

  // Sweeps, fits, attachments
  'GET /api/parts/:id/sweeps': 'read',
  'POST /api/parts/:id/sweeps': 'write',
  'GET /api/parts/:id/fits': 'read',
  'POST /api/parts/:id/sweeps/:sweepId/refit': 'write',
  'GET /api/parts/:id/attachments': 'read',
  'POST /api/parts/:id/attachments': 'write',
  'GET /api/lots/:id/attachments': 'read',
  'POST /api/lots/:id/attachments': 'write',
  'GET /api/jobs/:id/attachments': 'read',
  'POST /api/jobs/:id/attachments': 'write',
  'GET /api/attachments/:id/file': 'read',

  // Lots
  'GET /api/lots': 'read',
  'POST /api/lots': 'write',
  'GET /api/lots/:id': 'read',
  'GET /api/lots/:id/items': 'read',
  'POST /api/lots/:id/readings': 'write',
  'POST /api/lots/:id/disposition': 'qa',
  'POST /api/lots/:id/reopen': 'admin',
  'PUT /api/lots/:id/watchers': 'write',
  'GET /api/lots/watcher-candidates': 'qa',
  'GET /api/lots/:id/export.csv': 'read',
  'POST /api/lots/:id/promote': 'write',

  // Harness engine (computes, stores nothing) and saved designs
  'GET /api/harness/presets': 'read',
  'POST /api/harness/simulate': 'read',
  'POST /api/harness/sweep': 'read',
  'POST /api/harness/netlist': 'read',
  'POST /api/harness/render': 'read',
  'GET /api/harness/layouts': 'read',
  'POST /api/harness/bleed-finder': 'read',
  'GET /api/harnesses': 'read',
  'POST /api/harnesses': 'write',
  'GET /api/harnesses/:id': 'read',
  'PUT /api/harnesses/:id': 'write',
  'DELETE /api/harnesses/:id': 'write',

  // Jobs
  'GET /api/jobs': 'read',
  'POST /api/jobs': 'write',
  'GET /api/jobs/:id': 'read',
  'PATCH /api/jobs/:id': 'write',
  'PUT /api/jobs/:id/before': 'write',
  'POST /api/jobs/:id/parts': 'write',
  'DELETE /api/jobs/:id/parts/:partId': 'write',
  'PUT /api/jobs/:id/parts/:partId/slot': 'write',
  'GET /api/jobs/:id/report': 'read',
  'POST /api/jobs/:id/report': 'write',

  // Compare
  'GET /api/compare/candidates': 'read',
  'POST /api/compare/tapers': 'read',
  'GET /api/comparisons': 'read',
  'POST /api/comparisons': 'write',
  'GET /api/comparisons/:id': 'read',
  'PATCH /api/comparisons/:id': 'write',
  'DELETE /api/comparisons/:id': 'write',
  'GET /api/comparisons/:id/export.csv': 'read',

  // Stateless analysis (the measurement engine)
  'POST /api/analysis/value': 'read',
  'POST /api/analysis/marking': 'read',
  'POST /api/analysis/taper': 'read',
  'POST /api/analysis/coil': 'read',
  'POST /api/analysis/lot': 'read',

  // Readings, instruments, tolerance profiles
  'GET /api/parts/:id/readings': 'read',
  'POST /api/parts/:id/readings': 'write',
  'GET /api/readings/recent': 'read',
  'GET /api/instruments': 'read',
  'POST /api/instruments': 'instruments',
  'PUT /api/instruments/:id': 'instruments',
  'GET /api/profiles': 'read',
  'POST /api/profiles': 'qa',
  'PUT /api/profiles/:id': 'qa',
};
