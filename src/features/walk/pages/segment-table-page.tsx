import { memo, useCallback, useMemo, useRef, useState } from 'react';
import type { UseFormRegister, UseFormSetValue } from 'react-hook-form';
import { z } from 'zod';
import { TextField } from '../../../components/ui/field';
import { fromSI } from '../../../engine';
import type { CustomPipe, SystemDocument } from '../../../engine';
import { CustomPipeSchema, SegmentSchema } from '../../../engine/model/schema';
import { useProjectEntries } from '../../catalog/api/get-project-catalog';
import { matchProjectPipe, pipeFromProjectEntry, projectEntryIdOf, projectOptionValue } from '../../catalog/lib/apply-entries';
import { useWalk } from '../draft/walk-context';
import { CellInput, CellSelect } from '../components/cells';
import { LedgerPanel } from '../components/ledger-panel';
import { SegmentFlags, useSegmentFlags } from '../components/segment-flags';
import { plural } from '../lib/verdict';
import { num } from '../../../shared/format/quantity';
import { numberInput, plainError } from '../lib/form-values';
import { useLiveForm } from '../lib/use-live-form';
import { followTypedRises } from '../lib/rises';

const optionalText = z.preprocess((v) => (v === '' ? undefined : v), z.string().optional());
export const segmentTableSchema = z.object({
  segments: z.array(
    z
      .object({
        id: z.string(),
        material: optionalText,
        size: optionalText,
        length: z.number({ error: 'Enter a number' }).positive('Must be more than zero'),
        rise: z.preprocess((v) => (typeof v === 'number' && Number.isNaN(v) ? undefined : v), SegmentSchema.shape.rise),
        /** set when a project material and size are chosen: the pipe data copied from the entry */
        custom: z.unknown().optional(),
      })
      .transform((r, ctx) => {
        if (projectEntryIdOf(r.material) === null) return { ...r, custom: undefined };
        const pipe = CustomPipeSchema.safeParse(r.custom);
        if (pipe.success) return { ...r, custom: pipe.data };
        ctx.addIssue({ code: 'custom', path: ['size'], message: 'Choose a size of the project material' });
        return z.NEVER;
      }),
  ),
});
type Row = { id: string; material: string; size: string; length: number; rise?: number; custom?: CustomPipe };

export function applySegmentTable(doc: SystemDocument, v: z.output<typeof segmentTableSchema>): SystemDocument {
  const byId = new Map(v.segments.map((s) => [s.id, s]));
  return followTypedRises(doc, {
    ...doc,
    segments: doc.segments.map((s) => {
      const r = byId.get(s.id);
      if (!r) return s;
      const next = { ...s, length: r.length };
      for (const key of ['material', 'size', 'rise'] as const) {
        if (r[key] === undefined) delete next[key];
        else (next as Record<string, unknown>)[key] = r[key];
      }
      if (r.custom) {
        // a project material: copied as the segment's custom pipe, no catalog reference
        next.custom = r.custom;
        delete next.material;
        delete next.size;
      } else if (next.material !== undefined) delete next.custom;
      return next;
    }),
  });
}

type TableRowProps = {
  index: number;
  id: string;
  name: string;
  from: string;
  to: string;
  materialId: string;
  lengthError: string | undefined;
  wsfu: number | undefined;
  flow: number | undefined;
  velocity: number | undefined;
  fast: boolean;
  loss: number | undefined;
  flagFast: string | null;
  flagFailing: string | null;
  flagMissing: string | null;
  register: UseFormRegister<{ segments: Row[] }>;
  setValue: UseFormSetValue<{ segments: Row[] }>;
  materialOptions: { value: string; label: string }[];
  sizeOptions: { value: string; label: string }[];
  lengthUnit: string;
  units: { flow: string; velocity: string; pressure: string };
  sizeError: string | undefined;
  /** after a material or size change: copy a project material's pipe data (stable across renders) */
  onPipeChange: (index: number) => void;
};

/** One row; memoised on plain values so an edit re-renders only the rows whose numbers changed (500-segment systems). */
const TableRow = memo(function TableRow(p: TableRowProps) {
  const i = p.index;
  return (
    <tr className="border-b border-rule align-top" data-testid={`row-${p.id}`}>
      <th scope="row" className="py-1 pr-2 text-left font-normal">
        {p.name}
        <SegmentFlags fast={p.flagFast} failing={p.flagFailing} missing={p.flagMissing} className="mt-0.5 max-w-56" />
      </th>
      <td className="py-1 pr-2">{p.from}</td>
      <td className="py-1 pr-2">{p.to}</td>
      <td className="min-w-40 py-1 pr-2">
        <CellSelect
          label={`${p.name} material`}
          options={p.materialOptions}
          {...p.register(`segments.${i}.material`, {
            onChange: () => {
              p.setValue(`segments.${i}.size`, '', { shouldValidate: true });
              p.onPipeChange(i);
            },
          })}
        />
      </td>
      <td className="min-w-36 py-1 pr-2">
        <CellSelect
          label={`${p.name} size`}
          options={p.sizeOptions}
          error={p.sizeError}
          {...p.register(`segments.${i}.size`, { onChange: () => p.onPipeChange(i) })}
        />
      </td>
      <td className="w-24 py-1 pr-2">
        <CellInput
          label={`${p.name} length (${p.lengthUnit})`}
          type="text"
          inputMode="decimal"
          autoComplete="off"
          error={p.lengthError}
          {...p.register(`segments.${i}.length`, numberInput)}
        />
      </td>
      <td className="w-24 py-1 pr-2">
        <CellInput
          label={`${p.name} rise (${p.lengthUnit})`}
          type="text"
          inputMode="decimal"
          autoComplete="off"
          {...p.register(`segments.${i}.rise`, numberInput)}
        />
      </td>
      <td className="py-1 pr-2 text-right tabular-nums">{num(p.wsfu, 'WSFU')}</td>
      <td className="py-1 pr-2 text-right tabular-nums">{num(p.flow, p.units.flow)}</td>
      <td className="py-1 pr-2 text-right tabular-nums">
        {num(p.velocity, p.units.velocity)}
        {p.fast ? ' ▲ over' : ''}
      </td>
      <td className="py-1 text-right tabular-nums">{p.loss === undefined ? '—' : num(p.loss, p.units.pressure)}</td>
    </tr>
  );
});

/** One collator for every comparison: building one per localeCompare call costs more than the sort. */
const COLLATOR = new Intl.Collator('en', { numeric: true });

type SortKey = 'id' | 'from' | 'to' | 'material' | 'size' | 'length' | 'rise' | 'wsfu' | 'flow' | 'velocity' | 'loss';
const COLUMNS: { key: SortKey; label: string; numeric?: boolean }[] = [
  { key: 'id', label: 'Segment' },
  { key: 'from', label: 'From' },
  { key: 'to', label: 'To' },
  { key: 'material', label: 'Material' },
  { key: 'size', label: 'Size' },
  { key: 'length', label: 'Length', numeric: true },
  { key: 'rise', label: 'Rise', numeric: true },
  { key: 'wsfu', label: 'WSFU', numeric: true },
  { key: 'flow', label: 'Flow', numeric: true },
  { key: 'velocity', label: 'Velocity', numeric: true },
  { key: 'loss', label: 'Friction + fittings', numeric: true },
];

/** Every segment in one table: sort, filter, and edit material, size, length and rise in place. */
export function SegmentTablePage() {
  const { ids, document, draft, readOnlyReason, units, catalog, live } = useWalk();
  const project = useProjectEntries(ids.projectId);
  const [defaults] = useState<{ segments: Row[] }>(() => ({
    segments: document.segments.map((s) => {
      const match = s.material ? null : matchProjectPipe(s.custom, project.of('material'), document.unitSystem);
      return {
        id: s.id,
        material: match ? projectOptionValue(match.entryId) : (s.material ?? ''),
        size: match ? match.sizeKey : (s.size ?? ''),
        length: s.length,
        rise: s.rise,
        custom: s.custom,
      };
    }),
  }));
  const form = useLiveForm(segmentTableSchema, defaults, (v) => draft.update((doc) => applySegmentTable(doc, v)));
  const {
    register,
    watch,
    setValue,
    getValues,
    formState: { errors },
  } = form;
  const projectRef = useRef(project);
  projectRef.current = project;
  const onPipeChange = useCallback(
    (i: number) => {
      const entry = projectRef.current.find('material', projectEntryIdOf(getValues(`segments.${i}.material`)));
      setValue(`segments.${i}.custom`, entry ? (pipeFromProjectEntry(entry, getValues(`segments.${i}.size`), document.unitSystem) ?? undefined) : undefined, {
        shouldValidate: true,
      });
    },
    [getValues, setValue, document.unitSystem],
  );
  const [filter, setFilter] = useState('');
  const [sort, setSort] = useState<{ key: SortKey; dir: 1 | -1 }>({ key: 'id', dir: 1 });
  const rows = watch('segments');
  const results = useMemo(() => new Map(live.ok ? live.analysis.segments.map((s) => [s.id, s]) : []), [live]);
  const seg = useMemo(() => new Map(document.segments.map((s) => [s.id, s])), [document]);
  const sys = document.unitSystem;
  const flagsOf = useSegmentFlags();

  const value = (i: number, key: SortKey): string | number => {
    const r = rows[i];
    const s = seg.get(r.id);
    const res = results.get(r.id);
    switch (key) {
      case 'id':
        return s?.label || r.id;
      case 'from':
        return s?.from ?? '';
      case 'to':
        return s?.to ?? '';
      case 'material':
        return r.material;
      case 'size':
        return catalog.material(r.material)?.data.sizes.find((z) => z.key === r.size)?.nominalIn ?? 0;
      case 'length':
        return r.length;
      case 'rise':
        return r.rise ?? 0;
      case 'wsfu':
        return res?.wsfu ?? 0;
      case 'flow':
        return res?.designFlow ?? 0;
      case 'velocity':
        return res?.velocity ?? 0;
      case 'loss':
        return (res?.frictionLoss ?? 0) + (res?.fittingLoss ?? 0);
    }
  };
  const needle = filter.trim().toLowerCase();
  const visible = rows
    .map((_, i) => i)
    .filter((i) => {
      if (!needle) return true;
      const s = seg.get(rows[i].id);
      return [rows[i].id, s?.label, s?.from, s?.to, rows[i].material, rows[i].size].some((t) => t?.toLowerCase().includes(needle));
    })
    .sort((x, y) => {
      const a = value(x, sort.key);
      const b = value(y, sort.key);
      return (typeof a === 'number' && typeof b === 'number' ? a - b : COLLATOR.compare(String(a), String(b))) * sort.dir;
    });
  const materialOptions = useMemo(
    () => [
      { value: '', label: 'Custom / none' },
      ...catalog.materials.map((m) => ({ value: m.id, label: m.label })),
      ...project.of('material').map((m) => ({ value: projectOptionValue(m.id), label: `${m.label} — project` })),
    ],
    [catalog, project],
  );
  const sizeOptionsByMaterial = useMemo(() => {
    const map = new Map<string, { value: string; label: string }[]>();
    for (const m of catalog.materials) {
      map.set(m.id, [
        { value: '', label: '—' },
        ...m.data.sizes.map((z) => ({ value: z.key, label: `${z.key} (ID ${num(fromSI('diameter', z.innerDiameterM, sys), units.diameter)})` })),
      ]);
    }
    for (const m of project.of('material')) {
      map.set(projectOptionValue(m.id), [
        { value: '', label: '—' },
        ...m.data.sizes.map((z) => ({ value: z.key, label: `${z.key} (ID ${num(fromSI('diameter', z.innerDiameterM, sys), units.diameter)})` })),
      ]);
    }
    return map;
  }, [catalog, project, sys, units.diameter]);
  const noSizes = useMemo(() => [{ value: '', label: '—' }], []);
  const sizeOptionsFor = (materialId: string) => sizeOptionsByMaterial.get(materialId) ?? noSizes;
  const unitOf: Partial<Record<SortKey, string>> = {
    length: units.length,
    rise: units.length,
    flow: units.flow,
    velocity: units.velocity,
    loss: units.pressure,
  };

  return (
    <div className="flex flex-col gap-4">
      <h2 className="text-2xl">Segment table</h2>
      <TextField
        label="Filter segments"
        hint="By id, name, node, material or size."
        value={filter}
        onChange={(ev) => setFilter(ev.target.value)}
        className="max-w-sm"
      />
      <p className="text-sm text-ink-soft" aria-live="polite">
        {visible.length} of {plural(rows.length, 'segment')} shown.
      </p>
      <div className="grid gap-6 xl:grid-cols-[minmax(0,1fr)_20rem]">
        <form noValidate onSubmit={(ev) => ev.preventDefault()} aria-label="Segment table" className="min-w-0 overflow-x-auto [contain:layout_paint]">
          <fieldset disabled={readOnlyReason !== null}>
            <table className="w-full text-sm" data-testid="segment-table">
              <caption className="sr-only">All segments; column headers sort</caption>
              <thead>
                <tr className="border-b-2 border-rule text-left">
                  {COLUMNS.map((c) => (
                    <th key={c.key} scope="col" className="py-1 pr-2" aria-sort={sort.key === c.key ? (sort.dir === 1 ? 'ascending' : 'descending') : 'none'}>
                      <button
                        type="button"
                        className="font-semibold text-standpipe underline-offset-2 hover:underline"
                        onClick={() => setSort((s) => ({ key: c.key, dir: s.key === c.key ? (s.dir === 1 ? -1 : 1) : 1 }))}
                      >
                        {c.label}
                        {unitOf[c.key] ? ` (${unitOf[c.key]})` : ''}
                        <span aria-hidden="true">{sort.key === c.key ? (sort.dir === 1 ? ' ▲' : ' ▼') : ''}</span>
                      </button>
                    </th>
                  ))}
                </tr>
              </thead>
              <tbody>
                {visible.map((i) => {
                  const r = rows[i];
                  const s = seg.get(r.id);
                  const res = results.get(r.id);
                  const flags = flagsOf(r.id);
                  return (
                    <TableRow
                      key={r.id}
                      index={i}
                      id={r.id}
                      name={s?.label || r.id}
                      from={s?.from ?? ''}
                      to={s?.to ?? ''}
                      materialId={r.material}
                      lengthError={plainError(errors.segments?.[i]?.length?.message)}
                      wsfu={res?.wsfu}
                      flow={res?.designFlow}
                      velocity={res?.velocity}
                      fast={res?.velocityPass === false}
                      loss={res ? res.frictionLoss + res.fittingLoss : undefined}
                      flagFast={flags.fast}
                      flagFailing={flags.failing}
                      flagMissing={flags.missing}
                      register={register}
                      setValue={setValue}
                      materialOptions={materialOptions}
                      sizeOptions={sizeOptionsFor(r.material)}
                      lengthUnit={units.length}
                      units={units}
                      sizeError={plainError(errors.segments?.[i]?.size?.message)}
                      onPipeChange={onPipeChange}
                    />
                  );
                })}
              </tbody>
            </table>
          </fieldset>
        </form>
        <LedgerPanel live={live} />
      </div>
    </div>
  );
}
