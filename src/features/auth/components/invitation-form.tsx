import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { errorMessage } from '../../../lib/error-messages';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { acceptInvitationInputSchema, useAcceptInvitation } from '../api/accept-invitation';
import type { AcceptInvitationInput } from '../api/accept-invitation';
import type { InvitationInfo, User } from '../../../shared/api/auth';
import { formatDateTime } from '../../../lib/labels';

/** Sets the password of an invited account; the person is signed in when it succeeds. */
export function InvitationForm({ token, invitation, onAccepted }: { token: string; invitation: InvitationInfo; onAccepted: (user: User) => void }) {
  const accept = useAcceptInvitation();
  const form = useForm({
    resolver: zodResolver(acceptInvitationInputSchema),
    defaultValues: { password: '', confirmPassword: '' } satisfies AcceptInvitationInput,
  });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit(({ password }) =>
    accept.mutate({ token, password }, { onSuccess: onAccepted, onError: (error) => applyServerFieldErrors(error, form.setError, ['password']) }),
  );

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Set your password">
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="font-semibold">Name</dt>
        <dd>{invitation.name}</dd>
        <dt className="font-semibold">E-mail address</dt>
        <dd data-testid="invitation-email">{invitation.email}</dd>
        <dt className="font-semibold">Link valid until</dt>
        <dd>{formatDateTime(invitation.expiresAt)}</dd>
      </dl>
      {/* Lets password managers store the new password under the right account. */}
      <input type="hidden" autoComplete="username" value={invitation.email} readOnly />
      <div aria-live="assertive">
        {accept.isError ? (
          <Alert tone="fault" title="Password not set">
            {errorMessage(accept.error)}
          </Alert>
        ) : null}
      </div>
      <TextField
        label="New password"
        type="password"
        autoComplete="new-password"
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
      <Button type="submit" pending={accept.isPending} pendingLabel="Setting password…">
        Set password and sign in
      </Button>
    </form>
  );
}
