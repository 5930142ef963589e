import type { FieldErrors, UseFormRegister } from 'react-hook-form';
import { SelectField, TextAreaField, TextField } from '../../../components/ui/field';
import { UNIT_SYSTEM_LABELS } from '../../../lib/labels';
import { UNIT_SYSTEMS } from '../../../shared/api/projects';
import type { UpdateProjectInput } from '../api/update-project';

/** The fields a project is described by; shared by the new-project and edit forms. */
export type ProjectFieldValues = UpdateProjectInput;

export const PROJECT_FIELD_NAMES = ['name', 'address', 'codeBasis', 'unitSystem', 'notes'] as const satisfies readonly (keyof ProjectFieldValues)[];

const UNIT_OPTIONS = UNIT_SYSTEMS.map((value) => ({ value, label: UNIT_SYSTEM_LABELS[value] }));

export const EMPTY_PROJECT: ProjectFieldValues = { name: '', address: '', codeBasis: '', unitSystem: 'US', notes: '' };

export function ProjectFields({ register, errors }: { register: UseFormRegister<ProjectFieldValues>; errors: FieldErrors<ProjectFieldValues> }) {
  return (
    <div className="grid gap-4 md:grid-cols-2">
      <TextField label="Project name" autoComplete="off" error={errors.name?.message} {...register('name')} />
      <TextField label="Building address" autoComplete="off" error={errors.address?.message} {...register('address')} />
      <TextAreaField
        className="md:col-span-2"
        label="Code basis"
        hint="The plumbing code edition and the local amendments this design follows, as you state them."
        error={errors.codeBasis?.message}
        {...register('codeBasis')}
      />
      <SelectField label="Units" options={UNIT_OPTIONS} error={errors.unitSystem?.message} {...register('unitSystem')} />
      <TextAreaField className="md:col-span-2" label="Notes" error={errors.notes?.message} {...register('notes')} />
    </div>
  );
}
