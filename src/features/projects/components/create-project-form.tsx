import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { errorMessage } from '../../../lib/error-messages';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import type { Project } from '../../../shared/api/projects';
import { createProjectInputSchema, useCreateProject } from '../api/create-project';
import { EMPTY_PROJECT, PROJECT_FIELD_NAMES, ProjectFields } from './project-fields';

export function CreateProjectForm({ onCreated, onCancel }: { onCreated: (project: Project) => void; onCancel: () => void }) {
  const create = useCreateProject();
  const form = useForm({ resolver: zodResolver(createProjectInputSchema), defaultValues: EMPTY_PROJECT });

  const onSubmit = form.handleSubmit((values) =>
    create.mutate(values, {
      onSuccess: onCreated,
      onError: (error) => applyServerFieldErrors(error, form.setError, PROJECT_FIELD_NAMES),
    }),
  );

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5" aria-label="New project">
      <div aria-live="assertive">
        {create.isError ? (
          <Alert tone="fault" title="Project not created">
            {errorMessage(create.error)}
          </Alert>
        ) : null}
      </div>
      <ProjectFields register={form.register} errors={form.formState.errors} />
      <div className="flex gap-3">
        <Button type="submit" pending={create.isPending} pendingLabel="Creating…">
          Create project
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
