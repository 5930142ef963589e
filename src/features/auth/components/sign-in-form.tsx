import { Link } from 'react-router-dom';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { errorMessage } from '../../../lib/error-messages';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { signInInputSchema, useSignIn } from '../api/sign-in';
import type { SignInInput } from '../api/sign-in';
import type { User } from '../../../shared/api/auth';
import { paths } from '../../../app/paths';

export function SignInForm({ onSignedIn }: { onSignedIn: (user: User) => void }) {
  const signIn = useSignIn();
  const form = useForm({
    resolver: zodResolver(signInInputSchema),
    defaultValues: { email: '', password: '' } satisfies SignInInput,
  });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit((values) =>
    signIn.mutate(values, {
      onSuccess: onSignedIn,
      onError: (error) => applyServerFieldErrors(error, form.setError, ['email', 'password']),
    }),
  );

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Sign in">
      <div aria-live="assertive">
        {signIn.isError ? (
          <Alert tone="fault" title="Not signed in">
            {errorMessage(signIn.error)}
          </Alert>
        ) : null}
      </div>
      <TextField label="E-mail address" type="email" autoComplete="username" autoFocus error={errors.email?.message} {...form.register('email')} />
      <TextField label="Password" type="password" autoComplete="current-password" error={errors.password?.message} {...form.register('password')} />
      <Button type="submit" pending={signIn.isPending} pendingLabel="Signing in…">
        Sign in
      </Button>
      <p className="text-sm">
        <Link to={paths.forgotPassword.getHref()}>Forgot your password?</Link>
      </p>
    </form>
  );
}
