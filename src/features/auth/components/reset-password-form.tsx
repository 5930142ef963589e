import type { ReactNode } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { isApiError } from '../../../lib/api-client';
import { errorMessage } from '../../../lib/error-messages';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { confirmPasswordResetInputSchema, useConfirmPasswordReset } from '../api/confirm-password-reset';
import type { ConfirmPasswordResetInput } from '../api/confirm-password-reset';

/**
 * Sets a new password through the link of a reset e-mail. A refused link (used, expired or
 * incomplete) is shown with `invalidLink`, which offers to ask for a new one.
 */
export function ResetPasswordForm({ token, onDone, invalidLink }: { token: string; onDone: (message: string) => void; invalidLink: ReactNode }) {
  const confirm = useConfirmPasswordReset();
  const form = useForm({
    resolver: zodResolver(confirmPasswordResetInputSchema),
    defaultValues: { password: '', confirmPassword: '' } satisfies ConfirmPasswordResetInput,
  });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit(({ password }) =>
    confirm.mutate({ token, password }, { onSuccess: onDone, onError: (error) => applyServerFieldErrors(error, form.setError, ['password']) }),
  );
  const linkRefused = isApiError(confirm.error) && confirm.error.code === 'RESET_LINK_INVALID';

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Choose a new password">
      <div aria-live="assertive">
        {confirm.isError ? (
          <Alert tone="fault" title="Password not changed">
            <p>{errorMessage(confirm.error)}</p>
            {linkRefused ? <p className="mt-2">{invalidLink}</p> : null}
          </Alert>
        ) : null}
      </div>
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
        autoFocus
        hint="At least 10 characters. A short sentence is easy to remember and hard to guess."
        error={errors.password?.message}
        {...form.register('password')}
      />
      <TextField
        label="New password again"
        type="password"
        autoComplete="new-password"
        error={errors.confirmPassword?.message}
        {...form.register('confirmPassword')}
      />
      <Button type="submit" pending={confirm.isPending} pendingLabel="Changing password…">
        Change password
      </Button>
    </form>
  );
}
