import { roleCan } from '@shared/auth/capabilities';
import type { AuthUser } from './session';

/** Saved work (harness designs, comparisons) is changed by its owner, or by qa and admin. */
export function mayChangeOwned(ownerId: string | null, user: AuthUser): boolean {
  return ownerId === user.id || roleCan(user.role, 'qa');
}
