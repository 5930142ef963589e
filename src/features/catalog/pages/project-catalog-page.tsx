import { useState } from 'react';
import { useForm } from 'react-hook-form';
import { Link, useParams } from 'react-router-dom';
import { paths } from '../../../app/paths';
import { ErrorView } from '../../../components/errors/error-view';
import { Alert } from '../../../components/ui/alert';
import { Badge } from '../../../components/ui/badge';
import { Button } from '../../../components/ui/button';
import { Section } from '../../../components/ui/card';
import { SelectField, TextAreaField, TextField } from '../../../components/ui/field';
import { Loading } from '../../../components/ui/loading';
import { PageHeader } from '../../../components/ui/page-header';
import { UNIT_LABELS } from '../../../engine';
import type { UnitSystem } from '../../../engine';
import { useDocumentTitle } from '../../../hooks/use-document-title';
import { errorMessage } from '../../../lib/error-messages';
import { CATALOG_KINDS, DEVICE_KINDS, type CatalogKind, type ProjectCatalogEntry } from '../../../shared/api/catalog';
import { useProject } from '../../projects/api/get-project';
import { useAddCatalogEntry, useRemoveCatalogEntry } from '../api/change-entries';
import { useProjectCatalog } from '../api/get-project-catalog';
import { COPYABLE_KINDS } from '../lib/apply-entries';
import { describeEntry } from '../lib/describe-entry';
import { EMPTY_ENTRY_FORM, entryBodyFromForm, type EntryFormValues } from '../lib/entry-form';

export const KIND_LABELS: Record<CatalogKind, string> = {
  material: 'Pipe materials',
  'fitting-type': 'Fitting types',
  'fixture-type': 'Fixture types',
  'device-template': 'Device templates',
};
const KIND_ONE: Record<CatalogKind, string> = {
  material: 'a pipe material',
  'fitting-type': 'a fitting type',
  'fixture-type': 'a fixture type',
  'device-template': 'a device template',
};

function EntryList({
  projectId,
  kind,
  entries,
  canEdit,
  sys,
}: {
  projectId: string;
  kind: CatalogKind;
  entries: ProjectCatalogEntry[];
  canEdit: boolean;
  sys: UnitSystem;
}) {
  const remove = useRemoveCatalogEntry(projectId);
  const copyable = (COPYABLE_KINDS as readonly string[]).includes(kind);
  return (
    <Section title={KIND_LABELS[kind]} headingLevel={3}>
      {!copyable ? (
        <p className="mb-2 text-sm text-ink-soft">
          Kept for reference: the system document has no place yet for a {kind === 'fixture-type' ? 'fixture type’s own fixture units' : 'fitting’s own K'}, so
          these cannot be chosen in the walk.
        </p>
      ) : null}
      {entries.length === 0 ? <p className="text-ink-soft">None yet.</p> : null}
      <ul className="flex flex-col gap-3">
        {entries.map((e) => (
          <li key={e.id} className="rounded-md border-2 border-rule p-3" data-testid={`catalog-entry-${e.id}`}>
            <p className="font-semibold">
              {e.label} <Badge tone="standpipe">project</Badge>
            </p>
            <p className="text-sm">{describeEntry(e, sys)}</p>
            <p className="text-sm text-ink-muted">Source: {e.source}</p>
            {canEdit ? (
              <Button
                className="mt-2"
                variant="quiet"
                pending={remove.isPending && remove.variables?.entryId === e.id}
                onClick={() => remove.mutate({ kind: e.kind, entryId: e.id })}
                aria-label={`Remove ${e.label}`}
              >
                Remove
              </Button>
            ) : null}
          </li>
        ))}
      </ul>
      {remove.isError ? (
        <p role="alert" className="mt-2 text-sm text-fault">
          {errorMessage(remove.error)}
        </p>
      ) : null}
    </Section>
  );
}

function AddEntryForm({ projectId, sys }: { projectId: string; sys: UnitSystem }) {
  const add = useAddCatalogEntry(projectId);
  const [done, setDone] = useState<string | null>(null);
  const {
    register,
    handleSubmit,
    watch,
    setError,
    reset,
    formState: { errors },
  } = useForm<EntryFormValues>({ defaultValues: EMPTY_ENTRY_FORM });
  const kind = watch('kind');
  const u = UNIT_LABELS[sys];
  const err = (k: keyof EntryFormValues) => errors[k]?.message;
  const submit = handleSubmit(async (values) => {
    setDone(null);
    const result = entryBodyFromForm(values, sys);
    if (!result.ok) {
      for (const [field, message] of Object.entries(result.errors)) setError(field as keyof EntryFormValues, { message });
      return;
    }
    try {
      const entry = await add.mutateAsync(result.body);
      setDone(`${entry.label} added.`);
      reset({ ...EMPTY_ENTRY_FORM, kind: values.kind });
    } catch (error) {
      setError('label', { message: errorMessage(error) });
    }
  });
  return (
    <form noValidate onSubmit={submit} aria-label="Add a catalog entry" className="flex flex-col gap-3">
      <SelectField label="Kind of entry" options={CATALOG_KINDS.map((k) => ({ value: k, label: KIND_LABELS[k] }))} {...register('kind')} />
      <TextField label="Name" error={err('label')} {...register('label')} />
      <TextField
        label="Source of the numbers"
        hint="Say where they come from: “manufacturer’s data sheet X, 2025”."
        error={err('source')}
        {...register('source')}
      />
      {kind === 'material' ? (
        <>
          <SelectField
            label="Velocity limits of"
            options={[
              { value: 'copper', label: 'copper' },
              { value: 'plastic', label: 'plastic' },
              { value: 'steel', label: 'steel' },
            ]}
            {...register('velocityClass')}
          />
          <TextField label={`Absolute roughness (${u.diameter})`} inputMode="decimal" error={err('roughness')} {...register('roughness')} />
          <TextField label="Hazen–Williams C" inputMode="decimal" error={err('hazenWilliamsC')} {...register('hazenWilliamsC')} />
          <TextAreaField
            label={`Sizes: lines of size, inside diameter (${u.diameter})`}
            hint="Comma- or tab-separated, e.g. “20 mm, 0.638”; a header line is skipped."
            error={err('sizes')}
            {...register('sizes')}
          />
        </>
      ) : null}
      {kind === 'fitting-type' ? <TextField label="Loss coefficient K" inputMode="decimal" error={err('k')} {...register('k')} /> : null}
      {kind === 'fixture-type' ? (
        <>
          <SelectField
            label="Occupancy"
            options={[
              { value: 'private', label: 'private' },
              { value: 'public', label: 'public' },
              { value: 'assembly', label: 'assembly' },
            ]}
            {...register('occupancy')}
          />
          <SelectField
            label="Demand curve"
            options={[
              { value: 'flush-tank', label: 'flush tank' },
              { value: 'flush-valve', label: 'flush valve' },
            ]}
            {...register('demandCurve')}
          />
          <TextField label="WSFU cold (empty if none)" inputMode="decimal" error={err('wsfuCold')} {...register('wsfuCold')} />
          <TextField label="WSFU hot (empty if none)" inputMode="decimal" error={err('wsfuHot')} {...register('wsfuHot')} />
          <TextField label="WSFU total" inputMode="decimal" error={err('wsfuTotal')} {...register('wsfuTotal')} />
          <TextField label={`Minimum flow pressure (${u.pressure})`} inputMode="decimal" error={err('minFlowPressure')} {...register('minFlowPressure')} />
          <TextField label={`Flow at the fixture (${u.flow})`} inputMode="decimal" error={err('flowRate')} {...register('flowRate')} />
        </>
      ) : null}
      {kind === 'device-template' ? (
        <>
          <SelectField label="Device kind" options={DEVICE_KINDS.map((k) => ({ value: k, label: k }))} {...register('deviceKind')} />
          <TextAreaField
            label={`Loss at flow: lines of flow (${u.flow}), loss (${u.pressure})`}
            hint="Zero loss at zero flow is implied."
            error={err('points')}
            {...register('points')}
          />
        </>
      ) : null}
      <div>
        <Button type="submit" pending={add.isPending}>
          Add {KIND_ONE[kind]}
        </Button>
      </div>
      <div aria-live="polite">{done ? <p>{done}</p> : null}</div>
    </form>
  );
}

/** A project's own catalog: entries its designers add with their source, offered in the walk after the seeded ones. */
export function ProjectCatalogPage() {
  const { projectId = '' } = useParams();
  const project = useProject(projectId);
  const catalog = useProjectCatalog(projectId);
  useDocumentTitle(project.data ? `${project.data.project.name} · catalog` : 'Project catalog');
  const failed = [project, catalog].find((q) => q.isError);
  if (failed) return <ErrorView error={failed.error} onRetry={() => void failed.refetch()} what="the project catalog" />;
  if (!project.data || !catalog.data) return <Loading label="Loading the project catalog…" />;
  const p = project.data.project;
  const canEdit = p.myRole === 'designer' && !p.archived;
  return (
    <>
      <PageHeader
        title="Project catalog"
        subtitle={
          <Link className="text-standpipe underline" to={paths.project.getHref(p.id)}>
            {p.name}
          </Link>
        }
      />
      <p className="mb-4 max-w-prose text-ink-soft">
        This project’s own pipe materials, fitting types, fixture types and device templates, each with the source of its numbers. In the walk they are offered
        after the seeded entries, marked “project”; choosing one copies its numbers into the system, so a later change here changes no saved system. Check every
        figure against the product installed.
      </p>
      {!canEdit ? (
        <Alert tone="info" title="Read only">
          The project’s designers add and remove entries.
        </Alert>
      ) : null}
      <div className="mt-4 grid gap-6 lg:grid-cols-[minmax(0,1fr)_24rem]">
        <div className="flex flex-col gap-4">
          {CATALOG_KINDS.map((k) => (
            <EntryList key={k} projectId={p.id} kind={k} entries={catalog.data.of(k)} canEdit={canEdit} sys={p.unitSystem} />
          ))}
        </div>
        {canEdit ? (
          <Section title="Add an entry" headingLevel={3}>
            <AddEntryForm projectId={p.id} sys={p.unitSystem} />
          </Section>
        ) : null}
      </div>
    </>
  );
}
