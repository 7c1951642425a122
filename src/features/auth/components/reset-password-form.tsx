import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { z } from 'zod';
import { RequestResetInputSchema, ResetPasswordInputSchema } from '@shared/schemas/auth';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { paths } from '@/config/paths';
import { applyServerError } from '@/lib/form';
import { useRequestReset, useResetPassword } from '../api/reset-password';

const linkClass = 'text-accent underline underline-offset-2 hover:text-accent-strong';

/** Step one: ask for a reset link by e-mail. */
export function RequestResetForm() {
  const request = useRequestReset();
  const form = useForm({ resolver: zodResolver(RequestResetInputSchema), defaultValues: { email: '' } });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    try {
      await request.mutateAsync(values);
    } catch (err) {
      applyServerError(err, form.setError, ['email']);
    }
  });

  if (request.isSuccess) {
    return (
      <div className="space-y-4">
        <Alert tone="success">{request.data.message}</Alert>
        <p className="text-sm">
          <Link to={paths.auth.signIn.getHref()} className={linkClass}>
            Back to sign-in
          </Link>
        </p>
      </div>
    );
  }

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      <p className="text-sm text-ink-soft">
        Enter your account's e-mail address; we send a link to choose a new password. It works for one hour.
      </p>
      {errors.root?.server && <Alert>{errors.root.server.message}</Alert>}
      <TextField label="E-mail" type="email" autoComplete="username" autoFocus error={errors.email?.message} {...form.register('email')} />
      <Button type="submit" variant="primary" className="w-full" busy={request.isPending} busyText="Sending…">
        Send the reset link
      </Button>
      <p className="text-sm">
        <Link to={paths.auth.signIn.getHref()} className={linkClass}>
          Back to sign-in
        </Link>
      </p>
    </form>
  );
}

const ResetFormSchema = ResetPasswordInputSchema.extend({ confirm: z.string() }).refine((v) => v.password === v.confirm, {
  path: ['confirm'],
  message: 'The two passwords differ.',
});

/** Step two, from the e-mailed link: choose the new password. */
export function ResetPasswordForm({ token }: { token: string }) {
  const reset = useResetPassword();
  const form = useForm({ resolver: zodResolver(ResetFormSchema), defaultValues: { token, password: '', confirm: '' } });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit(async ({ confirm: _confirm, ...input }) => {
    try {
      await reset.mutateAsync(input);
    } catch (err) {
      applyServerError(err, form.setError, ['password']);
    }
  });

  if (reset.isSuccess) {
    return (
      <div className="space-y-4">
        <Alert tone="success">Your password is changed. Every earlier session of the account has ended.</Alert>
        <Link to={paths.auth.signIn.getHref()} className={linkClass}>
          Sign in with the new password
        </Link>
      </div>
    );
  }

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      {errors.root?.server && (
        <Alert>
          {errors.root.server.message}{' '}
          <Link to={paths.auth.resetPassword.getHref()} className="underline">
            Ask for a new link
          </Link>
        </Alert>
      )}
      {errors.token && <Alert>This reset link is incomplete. Open the link from the e-mail again.</Alert>}
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
        autoFocus
        hint="At least 8 characters; a long phrase is best."
        error={errors.password?.message}
        {...form.register('password')}
      />
      <TextField
        label="New password again"
        type="password"
        autoComplete="new-password"
        error={errors.confirm?.message}
        {...form.register('confirm')}
      />
      <Button type="submit" variant="primary" className="w-full" busy={reset.isPending} busyText="Saving…">
        Set the new password
      </Button>
    </form>
  );
}
