import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { errorMessage } from '../../../lib/error-messages';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { requestPasswordResetInputSchema, useRequestPasswordReset } from '../api/request-password-reset';
import type { RequestPasswordResetInput } from '../api/request-password-reset';

/** Asks for a link to choose a new password; the answer is the same for every address. */
export function ForgotPasswordForm() {
  const request = useRequestPasswordReset();
  const form = useForm({
    resolver: zodResolver(requestPasswordResetInputSchema),
    defaultValues: { email: '' } satisfies RequestPasswordResetInput,
  });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit((values) => request.mutate(values, { onError: (error) => applyServerFieldErrors(error, form.setError, ['email']) }));

  if (request.isSuccess) {
    return (
      <Alert tone="sound" title="Check your e-mail">
        <p>{request.data}</p>
      </Alert>
    );
  }

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Ask for a new password">
      <div aria-live="assertive">
        {request.isError ? (
          <Alert tone="fault" title="Link not sent">
            {errorMessage(request.error)}
          </Alert>
        ) : null}
      </div>
      <TextField label="E-mail address" type="email" autoComplete="username" autoFocus error={errors.email?.message} {...form.register('email')} />
      <Button type="submit" pending={request.isPending} pendingLabel="Sending…">
        Send me a link
      </Button>
    </form>
  );
}
