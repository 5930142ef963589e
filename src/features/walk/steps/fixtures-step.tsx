import { useState } from 'react';
import { useFieldArray } from 'react-hook-form';
import type { Control, UseFormRegister, UseFormWatch, FieldErrors } from 'react-hook-form';
import { z } from 'zod';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { Section } from '../../../components/ui/card';
import { fromSI, verdictStatus } from '../../../engine';
import type { Analysis, SystemDocument } from '../../../engine';
import { CheckedFixtureSchema } from '../../../engine/model/schema';
import type { Catalog } from '../../systems/api/get-catalog';
import { fixtureVerdict, VerdictMark } from '../../systems/components/verdict-mark';
import { useWalk } from '../draft/walk-context';
import { unusableProjectOptions } from '../../catalog/lib/apply-entries';
import { useProjectEntries } from '../../catalog/api/get-project-catalog';
import { CellInput, CellSelect, StepIntro } from '../components/cells';
import { num, signed } from '../../../shared/format/quantity';
import { freshId, numberInput, plainError } from '../lib/form-values';
import { useLiveForm } from '../lib/use-live-form';
import { describedCell, describedField } from '../lib/described';
import { CHECKED_FIXTURE } from '../../../engine/model/elements';

const optional = <T extends z.ZodType>(schema: T) => z.preprocess((v) => (v === '' || (typeof v === 'number' && Number.isNaN(v)) ? undefined : v), schema);
const fixtureRow = CheckedFixtureSchema.extend({
  label: optional(CheckedFixtureSchema.shape.label),
  minFlowPressure: optional(CheckedFixtureSchema.shape.minFlowPressure),
  flowRate: optional(CheckedFixtureSchema.shape.flowRate),
  expectedCritical: z
    .boolean()
    .optional()
    .transform((v) => (v ? true : undefined)),
});
export const fixturesFormSchema = z.object({ nodes: z.array(z.object({ id: z.string(), checkedFixtures: z.array(fixtureRow) })) });
type Row = { id: string; fixtureTypeId: string; label: string; minFlowPressure?: number; flowRate?: number; expectedCritical: boolean };
type FixturesForm = { nodes: { id: string; checkedFixtures: Row[] }[] };

export function applyFixtures(doc: SystemDocument, v: z.output<typeof fixturesFormSchema>): SystemDocument {
  const byId = new Map(v.nodes.map((n) => [n.id, n.checkedFixtures]));
  const clean = (f: z.output<typeof fixtureRow>) =>
    Object.fromEntries(Object.entries(f).filter(([, x]) => x !== undefined)) as SystemDocument['nodes'][number]['checkedFixtures'][number];
  return { ...doc, nodes: doc.nodes.map((n) => (byId.has(n.id) ? { ...n, checkedFixtures: byId.get(n.id)!.map(clean) } : n)) };
}

function NodeFixtures({
  index,
  control,
  register,
  watch,
  errors,
  catalog,
  doc,
  analysis,
  units,
  allIds,
}: {
  index: number;
  control: Control<FixturesForm>;
  register: UseFormRegister<FixturesForm>;
  watch: UseFormWatch<FixturesForm>;
  errors: FieldErrors<FixturesForm>;
  catalog: Catalog;
  doc: SystemDocument;
  analysis: Analysis | null;
  units: { pressure: string; flow: string };
  allIds: () => string[];
}) {
  const list = useFieldArray({ control, name: `nodes.${index}.checkedFixtures` });
  const nodeId = watch(`nodes.${index}.id`);
  const node = doc.nodes.find((n) => n.id === nodeId);
  const name = node?.label || nodeId;
  const rows = watch(`nodes.${index}.checkedFixtures`);
  const options = catalog.fixtureTypes.map((f) => ({ value: f.id, label: f.label }));
  const projectOptions = unusableProjectOptions(useProjectEntries(useWalk().ids.projectId).of('fixture-type'));
  const served = node?.fixtureGroups[0]?.fixtureTypeId ?? options[0]?.value ?? '';
  return (
    <div className="border-t border-rule pt-3">
      <p className="mb-2 font-semibold">{name}</p>
      {list.fields.map((f, k) => {
        const row = rows?.[k];
        const type = row ? catalog.fixtureType(row.fixtureTypeId) : undefined;
        const catalogMin = type ? fromSI('pressure', type.data.minFlowPressurePa, doc.unitSystem) : undefined;
        const result = analysis?.fixtures.find((x) => x.id === row?.id);
        const critical = analysis?.criticalFixtureId === row?.id;
        const err = errors.nodes?.[index]?.checkedFixtures?.[k];
        return (
          <div key={f.id} className="mb-3 rounded-md border-2 border-rule p-3" data-testid={`checked-${row?.id}`}>
            <div className="grid gap-2 md:grid-cols-4">
              <label className="flex flex-col text-xs font-semibold md:col-span-2">
                {describedField(CHECKED_FIXTURE, 'fixtureTypeId', doc.unitSystem).label}
                <CellSelect
                  {...describedCell(`${name}: checked fixture ${k + 1}`, CHECKED_FIXTURE, 'fixtureTypeId', doc.unitSystem)}
                  options={[...options, ...projectOptions]}
                  {...register(`nodes.${index}.checkedFixtures.${k}.fixtureTypeId`)}
                />
              </label>
              <label className="flex flex-col text-xs font-semibold md:col-span-2">
                {describedField(CHECKED_FIXTURE, 'label', doc.unitSystem).label}
                <CellInput
                  {...describedCell(`${name}: checked fixture ${k + 1}`, CHECKED_FIXTURE, 'label', doc.unitSystem)}
                  {...register(`nodes.${index}.checkedFixtures.${k}.label`)}
                />
              </label>
              <label className="flex flex-col text-xs font-semibold md:col-span-2">
                {describedField(CHECKED_FIXTURE, 'minFlowPressure', doc.unitSystem).label}
                <CellInput
                  {...describedCell(`${name}: checked fixture ${k + 1}`, CHECKED_FIXTURE, 'minFlowPressure', doc.unitSystem)}
                  type="text"
                  inputMode="decimal"
                  autoComplete="off"
                  placeholder={catalogMin === undefined ? '' : `catalog: ${num(catalogMin, units.pressure)}`}
                  error={plainError(err?.minFlowPressure?.message)}
                  {...register(`nodes.${index}.checkedFixtures.${k}.minFlowPressure`, numberInput)}
                />
                <span className="font-normal text-ink-muted">
                  Empty = the catalog’s {catalogMin === undefined ? '—' : `${num(catalogMin, units.pressure)} ${units.pressure}`}
                  {type ? ` (${type.source})` : ''}
                </span>
              </label>
              <label className="flex items-center gap-2 text-sm font-semibold md:col-span-2">
                <input type="checkbox" className="size-5 accent-standpipe" {...register(`nodes.${index}.checkedFixtures.${k}.expectedCritical`)} />I expect this
                to be the critical one
              </label>
            </div>
            <div className="mt-2 flex flex-wrap items-center gap-3 text-sm">
              {result ? (
                <>
                  <span>
                    Residual {num(result.residual, units.pressure)} {units.pressure}
                  </span>
                  <span>needs {num(result.required, units.pressure)}</span>
                  <span>margin {signed(result.margin, units.pressure)}</span>
                  <VerdictMark verdict={fixtureVerdict(result.pass, analysis ? verdictStatus(analysis) : null)} />
                  {critical ? <strong data-testid="critical-marker">◆ Critical: the smallest margin</strong> : null}
                </>
              ) : (
                <span className="text-ink-muted">Not computed yet</span>
              )}
              <Button variant="quiet" onClick={() => list.remove(k)} aria-label={`Remove checked fixture ${k + 1} at ${name}`}>
                Remove
              </Button>
            </div>
          </div>
        );
      })}
      <Button
        variant="secondary"
        onClick={() =>
          list.append({
            id: freshId(nodeId, allIds()),
            fixtureTypeId: served,
            label: '',
            minFlowPressure: undefined,
            flowRate: undefined,
            expectedCritical: false,
          })
        }
      >
        Check a fixture at {name}
      </Button>
    </div>
  );
}

export function FixturesStep() {
  const { document, draft, readOnlyReason, catalog, live, units } = useWalk();
  const [defaults] = useState<FixturesForm>(() => ({
    nodes: document.nodes
      .filter((n) => n.id !== document.source.nodeId)
      .map((n) => ({
        id: n.id,
        checkedFixtures: n.checkedFixtures.map((f) => ({
          id: f.id,
          fixtureTypeId: f.fixtureTypeId,
          label: f.label ?? '',
          minFlowPressure: f.minFlowPressure,
          flowRate: f.flowRate,
          expectedCritical: f.expectedCritical ?? false,
        })),
      })),
  }));
  const form = useLiveForm(fixturesFormSchema, defaults, (v) => draft.update((doc) => applyFixtures(doc, v)));
  const {
    register,
    control,
    watch,
    formState: { errors },
  } = form;
  const analysis = live.ok ? live.analysis : null;
  const allIds = () => watch('nodes').flatMap((n) => n.checkedFixtures.map((f) => f.id));
  const critical = analysis?.fixtures.find((f) => f.id === analysis.criticalFixtureId);
  const unexpected = analysis?.warnings.find((w) => w.code === 'critical-not-expected');
  const otherNotes = analysis?.warnings.filter((w) => w.code === 'critical-not-highest' || w.code === 'critical-not-farthest') ?? [];
  return (
    <form noValidate onSubmit={(ev) => ev.preventDefault()} aria-label="Remote fixture">
      <StepIntro title="Remote fixture">
        The fixtures whose residual pressure is compared with the minimum flow pressure they need. Check every one that could be the worst — the highest, the
        farthest, and any that needs more pressure (a flush valve, a shower with a pressure-balancing valve). Headroom finds the critical one: the smallest
        margin.
      </StepIntro>
      <div aria-live="polite" className="mb-4 flex flex-col gap-2">
        {critical ? (
          <p data-testid="critical-summary">
            Critical fixture: <strong>{critical.label}</strong> at {document.nodes.find((n) => n.id === critical.nodeId)?.label || critical.nodeId}, margin{' '}
            {signed(critical.margin, units.pressure)} {units.pressure}.
          </p>
        ) : null}
        {unexpected ? (
          <Alert tone="caution" title="The critical fixture is not the one you expected">
            {critical?.label} has the smallest margin, not the fixture you marked. {unexpected.detail ?? ''}
          </Alert>
        ) : null}
        {otherNotes.map((w) => (
          <p key={w.code} className="text-sm text-ink-soft">
            {w.message} {w.detail ?? ''}
          </p>
        ))}
      </div>
      <fieldset disabled={readOnlyReason !== null} className="flex flex-col gap-4">
        <Section title="Checked fixtures by node" headingLevel={3}>
          {defaults.nodes.length === 0 ? <p className="text-ink-soft">No nodes beyond the source yet: add segments at Risers.</p> : null}
          {defaults.nodes.map((n, i) => (
            <NodeFixtures
              key={n.id}
              index={i}
              control={control}
              register={register}
              watch={watch}
              errors={errors}
              catalog={catalog}
              doc={document}
              analysis={analysis}
              units={units}
              allIds={allIds}
            />
          ))}
        </Section>
      </fieldset>
    </form>
  );
}
