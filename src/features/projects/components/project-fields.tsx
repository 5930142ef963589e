import type { FieldErrors, UseFormRegister } from 'react-hook-form';
import { SelectField, TextAreaField, TextField } from '../../../components/ui/field';
import { UNIT_SYSTEM_LABELS } from '../../../lib/labels';
import { ADOPTED_CODE_LABELS, ADOPTED_CODES, EMPTY_PERMIT, UNIT_SYSTEMS } from '../../../shared/api/projects';
import type { UpdateProjectInput } from '../api/update-project';

/** The fields a project is described by; shared by the new-project and edit forms. */
export type ProjectFieldValues = UpdateProjectInput;

export const PROJECT_FIELD_NAMES = [
  'name',
  'address',
  'codeBasis',
  'unitSystem',
  'notes',
  'permit.permitNumber',
  'permit.adoptedCode',
  'permit.localAmendments',
  'permit.preparerLicence',
  'permit.licenceJurisdiction',
] as const;

const UNIT_OPTIONS = UNIT_SYSTEMS.map((value) => ({ value, label: UNIT_SYSTEM_LABELS[value] }));

export const EMPTY_PROJECT: ProjectFieldValues = { name: '', address: '', codeBasis: '', unitSystem: 'US', notes: '', permit: { ...EMPTY_PERMIT } };

const CODE_OPTIONS = ADOPTED_CODES.map((value) => ({ value, label: value === '' ? 'Not stated yet' : ADOPTED_CODE_LABELS[value] }));

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
      <fieldset className="md:col-span-2 grid gap-4 md:grid-cols-2 border-t border-rule pt-4" aria-label="Permit submission">
        <legend className="font-semibold">Permit submission</legend>
        <p className="md:col-span-2 text-sm text-ink-muted">Printed on every page of each issued summary, where a plan reviewer looks for them.</p>
        <TextField label="Permit or plan-check number" autoComplete="off" error={errors.permit?.permitNumber?.message} {...register('permit.permitNumber')} />
        <SelectField label="Code adopted" options={CODE_OPTIONS} error={errors.permit?.adoptedCode?.message} {...register('permit.adoptedCode')} />
        <TextAreaField
          className="md:col-span-2"
          label="Local amendments"
          hint="The jurisdiction's amendments to the adopted code, as you state them."
          error={errors.permit?.localAmendments?.message}
          {...register('permit.localAmendments')}
        />
        <TextField
          label="Preparer's licence or registration number"
          autoComplete="off"
          error={errors.permit?.preparerLicence?.message}
          {...register('permit.preparerLicence')}
        />
        <TextField
          label="Licence jurisdiction"
          hint="The state, province or body that issued the licence."
          autoComplete="off"
          error={errors.permit?.licenceJurisdiction?.message}
          {...register('permit.licenceJurisdiction')}
        />
      </fieldset>
    </div>
  );
}
