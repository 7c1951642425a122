// What each role may do (docs/domain.md, Roles). The server's route map refers to these capabilities;
// the client uses the same table only to hide what a role cannot do.
import type { Role } from '@shared/schemas/common';

export const CAPABILITIES = {
  /** Read everything, compare, export. */
  read: ['admin', 'qa', 'tech', 'viewer'],
  /** Parts, readings, sweeps, uploads, harness designs, jobs, lots and their uploads. */
  write: ['admin', 'qa', 'tech'],
  /** Lot dispositions and tolerance profiles. */
  qa: ['admin', 'qa'],
  /** Instruments and their calibration (admin and qa keep the meters). */
  instruments: ['admin', 'qa'],
  /** Members, roles, invitations, the outbox, reopening a disposed lot. */
  admin: ['admin'],
} as const satisfies Record<string, readonly Role[]>;

export type Capability = keyof typeof CAPABILITIES;

export function roleCan(role: Role | null | undefined, capability: Capability): boolean {
  if (!role) return false;
  return (CAPABILITIES[capability] as readonly Role[]).includes(role);
}

/** Where each role's day starts (docs/screens.md: techs to Bench, QA to Lots, viewers to Compare). */
export const HOME_BY_ROLE: Record<Role, string> = {
  admin: '/bench',
  tech: '/bench',
  qa: '/lots',
  viewer: '/compare',
};
