// Loader helpers shared by routes. They only decide what to show; the server checks every request.
import type { QueryClient } from '@tanstack/react-query';
import { data, redirect } from 'react-router-dom';
import { HOME_BY_ROLE, roleCan, type Capability } from '@shared/auth/capabilities';
import type { User } from '@shared/schemas/auth';
import { paths } from '@/config/paths';
import { meQueryOptions } from '@/lib/auth';

/** The signed-in user, or a redirect to sign-in that remembers the page asked for. */
export async function requireUser(queryClient: QueryClient, request: Request): Promise<User> {
  const { user } = await queryClient.ensureQueryData(meQueryOptions());
  if (!user) {
    const url = new URL(request.url);
    throw redirect(paths.auth.signIn.getHref(url.pathname + url.search));
  }
  return user;
}

/** For screens of one capability (Team, Outbox: admin): others get a 403 page, not the screen. */
export async function requireCapability(queryClient: QueryClient, request: Request, capability: Capability): Promise<User> {
  const user = await requireUser(queryClient, request);
  if (!roleCan(user.role, capability)) throw data('Your role may not open this screen.', { status: 403 });
  return user;
}

/** Signed-out pages send a signed-in user home instead. */
export async function redirectIfSignedIn(queryClient: QueryClient): Promise<null> {
  const { user } = await queryClient.ensureQueryData(meQueryOptions());
  if (user) throw redirect(HOME_BY_ROLE[user.role]);
  return null;
}
