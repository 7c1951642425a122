import { useSearchParams } from 'react-router-dom';
import { AuthLayout } from '@/components/layouts/auth-layout';
import { RequestResetForm, ResetPasswordForm } from '@/features/auth/components/reset-password-form';

/** Without a token: ask for a reset link. With the token from the e-mail: choose the new password. */
export function Component() {
  const [search] = useSearchParams();
  const token = search.get('token');
  return token ? (
    <AuthLayout title="Choose a new password">
      <ResetPasswordForm token={token} />
    </AuthLayout>
  ) : (
    <AuthLayout title="Forgot your password?">
      <RequestResetForm />
    </AuthLayout>
  );
}
