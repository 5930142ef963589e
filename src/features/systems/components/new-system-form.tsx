import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { useNavigate } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField, TextField } from '../../../components/ui/field';
import { errorMessage } from '../../../lib/error-messages';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import { createSystemInputSchema, useCreateSystem } from '../api/create-system';
import { walkPaths } from '../../walk/paths';

const SERVICE_OPTIONS = [
  { value: 'cold', label: 'Cold water' },
  { value: 'hot', label: 'Hot water' },
];

type Values = { name: string; service: 'cold' | 'hot'; waterTemperature: string };

/** A new system starts as a draft with only its connection; the walk then opens at its first step. */
export function NewSystemForm({ projectId, unitSystem }: { projectId: string; unitSystem: 'US' | 'SI' }) {
  const create = useCreateSystem();
  const navigate = useNavigate();
  const form = useForm<Values>({ resolver: zodResolver(createSystemInputSchema) as never, defaultValues: { name: '', service: 'cold', waterTemperature: '' } });
  const unit = unitSystem === 'US' ? '°F' : '°C';
  // 60/140 °F and 15.6/60 °C: the server's defaults for cold and hot (common practice).
  const usual = unitSystem === 'US' ? '60 °F cold, 140 °F hot' : '15.6 °C cold, 60 °C hot';

  const onSubmit = form.handleSubmit((values) => {
    const body = values as unknown as { name: string; service: 'cold' | 'hot'; waterTemperature?: number };
    create.mutate(
      { projectId, body },
      {
        onSuccess: ({ system, revision }) => navigate(walkPaths.step.getHref(projectId, system.id, revision.id, 'supply')),
        onError: (error) => applyServerFieldErrors(error, form.setError, ['name', 'service', 'waterTemperature']),
      },
    );
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-4" aria-label="New system">
      <div aria-live="assertive">
        {create.isError ? (
          <Alert tone="fault" title="System not created">
            {errorMessage(create.error)}
          </Alert>
        ) : null}
      </div>
      <div className="grid gap-4 md:grid-cols-3">
        <TextField label="System name" autoComplete="off" error={form.formState.errors.name?.message} {...form.register('name')} />
        <SelectField label="Service" options={SERVICE_OPTIONS} {...form.register('service')} />
        <TextField
          label={`Water temperature (${unit})`}
          type="number"
          step="any"
          hint={`Empty: the usual ${usual}.`}
          error={form.formState.errors.waterTemperature?.message}
          {...form.register('waterTemperature')}
        />
      </div>
      <div>
        <Button type="submit" pending={create.isPending} pendingLabel="Creating…">
          Create system and start the walk
        </Button>
      </div>
    </form>
  );
}
