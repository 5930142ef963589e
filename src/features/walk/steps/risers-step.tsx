import { useCallback, useEffect, useMemo, useRef, useState } from 'react';
import { useFieldArray } from 'react-hook-form';
import type { Control, UseFormRegister, UseFormReturn, UseFormSetValue } from 'react-hook-form';
import { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { Section } from '../../../components/ui/card';
import { TextAreaField } from '../../../components/ui/field';
import type { CustomFixture, FixtureGroup, Segment, SystemDocument } from '../../../engine';
import { CustomPipeSchema, DemandCurveSchema, FixtureGroupSchema, NodeSchema, SegmentSchema } from '../../../engine/model/schema';
import type { ProjectEntryOf } from '../../../shared/api/catalog';
import { useProjectEntries } from '../../catalog/api/get-project-catalog';
import {
  groupWithProjectData,
  matchProjectPipe,
  projectEntryIdOf,
  projectOptions as projectOptionsOf,
  projectOptionValue,
} from '../../catalog/lib/apply-entries';
import type { Catalog } from '../../systems/api/get-catalog';
import { useWalk } from '../draft/walk-context';
import type { WalkContextValue } from '../draft/walk-context';
import type { SegmentResult } from '../../../engine';
import { TreeEditor } from '../../tree-editor/components/tree-editor';
import { DeviceAdder } from '../../tree-editor/components/device-adder';
import type { TreeRow } from '../../tree-editor/model';
import { CONTRACTOR_POLICY, DESIGNER_POLICY, readOnlyPolicy } from '../../tree-editor/policy';
import type { EditPolicy } from '../../tree-editor/policy';
import { Link } from 'react-router-dom';
import { buildingPaths } from '../../building/paths';
import { CellInput, CellSelect, StepIntro } from '../components/cells';
import { useSegmentFlags } from '../components/segment-flags';
import { plural } from '../lib/verdict';
import { parseFixtureGroups } from '../lib/csv';
import { num } from '../../../shared/format/quantity';
import { freshId, numberInput, plainError } from '../lib/form-values';
import { followTypedRises } from '../lib/rises';
import { useLiveForm } from '../lib/use-live-form';
import { describedCell, describedField } from '../lib/described';
import { CUSTOM_PIPE, FIXTURE_GROUP, FIXTURE_USAGE, NODE, SEGMENT } from '../../../engine/model/elements';

const optionalText = z.preprocess((v) => (v === '' || v === null ? undefined : v), z.string().optional());
/** An empty number box (undefined or NaN from numberInput) or an empty select ('') is "not given". */
const blank = (v: unknown) => v === undefined || v === '' || v === null || (typeof v === 'number' && Number.isNaN(v));
const optionalOf = <T extends z.ZodType>(schema: T) => z.preprocess((v) => (blank(v) ? undefined : v), schema.optional());

/** A custom pipe's four numbers; checked only when the segment has no catalog material (see segmentRow). */
const customRow = z
  .object({
    innerDiameter: z.unknown().optional(),
    roughness: z.unknown().optional(),
    hazenWilliamsC: z.unknown().optional(),
    velocityClass: z.unknown().optional(),
  })
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
    for (const issue of parsed.error.issues)
      ctx.addIssue({ code: 'custom', path: ['custom', ...issue.path.map(String)], message: plainError(issue.message) ?? issue.message });
    return z.NEVER;
  });
const groupRow = FixtureGroupSchema.extend({
  count: z.number({ error: 'Enter a whole number' }).int('Enter a whole number').positive('At least 1'),
  demandCurve: optionalOf(DemandCurveSchema),
  wsfuBasis: optionalOf(FixtureGroupSchema.shape.wsfuBasis.unwrap()),
  usage: z.preprocess((v) => {
    if (!v || typeof v !== 'object') return undefined;
    const u = v as Record<string, unknown>;
    const cleaned = Object.fromEntries(Object.entries(u).filter(([, x]) => !blank(x)));
    return Object.keys(cleaned).length ? cleaned : undefined;
  }, FixtureGroupSchema.shape.usage),
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
type SegmentRow = {
  id: string;
  label: string;
  from: string;
  to: string;
  material: string;
  size: string;
  length: number;
  rise?: number;
  custom: CustomRow;
  flowOverride?: number;
};
/** `custom`: the project fixture type's data the group carries (copied when the type was chosen). */
type GroupRow = {
  fixtureTypeId: string;
  count: number;
  demandCurve: string;
  wsfuBasis: string;
  usage: { flow?: number; durationSeconds?: number; recurrenceSeconds?: number };
  custom?: CustomFixture;
};
type NodeRow = { id: string; label: string; elevation?: number; continuousDemand?: number; fixtureGroups: GroupRow[] };
type RisersForm = { segments: SegmentRow[]; nodes: NodeRow[] };

const groupToRow = (g: FixtureGroup): GroupRow => ({
  fixtureTypeId: g.fixtureTypeId,
  count: g.count,
  demandCurve: g.demandCurve ?? '',
  wsfuBasis: g.wsfuBasis ?? '',
  usage: { ...(g.usage ?? {}) },
  ...(g.custom ? { custom: { ...g.custom } } : {}),
});
const EMPTY_CUSTOM: CustomRow = { innerDiameter: undefined, roughness: undefined, hazenWilliamsC: undefined, velocityClass: 'copper' };

/** The form's rows; a custom pipe copied from a project material shows as that material and size. */
export function risersFormValues(doc: SystemDocument, projectMaterials: readonly ProjectEntryOf<'material'>[] = []): RisersForm {
  return {
    segments: doc.segments.map((s) => {
      const match = s.material ? null : matchProjectPipe(s.custom, projectMaterials, doc.unitSystem);
      return {
        id: s.id,
        label: s.label ?? '',
        from: s.from,
        to: s.to,
        material: match ? projectOptionValue(match.entryId) : (s.material ?? ''),
        size: match ? match.sizeKey : (s.size ?? ''),
        length: s.length,
        rise: s.rise,
        custom: s.custom ? { ...s.custom } : { ...EMPTY_CUSTOM },
        flowOverride: s.flowOverride,
      };
    }),
    nodes: doc.nodes.map((n) => ({
      id: n.id,
      label: n.label ?? '',
      elevation: n.elevation,
      continuousDemand: n.continuousDemand,
      fixtureGroups: n.fixtureGroups.map(groupToRow),
    })),
  };
}

const OPTIONAL_SEGMENT_KEYS = ['label', 'material', 'size', 'rise', 'custom', 'flowOverride'] as const;

/**
 * Writes the tree back: segment and node fields from the form, everything else (fittings, checked fixtures) kept.
 * A fixture group of a project fixture type (`project:<id>`) gets the type's data copied in as its
 * own (catalog/lib/apply-entries.ts); a group of a seeded type carries none.
 */
export function applyRisers(
  doc: SystemDocument,
  v: z.output<typeof risersFormSchema>,
  projectFixtures: readonly ProjectEntryOf<'fixture-type'>[] = [],
): SystemDocument {
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
    const fixtureGroups = r.fixtureGroups.map((g) =>
      groupWithProjectData(Object.fromEntries(Object.entries(g).filter(([, x]) => x !== undefined)) as FixtureGroup, projectFixtures),
    );
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

const DEMAND_CURVE_OPTIONS = [
  { value: '', label: 'As the fixture type' },
  { value: 'flush-tank', label: 'Flush tank' },
  { value: 'flush-valve', label: 'Flush valve' },
];
const WSFU_BASIS_OPTIONS = [
  { value: '', label: 'The system’s service' },
  { value: 'cold', label: 'Cold' },
  { value: 'hot', label: 'Hot' },
  { value: 'total', label: 'Total (cold + hot)' },
];

function FixtureGroups({
  index,
  control,
  register,
  setValue,
  rows,
  projectFixtures,
  catalog,
  nodeLabel,
  errors,
  locked,
}: {
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
}) {
  const groups = useFieldArray({ control, name: `nodes.${index}.fixtureGroups` });
  const sys = useWalk().document.unitSystem;
  const options = catalog.fixtureTypes.map((f) => ({ value: f.id, label: f.label }));
  const projectOptions = projectOptionsOf(projectFixtures);
  return (
    <div className="flex flex-col gap-2">
      {groups.fields.map((g, k) => {
        const row = rows?.[k];
        // the copy the group carries, or what choosing the project type will copy
        const own = row
          ? groupWithProjectData({ fixtureTypeId: row.fixtureTypeId, count: 1, ...(row.custom ? { custom: row.custom } : {}) }, projectFixtures).custom
          : undefined;
        return (
          <div key={g.id} className="flex flex-col gap-1">
            <div className="flex flex-wrap items-start gap-2">
              <CellSelect
                className="min-w-64 flex-1"
                {...describedCell(`${nodeLabel}: fixture group ${k + 1}`, FIXTURE_GROUP, 'fixtureTypeId', sys)}
                options={[...options, ...projectOptions]}
                {...register(`nodes.${index}.fixtureGroups.${k}.fixtureTypeId`, {
                  onChange: () => setValue(`nodes.${index}.fixtureGroups.${k}.custom`, undefined),
                })}
              />
              <CellInput
                className="w-24"
                {...describedCell(`${nodeLabel}: fixture group ${k + 1}`, FIXTURE_GROUP, 'count', sys)}
                type="text"
                inputMode="numeric"
                autoComplete="off"
                error={plainError(errors?.[k]?.count?.message)}
                {...register(`nodes.${index}.fixtureGroups.${k}.count`, numberInput)}
              />
              <Button variant="quiet" disabled={locked} onClick={() => groups.remove(k)} aria-label={`Remove fixture group ${k + 1} at ${nodeLabel}`}>
                Remove
              </Button>
            </div>
            {own ? (
              <p className="ml-2 text-xs text-ink-muted" data-testid={`project-fixture-${index}-${k}`}>
                Project data: {own.label} — fixture units each: cold {own.wsfuCold ?? 'none'}, hot {own.wsfuHot ?? 'none'}, total {own.wsfuTotal};{' '}
                {own.flushValve ? 'flush valve' : 'flush tank'}; source: {own.source}
              </p>
            ) : null}
            <details className="ml-2 text-sm">
              <summary className="cursor-pointer text-ink-soft">
                Overrides of group {k + 1} (demand curve, fixture-unit basis, use for the binomial method)
              </summary>
              <div className="mt-2 grid gap-2 sm:grid-cols-2 xl:grid-cols-5">
                <label className="flex flex-col text-xs font-semibold">
                  {describedField(FIXTURE_GROUP, 'demandCurve', sys).label}
                  <CellSelect
                    {...describedCell(`${nodeLabel}: fixture group ${k + 1}`, FIXTURE_GROUP, 'demandCurve', sys)}
                    options={DEMAND_CURVE_OPTIONS}
                    {...register(`nodes.${index}.fixtureGroups.${k}.demandCurve`)}
                  />
                </label>
                <label className="flex flex-col text-xs font-semibold">
                  {describedField(FIXTURE_GROUP, 'wsfuBasis', sys).label}
                  <CellSelect
                    {...describedCell(`${nodeLabel}: fixture group ${k + 1}`, FIXTURE_GROUP, 'wsfuBasis', sys)}
                    options={WSFU_BASIS_OPTIONS}
                    {...register(`nodes.${index}.fixtureGroups.${k}.wsfuBasis`)}
                  />
                </label>
                <label className="flex flex-col text-xs font-semibold">
                  {describedField(FIXTURE_USAGE, 'flow', sys).label}
                  <CellInput
                    {...describedCell(`${nodeLabel}: fixture group ${k + 1}`, FIXTURE_USAGE, 'flow', sys)}
                    type="text"
                    inputMode="decimal"
                    autoComplete="off"
                    placeholder="the type’s"
                    error={plainError(errors?.[k]?.usage?.flow?.message)}
                    {...register(`nodes.${index}.fixtureGroups.${k}.usage.flow`, numberInput)}
                  />
                </label>
                <label className="flex flex-col text-xs font-semibold">
                  {describedField(FIXTURE_USAGE, 'durationSeconds', sys).label}
                  <CellInput
                    {...describedCell(`${nodeLabel}: fixture group ${k + 1}`, FIXTURE_USAGE, 'durationSeconds', sys)}
                    type="text"
                    inputMode="decimal"
                    autoComplete="off"
                    error={plainError(errors?.[k]?.usage?.durationSeconds?.message)}
                    {...register(`nodes.${index}.fixtureGroups.${k}.usage.durationSeconds`, numberInput)}
                  />
                </label>
                <label className="flex flex-col text-xs font-semibold">
                  {describedField(FIXTURE_USAGE, 'recurrenceSeconds', sys).label}
                  <CellInput
                    {...describedCell(`${nodeLabel}: fixture group ${k + 1}`, FIXTURE_USAGE, 'recurrenceSeconds', sys)}
                    type="text"
                    inputMode="decimal"
                    autoComplete="off"
                    error={plainError(errors?.[k]?.usage?.recurrenceSeconds?.message)}
                    {...register(`nodes.${index}.fixtureGroups.${k}.usage.recurrenceSeconds`, numberInput)}
                  />
                </label>
              </div>
              <p className="mt-1 text-xs text-ink-muted">Private or public use is chosen with the fixture type. Empty = the fixture type’s own value.</p>
            </details>
          </div>
        );
      })}
      <div>
        <Button
          variant="secondary"
          disabled={locked}
          onClick={() => groups.append({ fixtureTypeId: options[0]?.value ?? '', count: 1, demandCurve: '', wsfuBasis: '', usage: {} })}
        >
          Add fixtures at {nodeLabel}
        </Button>
      </div>
    </div>
  );
}

const VELOCITY_CLASS_OPTIONS = [
  { value: 'copper', label: 'Copper limits' },
  { value: 'plastic', label: 'Plastic limits' },
  { value: 'steel', label: 'Steel limits' },
];

/** A custom pipe's own data; read-only when it was copied from a project material (change the entry's size instead). */
function CustomPipeFields({
  index,
  name,
  register,
  errors,
  fromProject,
  source,
}: {
  index: number;
  name: string;
  register: UseFormRegister<RisersForm>;
  errors: Record<string, { message?: string } | undefined> | undefined;
  fromProject: boolean;
  source: string | undefined;
}) {
  const sys = useWalk().document.unitSystem;
  return (
    <fieldset className="mt-2 rounded border border-rule p-2" disabled={fromProject || undefined}>
      <legend className="px-1 text-xs font-semibold">{fromProject ? 'Pipe data copied from the project catalog' : 'Custom pipe data'}</legend>
      <div className="grid gap-2 sm:grid-cols-2 xl:grid-cols-4">
        <label className="flex flex-col text-xs font-semibold">
          {describedField(CUSTOM_PIPE, 'innerDiameter', sys).label}
          <CellInput
            {...describedCell(`${name} custom`, CUSTOM_PIPE, 'innerDiameter', sys)}
            type="text"
            inputMode="decimal"
            autoComplete="off"
            error={plainError(errors?.innerDiameter?.message)}
            {...register(`segments.${index}.custom.innerDiameter`, numberInput)}
          />
        </label>
        <label className="flex flex-col text-xs font-semibold">
          {describedField(CUSTOM_PIPE, 'roughness', sys).label}
          <CellInput
            {...describedCell(`${name} custom`, CUSTOM_PIPE, 'roughness', sys)}
            type="text"
            inputMode="decimal"
            autoComplete="off"
            error={plainError(errors?.roughness?.message)}
            {...register(`segments.${index}.custom.roughness`, numberInput)}
          />
        </label>
        <label className="flex flex-col text-xs font-semibold">
          {describedField(CUSTOM_PIPE, 'hazenWilliamsC', sys).label}
          <CellInput
            {...describedCell(`${name} custom`, CUSTOM_PIPE, 'hazenWilliamsC', sys)}
            type="text"
            inputMode="decimal"
            autoComplete="off"
            error={plainError(errors?.hazenWilliamsC?.message)}
            {...register(`segments.${index}.custom.hazenWilliamsC`, numberInput)}
          />
        </label>
        <label className="flex flex-col text-xs font-semibold">
          {describedField(CUSTOM_PIPE, 'velocityClass', sys).label}
          <CellSelect
            {...describedCell(`${name} custom`, CUSTOM_PIPE, 'velocityClass', sys)}
            options={VELOCITY_CLASS_OPTIONS}
            error={plainError(errors?.velocityClass?.message)}
            {...register(`segments.${index}.custom.velocityClass`)}
          />
        </label>
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
    for (const s of values.segments)
      if (s.from === node && !segmentIds.has(s.id)) {
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
  const summary = [
    name,
    downstream.length ? plural(downstream.length, 'downstream segment') : null,
    groups.length ? plural(groups.length, 'fixture group') : null,
    checked.length ? plural(checked.length, 'checked fixture') : null,
  ]
    .filter(Boolean)
    .join(', ');
  return { segmentId: seg.id, segmentIds, nodeIds, lines, summary };
}

/** The details of the open row's segment and its end node: what the row has no room for. */
const detailSegmentRow = z
  .object({
    id: z.string(),
    label: optionalText,
    material: z.string(),
    flowOverride: optionalOf(z.number({ error: 'Enter a number' }).nonnegative('Must be zero or more')),
    custom: customRow,
  })
  .transform((r, ctx) => {
    if (r.material !== '' && projectEntryIdOf(r.material) === null) return { ...r, custom: undefined, customGiven: false };
    if (projectEntryIdOf(r.material) !== null) return { ...r, custom: undefined, customGiven: false };
    const parsed = CustomPipeSchema.safeParse({ ...r.custom, velocityClass: r.custom?.velocityClass || undefined });
    if (parsed.success) return { ...r, custom: parsed.data, customGiven: true };
    if (!r.custom || Object.entries(r.custom).every(([k, v]) => k === 'velocityClass' || blank(v))) return { ...r, custom: undefined, customGiven: false };
    for (const issue of parsed.error.issues)
      ctx.addIssue({ code: 'custom', path: ['custom', ...issue.path.map(String)], message: plainError(issue.message) ?? issue.message });
    return z.NEVER;
  });
const detailSchema = z.object({ segments: z.array(detailSegmentRow), nodes: z.array(nodeRow) });

/** The open segment's label, flow override and custom pipe, and its end node's name, continuous demand and fixtures, written back. */
function applyDetail(doc: SystemDocument, v: z.output<typeof detailSchema>, projectFixtures: readonly ProjectEntryOf<'fixture-type'>[]): SystemDocument {
  const r = v.segments[0];
  const n = v.nodes[0];
  return {
    ...doc,
    segments: doc.segments.map((s) => {
      if (!r || s.id !== r.id) return s;
      const next = { ...s } as Segment;
      if (r.label === undefined) delete next.label;
      else next.label = r.label;
      if (r.flowOverride === undefined) delete next.flowOverride;
      else next.flowOverride = r.flowOverride;
      if (r.customGiven && r.custom && next.material === undefined) next.custom = r.custom;
      return next;
    }),
    nodes: doc.nodes.map((node) => {
      if (!n || node.id !== n.id) return node;
      const next = {
        ...node,
        fixtureGroups: n.fixtureGroups.map((g) =>
          groupWithProjectData(Object.fromEntries(Object.entries(g).filter(([, x]) => x !== undefined)) as FixtureGroup, projectFixtures),
        ),
      };
      if (n.label === undefined) delete next.label;
      else next.label = n.label;
      if (n.continuousDemand === undefined) delete next.continuousDemand;
      else next.continuousDemand = n.continuousDemand;
      return next;
    }),
  };
}

/** A segment being entered: kept beside the draft until its length is given (the document needs one). */
interface Pending {
  segments: Segment[];
  nodes: SystemDocument['nodes'];
}
const NO_PENDING: Pending = { segments: [], nodes: [] };
const withPending = (doc: SystemDocument, p: Pending): SystemDocument =>
  p.segments.length ? { ...doc, segments: [...doc.segments, ...p.segments], nodes: [...doc.nodes, ...p.nodes] } : doc;
function splitPending(view: SystemDocument): { doc: SystemDocument; pending: Pending } {
  const waiting = view.segments.filter((s) => !(Number.isFinite(s.length) && s.length > 0));
  if (!waiting.length) return { doc: view, pending: NO_PENDING };
  const waitingNodes = new Set(waiting.map((s) => s.to));
  return {
    doc: { ...view, segments: view.segments.filter((s) => !waiting.includes(s)), nodes: view.nodes.filter((n) => !waitingNodes.has(n.id)) },
    pending: { segments: waiting, nodes: view.nodes.filter((n) => waitingNodes.has(n.id)) },
  };
}

/** The detail forms' values: the open segment (none at the connection) and the node it ends at, `nodes.0`. */
type DetailForm = { segments: unknown[]; nodes: NodeRow[] };

/**
 * A node's own fields, one form wherever a node is edited (a segment's end node, the connection):
 * its name, a continuous demand, and the fixtures served there. `where` words the labels.
 */
function NodeFields(p: {
  form: UseFormReturn<DetailForm>;
  nodeId: string;
  where: 'end' | 'connection';
  policy: EditPolicy;
  catalog: Catalog;
  projectFixtures: readonly ProjectEntryOf<'fixture-type'>[];
  units: WalkContextValue['units'];
}) {
  const {
    register,
    control,
    setValue,
    watch,
    formState: { errors },
  } = p.form;
  const id = p.nodeId;
  const nodeLabel = watch('nodes.0.label') || id;
  const groups = watch('nodes.0.fixtureGroups');
  const atEnd = p.where === 'end';
  const sys = useWalk().document.unitSystem;
  return (
    <div className="flex flex-col gap-3" data-testid={`node-fields-${id}`}>
      <div className="grid gap-2 sm:grid-cols-2 xl:grid-cols-4">
        <label className="flex flex-col text-xs font-semibold">
          {atEnd ? 'Node name at the end' : 'Node name'}
          <CellInput {...describedField(NODE, 'label', sys, { after: `of node ${id}` })} {...register('nodes.0.label')} />
        </label>
        <label className="flex flex-col text-xs font-semibold">
          {atEnd ? 'Continuous demand at the end' : 'Continuous demand'} ({p.units.flow})
          <CellInput
            {...describedField(NODE, 'continuousDemand', sys, { after: `at node ${id}` })}
            type="text"
            inputMode="decimal"
            autoComplete="off"
            placeholder="none"
            error={plainError(errors.nodes?.[0]?.continuousDemand?.message)}
            {...register('nodes.0.continuousDemand', numberInput)}
          />
        </label>
      </div>
      <div>
        <p className="mb-1 text-sm font-semibold">Fixtures served at {nodeLabel}</p>
        <FixtureGroups
          index={0}
          control={control as never}
          register={register as never}
          setValue={setValue as never}
          rows={groups}
          projectFixtures={p.projectFixtures}
          catalog={p.catalog}
          nodeLabel={nodeLabel}
          errors={errors.nodes?.[0]?.fixtureGroups as never}
          locked={p.policy.locked.fixtures !== null}
        />
      </div>
    </div>
  );
}

interface DetailProps {
  segment: Segment;
  view: SystemDocument;
  update: (change: (doc: SystemDocument) => SystemDocument) => void;
  policy: EditPolicy;
  catalog: Catalog;
  projectFixtures: readonly ProjectEntryOf<'fixture-type'>[];
  projectMaterialSource: string | undefined;
  materialValue: string;
  result: SegmentResult | undefined;
  units: WalkContextValue['units'];
  onAddFrom: (nodeId: string) => void;
  onRemove: () => void;
  removing: Removal | null;
  onConfirmRemove: () => void;
  onKeep: () => void;
  devicesHref: string;
}

function SegmentDetail(p: DetailProps) {
  const s = p.segment;
  const node = p.view.nodes.find((n) => n.id === s.to);
  const [defaults] = useState(() => ({
    segments: [
      { id: s.id, label: s.label ?? '', material: p.materialValue, flowOverride: s.flowOverride, custom: s.custom ? { ...s.custom } : { ...EMPTY_CUSTOM } },
    ],
    nodes: [
      {
        id: s.to,
        label: node?.label ?? '',
        elevation: node?.elevation,
        continuousDemand: node?.continuousDemand,
        fixtureGroups: (node?.fixtureGroups ?? []).map(groupToRow),
      },
    ],
  }));
  const form = useLiveForm(detailSchema, defaults, (v) => p.update((doc) => applyDetail(doc, v, p.projectFixtures)));
  const {
    register,
    watch,
    formState: { errors },
  } = form;
  const name = watch('segments.0.label') || s.id;
  const nodeLabel = watch('nodes.0.label') || s.to;
  const leaf = !p.view.segments.some((x) => x.from === s.to);
  const lockedTopology = p.policy.locked.topology;
  const err = errors.segments?.[0];
  return (
    <div className="flex flex-col gap-3" data-testid={`segment-detail-${s.id}`}>
      <div className="grid gap-2 sm:grid-cols-2 xl:grid-cols-4">
        <label className="flex flex-col text-xs font-semibold">
          {describedField(SEGMENT, 'label', p.view.unitSystem).label}
          <CellInput
            {...describedCell(name, SEGMENT, 'label', p.view.unitSystem)}
            readOnly={p.policy.locked.name !== null}
            title={p.policy.locked.name ?? undefined}
            {...register('segments.0.label')}
          />
        </label>
        <label className="flex flex-col text-xs font-semibold">
          {describedField(SEGMENT, 'flowOverride', p.view.unitSystem).label}
          <CellInput
            {...describedCell(name, SEGMENT, 'flowOverride', p.view.unitSystem)}
            type="text"
            inputMode="decimal"
            autoComplete="off"
            placeholder="from the fixture units"
            error={plainError(err?.flowOverride?.message)}
            {...register('segments.0.flowOverride', numberInput)}
          />
        </label>
      </div>
      <p className="text-sm" data-testid={`segment-demand-${s.id}`}>
        {p.result ? (
          <>
            <span className="font-semibold">{num(p.result.wsfu, 'WSFU')} WSFU</span> → {num(p.result.designFlow, p.units.flow)} {p.units.flow},{' '}
            {num(p.result.velocity, p.units.velocity)} {p.units.velocity}
          </>
        ) : (
          <span className="text-ink-muted">
            {Number.isFinite(s.length) ? 'Demand not computed yet' : 'Give its length to add it to the draft; the demand follows.'}
          </span>
        )}
      </p>
      {p.materialValue === '' || projectEntryIdOf(p.materialValue) ? (
        <CustomPipeFields
          index={0}
          name={name}
          register={register as never}
          errors={err?.custom as never}
          fromProject={projectEntryIdOf(p.materialValue) !== null}
          source={p.projectMaterialSource}
        />
      ) : null}
      <NodeFields form={form as never} nodeId={s.to} where="end" policy={p.policy} catalog={p.catalog} projectFixtures={p.projectFixtures} units={p.units} />
      <div className="flex flex-wrap items-center gap-2">
        <Button variant="secondary" disabled={lockedTopology !== null} title={lockedTopology ?? undefined} onClick={() => p.onAddFrom(s.to)}>
          Add a segment from {nodeLabel}
        </Button>
        <Button variant="danger" disabled={lockedTopology !== null || p.removing !== null} title={lockedTopology ?? undefined} onClick={p.onRemove}>
          Remove {name}
          {leaf ? '' : ' and what it feeds'}…
        </Button>
      </div>
      <div className="flex flex-wrap items-end gap-3">
        <DeviceAdder segmentId={s.id} segmentName={name} doc={p.view} catalog={p.catalog} locked={p.policy.locked.devices} onChange={p.update} />
        <Link to={p.devicesHref} className="text-sm">
          Its loss, a fixed loss, a PRV or a booster at Meter &amp; devices →
        </Link>
      </div>
      {p.removing?.segmentId === s.id ? (
        <div
          className="flex flex-col gap-2 rounded-md border-2 border-fault bg-fault-soft p-3 text-sm"
          role="group"
          aria-label={`Confirm removing ${name}`}
          data-testid="confirm-remove"
        >
          <p className="font-semibold">Remove {name}? This also removes:</p>
          <ul className="list-disc pl-5">{p.removing.lines.length ? p.removing.lines.map((l) => <li key={l}>{l}</li>) : <li>nothing else</li>}</ul>
          <div className="flex flex-wrap gap-2">
            <Button variant="danger" onClick={p.onConfirmRemove}>
              Yes, remove
            </Button>
            <Button variant="secondary" onClick={p.onKeep}>
              Keep it
            </Button>
          </div>
        </div>
      ) : null}
    </div>
  );
}

/**
 * The connection node itself: no segment ends there, so no row of the tree opens it. Fixtures served
 * right at the connection (a hose bibb at the meter, a yard hydrant) and its name are edited here.
 */
function ConnectionNode({
  view,
  update,
  policy,
  catalog,
  projectFixtures,
  units,
}: {
  view: SystemDocument;
  update: (change: (doc: SystemDocument) => SystemDocument) => void;
  policy: EditPolicy;
  catalog: Catalog;
  projectFixtures: readonly ProjectEntryOf<'fixture-type'>[];
  units: WalkContextValue['units'];
}) {
  const id = view.source.nodeId;
  const node = view.nodes.find((n) => n.id === id);
  const [defaults] = useState(() => ({
    segments: [],
    nodes: [
      {
        id,
        label: node?.label ?? '',
        elevation: node?.elevation,
        continuousDemand: node?.continuousDemand,
        fixtureGroups: (node?.fixtureGroups ?? []).map(groupToRow),
      },
    ],
  }));
  const form = useLiveForm(detailSchema, defaults, (v) => update((doc) => applyDetail(doc, v, projectFixtures)));
  const nodeLabel = form.watch('nodes.0.label') || id;
  const groups = form.watch('nodes.0.fixtureGroups');
  if (!node) return null;
  return (
    <details className="rounded-md border border-rule p-3" open={node.fixtureGroups.length > 0 || undefined} data-testid="connection-node">
      <summary className="cursor-pointer text-sm font-semibold">
        At the connection ({nodeLabel}): {groups?.length ? plural(groups.length, 'fixture group') : 'no fixtures'}
      </summary>
      <div className="mt-3">
        <NodeFields form={form as never} nodeId={id} where="connection" policy={policy} catalog={catalog} projectFixtures={projectFixtures} units={units} />
      </div>
    </details>
  );
}

/**
 * The pipe step of the walk: the tree editor (one row per segment, edited in place), with the open
 * row's details — name, flow override, custom pipe, end node, its fixtures, add and remove — under it.
 */
export function RisersStep() {
  const { ids, document, draft, readOnlyReason, scope, units, catalog, live, links } = useWalk();
  const project = useProjectEntries(ids.projectId);
  const projectFixtures = project.of('fixture-type');
  const policy = readOnlyReason ? readOnlyPolicy(readOnlyReason) : scope === 'field-change' ? CONTRACTOR_POLICY : DESIGNER_POLICY;
  const [pending, setPending] = useState<Pending>(NO_PENDING);
  const view = useMemo(() => withPending(document, pending), [document, pending]);
  const viewRef = useRef(view);
  viewRef.current = view;
  /** every change goes through the view (draft + segments being entered); what is complete goes to the draft */
  const update = useCallback(
    (change: (doc: SystemDocument) => SystemDocument) => {
      const next = splitPending(change(viewRef.current));
      viewRef.current = withPending(next.doc, next.pending);
      draft.update(() => next.doc);
      setPending(next.pending);
    },
    [draft],
  );
  // a segment being entered is a value not saved yet: the save bar says so
  const report = draft.reportHeld;
  useEffect(() => {
    report(
      'risers-pending',
      pending.segments.map((s) => ({ path: `segments.${s.id}.length`, message: `${s.label || s.id}: give its length to add it to the draft` })),
    );
  }, [pending, report]);
  useEffect(() => () => report('risers-pending', []), [report]);

  const [activeRequest, setActiveRequest] = useState<{ id: string; at: number } | null>(null);
  const [detailEpoch, setDetailEpoch] = useState(0);
  const addSegmentFrom = (fromId: string) => {
    const v = viewRef.current;
    const to = freshId(
      'node',
      v.nodes.map((n) => n.id),
    );
    const id = freshId(
      'seg',
      v.segments.map((s) => s.id),
    );
    const feeding = v.segments.find((s) => s.to === fromId);
    const segment = {
      id,
      from: fromId,
      to,
      ...(feeding?.material ? { material: feeding.material } : feeding ? {} : { material: catalog.materials[0]?.id }),
      ...(feeding?.size ? { size: feeding.size } : {}),
      ...(feeding?.custom ? { custom: { ...feeding.custom } } : {}),
      length: Number.NaN,
      fittings: [],
      reducerAuto: true,
    } as Segment;
    // a new node has no position: the new segment's rise places it (document version 2)
    update((doc) => ({
      ...doc,
      segments: [...doc.segments, segment],
      nodes: [...doc.nodes, { id: to, fixtureGroups: [], checkedFixtures: [] } as unknown as SystemDocument['nodes'][number]],
    }));
    setActiveRequest({ id, at: Date.now() });
  };

  const nodeName = (id: string) => view.nodes.find((n) => n.id === id)?.label || id;
  const [removing, setRemoving] = useState<Removal | null>(null);
  const [undo, setUndo] = useState<{ text: string; doc: SystemDocument; pending: Pending } | null>(null);
  const askRemove = (segmentId: string) => {
    const values = risersFormValues(view);
    setRemoving(
      removalOf(
        values,
        view,
        values.segments.findIndex((s) => s.id === segmentId),
        nodeName,
      ),
    );
  };
  const removeSegment = () => {
    if (!removing) return;
    setUndo({ text: removing.summary, doc: document, pending });
    update((doc) => ({
      ...doc,
      segments: doc.segments.filter((s) => !removing.segmentIds.has(s.id)),
      nodes: doc.nodes.filter((n) => !removing.nodeIds.has(n.id)),
    }));
    setRemoving(null);
  };
  const undoRemove = () => {
    if (!undo) return;
    draft.update(() => undo.doc);
    viewRef.current = withPending(undo.doc, undo.pending);
    setPending(undo.pending);
    setUndo(null);
    setDetailEpoch((e) => e + 1);
  };

  const [csv, setCsv] = useState('');
  const [csvProblems, setCsvProblems] = useState<string[]>([]);
  const [csvDone, setCsvDone] = useState<string | null>(null);
  const importCsv = (text: string) => {
    const result = parseFixtureGroups(text, { nodes: view.nodes, fixtureTypeIds: new Set(catalog.fixtureTypes.map((f) => f.id)) });
    setCsvProblems(result.errors);
    setCsvDone(null);
    if (result.errors.length) return;
    update((doc) => ({
      ...doc,
      nodes: doc.nodes.map((n) => {
        const added = result.rows.filter((r) => r.nodeId === n.id).map((r) => ({ fixtureTypeId: r.fixtureTypeId, count: r.count }));
        return added.length ? { ...n, fixtureGroups: [...n.fixtureGroups, ...added] } : n;
      }),
    }));
    // the open row's details show the node's fixtures: read them again
    setDetailEpoch((e) => e + 1);
    setCsvDone(`${result.rows.length} fixture group(s) added.`);
    setCsv('');
  };

  const results = useMemo(() => new Map(live.ok ? live.analysis.segments.map((s) => [s.id, s]) : []), [live]);
  const flagsOf = useSegmentFlags();
  const projectMaterials = project.of('material');
  const renderDetail = (row: TreeRow) => {
    const s = view.segments.find((x) => x.id === row.id);
    if (!s) return null;
    const match = !s.material && s.custom ? matchProjectPipe(s.custom, projectMaterials, document.unitSystem) : null;
    const materialValue = match ? projectOptionValue(match.entryId) : (s.material ?? '');
    const kind = materialValue === '' ? 'custom' : match ? `project:${match.entryId}` : 'catalog';
    return (
      <SegmentDetail
        key={`${s.id}:${kind}:${detailEpoch}`}
        segment={s}
        view={view}
        update={update}
        policy={policy}
        catalog={catalog}
        projectFixtures={projectFixtures}
        projectMaterialSource={match ? project.find('material', match.entryId)?.source : undefined}
        materialValue={materialValue}
        result={results.get(s.id)}
        units={units}
        onAddFrom={addSegmentFrom}
        onRemove={() => askRemove(s.id)}
        removing={removing}
        onConfirmRemove={removeSegment}
        onKeep={() => setRemoving(null)}
        devicesHref={links.step('devices')}
      />
    );
  };

  return (
    <div>
      <StepIntro title="Risers">
        The tree of segments from the source up and out, one row each: material, size, developed length and rise in place (arrow keys move, Enter or F2 edits,
        Escape cancels). Open a row for its name, its end node and the fixtures served there; select rows (shift- or ctrl-click, or a whole branch) to change
        them together.
      </StepIntro>
      {scope === 'design' ? (
        <p className="mb-4">
          <Link to={buildingPaths.building.getHref(ids.projectId, ids.systemId, ids.revisionId)}>
            Build from floors: floors, typical units and a riser from a short form →
          </Link>
        </p>
      ) : null}
      <form noValidate onSubmit={(ev) => ev.preventDefault()} aria-label="Risers">
        <fieldset disabled={readOnlyReason !== null} className="flex min-w-0 flex-col gap-4">
          <div aria-live="polite">
            {undo ? (
              <div className="flex flex-wrap items-center gap-3 rounded-md border-2 border-rule bg-paper-deep p-3 text-sm" data-testid="undo-remove">
                <p>Removed {undo.text}.</p>
                <Button variant="secondary" onClick={undoRemove}>
                  Undo
                </Button>
                <Button variant="quiet" onClick={() => setUndo(null)}>
                  Dismiss
                </Button>
              </div>
            ) : null}
          </div>
          {view.segments.length === 0 ? <p className="text-ink-soft">No segments yet. Start with one from the connection.</p> : null}
          <TreeEditor
            label="Segments in tree order"
            document={view}
            analysis={live.ok ? live.analysis : null}
            policy={policy}
            catalog={catalog}
            project={project}
            onChange={update}
            reportHeld={draft.reportHeld}
            flagsOf={flagsOf}
            renderDetail={renderDetail}
            activeRequest={activeRequest}
          />
          <div>
            <Button variant="secondary" disabled={policy.locked.topology !== null} onClick={() => addSegmentFrom(document.source.nodeId)}>
              Add a segment from the connection
            </Button>
          </div>
          <ConnectionNode
            key={`${document.source.nodeId}:${detailEpoch}`}
            view={view}
            update={update}
            policy={policy}
            catalog={catalog}
            projectFixtures={projectFixtures}
            units={units}
          />
          <Section title="Import fixture groups (CSV)" headingLevel={3}>
            <TextAreaField
              label="Lines of node, fixture, count"
              hint="Comma- or tab-separated, a header line is skipped: the node by its name, the fixture in the trade's words (“water closet, flush tank”, “lavatory”, “shower”), the count, and optionally private or public. Groups are added to the nodes named."
              value={csv}
              onChange={(ev) => setCsv(ev.target.value)}
            />
            <div className="mt-2 flex flex-wrap items-end gap-3">
              <Button variant="secondary" onClick={() => importCsv(csv)} disabled={policy.locked.fixtures !== null || csv.trim() === ''}>
                Add these fixture groups
              </Button>
              <label className="text-sm font-semibold">
                Or a CSV file
                <input
                  type="file"
                  accept=".csv,.txt,text/csv,text/plain"
                  className="mt-1 block text-sm"
                  disabled={policy.locked.fixtures !== null}
                  onChange={async (ev) => {
                    const f = ev.target.files?.[0];
                    if (f) importCsv(await f.text());
                    ev.target.value = '';
                  }}
                />
              </label>
            </div>
            <div aria-live="polite" className="mt-2 text-sm">
              {csvProblems.length ? (
                <ul role="alert" className="list-disc pl-5 text-fault">
                  {csvProblems.map((p) => (
                    <li key={p}>{p}</li>
                  ))}
                </ul>
              ) : null}
              {csvDone ? <p>{csvDone}</p> : null}
            </div>
          </Section>
        </fieldset>
      </form>
    </div>
  );
}
