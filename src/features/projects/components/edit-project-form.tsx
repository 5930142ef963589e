import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { errorMessage, isStaleVersion } from '../../../lib/error-messages';
import { applyServerFieldErrors } from '../../../lib/form-errors';
import type { Project } from '../../../shared/api/projects';
import { updateProjectInputSchema, useUpdateProject } from '../api/update-project';
import { PROJECT_FIELD_NAMES, ProjectFields } from './project-fields';
import type { ProjectFieldValues } from './project-fields';
import { StaleVersionAlert } from './stale-version-alert';

function fieldValues(project: Project): ProjectFieldValues {
  return {
    name: project.name,
    address: project.address,
    codeBasis: project.codeBasis,
    unitSystem: project.unitSystem,
    notes: project.notes,
    permit: { ...project.permit },
  };
}

/**
 * Edits a project's details. The form keeps the version it was opened with (not whatever a
 * background refetch brings), so a save after someone else's change answers 409 and is refused.
 */
export function EditProjectForm({
  project,
  onSaved,
  onCancel,
  reload,
}: {
  project: Project;
  onSaved: () => void;
  onCancel: () => void;
  /** fetches the project as it is now */
  reload: () => Promise<Project | undefined>;
}) {
  const update = useUpdateProject();
  const [baseVersion, setBaseVersion] = useState(project.version);
  const [reloading, setReloading] = useState(false);
  const form = useForm({ resolver: zodResolver(updateProjectInputSchema), defaultValues: fieldValues(project) });

  const onSubmit = form.handleSubmit((values) =>
    update.mutate(
      { projectId: project.id, body: { ...values, version: baseVersion } },
      {
        onSuccess: onSaved,
        onError: (error) => applyServerFieldErrors(error, form.setError, PROJECT_FIELD_NAMES),
      },
    ),
  );

  const onReload = async () => {
    setReloading(true);
    try {
      const fresh = await reload();
      if (fresh) {
        form.reset(fieldValues(fresh));
        setBaseVersion(fresh.version);
        update.reset();
      }
    } finally {
      setReloading(false);
    }
  };

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5" aria-label="Edit project details">
      <div aria-live="assertive">
        {update.isError && isStaleVersion(update.error) ? <StaleVersionAlert onReload={onReload} reloading={reloading} /> : null}
        {update.isError && !isStaleVersion(update.error) ? (
          <Alert tone="fault" title="Changes not saved">
            {errorMessage(update.error)}
          </Alert>
        ) : null}
      </div>
      <ProjectFields register={form.register} errors={form.formState.errors} />
      <div className="flex gap-3">
        <Button type="submit" pending={update.isPending} pendingLabel="Saving…" disabled={isStaleVersion(update.error)}>
          Save changes
        </Button>
        <Button variant="secondary" onClick={onCancel}>
          Cancel
        </Button>
      </div>
    </form>
  );
}
