import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Alert, LiveMessage } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField, TextField } from '../../../components/ui/field';
import { isApiError } from '../../../lib/api-client';
import { errorMessage } from '../../../lib/error-messages';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { ROLE_LABELS } from '../../../lib/labels';
import { addMemberInputSchema, useAddMember } from '../api/add-member';
import type { AddMemberInput } from '../api/add-member';
import type { MemberMutationConfig } from '../api/mutation-config';
import { ROLE_OPTIONS } from './role-options';

export function AddMemberForm({ projectId, config }: { projectId: string; config?: MemberMutationConfig }) {
  const add = useAddMember(projectId, config);
  const [added, setAdded] = useState<string | null>(null);
  const form = useForm({
    resolver: zodResolver(addMemberInputSchema),
    defaultValues: { email: '', role: 'contractor' } satisfies AddMemberInput,
  });
  const { errors } = form.formState;

  const onSubmit = form.handleSubmit((values) => {
    setAdded(null);
    add.mutate(values, {
      onSuccess: (member) => {
        setAdded(`${member.name} was added as ${ROLE_LABELS[member.role].toLowerCase()}.`);
        form.reset({ email: '', role: values.role });
      },
      onError: (error) => {
        if (isApiError(error) && (error.code === 'USER_NOT_FOUND' || error.code === 'CONFLICT')) {
          form.setError('email', {
            type: 'server',
            message: error.code === 'CONFLICT' ? 'This person is already a member of the project' : errorMessage(error),
          });
        } else {
          applyServerFieldErrors(error, form.setError, ['email', 'role']);
        }
      },
    });
  });

  const generalError = add.isError && !(isApiError(add.error) && ['USER_NOT_FOUND', 'CONFLICT', 'VALIDATION_FAILED'].includes(add.error.code));

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3" aria-label="Add a member">
      <h3 className="text-lg">Add a member</h3>
      <p className="text-sm text-ink-soft">The person needs a Headroom account; an administrator creates accounts.</p>
      <div className="grid items-start gap-3 sm:grid-cols-[1fr_12rem_auto]">
        <TextField label="Member's e-mail address" type="email" autoComplete="off" error={errors.email?.message} {...form.register('email')} />
        <SelectField label="Role in this project" options={ROLE_OPTIONS} error={errors.role?.message} {...form.register('role')} />
        <Button type="submit" className="sm:mt-6" pending={add.isPending} pendingLabel="Adding…">
          Add member
        </Button>
      </div>
      <div aria-live="assertive">
        {generalError ? (
          <Alert tone="fault" title="Member not added">
            {errorMessage(add.error)}
          </Alert>
        ) : null}
      </div>
      <LiveMessage tone="sound" message={added} />
    </form>
  );
}
