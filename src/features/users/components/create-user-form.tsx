import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { CheckboxField, SelectField, TextField } from '../../../components/ui/field';
import { isApiError } from '../../../lib/api-client';
import { errorMessage } from '../../../lib/error-messages';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { ROLE_LABELS } from '../../../lib/labels';
import { ACCOUNT_ROLES } from '../../../shared/api/auth';
import { createUserInputSchema, useCreateUser } from '../api/create-user';
import type { CreateUserInput } from '../api/create-user';
import type { User } from '../../../shared/api/auth';
import type { Invitation } from '../../../shared/api/users';

const ACCOUNT_ROLE_OPTIONS = ACCOUNT_ROLES.map((value) => ({ value, label: ROLE_LABELS[value] }));

export function CreateUserForm({ onCreated }: { onCreated: (result: { user: User; invitation: Invitation }) => void }) {
  const create = useCreateUser();
  const form = useForm({
    resolver: zodResolver(createUserInputSchema),
    defaultValues: { email: '', name: '', accountRole: 'contractor', isAdmin: false } satisfies CreateUserInput,
  });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit((values) =>
    create.mutate(values, {
      onSuccess: (result) => {
        form.reset();
        onCreated(result);
      },
      onError: (error) => {
        if (isApiError(error) && error.code === 'CONFLICT')
          form.setError('email', { type: 'server', message: 'An account with this e-mail address already exists' });
        else applyServerFieldErrors(error, form.setError, ['email', 'name', 'accountRole', 'isAdmin']);
      },
    }),
  );

  const generalError = create.isError && !(isApiError(create.error) && ['CONFLICT', 'VALIDATION_FAILED'].includes(create.error.code));

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="Create an account">
      <div className="grid gap-4 md:grid-cols-2">
        <TextField label="Full name" autoComplete="off" error={errors.name?.message} {...form.register('name')} />
        <TextField label="E-mail address" type="email" autoComplete="off" error={errors.email?.message} {...form.register('email')} />
        <SelectField
          label="Kind of account"
          hint="Designer accounts may create projects. A person's role in each project is set when they are added to it."
          options={ACCOUNT_ROLE_OPTIONS}
          error={errors.accountRole?.message}
          {...form.register('accountRole')}
        />
        <CheckboxField className="md:mt-7" label="Administrator (manages accounts)" error={errors.isAdmin?.message} {...form.register('isAdmin')} />
      </div>
      <div aria-live="assertive">
        {generalError ? (
          <Alert tone="fault" title="Account not created">
            {errorMessage(create.error)}
          </Alert>
        ) : null}
      </div>
      <div>
        <Button type="submit" pending={create.isPending} pendingLabel="Creating…">
          Create account and invitation link
        </Button>
      </div>
    </form>
  );
}
