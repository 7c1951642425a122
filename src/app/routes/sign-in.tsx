import type { QueryClient } from '@tanstack/react-query';
import { useNavigate, useSearchParams } from 'react-router-dom';
import { HOME_BY_ROLE } from '@shared/auth/capabilities';
import { AuthLayout } from '@/components/layouts/auth-layout';
import { safeRedirect } from '@/config/paths';
import { SignInForm } from '@/features/auth/components/sign-in-form';
import { redirectIfSignedIn } from '../route-guards';

export const makeLoader = (queryClient: QueryClient) => () => redirectIfSignedIn(queryClient);

export function Component() {
  const navigate = useNavigate();
  const [search] = useSearchParams();
  return (
    <AuthLayout title="Sign in">
      <SignInForm onSignedIn={(user) => navigate(safeRedirect(search.get('redirectTo'), HOME_BY_ROLE[user.role]), { replace: true })} />
    </AuthLayout>
  );
}
