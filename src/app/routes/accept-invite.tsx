import { useNavigate, useSearchParams } from 'react-router-dom';
import { HOME_BY_ROLE } from '@shared/auth/capabilities';
import { AuthLayout } from '@/components/layouts/auth-layout';
import { AcceptInviteForm } from '@/features/auth/components/accept-invite-form';

export function Component() {
  const navigate = useNavigate();
  const [search] = useSearchParams();
  return (
    <AuthLayout title="Join the workshop">
      <AcceptInviteForm token={search.get('token') ?? ''} onAccepted={(user) => navigate(HOME_BY_ROLE[user.role], { replace: true })} />
    </AuthLayout>
  );
}
