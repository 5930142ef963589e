import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { TextAreaField, TextField } from '../../../components/ui/field';
import { errorMessage } from '../../../lib/error-messages';
import type { FieldChange } from '../../../shared/api/fieldChanges';
import type { Draft } from '../../walk/draft/use-draft';
import { CreateFieldChangeBody } from '../api/create-field-change';
import { useUpdateFieldChange } from '../api/update-field-change';
import type { FieldChangeIds } from '../api/urls';

export const detailsFormSchema = CreateFieldChangeBody.pick({ title: true, description: true });

/**
 * The field change's title and description, in words for the designer. Saved at the version the
 * open draft holds (after saving any document change still pending), so neither write is lost.
 */
export function DetailsForm({ ids, fieldChange, draft }: { ids: FieldChangeIds; fieldChange: FieldChange; draft: Draft }) {
  const update = useUpdateFieldChange();
  const form = useForm({ resolver: zodResolver(detailsFormSchema), defaultValues: { title: fieldChange.title, description: fieldChange.description } });
  const onSubmit = form.handleSubmit(async (values) => {
    const version = await draft.versionToIssue();
    if (version === null) return;
    update.mutate(
      { ids, body: { ...values, version } },
      {
        onSuccess: (saved) => {
          draft.acknowledge(saved.version);
          form.reset(values);
        },
      },
    );
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3" aria-label="Field change details">
      <TextField label="What is substituted" error={form.formState.errors.title?.message} {...form.register('title')} />
      <TextAreaField
        label="Why, and what the designer should know"
        hint="For example: press fittings in stock, soldering not allowed in the occupied floors."
        error={form.formState.errors.description?.message}
        {...form.register('description')}
      />
      <div>
        <Button type="submit" variant="secondary" pending={update.isPending} pendingLabel="Saving…" disabled={!form.formState.isDirty}>
          Save the details
        </Button>
      </div>
      <div aria-live="assertive">
        {update.isError ? (
          <Alert tone="fault" title="Details not saved">
            {errorMessage(update.error)}
          </Alert>
        ) : null}
      </div>
    </form>
  );
}
