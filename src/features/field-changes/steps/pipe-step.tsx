import { useState } from 'react';
import { z } from 'zod';
import type { Segment, SystemDocument } from '../../../engine';
import type { SegmentResult } from '../../../engine/analysis/types';
import type { Catalog } from '../../systems/api/get-catalog';
import { useWalk } from '../../walk/draft/walk-context';
import { CellInput, CellSelect, StepIntro } from '../../walk/components/cells';
import { fmt, signed } from '../../walk/lib/format';
import { numberInput, plainError } from '../../walk/lib/form-values';
import { treeOrder } from '../../walk/lib/tree';
import { useLiveForm } from '../../walk/lib/use-live-form';
import { sizeChoices } from '../../walk/lib/sizes';
import { useFieldChangeFrame } from '../components/field-change-context';
import { SubstitutePanel } from '../../sizing/components/substitute-panel';

const row = z
  .object({
    id: z.string(),
    material: z.string(),
    size: z.string(),
    length: z.number({ error: 'Enter a number' }).positive('Must be more than zero'),
  })
  .refine((r) => r.material === '' || r.size !== '', { path: ['size'], message: 'Choose a size' });
export const pipeFormSchema = z.object({ segments: z.array(row) });
type PipeForm = { segments: { id: string; material: string; size: string; length: number }[] };

function formValues(doc: SystemDocument): PipeForm {
  return { segments: doc.segments.map((s) => ({ id: s.id, material: s.material ?? '', size: s.size ?? '', length: s.length })) };
}

/**
 * Writes the pipe substitutions back: material, size and developed length of each segment, the
 * rest of the segment (ends, rise, fittings, a custom pipe kept as issued) untouched.
 */
export function applyPipe(doc: SystemDocument, v: z.output<typeof pipeFormSchema>): SystemDocument {
  const rows = new Map(v.segments.map((r) => [r.id, r]));
  const segments = doc.segments.map((s): Segment => {
    const r = rows.get(s.id);
    if (!r) return s;
    const next: Segment = { ...s, length: r.length };
    if (r.material) {
      next.material = r.material;
      next.size = r.size;
      delete next.custom;
    }
    return next;
  });
  return { ...doc, segments };
}

function pipeText(catalog: Catalog, s: Segment, doc: SystemDocument, unit: string) {
  // a custom pipe's inside diameter is already in the document's diameter unit
  if (!s.material) return s.custom ? `Custom pipe (${fmt(s.custom.innerDiameter, doc.unitSystem === 'US' ? 3 : 1)} ${unit} inside)` : 'Not chosen';
  return `${catalog.material(s.material)?.label ?? s.material}, ${s.size ?? '—'}`;
}

function sizeOptions(catalog: Catalog, materialId: string, sys: SystemDocument['unitSystem'], unit: string) {
  const material = catalog.material(materialId || undefined);
  if (!material) return [{ value: '', label: 'As issued (custom pipe)' }];
  return sizeChoices(material.data.sizes, sys, unit);
}

const lossOf = (r: SegmentResult | undefined) => (r ? r.frictionLoss + r.fittingLoss : null);

/** The contractor's pipe substitutions: per segment, what was issued, what goes in instead, and its effect. */
export function PipeStep() {
  const { document, draft, readOnlyReason, units, catalog, live } = useWalk();
  const { baseDocument, issuedLive } = useFieldChangeFrame();
  const [defaults] = useState(() => formValues(document));
  const form = useLiveForm(pipeFormSchema, defaults, (v) => draft.update((doc) => applyPipe(doc, v)));
  const { register, watch, setValue, formState: { errors } } = form;
  const rows = watch('segments');
  const sys = document.unitSystem;
  const order = treeOrder(document.segments, document.source.nodeId);
  const issued = new Map(baseDocument.segments.map((s) => [s.id, s]));
  const before = new Map(issuedLive.ok ? issuedLive.analysis.segments.map((s) => [s.id, s]) : []);
  const after = new Map(live.ok ? live.analysis.segments.map((s) => [s.id, s]) : []);
  const nodeName = new Map(document.nodes.map((n) => [n.id, n.label || n.id]));
  const materialOptions = catalog.materials.map((m) => ({ value: m.id, label: m.label }));

  return (
    <form noValidate onSubmit={(ev) => ev.preventDefault()} aria-label="Pipe and sizes">
      <StepIntro title="Pipe and sizes">
        Another pipe material, another size, or more developed length for an offset. Each segment shows what was issued
        beside what goes in instead, and the effect on its velocity and on its loss (friction and fittings) at the
        design flow. Insert fittings of PEX narrow the bore further: add them on the fittings step.
      </StepIntro>
      <SubstitutePanel onChanged={(doc) => form.reset(formValues(doc))} />
      <fieldset disabled={readOnlyReason !== null}>
        <div className="overflow-x-auto">
          <table className="w-full min-w-[40rem] text-sm" aria-label="Pipe substitutions by segment">
            <thead>
              <tr className="border-b-2 border-rule text-left align-bottom">
                <th scope="col" className="py-1 pr-2">Segment, as issued</th>
                <th scope="col" className="py-1 pr-2">Material</th>
                <th scope="col" className="py-1 pr-2">Size</th>
                <th scope="col" className="py-1 pr-2">Length ({units.length})</th>
                <th scope="col" className="py-1 text-right">Effect: issued → new</th>
              </tr>
            </thead>
            <tbody>
              {order.map(({ index: i }) => {
                const current = rows[i];
                const segment = document.segments[i];
                const was = issued.get(segment?.id ?? '');
                if (!current || !segment || !was) return null;
                const name = segment.label || segment.id;
                const b = before.get(segment.id);
                const a = after.get(segment.id);
                const lossBefore = lossOf(b);
                const lossAfter = lossOf(a);
                const changed = current.material !== (was.material ?? '') || current.size !== (was.size ?? '') || current.length !== was.length;
                const err = errors.segments?.[i];
                return (
                  <tr key={segment.id} className="border-b border-rule align-top" data-testid={`pipe-${segment.id}`} data-changed={changed || undefined}>
                    <th scope="row" className="py-2 pr-2 text-left font-semibold">
                      {name}
                      <span className="block text-xs font-normal text-ink-soft">
                        {nodeName.get(segment.from)} → {nodeName.get(segment.to)}
                      </span>
                      <span className="block text-xs font-normal">
                        Issued: {pipeText(catalog, was, baseDocument, units.diameter)}, {fmt(was.length, 1)} {units.length}
                      </span>
                      {changed ? <span className="mt-1 inline-block rounded border border-caution px-1 text-xs font-semibold">changed</span> : null}
                    </th>
                    <td className="py-2 pr-2">
                      <CellSelect
                        className="w-36"
                        label={`${name} material`}
                        options={was.material ? materialOptions : [{ value: '', label: 'As issued (custom pipe)' }, ...materialOptions]}
                        {...register(`segments.${i}.material`, { onChange: () => setValue(`segments.${i}.size`, '', { shouldValidate: true }) })}
                      />
                    </td>
                    <td className="py-2 pr-2">
                      <CellSelect className="w-28" label={`${name} size`} options={sizeOptions(catalog, current.material, sys, units.diameter)} error={plainError(err?.size?.message)} {...register(`segments.${i}.size`)} />
                    </td>
                    <td className="py-2 pr-2">
                      <CellInput className="w-20" label={`${name} length (${units.length})`} type="text" inputMode="decimal" autoComplete="off" error={plainError(err?.length?.message)} {...register(`segments.${i}.length`, numberInput)} />
                    </td>
                    <td className="py-2 text-right text-xs tabular-nums">
                      <span className="block" data-testid={`pipe-velocity-${segment.id}`}>
                        {fmt(b?.velocity, 1)} → {fmt(a?.velocity, 1)} {units.velocity}
                      </span>
                      {a?.velocityPass === false ? <span className="block font-semibold text-fault">⚠ over the velocity limit</span> : null}
                      <span className="block" data-testid={`pipe-loss-${segment.id}`}>
                        {fmt(lossBefore, 2)} → {fmt(lossAfter, 2)} {units.pressure} ({lossBefore !== null && lossAfter !== null ? signed(lossAfter - lossBefore, 2) : '—'})
                      </span>
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      </fieldset>
    </form>
  );
}
