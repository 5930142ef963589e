import { useState } from 'react';
import { useFieldArray, useWatch } from 'react-hook-form';
import type { Control, FieldErrors, UseFormRegister, UseFormSetValue } from 'react-hook-form';
import { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { Section } from '../../../components/ui/card';
import { SelectField, TextAreaField } from '../../../components/ui/field';
import { boosterDesignGain } from '../../../engine';
import { roundedFromSI } from '../../../engine/building/convertUnits';
import { DEVICE_KIND_LABELS } from '../../../engine/model/labels';
import type { Device, SystemDocument } from '../../../engine';
import { DeviceSchema } from '../../../engine/model/schema';
import { useWalk } from '../draft/walk-context';
import { CellInput, StepIntro } from '../components/cells';
import { parseCurvePoints } from '../lib/csv';
import { withUnit } from '../../../shared/format/quantity';
import { freshId, numberInput, plainError } from '../lib/form-values';
import { useLiveForm } from '../lib/use-live-form';
import { describedCell, describedField } from '../lib/described';
import { BOOST_CONSTANT_SPEED, BOOST_VARIABLE_SPEED, CURVE_POINT, DEVICE, DEVICE_LOSS_FIXED, PRV } from '../../../engine/model/elements';
import { useProjectEntries } from '../../catalog/api/get-project-catalog';
import { deviceFromProjectTemplate, projectEntryIdOf, projectOptionValue } from '../../catalog/lib/apply-entries';

const KINDS = DeviceSchema.shape.kind.options;
const KIND_LABELS = DEVICE_KIND_LABELS;

const num = z.number({ error: 'Enter a number' }).nonnegative('Must be zero or more');
const row = z
  .object({
    id: DeviceSchema.shape.id,
    kind: DeviceSchema.shape.kind,
    label: z.string().trim().min(1, 'Give the device a name'),
    segmentId: z.string().min(1, 'Choose the segment the device sits on'),
    lossKind: z.enum(['fixed', 'curve']),
    fixedLoss: z.unknown().optional(),
    points: z.array(z.object({ flow: num, loss: num })),
    prvSet: z.unknown().optional(),
    prvFalloff: z.unknown().optional(),
    boostGain: z.unknown().optional(),
    /** constant speed: gain at the design point and at shutoff (the static check takes shutoff); variable speed: the discharge it holds */
    boostControl: z.enum(['constant-speed', 'variable-speed']).optional(),
    boostShutoff: z.unknown().optional(),
    boostSet: z.unknown().optional(),
  })
  .transform((r, ctx): Device => {
    const candidate = {
      id: r.id,
      kind: r.kind,
      label: r.label,
      segmentId: r.segmentId,
      loss: r.lossKind === 'fixed' ? { kind: 'fixed' as const, loss: r.fixedLoss } : { kind: 'curve' as const, points: r.points },
      ...(r.kind === 'prv' ? { prv: { setPressure: r.prvSet, falloffPerFlow: r.prvFalloff ?? 0 } } : {}),
      ...(r.kind === 'booster-pump'
        ? {
            boost:
              r.boostControl === 'variable-speed'
                ? { control: 'variable-speed' as const, setPressure: r.boostSet }
                : { control: 'constant-speed' as const, designGain: r.boostGain, shutoffGain: r.boostShutoff },
          }
        : {}),
    };
    const parsed = DeviceSchema.safeParse(candidate);
    if (parsed.success) return parsed.data;
    for (const issue of parsed.error.issues) {
      const [first, second] = issue.path.map(String);
      const path =
        first === 'loss'
          ? r.lossKind === 'fixed'
            ? ['fixedLoss']
            : ['points']
          : first === 'prv'
            ? [second === 'falloffPerFlow' ? 'prvFalloff' : 'prvSet']
            : first === 'boost'
              ? [second === 'shutoffGain' ? 'boostShutoff' : second === 'setPressure' ? 'boostSet' : 'boostGain']
              : [first];
      ctx.addIssue({ code: 'custom', path, message: plainError(issue.message) ?? issue.message });
    }
    return z.NEVER;
  });
export const devicesFormSchema = z.object({ devices: z.array(row) });
type DeviceRow = z.input<typeof row>;
type DevicesForm = { devices: DeviceRow[] };

function toRow(d: Device): DeviceRow {
  return {
    id: d.id,
    kind: d.kind,
    label: d.label,
    segmentId: d.segmentId,
    lossKind: d.loss.kind,
    fixedLoss: d.loss.kind === 'fixed' ? d.loss.loss : 0,
    points: d.loss.kind === 'curve' ? d.loss.points.map((p) => ({ ...p })) : [{ flow: 0, loss: 0 }],
    prvSet: d.prv?.setPressure,
    prvFalloff: d.prv?.falloffPerFlow ?? 0,
    boostGain: d.boost ? (boosterDesignGain(d.boost) ?? undefined) : undefined,
    boostControl: d.boost && 'control' in d.boost ? d.boost.control : 'constant-speed',
    // a version-1 booster (one gain) has no shutoff: the field stays empty until the designer enters it
    boostShutoff: d.boost && 'control' in d.boost && d.boost.control === 'constant-speed' ? d.boost.shutoffGain : undefined,
    boostSet: d.boost && 'control' in d.boost && d.boost.control === 'variable-speed' ? d.boost.setPressure : undefined,
  };
}

/**
 * A booster by its control: a constant-speed pump adds its design gain at design flow and more at
 * shutoff (the static check takes the shutoff gain from the pump curve); a variable-speed package
 * holds its set discharge pressure.
 */
function BoosterFields({
  index,
  register,
  control,
  errors,
  unitSystem,
}: {
  index: number;
  register: UseFormRegister<DevicesForm>;
  control: Control<DevicesForm>;
  errors: FieldErrors<DeviceRow> | undefined;
  unitSystem: SystemDocument['unitSystem'];
}) {
  const boostControl = useWatch({ control, name: `devices.${index}.boostControl` });
  const n = index + 1;
  return (
    <>
      <label className="flex flex-col gap-1 text-sm font-semibold">
        Pump control
        <select className="rounded-md border-2 border-rule px-2 py-1" aria-label={`Device ${n} pump control`} {...register(`devices.${index}.boostControl`)}>
          <option value="constant-speed">Constant speed (pump curve)</option>
          <option value="variable-speed">Variable speed (holds a discharge pressure)</option>
        </select>
      </label>
      {boostControl === 'variable-speed' ? (
        <label className="flex flex-col gap-1 text-sm font-semibold">
          {describedField(BOOST_VARIABLE_SPEED, 'setPressure', unitSystem).label}
          <CellInput
            {...describedCell(`Device ${n}`, BOOST_VARIABLE_SPEED, 'setPressure', unitSystem)}
            type="text"
            inputMode="decimal"
            autoComplete="off"
            error={plainError(errors?.boostSet?.message)}
            {...register(`devices.${index}.boostSet`, numberInput)}
          />
        </label>
      ) : (
        <>
          <label className="flex flex-col gap-1 text-sm font-semibold">
            {describedField(BOOST_CONSTANT_SPEED, 'designGain', unitSystem).label}
            <CellInput
              {...describedCell(`Device ${n}`, BOOST_CONSTANT_SPEED, 'designGain', unitSystem)}
              type="text"
              inputMode="decimal"
              autoComplete="off"
              error={plainError(errors?.boostGain?.message)}
              {...register(`devices.${index}.boostGain`, numberInput)}
            />
          </label>
          <label className="flex flex-col gap-1 text-sm font-semibold">
            {describedField(BOOST_CONSTANT_SPEED, 'shutoffGain', unitSystem).label}
            <CellInput
              {...describedCell(`Device ${n}`, BOOST_CONSTANT_SPEED, 'shutoffGain', unitSystem)}
              type="text"
              inputMode="decimal"
              autoComplete="off"
              error={plainError(errors?.boostShutoff?.message)}
              {...register(`devices.${index}.boostShutoff`, numberInput)}
            />
          </label>
        </>
      )}
    </>
  );
}

function CurvePoints({
  index,
  control,
  register,
  setValue,
  errors,
  units,
}: {
  index: number;
  control: Control<DevicesForm>;
  register: UseFormRegister<DevicesForm>;
  setValue: UseFormSetValue<DevicesForm>;
  errors: FieldErrors<DevicesForm>;
  units: { flow: string; pressure: string };
}) {
  const points = useFieldArray({ control, name: `devices.${index}.points` });
  const [pasted, setPasted] = useState('');
  const [problems, setProblems] = useState<string[]>([]);
  const applyPoints = (text: string) => {
    const result = parseCurvePoints(text);
    setProblems(result.errors);
    if (result.errors.length === 0) {
      setValue(`devices.${index}.points`, result.rows, { shouldValidate: true, shouldDirty: true });
      setPasted('');
    }
  };
  const rowErrors = errors.devices?.[index]?.points;
  const sys = useWalk().document.unitSystem;
  return (
    <div className="flex flex-col gap-3">
      <table className="w-full max-w-md text-sm">
        <caption className="text-left font-semibold">Loss at flow (the manufacturer’s points; zero loss at zero flow is implied)</caption>
        <thead>
          <tr className="text-left">
            <th scope="col">Flow ({units.flow})</th>
            <th scope="col">Loss ({units.pressure})</th>
            <th scope="col">
              <span className="sr-only">Remove</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {points.fields.map((field, k) => (
            <tr key={field.id}>
              <td className="pr-2">
                <CellInput
                  {...describedCell(`Point ${k + 1}`, CURVE_POINT, 'flow', sys)}
                  type="text"
                  inputMode="decimal"
                  autoComplete="off"
                  error={plainError(rowErrors?.[k]?.flow?.message)}
                  onPaste={(ev) => {
                    const text = ev.clipboardData.getData('text');
                    if (/\n/.test(text.trim())) {
                      ev.preventDefault();
                      applyPoints(text);
                    }
                  }}
                  {...register(`devices.${index}.points.${k}.flow`, numberInput)}
                />
              </td>
              <td className="pr-2">
                <CellInput
                  {...describedCell(`Point ${k + 1}`, CURVE_POINT, 'loss', sys)}
                  type="text"
                  inputMode="decimal"
                  autoComplete="off"
                  error={plainError(rowErrors?.[k]?.loss?.message)}
                  {...register(`devices.${index}.points.${k}.loss`, numberInput)}
                />
              </td>
              <td>
                <Button variant="quiet" onClick={() => points.remove(k)} disabled={points.fields.length <= 1} aria-label={`Remove point ${k + 1}`}>
                  Remove
                </Button>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      {typeof rowErrors?.message === 'string' ? <p className="text-sm text-fault">{plainError(rowErrors.message)}</p> : null}
      <div className="flex flex-wrap items-end gap-3">
        <Button variant="secondary" onClick={() => points.append({ flow: Number.NaN, loss: Number.NaN })}>
          Add a point
        </Button>
        <label className="text-sm font-semibold">
          Import points from a CSV file
          <input
            type="file"
            accept=".csv,.txt,text/csv,text/plain"
            className="mt-1 block text-sm"
            onChange={async (ev) => {
              const file = ev.target.files?.[0];
              if (file) applyPoints(await file.text());
              ev.target.value = '';
            }}
          />
        </label>
      </div>
      <TextAreaField
        label="Paste points from a spreadsheet"
        hint="Lines of flow and loss, separated by a tab or a comma; a header line is skipped. Pasting replaces the points above."
        value={pasted}
        onChange={(ev) => setPasted(ev.target.value)}
      />
      <div>
        <Button variant="secondary" onClick={() => applyPoints(pasted)} disabled={pasted.trim() === ''}>
          Use the pasted points
        </Button>
      </div>
      <div aria-live="assertive">
        {problems.length ? (
          <ul className="list-disc pl-5 text-sm text-fault" role="alert">
            {problems.map((p) => (
              <li key={p}>{p}</li>
            ))}
          </ul>
        ) : null}
      </div>
    </div>
  );
}

export function DevicesStep() {
  const { ids, document, draft, readOnlyReason, scope, units, catalog, live } = useWalk();
  const project = useProjectEntries(ids.projectId);
  const [defaults] = useState<DevicesForm>(() => ({ devices: document.devices.map(toRow) }));
  const form = useLiveForm(devicesFormSchema, defaults, (v) => draft.update((doc) => ({ ...doc, devices: v.devices })));
  const {
    register,
    control,
    formState: { errors },
    watch,
    setValue,
  } = form;
  const devices = useFieldArray({ control, name: 'devices' });
  const [template, setTemplate] = useState(catalog.deviceTemplates[0]?.id ?? '');
  const sys = document.unitSystem;
  const segmentOptions = [
    { value: '', label: 'Choose a segment…' },
    ...document.segments.map((s) => ({ value: s.id, label: s.label ? `${s.label} (${s.id})` : s.id })),
  ];
  const lossById = new Map(live.ok ? live.analysis.segments.flatMap((s) => s.devices.map((d) => [d.deviceId, d] as const)) : []);
  const takenIds = () => watch('devices').map((d) => d.id);
  const firstSegment = document.segments.find((s) => s.from === document.source.nodeId)?.id ?? document.segments[0]?.id ?? '';

  const projectTemplate = project.find('device-template', projectEntryIdOf(template));
  const templateOptions = [
    ...catalog.deviceTemplates.map((t) => ({ value: t.id, label: t.label })),
    ...project.of('device-template').map((t) => ({ value: projectOptionValue(t.id), label: `${t.label} — project` })),
  ];
  const templateSource = projectTemplate?.source ?? catalog.deviceTemplates.find((t) => t.id === template)?.source;

  const addFromTemplate = () => {
    if (projectTemplate) {
      // a project template: its kind and curve are copied into the device (the document does not refer to the entry)
      const copied = deviceFromProjectTemplate(projectTemplate, sys);
      devices.append({
        id: freshId(copied.kind, takenIds()),
        kind: copied.kind,
        label: copied.label,
        segmentId: firstSegment,
        lossKind: 'curve',
        fixedLoss: 0,
        points: copied.points,
        prvSet: undefined,
        prvFalloff: 0,
        boostGain: undefined,
        boostControl: 'constant-speed',
        boostShutoff: undefined,
        boostSet: undefined,
      });
      return;
    }
    const t = catalog.deviceTemplates.find((d) => d.id === template);
    if (!t) return;
    devices.append({
      id: freshId('meter', takenIds()),
      kind: 'meter',
      label: t.label,
      segmentId: firstSegment,
      lossKind: 'curve',
      fixedLoss: 0,
      points: t.data.points.map((p) => ({ flow: roundedFromSI('flow', p.flowM3s, sys), loss: roundedFromSI('pressure', p.lossPa, sys) })),
      prvSet: undefined,
      prvFalloff: 0,
      boostGain: undefined,
      boostControl: 'constant-speed',
      boostShutoff: undefined,
      boostSet: undefined,
    });
  };

  const addServicePipe = () => draft.update((doc) => addServiceSegment(doc, catalog.materials[0]?.id, catalog.materials[0]?.data.sizes.at(-1)?.key));

  return (
    <form noValidate onSubmit={(ev) => ev.preventDefault()} aria-label="Meter and devices">
      <StepIntro title="Meter & devices">
        The meter and every device in line — backflow preventer, pressure-reducing valve, strainer, softener, filter — with its loss at flow: a fixed loss, or
        the manufacturer’s curve points. A device sits at the inlet of a segment. Use the data of the product actually installed.
      </StepIntro>
      {document.segments.length === 0 ? (
        <div className="mb-4 rounded-md border-2 border-caution bg-caution-soft p-3 text-sm">
          <p>Devices sit on segments, and this system has none yet.</p>
          <Button className="mt-2" variant="secondary" onClick={addServicePipe} disabled={readOnlyReason !== null || scope === 'field-change'}>
            Add the service pipe (connection → building entry)
          </Button>
        </div>
      ) : null}
      <fieldset disabled={readOnlyReason !== null} className="flex flex-col gap-6">
        {devices.fields.map((field, i) => {
          const kind = watch(`devices.${i}.kind`);
          const lossKind = watch(`devices.${i}.lossKind`);
          const err = errors.devices?.[i];
          const result = lossById.get(watch(`devices.${i}.id`));
          return (
            <Section
              key={field.id}
              title={`Device ${i + 1}: ${watch(`devices.${i}.label`) || 'unnamed'}`}
              headingLevel={3}
              actions={
                <Button variant="danger" onClick={() => devices.remove(i)}>
                  Remove device
                </Button>
              }
            >
              <div className="grid gap-4 md:grid-cols-2">
                <SelectField
                  {...describedField(DEVICE, 'kind', document.unitSystem)}
                  options={KINDS.map((k) => ({ value: k, label: KIND_LABELS[k] }))}
                  {...register(`devices.${i}.kind`)}
                />
                <label className="flex flex-col gap-1 text-sm font-semibold">
                  {describedField(DEVICE, 'label', document.unitSystem).label}
                  <CellInput
                    {...describedCell(`Device ${i + 1}`, DEVICE, 'label', document.unitSystem)}
                    error={plainError(err?.label?.message)}
                    {...register(`devices.${i}.label`)}
                  />
                </label>
                <SelectField
                  {...describedField(DEVICE, 'segmentId', document.unitSystem)}
                  options={segmentOptions}
                  error={plainError(err?.segmentId?.message)}
                  {...register(`devices.${i}.segmentId`)}
                />
                <SelectField
                  label="Loss given as"
                  options={[
                    { value: 'fixed', label: 'A fixed loss' },
                    { value: 'curve', label: 'Loss-at-flow curve points' },
                  ]}
                  {...register(`devices.${i}.lossKind`)}
                />
                {lossKind === 'fixed' ? (
                  <label className="flex flex-col gap-1 text-sm font-semibold">
                    {describedField(DEVICE_LOSS_FIXED, 'loss', document.unitSystem).label}
                    <CellInput
                      {...describedCell(`Device ${i + 1}`, DEVICE_LOSS_FIXED, 'loss', document.unitSystem)}
                      type="text"
                      inputMode="decimal"
                      autoComplete="off"
                      error={plainError(err?.fixedLoss?.message)}
                      {...register(`devices.${i}.fixedLoss`, numberInput)}
                    />
                  </label>
                ) : null}
                {kind === 'prv' ? (
                  <>
                    <label className="flex flex-col gap-1 text-sm font-semibold">
                      {describedField(PRV, 'setPressure', document.unitSystem).label}
                      <CellInput
                        {...describedCell(`Device ${i + 1}`, PRV, 'setPressure', document.unitSystem)}
                        type="text"
                        inputMode="decimal"
                        autoComplete="off"
                        error={plainError(err?.prvSet?.message)}
                        {...register(`devices.${i}.prvSet`, numberInput)}
                      />
                    </label>
                    <label className="flex flex-col gap-1 text-sm font-semibold">
                      {describedField(PRV, 'falloffPerFlow', document.unitSystem).label}
                      <CellInput
                        {...describedCell(`Device ${i + 1}`, PRV, 'falloffPerFlow', document.unitSystem)}
                        type="text"
                        inputMode="decimal"
                        autoComplete="off"
                        error={plainError(err?.prvFalloff?.message)}
                        {...register(`devices.${i}.prvFalloff`, numberInput)}
                      />
                    </label>
                  </>
                ) : null}
                {kind === 'booster-pump' ? (
                  <BoosterFields index={i} register={register} control={control} errors={err} unitSystem={document.unitSystem} />
                ) : null}
              </div>
              {lossKind === 'curve' ? (
                <div className="mt-4">
                  <CurvePoints index={i} control={control} register={register} setValue={setValue} errors={errors} units={units} />
                </div>
              ) : null}
              <p className="mt-3 text-sm" data-testid={`device-loss-${i}`}>
                {result
                  ? `Loss at the design flow: ${withUnit(result.loss, units.pressure)}${result.extrapolated ? ' — beyond the curve, extrapolated' : ''}.`
                  : 'The loss at the design flow appears once the system can be computed.'}
              </p>
            </Section>
          );
        })}
        <div className="flex flex-wrap items-end gap-3">
          <Button
            variant="secondary"
            onClick={() =>
              devices.append({
                id: freshId('device', takenIds()),
                kind: 'backflow-preventer',
                label: '',
                segmentId: firstSegment,
                lossKind: 'fixed',
                fixedLoss: Number.NaN,
                points: [{ flow: Number.NaN, loss: Number.NaN }],
                prvSet: undefined,
                prvFalloff: 0,
                boostGain: undefined,
                boostControl: 'constant-speed',
                boostShutoff: undefined,
                boostSet: undefined,
              })
            }
          >
            Add a device
          </Button>
          {templateOptions.length ? (
            <>
              <SelectField label="Device template" options={templateOptions} value={template} onChange={(ev) => setTemplate(ev.target.value)} />
              <Button variant="secondary" onClick={addFromTemplate}>
                Add from template
              </Button>
            </>
          ) : null}
        </div>
        {templateSource ? <p className="text-xs text-ink-muted">Template source: {templateSource}</p> : null}
      </fieldset>
    </form>
  );
}

/**
 * The first segment of a new system: from the connection to a new entry node at the same elevation.
 * The entry node carries that elevation itself, so the service pipe has no rise of its own (document
 * version 2: one position per node); typing a rise on it at the pipe step moves the entry node.
 */
export function addServiceSegment(doc: SystemDocument, material: string | undefined, size: string | undefined): SystemDocument {
  const from = doc.source.nodeId;
  const fromNode = doc.nodes.find((n) => n.id === from);
  const to = freshId(
    'entry',
    doc.nodes.map((n) => n.id),
  );
  return {
    ...doc,
    nodes: [...doc.nodes, { id: to, label: 'Building entry', elevation: fromNode?.elevation ?? 0, fixtureGroups: [], checkedFixtures: [] }],
    segments: [
      ...doc.segments,
      // 10 length units: a placeholder the designer replaces with the measured run.
      {
        id: freshId(
          'service',
          doc.segments.map((s) => s.id),
        ),
        label: 'Service pipe',
        from,
        to,
        material,
        size,
        length: 10,
        fittings: [],
        reducerAuto: true,
      },
    ],
  };
}
