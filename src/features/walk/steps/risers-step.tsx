import { useState } from 'react';
import { useFieldArray } from 'react-hook-form';
import type { Control, UseFormRegister } from 'react-hook-form';
import { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { Section } from '../../../components/ui/card';
import { TextAreaField } from '../../../components/ui/field';
import { fromSI } from '../../../engine';
import type { Segment, SystemDocument } from '../../../engine';
import { FixtureGroupSchema, SegmentSchema } from '../../../engine/model/schema';
import type { Catalog } from '../../systems/api/get-catalog';
import { useWalk } from '../draft/walk-context';
import { CellInput, CellSelect, StepIntro } from '../components/cells';
import { parseFixtureGroups } from '../lib/csv';
import { fmt } from '../lib/format';
import { freshId, numberInput, plainError } from '../lib/form-values';
import { treeOrder } from '../lib/tree';
import { useLiveForm } from '../lib/use-live-form';

const optionalText = z.preprocess((v) => (v === '' || v === null ? undefined : v), z.string().optional());
const segmentRow = SegmentSchema.pick({ id: true, from: true, to: true, length: true }).extend({
  label: optionalText,
  material: optionalText,
  size: optionalText,
  rise: z.preprocess((v) => (typeof v === 'number' && Number.isNaN(v) ? undefined : v), SegmentSchema.shape.rise),
  length: z.number({ error: 'Enter a number' }).positive('Must be more than zero'),
});
const nodeRow = z.object({
  id: z.string().min(1),
  label: optionalText,
  elevation: z.number(),
  fixtureGroups: z.array(FixtureGroupSchema.extend({ count: z.number({ error: 'Enter a whole number' }).int('Enter a whole number').positive('At least 1') })),
});
export const risersFormSchema = z.object({ segments: z.array(segmentRow), nodes: z.array(nodeRow) });
type SegmentRow = { id: string; label: string; from: string; to: string; material: string; size: string; length: number; rise?: number };
type NodeRow = { id: string; label: string; elevation: number; fixtureGroups: { fixtureTypeId: string; count: number }[] };
type RisersForm = { segments: SegmentRow[]; nodes: NodeRow[] };

function formValues(doc: SystemDocument): RisersForm {
  return {
    segments: doc.segments.map((s) => ({ id: s.id, label: s.label ?? '', from: s.from, to: s.to, material: s.material ?? '', size: s.size ?? '', length: s.length, rise: s.rise })),
    nodes: doc.nodes.map((n) => ({ id: n.id, label: n.label ?? '', elevation: n.elevation, fixtureGroups: n.fixtureGroups.map((g) => ({ ...g })) })),
  };
}

/** Writes the tree back: segment and node fields from the form, everything else (fittings, checked fixtures) kept. */
export function applyRisers(doc: SystemDocument, v: z.output<typeof risersFormSchema>): SystemDocument {
  const oldSegments = new Map(doc.segments.map((s) => [s.id, s]));
  const oldNodes = new Map(doc.nodes.map((n) => [n.id, n]));
  const segments: Segment[] = v.segments.map((r) => {
    const old = oldSegments.get(r.id);
    const next: Segment = { ...(old ?? { fittings: [], reducerAuto: true }), id: r.id, from: r.from, to: r.to, length: r.length } as Segment;
    for (const key of ['label', 'material', 'size', 'rise'] as const) {
      if (r[key] === undefined) delete next[key];
      else (next as Record<string, unknown>)[key] = r[key];
    }
    if (next.material) delete next.custom;
    return next;
  });
  const nodes = v.nodes.map((r) => {
    const old = oldNodes.get(r.id);
    const next = { ...(old ?? { checkedFixtures: [] }), id: r.id, elevation: old?.elevation ?? r.elevation, fixtureGroups: r.fixtureGroups } as SystemDocument['nodes'][number];
    if (r.label === undefined) delete next.label;
    else next.label = r.label;
    return next;
  });
  return { ...doc, segments, nodes };
}

function sizeOptions(catalog: Catalog, materialId: string | undefined, sys: SystemDocument['unitSystem'], unit: string) {
  const material = catalog.material(materialId);
  if (!material) return [{ value: '', label: 'Choose a material first' }];
  return [{ value: '', label: 'Choose a size…' }, ...material.data.sizes.map((s) => ({ value: s.key, label: `${s.key} — inside ${fmt(fromSI('diameter', s.innerDiameterM, sys), sys === 'US' ? 3 : 1)} ${unit}` }))];
}

function FixtureGroups({ index, control, register, catalog, nodeLabel, errors }: {
  index: number;
  control: Control<RisersForm>;
  register: UseFormRegister<RisersForm>;
  catalog: Catalog;
  nodeLabel: string;
  errors: { count?: { message?: string }; fixtureTypeId?: { message?: string } }[] | undefined;
}) {
  const groups = useFieldArray({ control, name: `nodes.${index}.fixtureGroups` });
  const options = catalog.fixtureTypes.map((f) => ({ value: f.id, label: f.label }));
  return (
    <div className="flex flex-col gap-2">
      {groups.fields.map((g, k) => (
        <div key={g.id} className="flex flex-wrap items-start gap-2">
          <CellSelect className="min-w-64 flex-1" label={`${nodeLabel}: fixture group ${k + 1} type`} options={options} {...register(`nodes.${index}.fixtureGroups.${k}.fixtureTypeId`)} />
          <CellInput className="w-24" label={`${nodeLabel}: fixture group ${k + 1} count`} type="number" step="1" min="1" error={plainError(errors?.[k]?.count?.message)} {...register(`nodes.${index}.fixtureGroups.${k}.count`, numberInput)} />
          <Button variant="quiet" onClick={() => groups.remove(k)} aria-label={`Remove fixture group ${k + 1} at ${nodeLabel}`}>Remove</Button>
        </div>
      ))}
      <div>
        <Button variant="secondary" onClick={() => groups.append({ fixtureTypeId: options[0]?.value ?? '', count: 1 })}>
          Add fixtures at {nodeLabel}
        </Button>
      </div>
    </div>
  );
}

export function RisersStep() {
  const { document, draft, readOnlyReason, units, catalog, live } = useWalk();
  const [defaults] = useState(() => formValues(document));
  const form = useLiveForm(risersFormSchema, defaults, (v) => draft.update((doc) => applyRisers(doc, v)));
  const { register, control, watch, setValue, getValues, formState: { errors } } = form;
  const segments = useFieldArray({ control, name: 'segments' });
  const nodes = useFieldArray({ control, name: 'nodes' });
  const [csv, setCsv] = useState('');
  const [csvProblems, setCsvProblems] = useState<string[]>([]);
  const [csvDone, setCsvDone] = useState<string | null>(null);
  const sys = document.unitSystem;
  const rows = watch('segments');
  const nodeRows = watch('nodes');
  const order = treeOrder(rows, document.source.nodeId);
  const results = new Map(live.ok ? live.analysis.segments.map((s) => [s.id, s]) : []);
  const nodeIndex = new Map(nodeRows.map((n, i) => [n.id, i]));
  const nodeName = (id: string) => nodeRows[nodeIndex.get(id) ?? -1]?.label || id;
  const materialOptions = [{ value: '', label: 'Custom pipe / not chosen' }, ...catalog.materials.map((m) => ({ value: m.id, label: m.label }))];

  const addSegmentFrom = (fromId: string) => {
    const current = getValues();
    const fromRow = current.nodes.find((n) => n.id === fromId);
    const to = freshId('node', current.nodes.map((n) => n.id));
    const feeding = current.segments.find((s) => s.to === fromId);
    nodes.append({ id: to, label: '', elevation: fromRow?.elevation ?? 0, fixtureGroups: [] });
    segments.append({
      id: freshId('seg', current.segments.map((s) => s.id)),
      label: '',
      from: fromId,
      to,
      material: feeding?.material ?? catalog.materials[0]?.id ?? '',
      size: feeding?.size ?? '',
      length: Number.NaN,
      rise: 0,
    });
  };

  const removeSegment = (index: number) => {
    const seg = getValues(`segments.${index}`);
    segments.remove(index);
    const stillUsed = getValues('segments').some((s) => s.from === seg.to || s.to === seg.to);
    const ni = getValues('nodes').findIndex((n) => n.id === seg.to);
    if (!stillUsed && ni >= 0 && seg.to !== document.source.nodeId) nodes.remove(ni);
  };

  const importCsv = (text: string) => {
    const result = parseFixtureGroups(text, { nodeIds: new Set(getValues('nodes').map((n) => n.id)), fixtureTypeIds: new Set(catalog.fixtureTypes.map((f) => f.id)) });
    setCsvProblems(result.errors);
    setCsvDone(null);
    if (result.errors.length) return;
    for (const r of result.rows) {
      const i = getValues('nodes').findIndex((n) => n.id === r.nodeId);
      setValue(`nodes.${i}.fixtureGroups`, [...getValues(`nodes.${i}.fixtureGroups`), { fixtureTypeId: r.fixtureTypeId, count: r.count }], { shouldValidate: true, shouldDirty: true });
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
      <fieldset disabled={readOnlyReason !== null} className="flex flex-col gap-6">
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
                  <div className="grid gap-2 sm:grid-cols-2 xl:grid-cols-6">
                    <label className="flex flex-col text-xs font-semibold xl:col-span-2">Name<CellInput label={`${name} name`} {...register(`segments.${i}.label`)} /></label>
                    <label className="flex flex-col text-xs font-semibold xl:col-span-2">Material<CellSelect label={`${name} material`} options={materialOptions} {...register(`segments.${i}.material`, { onChange: () => setValue(`segments.${i}.size`, '', { shouldValidate: true }) })} /></label>
                    <label className="flex flex-col text-xs font-semibold xl:col-span-2">Size<CellSelect label={`${name} size`} options={sizeOptions(catalog, row.material || undefined, sys, units.diameter)} {...register(`segments.${i}.size`)} /></label>
                    <label className="flex flex-col text-xs font-semibold">Length ({units.length})<CellInput label={`${name} length (${units.length})`} type="number" step="any" error={plainError(err?.length?.message)} {...register(`segments.${i}.length`, numberInput)} /></label>
                    <label className="flex flex-col text-xs font-semibold">Rise ({units.length})<CellInput label={`${name} rise (${units.length})`} type="number" step="any" error={plainError(err?.rise?.message)} {...register(`segments.${i}.rise`, numberInput)} /></label>
                    <label className="flex flex-col text-xs font-semibold xl:col-span-2">Node name at the end<CellInput label={`Name of node ${row.to}`} {...register(`nodes.${nodeIndex.get(row.to) ?? 0}.label`)} /></label>
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
                  <div className="mt-2 flex flex-wrap gap-2">
                    <Button variant="secondary" onClick={() => addSegmentFrom(row.to)}>Add a segment from {nodeName(row.to)}</Button>
                    {leaf ? <Button variant="danger" onClick={() => removeSegment(i)}>Remove {name}</Button> : null}
                  </div>
                </li>
              );
            })}
          </ol>
          <div className="mt-3">
            <Button variant="secondary" onClick={() => addSegmentFrom(document.source.nodeId)}>Add a segment from the connection</Button>
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
                  <FixtureGroups index={i} control={control} register={register} catalog={catalog} nodeLabel={label} errors={errors.nodes?.[i]?.fixtureGroups as never} />
                </div>
              );
            })}
          </div>
        </Section>
        <Section title="Import fixture groups (CSV)" headingLevel={3}>
          <TextAreaField label="Lines of node id, fixture type id, count" hint="Comma- or tab-separated; a header line is skipped. Groups are added to the nodes named." value={csv} onChange={(ev) => setCsv(ev.target.value)} />
          <div className="mt-2 flex flex-wrap items-end gap-3">
            <Button variant="secondary" onClick={() => importCsv(csv)} disabled={csv.trim() === ''}>Add these fixture groups</Button>
            <label className="text-sm font-semibold">
              Or a CSV file
              <input type="file" accept=".csv,.txt,text/csv,text/plain" className="mt-1 block text-sm" onChange={async (ev) => { const f = ev.target.files?.[0]; if (f) importCsv(await f.text()); ev.target.value = ''; }} />
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
