import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { z } from 'zod';
import { AcceptInviteInputSchema, type User } from '@shared/schemas/auth';
import { Alert, Loading } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { ROLE_LABEL, formatDate } from '@/lib/format';
import { applyServerError } from '@/lib/form';
import { useAcceptInvite } from '../api/accept-invite';
import { useInvitation } from '../api/get-invitation';

const AcceptInviteFormSchema = AcceptInviteInputSchema.extend({ confirm: z.string() }).refine((v) => v.password === v.confirm, {
  path: ['confirm'],
  message: 'The two passwords differ.',
});

export function AcceptInviteForm({ token, onAccepted }: { token: string; onAccepted: (user: User) => void }) {
  const invitation = useInvitation(token);
  const accept = useAcceptInvite();
  const form = useForm({
    resolver: zodResolver(AcceptInviteFormSchema),
    defaultValues: { token, name: '', password: '', confirm: '' },
  });
  const { errors } = form.formState;

  if (token.length < 20)
    return <Alert>This invitation link is incomplete. Open the link from the e-mail again, or ask an admin for a new one.</Alert>;
  if (invitation.isPending) return <Loading what="Checking the invitation" />;
  if (invitation.isError) return <Alert>{invitation.error.message}</Alert>;

  const onSubmit = form.handleSubmit(async ({ confirm: _confirm, ...input }) => {
    try {
      const { user } = await accept.mutateAsync(input);
      onAccepted(user);
    } catch (err) {
      applyServerError(err, form.setError, ['name', 'password']);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 rounded-md bg-paper-deep px-3 py-2 text-sm">
        <dt className="text-ink-soft">E-mail</dt>
        <dd className="font-medium break-all">{invitation.data.email}</dd>
        <dt className="text-ink-soft">Role</dt>
        <dd className="font-medium">{ROLE_LABEL[invitation.data.role]}</dd>
        <dt className="text-ink-soft">Valid until</dt>
        <dd>{formatDate(invitation.data.expiresAt)}</dd>
      </dl>
      {errors.root?.server && <Alert>{errors.root.server.message}</Alert>}
      <TextField label="Your name" autoComplete="name" autoFocus error={errors.name?.message} {...form.register('name')} />
      <TextField
        label="Password"
        type="password"
        autoComplete="new-password"
        hint="At least 8 characters; a long phrase is best."
        error={errors.password?.message}
        {...form.register('password')}
      />
      <TextField
        label="Password again"
        type="password"
        autoComplete="new-password"
        error={errors.confirm?.message}
        {...form.register('confirm')}
      />
      <Button type="submit" variant="primary" className="w-full" busy={accept.isPending} busyText="Joining…">
        Join and sign in
      </Button>
    </form>
  );
}
