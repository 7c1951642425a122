import { zodResolver } from '@hookform/resolvers/zod';
import { useForm } from 'react-hook-form';
import { Link } from 'react-router-dom';
import { SignInInputSchema } from '@shared/schemas/auth';
import type { User } from '@shared/schemas/auth';
import { Alert } from '@/components/ui/alert';
import { Button } from '@/components/ui/button';
import { TextField } from '@/components/ui/field';
import { paths } from '@/config/paths';
import { applyServerError } from '@/lib/form';
import { useSignIn } from '../api/sign-in';

export function SignInForm({ onSignedIn }: { onSignedIn: (user: User) => void }) {
  const signIn = useSignIn();
  const form = useForm({ resolver: zodResolver(SignInInputSchema), defaultValues: { email: '', password: '' } });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit(async (values) => {
    try {
      const { user } = await signIn.mutateAsync(values);
      onSignedIn(user);
    } catch (err) {
      applyServerError(err, form.setError, ['email', 'password']);
    }
  });

  return (
    <form onSubmit={onSubmit} noValidate className="space-y-4">
      {errors.root?.server && <Alert>{errors.root.server.message}</Alert>}
      <TextField label="E-mail" type="email" autoComplete="username" autoFocus error={errors.email?.message} {...form.register('email')} />
      <TextField
        label="Password"
        type="password"
        autoComplete="current-password"
        error={errors.password?.message}
        {...form.register('password')}
      />
      <Button type="submit" variant="primary" className="w-full" busy={signIn.isPending} busyText="Signing in…">
        Sign in
      </Button>
      <p className="text-sm">
        <Link to={paths.auth.resetPassword.getHref()} className="text-accent underline underline-offset-2 hover:text-accent-strong">
          Forgot your password?
        </Link>
      </p>
    </form>
  );
}
