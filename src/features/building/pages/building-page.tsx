import { useMemo, useState } from 'react';
import { FormProvider, useForm, useWatch } from 'react-hook-form';
import { zodResolver } from '@hookform/resolvers/zod';
import { Link } from 'react-router-dom';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Section } from '../../../components/ui/card';
import type { SystemDocument } from '../../../engine';
import { useWalk } from '../../walk/draft/walk-context';
import { StepIntro } from '../../walk/components/cells';
import { buildFromForm, countBuilding } from '../lib/build';
import { defaultBuildingForm, newUnitType } from '../lib/defaults';
import { downstreamOf, nodeElevation, readBuilding, writeGenerated, writePlacement, writeUnitType } from '../lib/document-adapter';
import { BuildingFormSchema, type BuildingForm } from '../lib/form';
import { unitTypeFromForm } from '../lib/unit-types';
import { FloorsSection } from '../components/floors-section';
import { GeneratePanel, type PendingReplace } from '../components/generate-panel';
import { PlacementsList } from '../components/placements-list';
import { PreviewPanel } from '../components/preview-panel';
import { RiserSection } from '../components/riser-section';
import { ScheduleImport } from '../components/schedule-import';
import { UnitTypeEditor } from '../components/unit-type-editor';

function tryBuild(values: unknown, doc: SystemDocument) {
  const parsed = BuildingFormSchema.safeParse(values);
  if (!parsed.success) return { result: null, problem: null };
  const start = nodeElevation(doc, parsed.data.riser.startNodeId);
  if (start === null) return { result: null, problem: 'The start point has no elevation yet: give it one in the Elevation step.' };
  try {
    return { result: buildFromForm(parsed.data, start, readBuilding(doc).unitTypes), problem: null };
  } catch (error) {
    return { result: null, problem: error instanceof Error ? error.message : String(error) };
  }
}

/**
 * A whole building in a few minutes: floors, unit types defined once, a riser built from a short
 * form, a preview of what it makes, then one "Generate into draft" (undoable). What it writes is
 * ordinary data the walk's steps edit.
 */
export function BuildingPage() {
  const { document, draft, catalog, readOnlyReason, units, links, system } = useWalk();
  // read once: useForm takes its defaults on the first render only (and a generated tower makes them slow to read)
  const [defaults] = useState(() => defaultBuildingForm(document));
  const form = useForm<BuildingForm>({ resolver: zodResolver(BuildingFormSchema), defaultValues: defaults, mode: 'onChange' });
  const values = useWatch({ control: form.control });
  const { result, problem } = useMemo(() => tryBuild(values, document), [values, document]);
  const counts = useMemo(() => (result ? countBuilding(result, system.service) : null), [result, system.service]);
  const [pending, setPending] = useState<PendingReplace | null>(null);
  const [undoTo, setUndoTo] = useState<SystemDocument | null>(null);
  const [done, setDone] = useState<string | null>(null);
  const [failure, setFailure] = useState<string | null>(null);
  const stored = readBuilding(document);
  const readOnly = readOnlyReason !== null;

  const generate = (confirmed: boolean) =>
    form.handleSubmit((v) => {
      setFailure(null);
      const start = nodeElevation(document, v.riser.startNodeId);
      if (start === null) return setFailure('The start point has no elevation yet.');
      try {
        const built = buildFromForm(v, start, stored.unitTypes);
        const gone = v.riser.mode === 'replace' ? downstreamOf(document, v.riser.startNodeId) : null;
        const replaced = gone ? [...gone.segments.map((s) => s.label ?? s.id), ...gone.placements.map((p) => p.label)] : [];
        if (replaced.length > 0 && !confirmed) {
          const startNode = document.nodes.find((n) => n.id === v.riser.startNodeId);
          return setPending({ startLabel: startNode?.label ?? v.riser.startNodeId, segmentLabels: replaced });
        }
        const next = writeGenerated(document, built.built, built.unitTypes, { startNodeId: v.riser.startNodeId, mode: v.riser.mode });
        setPending(null);
        setUndoTo(document);
        draft.update(() => next);
        const c = countBuilding(built, system.service);
        setDone(`Generated ${c.segments} segments, ${c.nodes} nodes and ${c.placements} units into the draft.`);
      } catch (error) {
        setPending(null);
        setFailure(error instanceof Error ? error.message : String(error));
      }
    })();

  const undo = () => {
    if (!undoTo) return;
    const before = undoTo;
    draft.update(() => before);
    setUndoTo(null);
    setDone('The generation was undone.');
  };

  const applyTypes = () =>
    void form.trigger('unitTypes').then((ok) => {
      if (!ok) return;
      const types = form.getValues('unitTypes').map((t) =>
        unitTypeFromForm(
          t,
          stored.unitTypes.find((s) => s.id === t.id),
        ),
      );
      draft.update((doc) => types.reduce(writeUnitType, doc));
      setDone(`Unit types applied to ${stored.placements.length} placements.`);
    });

  return (
    <FormProvider {...form}>
      <div className="flex flex-col gap-6" data-testid="building-page">
        <StepIntro title="Building">
          Enter the floors, define each typical unit once, and describe the riser: Headroom generates the riser, the floor mains and every unit’s piping into
          this draft. Review and edit the result in the <Link to={links.step('risers')}>walk</Link>.
        </StepIntro>
        {readOnly ? (
          <Alert tone="info" title="Read only">
            {readOnlyReason}
          </Alert>
        ) : null}
        <fieldset disabled={readOnly} className="flex flex-col gap-6">
          <FloorsSection lengthUnit={units.length} />
          <Section
            title="Unit types"
            actions={
              stored.placements.length > 0 ? (
                <Button variant="secondary" onClick={applyTypes}>
                  Apply unit types to every placement
                </Button>
              ) : null
            }
          >
            <div className="flex flex-col gap-4">
              {form.watch('unitTypes').map((t, i) => (
                <UnitTypeEditor
                  key={t.id}
                  index={i}
                  catalog={catalog}
                  lengthUnit={units.length}
                  onRemove={
                    i > 0
                      ? () =>
                          form.setValue(
                            'unitTypes',
                            form.getValues('unitTypes').filter((_, k) => k !== i),
                          )
                      : undefined
                  }
                />
              ))}
              <Button
                variant="secondary"
                className="self-start"
                onClick={() => {
                  const n = form.getValues('unitTypes').length;
                  form.setValue('unitTypes', [
                    ...form.getValues('unitTypes'),
                    newUnitType(`unit-${String.fromCharCode(97 + (n % 26))}${n >= 26 ? n : ''}`, `Unit ${String.fromCharCode(65 + (n % 26))}`),
                  ]);
                }}
              >
                Add a unit type
              </Button>
              <ScheduleImport />
            </div>
          </Section>
          <RiserSection catalog={catalog} document={document} lengthUnit={units.length} pressureUnit={units.pressure} />
          <Section title="Preview">
            <div className="flex flex-col gap-4">
              <PreviewPanel counts={counts} problem={problem} />
              <Button className="self-start" onClick={() => void generate(false)}>
                Generate into draft
              </Button>
              <GeneratePanel
                pending={pending}
                onConfirm={() => void generate(true)}
                onCancel={() => setPending(null)}
                done={done}
                onUndo={undoTo ? undo : null}
                failure={failure}
              />
            </div>
          </Section>
          <PlacementsList
            placements={stored.placements}
            unitTypes={stored.unitTypes}
            floors={stored.floors}
            lengthUnit={units.length}
            readOnly={readOnly}
            onChange={(p) => draft.update((doc) => writePlacement(doc, p))}
          />
        </fieldset>
      </div>
    </FormProvider>
  );
}
