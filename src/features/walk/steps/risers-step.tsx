import { useState } from 'react';
import { useFieldArray } from 'react-hook-form';
import type { Control, UseFormRegister, UseFormSetValue } from 'react-hook-form';
import { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { Section } from '../../../components/ui/card';
import { TextAreaField } from '../../../components/ui/field';
import type { CustomFixture, FixtureGroup, Segment, SystemDocument } from '../../../engine';
import { CustomPipeSchema, DemandCurveSchema, FixtureGroupSchema, NodeSchema, SegmentSchema } from '../../../engine/model/schema';
import type { ProjectEntryOf } from '../../../shared/api/catalog';
import { useProjectEntries } from '../../catalog/api/get-project-catalog';
import { groupWithProjectData, matchProjectPipe, pipeFromProjectEntry, projectEntryIdOf, projectOptions as projectOptionsOf, projectOptionValue } from '../../catalog/lib/apply-entries';
import type { Catalog } from '../../systems/api/get-catalog';
import type { ProjectCatalog } from '../../catalog/api/get-project-catalog';
import { useWalk } from '../draft/walk-context';
import { Link } from 'react-router-dom';
import { buildingPaths } from '../../building/paths';
import { CellInput, CellSelect, StepIntro } from '../components/cells';
import { SegmentFlags, useSegmentFlags } from '../components/segment-flags';
import { plural } from '../lib/verdict';
import { parseFixtureGroups } from '../lib/csv';
import { fmt } from '../lib/format';
import { freshId, numberInput, plainError } from '../lib/form-values';
import { treeOrder } from '../lib/tree';
import { followTypedRises } from '../lib/rises';
import { useLiveForm } from '../lib/use-live-form';
import { sizeChoices } from '../lib/sizes';

const optionalText = z.preprocess((v) => (v === '' || v === null ? undefined : v), z.string().optional());
/** An empty number box (undefined or NaN from numberInput) or an empty select ('') is "not given". */
const blank = (v: unknown) => v === undefined || v === '' || v === null || (typeof v === 'number' && Number.isNaN(v));
const optionalOf = <T extends z.ZodType>(schema: T) => z.preprocess((v) => (blank(v) ? undefined : v), schema.optional());

/** A custom pipe's four numbers; checked only when the segment has no catalog material (see segmentRow). */
const customRow = z
  .object({ innerDiameter: z.unknown().optional(), roughness: z.unknown().optional(), hazenWilliamsC: z.unknown().optional(), velocityClass: z.unknown().optional() })
  .optional();
const segmentRow = SegmentSchema.pick({ id: true, from: true, to: true, length: true })
  .extend({
    label: optionalText,
    /** a seeded material id; '' = a custom pipe; `project:<id>` = a project material copied as a custom pipe */
    material: optionalText,
    size: optionalText,
    rise: z.preprocess((v) => (typeof v === 'number' && Number.isNaN(v) ? undefined : v), SegmentSchema.shape.rise),
    length: z.number({ error: 'Enter a number' }).positive('Must be more than zero'),
    custom: customRow,
    flowOverride: optionalOf(z.number({ error: 'Enter a number' }).nonnegative('Must be zero or more')),
  })
  .transform((r, ctx) => {
    const { custom, ...rest } = r;
    // a seeded material: the custom data is not used (and is dropped from the document)
    if (r.material !== undefined && projectEntryIdOf(r.material) === null) return { ...rest, custom: undefined };
    const parsed = CustomPipeSchema.safeParse({ ...custom, velocityClass: custom?.velocityClass || undefined });
    if (parsed.success) return { ...rest, material: undefined, size: undefined, custom: parsed.data };
    // no material and no custom data at all: as before, the engine names the missing material
    if (r.material === undefined && (!custom || Object.values(custom).every((v) => blank(v) || v === undefined))) return { ...rest, custom: undefined };
    for (const issue of parsed.error.issues) ctx.addIssue({ code: 'custom', path: ['custom', ...issue.path.map(String)], message: plainError(issue.message) ?? issue.message });
    return z.NEVER;
  });
const groupRow = FixtureGroupSchema.extend({
  count: z.number({ error: 'Enter a whole number' }).int('Enter a whole number').positive('At least 1'),
  demandCurve: optionalOf(DemandCurveSchema),
  wsfuBasis: optionalOf(FixtureGroupSchema.shape.wsfuBasis.unwrap()),
  usage: z.preprocess(
    (v) => {
      if (!v || typeof v !== 'object') return undefined;
      const u = v as Record<string, unknown>;
      const cleaned = Object.fromEntries(Object.entries(u).filter(([, x]) => !blank(x)));
      return Object.keys(cleaned).length ? cleaned : undefined;
    },
    FixtureGroupSchema.shape.usage,
  ),
});
const nodeRow = z.object({
  id: z.string().min(1),
  label: optionalText,
  elevation: z.number().optional(),
  continuousDemand: optionalOf(NodeSchema.shape.continuousDemand.unwrap()),
  fixtureGroups: z.array(groupRow),
});
export const risersFormSchema = z.object({ segments: z.array(segmentRow), nodes: z.array(nodeRow) });
type CustomRow = { innerDiameter?: number; roughness?: number; hazenWilliamsC?: number; velocityClass: string };
type SegmentRow = { id: string; label: string; from: string; to: string; material: string; size: string; length: number; rise?: number; custom: CustomRow; flowOverride?: number };
/** `custom`: the project fixture type's data the group carries (copied when the type was chosen). */
type GroupRow = { fixtureTypeId: string; count: number; demandCurve: string; wsfuBasis: string; usage: { flow?: number; durationSeconds?: number; recurrenceSeconds?: number }; custom?: CustomFixture };
type NodeRow = { id: string; label: string; elevation?: number; continuousDemand?: number; fixtureGroups: GroupRow[] };
type RisersForm = { segments: SegmentRow[]; nodes: NodeRow[] };

const groupToRow = (g: FixtureGroup): GroupRow => ({ fixtureTypeId: g.fixtureTypeId, count: g.count, demandCurve: g.demandCurve ?? '', wsfuBasis: g.wsfuBasis ?? '', usage: { ...(g.usage ?? {}) }, ...(g.custom ? { custom: { ...g.custom } } : {}) });
const EMPTY_CUSTOM: CustomRow = { innerDiameter: undefined, roughness: undefined, hazenWilliamsC: undefined, velocityClass: 'copper' };

/** The form's rows; a custom pipe copied from a project material shows as that material and size. */
export function risersFormValues(doc: SystemDocument, projectMaterials: readonly ProjectEntryOf<'material'>[] = []): RisersForm {
  return {
    segments: doc.segments.map((s) => {
      const match = s.material ? null : matchProjectPipe(s.custom, projectMaterials, doc.unitSystem);
      return {
        id: s.id, label: s.label ?? '', from: s.from, to: s.to,
        material: match ? projectOptionValue(match.entryId) : s.material ?? '',
        size: match ? match.sizeKey : s.size ?? '',
        length: s.length, rise: s.rise,
        custom: s.custom ? { ...s.custom } : { ...EMPTY_CUSTOM },
        flowOverride: s.flowOverride,
      };
    }),
    nodes: doc.nodes.map((n) => ({ id: n.id, label: n.label ?? '', elevation: n.elevation, continuousDemand: n.continuousDemand, fixtureGroups: n.fixtureGroups.map(groupToRow) })),
  };
}

const OPTIONAL_SEGMENT_KEYS = ['label', 'material', 'size', 'rise', 'custom', 'flowOverride'] as const;

/**
 * Writes the tree back: segment and node fields from the form, everything else (fittings, checked fixtures) kept.
 * A fixture group of a project fixture type (`project:<id>`) gets the type's data copied in as its
 * own (catalog/lib/apply-entries.ts); a group of a seeded type carries none.
 */
export function applyRisers(doc: SystemDocument, v: z.output<typeof risersFormSchema>, projectFixtures: readonly ProjectEntryOf<'fixture-type'>[] = []): SystemDocument {
  const oldSegments = new Map(doc.segments.map((s) => [s.id, s]));
  const oldNodes = new Map(doc.nodes.map((n) => [n.id, n]));
  const segments: Segment[] = v.segments.map((r) => {
    const old = oldSegments.get(r.id);
    const next: Segment = { ...(old ?? { fittings: [], reducerAuto: true }), id: r.id, from: r.from, to: r.to, length: r.length } as Segment;
    for (const key of OPTIONAL_SEGMENT_KEYS) {
      if (r[key] === undefined) delete next[key];
      else (next as Record<string, unknown>)[key] = r[key];
    }
    return next;
  });
  const nodes = v.nodes.map((r) => {
    const old = oldNodes.get(r.id);
    const fixtureGroups = r.fixtureGroups.map((g) => groupWithProjectData(Object.fromEntries(Object.entries(g).filter(([, x]) => x !== undefined)) as FixtureGroup, projectFixtures));
    // Document version 2: a node keeps the position it has (elevation, floor, or none: placed by its feed's rise).
    const next = { ...(old ?? { checkedFixtures: [] }), id: r.id, fixtureGroups } as SystemDocument['nodes'][number];
    if (!old && r.elevation !== undefined) next.elevation = r.elevation;
    if (r.label === undefined) delete next.label;
    else next.label = r.label;
    if (r.continuousDemand === undefined) delete next.continuousDemand;
    else next.continuousDemand = r.continuousDemand;
    return next;
  });
  return followTypedRises(doc, { ...doc, segments, nodes });
}

function sizeOptions(catalog: Catalog, project: ProjectCatalog, materialId: string | undefined, sys: SystemDocument['unitSystem'], unit: string) {
  const projectMaterial = project.find('material', projectEntryIdOf(materialId));
  const sizes = projectMaterial ? projectMaterial.data.sizes : catalog.material(materialId)?.data.sizes;
  if (!sizes) return [{ value: '', label: materialId === '' ? 'Custom pipe: give its data below' : 'Choose a material first' }];
  return sizeChoices(sizes, sys, unit);
}

/** The material choices: the seeded materials, then the project's own (marked), then a custom pipe. */
export function materialOptions(catalog: Catalog, project: ProjectCatalog) {
  return [
    { value: '', label: 'Custom pipe (give its data)' },
    ...catalog.materials.map((m) => ({ value: m.id, label: m.label })),
    ...project.of('material').map((m) => ({ value: projectOptionValue(m.id), label: `${m.label} — project` })),
  ];
}

const DEMAND_CURVE_OPTIONS = [{ value: '', label: 'As the fixture type' }, { value: 'flush-tank', label: 'Flush tank' }, { value: 'flush-valve', label: 'Flush valve' }];
const WSFU_BASIS_OPTIONS = [{ value: '', label: 'The system’s service' }, { value: 'cold', label: 'Cold' }, { value: 'hot', label: 'Hot' }, { value: 'total', label: 'Total (cold + hot)' }];

function FixtureGroups({ index, control, register, setValue, rows, projectFixtures, catalog, nodeLabel, errors, locked, units }: {
  index: number;
  control: Control<RisersForm>;
  register: UseFormRegister<RisersForm>;
  setValue: UseFormSetValue<RisersForm>;
  /** the node's group rows as they are now (watched) */
  rows: GroupRow[] | undefined;
  projectFixtures: readonly ProjectEntryOf<'fixture-type'>[];
  catalog: Catalog;
  nodeLabel: string;
  errors: { count?: { message?: string }; fixtureTypeId?: { message?: string }; usage?: Record<string, { message?: string } | undefined> }[] | undefined;
  /** in a field change no fixture is added or removed */
  locked: boolean;
  units: { flow: string };
}) {
  const groups = useFieldArray({ control, name: `nodes.${index}.fixtureGroups` });
  const options = catalog.fixtureTypes.map((f) => ({ value: f.id, label: f.label }));
  const projectOptions = projectOptionsOf(projectFixtures);
  return (
    <div className="flex flex-col gap-2">
      {groups.fields.map((g, k) => {
        const row = rows?.[k];
        // the copy the group carries, or what choosing the project type will copy
        const own = row ? groupWithProjectData({ fixtureTypeId: row.fixtureTypeId, count: 1, ...(row.custom ? { custom: row.custom } : {}) }, projectFixtures).custom : undefined;
        return (
        <div key={g.id} className="flex flex-col gap-1">
          <div className="flex flex-wrap items-start gap-2">
            <CellSelect className="min-w-64 flex-1" label={`${nodeLabel}: fixture group ${k + 1} type`} options={[...options, ...projectOptions]} {...register(`nodes.${index}.fixtureGroups.${k}.fixtureTypeId`, { onChange: () => setValue(`nodes.${index}.fixtureGroups.${k}.custom`, undefined) })} />
            <CellInput className="w-24" label={`${nodeLabel}: fixture group ${k + 1} count`} type="text" inputMode="numeric" autoComplete="off" error={plainError(errors?.[k]?.count?.message)} {...register(`nodes.${index}.fixtureGroups.${k}.count`, numberInput)} />
            <Button variant="quiet" disabled={locked} onClick={() => groups.remove(k)} aria-label={`Remove fixture group ${k + 1} at ${nodeLabel}`}>Remove</Button>
          </div>
          {own ? (
            <p className="ml-2 text-xs text-ink-muted" data-testid={`project-fixture-${index}-${k}`}>
              Project data: {own.label} — fixture units each: cold {own.wsfuCold ?? 'none'}, hot {own.wsfuHot ?? 'none'}, total {own.wsfuTotal}; {own.flushValve ? 'flush valve' : 'flush tank'}; source: {own.source}
            </p>
          ) : null}
          <details className="ml-2 text-sm">
            <summary className="cursor-pointer text-ink-soft">Overrides of group {k + 1} (demand curve, fixture-unit basis, use for the binomial method)</summary>
            <div className="mt-2 grid gap-2 sm:grid-cols-2 xl:grid-cols-5">
              <label className="flex flex-col text-xs font-semibold">Demand curve<CellSelect label={`${nodeLabel}: fixture group ${k + 1} demand curve`} options={DEMAND_CURVE_OPTIONS} {...register(`nodes.${index}.fixtureGroups.${k}.demandCurve`)} /></label>
              <label className="flex flex-col text-xs font-semibold">Fixture units counted<CellSelect label={`${nodeLabel}: fixture group ${k + 1} fixture-unit basis`} options={WSFU_BASIS_OPTIONS} {...register(`nodes.${index}.fixtureGroups.${k}.wsfuBasis`)} /></label>
              <label className="flex flex-col text-xs font-semibold">Flow in use ({units.flow})<CellInput label={`${nodeLabel}: fixture group ${k + 1} flow in use (${units.flow})`} type="text" inputMode="decimal" autoComplete="off" placeholder="the type’s" error={plainError(errors?.[k]?.usage?.flow?.message)} {...register(`nodes.${index}.fixtureGroups.${k}.usage.flow`, numberInput)} /></label>
              <label className="flex flex-col text-xs font-semibold">Use lasts (s)<CellInput label={`${nodeLabel}: fixture group ${k + 1} duration of use (s)`} type="text" inputMode="decimal" autoComplete="off" error={plainError(errors?.[k]?.usage?.durationSeconds?.message)} {...register(`nodes.${index}.fixtureGroups.${k}.usage.durationSeconds`, numberInput)} /></label>
              <label className="flex flex-col text-xs font-semibold">Time between uses (s)<CellInput label={`${nodeLabel}: fixture group ${k + 1} time between uses (s)`} type="text" inputMode="decimal" autoComplete="off" error={plainError(errors?.[k]?.usage?.recurrenceSeconds?.message)} {...register(`nodes.${index}.fixtureGroups.${k}.usage.recurrenceSeconds`, numberInput)} /></label>
            </div>
            <p className="mt-1 text-xs text-ink-muted">Private or public use is chosen with the fixture type. Empty = the fixture type’s own value.</p>
          </details>
        </div>
        );
      })}
      <div>
        <Button variant="secondary" disabled={locked} onClick={() => groups.append({ fixtureTypeId: options[0]?.value ?? '', count: 1, demandCurve: '', wsfuBasis: '', usage: {} })}>
          Add fixtures at {nodeLabel}
        </Button>
      </div>
    </div>
  );
}

const VELOCITY_CLASS_OPTIONS = [{ value: 'copper', label: 'Copper limits' }, { value: 'plastic', label: 'Plastic limits' }, { value: 'steel', label: 'Steel limits' }];

/** A custom pipe's own data; read-only when it was copied from a project material (change the entry's size instead). */
function CustomPipeFields({ index, name, register, errors, units, fromProject, source }: {
  index: number;
  name: string;
  register: UseFormRegister<RisersForm>;
  errors: Record<string, { message?: string } | undefined> | undefined;
  units: { diameter: string };
  fromProject: boolean;
  source: string | undefined;
}) {
  return (
    <fieldset className="mt-2 rounded border border-rule p-2" disabled={fromProject || undefined}>
      <legend className="px-1 text-xs font-semibold">{fromProject ? 'Pipe data copied from the project catalog' : 'Custom pipe data'}</legend>
      <div className="grid gap-2 sm:grid-cols-2 xl:grid-cols-4">
        <label className="flex flex-col text-xs font-semibold">Inside diameter ({units.diameter})<CellInput label={`${name} custom inside diameter (${units.diameter})`} type="text" inputMode="decimal" autoComplete="off" error={plainError(errors?.innerDiameter?.message)} {...register(`segments.${index}.custom.innerDiameter`, numberInput)} /></label>
        <label className="flex flex-col text-xs font-semibold">Absolute roughness ({units.diameter})<CellInput label={`${name} custom roughness (${units.diameter})`} type="text" inputMode="decimal" autoComplete="off" error={plainError(errors?.roughness?.message)} {...register(`segments.${index}.custom.roughness`, numberInput)} /></label>
        <label className="flex flex-col text-xs font-semibold">Hazen–Williams C<CellInput label={`${name} custom Hazen–Williams C`} type="text" inputMode="decimal" autoComplete="off" error={plainError(errors?.hazenWilliamsC?.message)} {...register(`segments.${index}.custom.hazenWilliamsC`, numberInput)} /></label>
        <label className="flex flex-col text-xs font-semibold">Velocity limit<CellSelect label={`${name} custom velocity class`} options={VELOCITY_CLASS_OPTIONS} error={plainError(errors?.velocityClass?.message)} {...register(`segments.${index}.custom.velocityClass`)} /></label>
      </div>
      {source ? <p className="mt-1 text-xs text-ink-muted">Source: {source}</p> : null}
    </fieldset>
  );
}

/** What removing a segment takes with it: its downstream segments and nodes, their fixture groups and checked fixtures. */
interface Removal {
  segmentId: string;
  segmentIds: Set<string>;
  nodeIds: Set<string>;
  lines: string[];
  summary: string;
}

export function removalOf(values: RisersForm, doc: SystemDocument, index: number, nodeName: (id: string) => string): Removal {
  const seg = values.segments[index];
  const segmentIds = new Set([seg.id]);
  const nodeIds = new Set<string>();
  const queue = [seg.to];
  while (queue.length) {
    const node = queue.shift()!;
    if (node === doc.source.nodeId || nodeIds.has(node)) continue;
    nodeIds.add(node);
    for (const s of values.segments) if (s.from === node && !segmentIds.has(s.id)) {
      segmentIds.add(s.id);
      queue.push(s.to);
    }
  }
  const downstream = values.segments.filter((s) => segmentIds.has(s.id) && s.id !== seg.id).map((s) => s.label || s.id);
  const groups = values.nodes.filter((n) => nodeIds.has(n.id)).flatMap((n) => n.fixtureGroups.map(() => nodeName(n.id)));
  const checked = doc.nodes.filter((n) => nodeIds.has(n.id)).flatMap((n) => n.checkedFixtures.map((f) => f.label || f.id));
  const lines = [
    downstream.length ? `${plural(downstream.length, 'downstream segment')}: ${downstream.join(', ')}` : null,
    nodeIds.size ? `${plural(nodeIds.size, 'node')}: ${[...nodeIds].map(nodeName).join(', ')}` : null,
    groups.length ? `${plural(groups.length, 'fixture group')} (at ${[...new Set(groups)].join(', ')})` : null,
    checked.length ? `${plural(checked.length, 'checked fixture')}: ${checked.join(', ')}` : null,
  ].filter((l): l is string => l !== null);
  const name = seg.label || seg.id;
  const summary = [name, downstream.length ? plural(downstream.length, 'downstream segment') : null, groups.length ? plural(groups.length, 'fixture group') : null, checked.length ? plural(checked.length, 'checked fixture') : null]
    .filter(Boolean)
    .join(', ');
  return { segmentId: seg.id, segmentIds, nodeIds, lines, summary };
}

export function RisersStep() {
  const { ids, document, draft, readOnlyReason, scope, units, catalog, live } = useWalk();
  const project = useProjectEntries(ids.projectId);
  const [defaults] = useState(() => risersFormValues(document, project.of('material')));
  const projectFixtures = project.of('fixture-type');
  const form = useLiveForm(risersFormSchema, defaults, (v) => draft.update((doc) => applyRisers(doc, v, projectFixtures)));
  const { register, control, watch, setValue, getValues, formState: { errors } } = form;
  const segments = useFieldArray({ control, name: 'segments' });
  const nodes = useFieldArray({ control, name: 'nodes' });
  const [csv, setCsv] = useState('');
  const [csvProblems, setCsvProblems] = useState<string[]>([]);
  const [csvDone, setCsvDone] = useState<string | null>(null);
  const sys = document.unitSystem;
  const locked = scope === 'field-change';
  const rows = watch('segments');
  const nodeRows = watch('nodes');
  const order = treeOrder(rows, document.source.nodeId);
  const results = new Map(live.ok ? live.analysis.segments.map((s) => [s.id, s]) : []);
  const nodeIndex = new Map(nodeRows.map((n, i) => [n.id, i]));
  const nodeName = (id: string) => nodeRows[nodeIndex.get(id) ?? -1]?.label || id;
  const materialChoices = materialOptions(catalog, project);
  const flagsOf = useSegmentFlags();

  /** A project material and size chosen: its numbers are copied into the segment's custom pipe. */
  const copyProjectPipe = (i: number) => {
    const entry = project.find('material', projectEntryIdOf(getValues(`segments.${i}.material`)));
    const pipe = entry ? pipeFromProjectEntry(entry, getValues(`segments.${i}.size`), sys) : null;
    setValue(`segments.${i}.custom`, pipe ? { ...pipe } : { ...EMPTY_CUSTOM }, { shouldValidate: true, shouldDirty: true });
  };

  const addSegmentFrom = (fromId: string) => {
    const current = getValues();
    const to = freshId('node', current.nodes.map((n) => n.id));
    const feeding = current.segments.find((s) => s.to === fromId);
    // A new node has no position: the new segment's rise places it (document version 2).
    nodes.append({ id: to, label: '', elevation: undefined, continuousDemand: undefined, fixtureGroups: [] });
    segments.append({
      id: freshId('seg', current.segments.map((s) => s.id)),
      label: '',
      from: fromId,
      to,
      material: feeding?.material ?? catalog.materials[0]?.id ?? '',
      size: feeding?.size ?? '',
      length: Number.NaN,
      rise: Number.NaN, // empty: the user enters the rise (0 for a level run); until then the verdict is incomplete
      custom: feeding ? { ...feeding.custom } : { ...EMPTY_CUSTOM },
      flowOverride: undefined,
    });
  };

  /** Asked first: removing a segment takes everything downstream with it (named in the question). */
  const [removing, setRemoving] = useState<Removal | null>(null);
  const [undo, setUndo] = useState<{ text: string; values: RisersForm; doc: SystemDocument } | null>(null);
  const askRemove = (index: number) => setRemoving(removalOf(getValues(), document, index, nodeName));
  const removeSegment = () => {
    if (!removing) return;
    const before = getValues();
    const snapshot = { text: removing.summary, values: structuredClone(before), doc: document };
    const segIdx = before.segments.map((s, i) => (removing.segmentIds.has(s.id) ? i : -1)).filter((i) => i >= 0);
    const nodeIdx = before.nodes.map((n, i) => (removing.nodeIds.has(n.id) ? i : -1)).filter((i) => i >= 0);
    segments.remove(segIdx);
    if (nodeIdx.length) nodes.remove(nodeIdx);
    setRemoving(null);
    setUndo(snapshot);
  };
  const undoRemove = () => {
    if (!undo) return;
    // the document first (it holds the checked fixtures the form does not), then the form's rows
    draft.update(() => undo.doc);
    form.reset(undo.values);
    setUndo(null);
  };

  const importCsv = (text: string) => {
    const result = parseFixtureGroups(text, { nodeIds: new Set(getValues('nodes').map((n) => n.id)), fixtureTypeIds: new Set(catalog.fixtureTypes.map((f) => f.id)) });
    setCsvProblems(result.errors);
    setCsvDone(null);
    if (result.errors.length) return;
    for (const r of result.rows) {
      const i = getValues('nodes').findIndex((n) => n.id === r.nodeId);
      setValue(`nodes.${i}.fixtureGroups`, [...getValues(`nodes.${i}.fixtureGroups`), { fixtureTypeId: r.fixtureTypeId, count: r.count, demandCurve: '', wsfuBasis: '', usage: {} }], { shouldValidate: true, shouldDirty: true });
    }
    setCsvDone(`${result.rows.length} fixture group(s) added.`);
    setCsv('');
  };

  return (
    <form noValidate onSubmit={(ev) => ev.preventDefault()} aria-label="Risers">
      <StepIntro title="Risers">
        The tree of segments from the source up and out: the riser, the branches off it, the fixture branches. Each
        segment runs from a node toward the fixtures. Give each its material, size, developed length and rise; at each
        node, the fixtures it serves. The fixture units and the design flow of each segment follow live.
      </StepIntro>
      {scope === 'design' ? <p className="mb-4"><Link to={buildingPaths.building.getHref(ids.projectId, ids.systemId, ids.revisionId)}>Build from floors: floors, typical units and a riser from a short form →</Link></p> : null}
      <fieldset disabled={readOnlyReason !== null} className="flex flex-col gap-6">
        <div aria-live="polite">
          {undo ? (
            <div className="flex flex-wrap items-center gap-3 rounded-md border-2 border-rule bg-paper-deep p-3 text-sm" data-testid="undo-remove">
              <p>Removed {undo.text}.</p>
              <Button variant="secondary" onClick={undoRemove}>Undo</Button>
              <Button variant="quiet" onClick={() => setUndo(null)}>Dismiss</Button>
            </div>
          ) : null}
        </div>
        <Section title="Segments" headingLevel={3}>
          {rows.length === 0 ? <p className="mb-3 text-ink-soft">No segments yet. Start with one from the connection.</p> : null}
          <ol className="flex flex-col gap-3" aria-label="Segments in tree order">
            {order.map(({ index: i, depth }) => {
              const row = rows[i];
              const field = segments.fields[i];
              if (!row || !field) return null;
              const err = errors.segments?.[i];
              const result = results.get(row.id);
              const name = row.label || row.id;
              const leaf = !rows.some((s) => s.from === row.to);
              return (
                <li key={field.id} className="rounded-md border-2 border-rule p-3" style={{ marginLeft: `${Math.min(depth - 1, 8) * 1.25}rem` }} data-testid={`segment-${row.id}`}>
                  <p className="mb-2 text-sm font-semibold">
                    {name}: {nodeName(row.from)} → {nodeName(row.to)}
                  </p>
                  <SegmentFlags {...flagsOf(row.id)} className="mb-2" />
                  <div className="grid gap-2 sm:grid-cols-2 xl:grid-cols-6">
                    <label className="flex flex-col text-xs font-semibold xl:col-span-2">Name<CellInput label={`${name} name`} {...register(`segments.${i}.label`)} /></label>
                    <label className="flex flex-col text-xs font-semibold xl:col-span-2">Material<CellSelect label={`${name} material`} options={materialChoices} {...register(`segments.${i}.material`, { onChange: () => { setValue(`segments.${i}.size`, '', { shouldValidate: true }); if (projectEntryIdOf(getValues(`segments.${i}.material`))) copyProjectPipe(i); } })} /></label>
                    <label className="flex flex-col text-xs font-semibold xl:col-span-2">Size<CellSelect label={`${name} size`} options={sizeOptions(catalog, project, row.material, sys, units.diameter)} {...register(`segments.${i}.size`, { onChange: () => { if (projectEntryIdOf(getValues(`segments.${i}.material`))) copyProjectPipe(i); } })} /></label>
                    <label className="flex flex-col text-xs font-semibold">Length ({units.length})<CellInput label={`${name} length (${units.length})`} type="text" inputMode="decimal" autoComplete="off" error={plainError(err?.length?.message)} {...register(`segments.${i}.length`, numberInput)} /></label>
                    <label className="flex flex-col text-xs font-semibold">Rise ({units.length})<CellInput label={`${name} rise (${units.length})`} type="text" inputMode="decimal" autoComplete="off" error={plainError(err?.rise?.message)} {...register(`segments.${i}.rise`, numberInput)} /></label>
                    <label className="flex flex-col text-xs font-semibold">Design flow override ({units.flow})<CellInput label={`${name} design flow override (${units.flow})`} type="text" inputMode="decimal" autoComplete="off" placeholder="from the fixture units" error={plainError(err?.flowOverride?.message)} {...register(`segments.${i}.flowOverride`, numberInput)} /></label>
                    <label className="flex flex-col text-xs font-semibold xl:col-span-2">Node name at the end<CellInput label={`Name of node ${row.to}`} {...register(`nodes.${nodeIndex.get(row.to) ?? 0}.label`)} /></label>
                    <label className="flex flex-col text-xs font-semibold">Continuous demand at the end ({units.flow})<CellInput label={`Continuous demand at node ${row.to} (${units.flow})`} type="text" inputMode="decimal" autoComplete="off" placeholder="none" error={plainError(errors.nodes?.[nodeIndex.get(row.to) ?? 0]?.continuousDemand?.message)} {...register(`nodes.${nodeIndex.get(row.to) ?? 0}.continuousDemand`, numberInput)} /></label>
                    <p className="text-sm xl:col-span-2" data-testid={`segment-demand-${row.id}`}>
                      {result ? (
                        <>
                          <span className="font-semibold">{fmt(result.wsfu, 1)} WSFU</span> → {fmt(result.designFlow, 1)} {units.flow}, {fmt(result.velocity, 1)} {units.velocity}
                        </>
                      ) : (
                        <span className="text-ink-muted">Demand not computed yet</span>
                      )}
                    </p>
                  </div>
                  {row.material === '' || projectEntryIdOf(row.material) ? (
                    <CustomPipeFields index={i} name={name} register={register} errors={err?.custom as never} units={units} fromProject={projectEntryIdOf(row.material) !== null} source={project.find('material', projectEntryIdOf(row.material))?.source} />
                  ) : null}
                  <div className="mt-2 flex flex-wrap gap-2">
                    <Button variant="secondary" disabled={locked} onClick={() => addSegmentFrom(row.to)}>Add a segment from {nodeName(row.to)}</Button>
                    <Button variant="danger" disabled={locked || removing !== null} onClick={() => askRemove(i)}>Remove {name}{leaf ? '' : ' and what it feeds'}…</Button>
                  </div>
                  {removing?.segmentId === row.id ? (
                    <div className="mt-2 flex flex-col gap-2 rounded-md border-2 border-fault bg-fault-soft p-3 text-sm" role="group" aria-label={`Confirm removing ${name}`} data-testid="confirm-remove">
                      <p className="font-semibold">Remove {name}? This also removes:</p>
                      <ul className="list-disc pl-5">
                        {removing.lines.length ? removing.lines.map((l) => <li key={l}>{l}</li>) : <li>nothing else</li>}
                      </ul>
                      <div className="flex flex-wrap gap-2">
                        <Button variant="danger" onClick={removeSegment}>Yes, remove</Button>
                        <Button variant="secondary" onClick={() => setRemoving(null)}>Keep it</Button>
                      </div>
                    </div>
                  ) : null}
                </li>
              );
            })}
          </ol>
          <div className="mt-3">
            <Button variant="secondary" disabled={locked} onClick={() => addSegmentFrom(document.source.nodeId)}>Add a segment from the connection</Button>
          </div>
        </Section>
        <Section title="Fixtures served at each node" headingLevel={3}>
          <p className="mb-3 text-sm text-ink-soft">Type × count; the fixture units add up toward the source and set each segment’s design flow.</p>
          <div className="flex flex-col gap-4">
            {nodes.fields.map((field, i) => {
              const n = nodeRows[i];
              if (!n) return null;
              const label = n.label || n.id;
              return (
                <div key={field.id} className="border-t border-rule pt-3">
                  <p className="mb-2 font-semibold">{label}</p>
                  <FixtureGroups index={i} control={control} register={register} setValue={setValue} rows={nodeRows[i]?.fixtureGroups} projectFixtures={projectFixtures} catalog={catalog} nodeLabel={label} errors={errors.nodes?.[i]?.fixtureGroups as never} locked={locked} units={units} />
                </div>
              );
            })}
          </div>
        </Section>
        <Section title="Import fixture groups (CSV)" headingLevel={3}>
          <TextAreaField label="Lines of node id, fixture type id, count" hint="Comma- or tab-separated; a header line is skipped. Groups are added to the nodes named." value={csv} onChange={(ev) => setCsv(ev.target.value)} />
          <div className="mt-2 flex flex-wrap items-end gap-3">
            <Button variant="secondary" onClick={() => importCsv(csv)} disabled={locked || csv.trim() === ''}>Add these fixture groups</Button>
            <label className="text-sm font-semibold">
              Or a CSV file
              <input type="file" accept=".csv,.txt,text/csv,text/plain" className="mt-1 block text-sm" disabled={locked} onChange={async (ev) => { const f = ev.target.files?.[0]; if (f) importCsv(await f.text()); ev.target.value = ''; }} />
            </label>
          </div>
          <div aria-live="polite" className="mt-2 text-sm">
            {csvProblems.length ? <ul role="alert" className="list-disc pl-5 text-fault">{csvProblems.map((p) => <li key={p}>{p}</li>)}</ul> : null}
            {csvDone ? <p>{csvDone}</p> : null}
          </div>
        </Section>
      </fieldset>
    </form>
  );
}
