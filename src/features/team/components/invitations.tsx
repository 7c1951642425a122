import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { InviteInputSchema } from '@shared/schemas/auth';
import { ROLES } from '@shared/schemas/common';
import { Alert, Loading } from '@/components/ui/alert';
import { Badge, type BadgeIconName, type BadgeTone } from '@/components/ui/badge';
import { Button } from '@/components/ui/button';
import { SelectField, TextField } from '@/components/ui/field';
import { ROLE_LABEL, formatDate } from '@/lib/format';
import { applyServerError } from '@/lib/form';
import { useCreateInvitation } from '../api/create-invitation';
import { invitationState, useInvitations, type InvitationState } from '../api/get-invitations';
import { useRevokeInvitation } from '../api/revoke-invitation';

export function InviteForm() {
  const create = useCreateInvitation();
  const form = useForm({ resolver: zodResolver(InviteInputSchema), defaultValues: { email: '', role: 'tech' as const } });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    try {
      await create.mutateAsync(values);
      form.reset({ email: '', role: values.role });
    } catch (err) {
      applyServerError(err, form.setError, ['email', 'role']);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate aria-label="Invite a member" className="space-y-3">
      {errors.root?.server && <Alert>{errors.root.server.message}</Alert>}
      {create.isSuccess && <Alert tone="success">Invitation sent to {create.data.email}. The message is in the Outbox.</Alert>}
      <div className="grid gap-3 sm:grid-cols-[1fr_11rem_auto] sm:items-start">
        <TextField label="E-mail" type="email" autoComplete="off" error={errors.email?.message} {...form.register('email')} />
        <SelectField label="Role" error={errors.role?.message} {...form.register('role')}>
          {ROLES.map((r) => (
            <option key={r} value={r}>
              {ROLE_LABEL[r]}
            </option>
          ))}
        </SelectField>
        <Button type="submit" variant="primary" className="sm:mt-6" busy={create.isPending} busyText="Sending…">
          Send invitation
        </Button>
      </div>
    </form>
  );
}

const STATE_LOOK: Record<InvitationState, { tone: BadgeTone; icon: BadgeIconName; label: string }> = {
  open: { tone: 'accent', icon: 'arrive', label: 'Open' },
  accepted: { tone: 'pass', icon: 'check', label: 'Accepted' },
  revoked: { tone: 'fail', icon: 'cross', label: 'Revoked' },
  expired: { tone: 'neutral', icon: 'shelf', label: 'Expired' },
};

export function InvitationsList() {
  const invitations = useInvitations();
  const revoke = useRevokeInvitation();

  if (invitations.isPending) return <Loading what="Loading invitations" />;
  if (invitations.isError) return <Alert>{invitations.error.message}</Alert>;
  const rows = invitations.data.invitations;
  if (rows.length === 0) return <p className="text-sm text-ink-soft">No invitations yet.</p>;

  return (
    <div className="space-y-3">
      {revoke.isError && <Alert>{revoke.error.message}</Alert>}
      <ul className="divide-y divide-paper-edge/70">
        {rows.map((inv) => {
          const state = invitationState(inv);
          return (
            <li key={inv.id} className="flex flex-wrap items-center gap-x-4 gap-y-1 py-2 text-sm">
              <span className="min-w-0 flex-1 break-all font-medium">{inv.email}</span>
              <span className="text-ink-soft">{ROLE_LABEL[inv.role]}</span>
              <Badge {...STATE_LOOK[state]} />
              <span className="text-xs text-ink-soft">
                {state === 'open' ? `until ${formatDate(inv.expiresAt)}` : `sent ${formatDate(inv.createdAt)}`}
              </span>
              {state === 'open' && (
                <Button
                  size="sm"
                  variant="danger"
                  busy={revoke.isPending && revoke.variables === inv.id}
                  busyText="Revoking…"
                  onClick={() => revoke.mutate(inv.id)}
                  aria-label={`Revoke the invitation of ${inv.email}`}
                >
                  Revoke
                </Button>
              )}
            </li>
          );
        })}
      </ul>
    </div>
  );
}
