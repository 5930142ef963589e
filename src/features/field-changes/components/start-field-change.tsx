import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useNavigate } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextAreaField, TextField } from '../../../components/ui/field';
import { errorMessage } from '../../../lib/error-messages';
import { CreateFieldChangeBody, useCreateFieldChange } from '../api/create-field-change';
import { fieldChangePaths } from '../paths';

const startForm = CreateFieldChangeBody.omit({ revisionId: true });

/**
 * A contractor starts a field change on the current issued revision: a copy of it in which they
 * may change fittings, pipe and devices, checked against the issued one.
 */
export function StartFieldChange({
  projectId,
  systemId,
  revisionId,
  revisionNumber,
}: {
  projectId: string;
  systemId: string;
  revisionId: string;
  revisionNumber: number;
}) {
  const [open, setOpen] = useState(false);
  const create = useCreateFieldChange();
  const navigate = useNavigate();
  const form = useForm({ resolver: zodResolver(startForm), defaultValues: { title: '', description: '' } });
  const onSubmit = form.handleSubmit((values) =>
    create.mutate(
      { projectId, systemId, body: { revisionId, ...values } },
      { onSuccess: (fc) => navigate(fieldChangePaths.step.getHref(projectId, systemId, fc.id, 'pipe')) },
    ),
  );
  if (!open) {
    return (
      <div>
        <Button onClick={() => setOpen(true)}>Check a substitution on revision {revisionNumber}</Button>
      </div>
    );
  }
  return (
    <form
      onSubmit={onSubmit}
      noValidate
      className="flex max-w-xl flex-col gap-3 rounded-md border-2 border-rule bg-surface p-4"
      aria-label="Start a field change"
    >
      <p className="text-sm">
        A field change is a copy of issued revision {revisionNumber} in which you change fittings, pipe material, sizes and lengths, or devices, and see the
        effect at every fixture before you build it. The designer accepts or declines it.
      </p>
      <TextField
        label="What do you want to substitute?"
        hint="For example: press fittings on the riser instead of soldered elbows."
        error={form.formState.errors.title?.message}
        {...form.register('title')}
      />
      <TextAreaField label="Why (optional)" error={form.formState.errors.description?.message} {...form.register('description')} />
      <div className="flex gap-2">
        <Button type="submit" pending={create.isPending} pendingLabel="Starting…">
          Start the field change
        </Button>
        <Button variant="quiet" onClick={() => setOpen(false)}>
          Cancel
        </Button>
      </div>
      <div aria-live="assertive">
        {create.isError ? (
          <Alert tone="fault" title="Not started">
            {errorMessage(create.error)}
          </Alert>
        ) : null}
      </div>
    </form>
  );
}
