import { useRef, useState } from 'react';
import { useFieldArray } from 'react-hook-form';
import type { Control, UseFormRegister, UseFormSetValue, UseFormWatch } from 'react-hook-form';
import { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { Section } from '../../../components/ui/card';
import { SelectField } from '../../../components/ui/field';
import { toSI } from '../../../engine';
import type { Analysis, CustomFitting, SegmentResult, SystemDocument } from '../../../engine';
import { CriteriaOverridesSchema, FittingSchema } from '../../../engine/model/schema';
import {
  COPPER_LINES,
  copperFittingFor,
  fittingK,
  isMetalPipeFitting,
  pexFittingFor,
  PEX_LINES,
  type CopperFittingLine,
  type PexFittingLine,
} from '../../../engine/fittings';
import type { Catalog } from '../../systems/api/get-catalog';
import { useWalk } from '../draft/walk-context';
import { TreeEditor } from '../../tree-editor/components/tree-editor';
import type { TreeRow } from '../../tree-editor/model';
import { CONTRACTOR_POLICY, DESIGNER_POLICY, readOnlyPolicy } from '../../tree-editor/policy';
import { SegmentFlags, useSegmentFlags } from '../components/segment-flags';
import type { SegmentFlagValues } from '../components/segment-flags';
import { fittingWithProjectData, projectOptions as projectOptionsOf } from '../../catalog/lib/apply-entries';
import type { ProjectEntryOf } from '../../../shared/api/catalog';
import { useProjectEntries } from '../../catalog/api/get-project-catalog';
import { CellInput, CellSelect, StepIntro } from '../components/cells';
import { num, withUnit } from '../../../shared/format/quantity';
import { numberInput } from '../lib/form-values';
import { useLiveForm } from '../lib/use-live-form';
import { describedCell, describedColumn, describedField } from '../lib/described';
import { CRITERIA, FITTING } from '../../../engine/model/elements';

const METHOD_LABELS = {
  crane: 'Crane K = N·f_T (size-dependent, default)',
  'hooper-2k': 'Two-constant (Hooper 2-K)',
  'darby-3k': 'Three-constant (Darby 3-K)',
  'equivalent-length': 'Equivalent length',
} as const;
const METHODS = CriteriaOverridesSchema.shape.fittingMethod.unwrap().options;

/** A quick start for a segment: two standard 90° elbows and a tee, flow through the run (common practice, not a rule). */
export const USUAL_SET = [
  { typeId: 'elbow-90-standard', count: 2 },
  { typeId: 'tee-run', count: 1 },
] as const;

export const fittingsFormSchema = z.object({
  fittingMethod: CriteriaOverridesSchema.shape.fittingMethod.unwrap(),
  segments: z.array(
    z.object({
      id: z.string(),
      fittings: z.array(FittingSchema.extend({ count: z.number({ error: 'Enter a whole number' }).int('Enter a whole number').positive('At least 1') })),
    }),
  ),
});
type FittingsForm = {
  fittingMethod: (typeof METHODS)[number];
  segments: { id: string; fittings: { typeId: string; count: number; custom?: CustomFitting }[] }[];
};

/**
 * Writes the fittings back. A project fitting type (`project:<id>`) is copied into the document
 * as the fitting's own data (catalog/lib/apply-entries.ts); a seeded type carries none.
 */
export function applyFittings(
  doc: SystemDocument,
  v: z.output<typeof fittingsFormSchema>,
  projectFittings: readonly ProjectEntryOf<'fitting-type'>[] = [],
): SystemDocument {
  const byId = new Map(v.segments.map((s) => [s.id, s.fittings.map((f) => fittingWithProjectData(f, projectFittings))]));
  // The loss method is a criterion: written only when it is changed, so that editing fittings alone
  // leaves the criteria exactly as they were (a field change may not touch them at all).
  const methodChanged = v.fittingMethod !== (doc.criteria?.fittingMethod ?? 'crane');
  return {
    ...doc,
    ...(methodChanged ? { criteria: { ...(doc.criteria ?? {}), fittingMethod: v.fittingMethod } } : {}),
    segments: doc.segments.map((s) => (byId.has(s.id) ? { ...s, fittings: byId.get(s.id)! } : s)),
  };
}

/**
 * One fitting's K in its segment, by the engine's own fitting function and the segment's live Re and f;
 * a fitting with its own data by the engine's rule for it (schema.ts CustomFittingSchema): K as given, or f·L/D.
 */
export function kOf(
  typeId: string,
  segment: SystemDocument['segments'][number] | undefined,
  si: SegmentResult | undefined,
  method: FittingsForm['fittingMethod'],
  catalog: Catalog,
  custom?: CustomFitting,
  sys: SystemDocument['unitSystem'] = 'US',
): { K: number; fellBackFrom?: string; method?: string } | null {
  if (custom) {
    if ('k' in custom) return { K: custom.k };
    return si && si.innerDiameter > 0 ? { K: (si.frictionFactor * toSI('length', custom.equivalentLength, sys)) / si.innerDiameter } : null;
  }
  if (!segment || !si) return null;
  const size = catalog.material(segment.material)?.data.sizes.find((s) => s.key === segment.size);
  if (!size) return null;
  try {
    return fittingK(typeId, {
      method,
      innerDiameterM: si.innerDiameter,
      nominalSizeIn: size.nominalIn,
      nominalSizeKey: size.key,
      Re: si.reynolds,
      frictionFactor: si.frictionFactor,
    });
  } catch {
    return null;
  }
}

function SegmentFittings({
  index,
  control,
  register,
  watch,
  setValue,
  catalog,
  doc,
  analysis,
  method,
  units,
  projectFittings,
  flags,
}: {
  index: number;
  control: Control<FittingsForm>;
  register: UseFormRegister<FittingsForm>;
  watch: UseFormWatch<FittingsForm>;
  setValue: UseFormSetValue<FittingsForm>;
  projectFittings: readonly ProjectEntryOf<'fitting-type'>[];
  catalog: Catalog;
  doc: SystemDocument;
  analysis: Analysis | null;
  method: FittingsForm['fittingMethod'];
  units: { pressure: string };
  flags: SegmentFlagValues;
}) {
  const list = useFieldArray({ control, name: `segments.${index}.fittings` });
  const id = watch(`segments.${index}.id`);
  const rows = watch(`segments.${index}.fittings`);
  const segment = doc.segments.find((s) => s.id === id);
  const name = segment?.label || id;
  const display = analysis?.segments.find((s) => s.id === id);
  const si = analysis?.si.segments.find((s) => s.id === id);
  const isPex = segment?.material === 'pex-sdr9';
  // On a PEX segment the PEX fitting types come first; elsewhere they stay after the metal ones.
  const types = isPex
    ? [...catalog.fittingTypes.filter((f) => f.id.startsWith('pex-')), ...catalog.fittingTypes.filter((f) => !f.id.startsWith('pex-'))]
    : catalog.fittingTypes;
  const options = types.map((f) => ({ value: f.id, label: f.label }));
  const projectOptions = projectOptionsOf(projectFittings);
  const metalRows = isPex ? (rows ?? []).flatMap((r, k) => (r && !r.custom && isMetalPipeFitting(r.typeId) ? [k] : [])) : [];
  const size = segment?.size ?? '';
  const pexLines =
    metalRows.length > 0
      ? pexLinesAtSize(
          metalRows.map((k) => rows![k].typeId),
          size,
        )
      : [];
  // Copper kept, soldered → another line (push-fit): offered where the line publishes one of this segment's fittings at its size.
  const copperLines = segment?.material?.startsWith('copper-')
    ? COPPER_LINES.filter((l) => (rows ?? []).some((r) => r && !r.custom && copperFittingFor(r.typeId, l.id, size) !== undefined))
    : [];
  return (
    <Section title={name} headingLevel={3}>
      <div data-testid={`fittings-${id}`}>
        <SegmentFlags {...flags} className="mb-2" />
      </div>
      <table className="w-full text-sm">
        <caption className="sr-only">Fittings of {name}</caption>
        <thead>
          <tr className="text-left">
            <th scope="col">{describedColumn(FITTING, 'typeId', doc.unitSystem).label}</th>
            <th scope="col">{describedColumn(FITTING, 'count', doc.unitSystem).label}</th>
            <th scope="col" className="text-right">
              K each
            </th>
            <th scope="col" className="text-right">
              Loss ({units.pressure})
            </th>
            <th scope="col">
              <span className="sr-only">Remove</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {list.fields.map((f, k) => {
            const row = rows?.[k];
            // the copy the row carries, or what choosing the project entry will copy
            const custom = row
              ? fittingWithProjectData(row as z.output<typeof fittingsFormSchema>['segments'][number]['fittings'][number], projectFittings).custom
              : undefined;
            const kr = row ? kOf(row.typeId, segment, si, method, catalog, custom, doc.unitSystem) : null;
            const loss = kr && display && display.totalK > 0 && Number.isFinite(row?.count) ? (display.fittingLoss * kr.K * row!.count) / display.totalK : null;
            const entry = row && !custom ? catalog.fittingType(row.typeId) : undefined;
            return (
              <tr key={f.id} className="border-t border-rule align-top">
                <td className="py-1 pr-2">
                  <CellSelect
                    {...describedCell(`${name}: fitting ${k + 1}`, FITTING, 'typeId', doc.unitSystem)}
                    options={[...options, ...projectOptions]}
                    {...register(`segments.${index}.fittings.${k}.typeId`, { onChange: () => setValue(`segments.${index}.fittings.${k}.custom`, undefined) })}
                  />
                  {entry ? (
                    <p className="mt-0.5 text-xs text-ink-muted">
                      Source: {entry.source}
                      {entry.fromMemory && !/not verified/i.test(entry.source)
                        ? ' — not verified against the printed code; confirm against the adopted edition'
                        : ''}
                    </p>
                  ) : null}
                  {custom ? (
                    <p className="mt-0.5 text-xs text-ink-muted" data-testid={`project-fitting-${id}-${k}`}>
                      Project data: {custom.label} — source: {custom.source}
                    </p>
                  ) : null}
                </td>
                <td className="w-20 py-1 pr-2">
                  <CellInput
                    {...describedCell(`${name}: fitting ${k + 1}`, FITTING, 'count', doc.unitSystem)}
                    type="text"
                    inputMode="numeric"
                    autoComplete="off"
                    {...register(`segments.${index}.fittings.${k}.count`, numberInput)}
                  />
                </td>
                <td className="py-1 pr-2 text-right tabular-nums" data-testid={`k-${id}-${k}`}>
                  {kr ? num(kr.K, 'loss coefficient') : '—'}
                  {kr?.fellBackFrom ? (
                    <span className="block text-xs text-caution">
                      no {kr.fellBackFrom} data: {kr.method} used
                    </span>
                  ) : null}
                </td>
                <td className="py-1 pr-2 text-right tabular-nums">{loss === null ? '—' : num(loss, units.pressure)}</td>
                <td className="py-1">
                  <Button variant="quiet" onClick={() => list.remove(k)} aria-label={`Remove fitting ${k + 1} of ${name}`}>
                    Remove
                  </Button>
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
      {metalRows.length > 0 ? (
        <PexSubstitute
          name={name}
          size={size}
          lines={pexLines}
          onApply={(line) => {
            for (const k of metalRows) {
              const next = pexFittingFor(rows![k].typeId, line, size);
              if (next) setValue(`segments.${index}.fittings.${k}.typeId`, next, { shouldDirty: true });
            }
          }}
          testId={`pex-substitute-${id}`}
        />
      ) : null}
      {copperLines.length > 0 ? (
        <CopperLineSubstitute
          name={name}
          lines={copperLines}
          onApply={(line) => {
            (rows ?? []).forEach((r, k) => {
              const next = r && !r.custom ? copperFittingFor(r.typeId, line, size) : undefined;
              if (next) setValue(`segments.${index}.fittings.${k}.typeId`, next, { shouldDirty: true });
            });
          }}
          testId={`copper-line-${id}`}
        />
      ) : null}
      <p className="mt-2 text-sm" data-testid={`fitting-loss-${id}`}>
        {display ? (
          <>
            Σ K = {num(display.fittingsK, 'loss coefficient')}
            {display.sizeChangeK > 0 ? ` + size change ${num(display.sizeChangeK, 'loss coefficient')}` : ''} · loss in fittings{' '}
            {num(display.fittingLoss, units.pressure)} {units.pressure} at {analysis ? withUnit(display.velocity, analysis.units.velocity) : null}
          </>
        ) : (
          'Losses appear once the system can be computed.'
        )}
      </p>
      <div className="mt-2 flex flex-wrap gap-2">
        <Button variant="secondary" onClick={() => list.append({ typeId: options[0]?.value ?? '', count: 1 })}>
          Add a fitting to {name}
        </Button>
        <Button variant="secondary" onClick={() => USUAL_SET.forEach((f) => list.append({ ...f }))}>
          Add the usual set (2 elbows, 1 tee run) to {name}
        </Button>
      </div>
    </Section>
  );
}

/** The open row's fittings: a form of its own, read again when the segment's fittings change elsewhere (a bulk edit). */
function ActiveFittings({
  segmentId,
  fittings,
  analysis,
  projectFittings,
  flags,
  written,
}: {
  written: { current: string };
  segmentId: string;
  fittings: SystemDocument['segments'][number]['fittings'];
  analysis: Analysis | null;
  projectFittings: readonly ProjectEntryOf<'fitting-type'>[];
  flags: SegmentFlagValues;
}) {
  const { document, draft, catalog, units } = useWalk();
  const method = document.criteria?.fittingMethod ?? 'crane';
  const [defaults] = useState<FittingsForm>(() => ({ fittingMethod: method, segments: [{ id: segmentId, fittings: fittings.map((f) => ({ ...f })) }] }));
  // the loss method is set above, not by this form: what it holds from its opening is not written back
  const form = useLiveForm(fittingsFormSchema, defaults, (v) => {
    written.current = JSON.stringify((v.segments[0]?.fittings ?? []).map((f) => fittingWithProjectData(f, projectFittings)));
    draft.update((doc) => applyFittings(doc, { ...v, fittingMethod: doc.criteria?.fittingMethod ?? 'crane' }, projectFittings));
  });
  const { register, control, watch, setValue } = form;
  return (
    <SegmentFittings
      index={0}
      control={control}
      register={register}
      watch={watch}
      setValue={setValue}
      projectFittings={projectFittings}
      catalog={catalog}
      doc={document}
      analysis={analysis}
      method={method}
      units={units}
      flags={flags}
    />
  );
}

/** A PEX fitting line and whether it publishes a loss for each of the segment's metal fittings at its size. */
export interface PexLineAtSize {
  id: PexFittingLine;
  label: string;
  sizes: string;
  covers: boolean;
}

/**
 * The PEX lines for a segment of size `sizeKey` carrying `metalTypeIds`: a line covers it when it
 * publishes a loss for the replacement of every one of them at that size (pexSubstitute.ts); none
 * covers a segment without a size.
 */
export function pexLinesAtSize(metalTypeIds: readonly string[], sizeKey: string): PexLineAtSize[] {
  return PEX_LINES.map((l) => ({
    ...l,
    covers: sizeKey !== '' && metalTypeIds.every((typeId) => pexFittingFor(typeId, l.id, sizeKey) !== undefined),
  }));
}

/**
 * A PEX segment still carrying metal-pipe fittings (after a change from copper to PEX): offers the
 * PEX fitting lines published at its size and replaces each elbow, tee and coupling by the chosen
 * line's (pexSubstitute.ts); a line with no data at that size is named with the sizes it has, not
 * offered (its fittings would have no loss to compute with).
 */
function PexSubstitute({
  name,
  size,
  lines,
  onApply,
  testId,
}: {
  name: string;
  size: string;
  lines: readonly PexLineAtSize[];
  onApply: (line: PexFittingLine) => void;
  testId: string;
}) {
  const offered = lines.filter((l) => l.covers);
  const missing = lines.filter((l) => !l.covers);
  const [line, setLine] = useState<PexFittingLine | undefined>(offered[0]?.id);
  // the size changed under the choice: the first line offered at the new size
  const chosen = offered.some((l) => l.id === line) ? line : offered[0]?.id;
  return (
    <div className="mt-2 rounded border border-caution p-2 text-sm" data-testid={testId}>
      <p>
        <span aria-hidden="true">⚠ </span>
        {name} is PEX but still carries fittings made for metal pipe.{' '}
        {offered.length > 0
          ? 'Choose the PEX fittings installed:'
          : size === ''
            ? 'Give it a size first: the PEX fitting lines are published by size.'
            : `No PEX fitting line has published data at ${size} in: give the fittings installed as project fitting types, with their source.`}
      </p>
      {chosen !== undefined ? (
        <div className="mt-1 flex flex-wrap items-end gap-2">
          <CellSelect
            className="w-72"
            label={`${name}: PEX fitting line`}
            value={chosen}
            onChange={(e) => setLine(e.target.value as PexFittingLine)}
            options={offered.map((l) => ({ value: l.id, label: l.label }))}
          />
          <Button variant="secondary" onClick={() => onApply(chosen)}>
            Use these PEX fittings on {name}
          </Button>
        </div>
      ) : null}
      {size !== '' && missing.length > 0 ? (
        <ul className="mt-1 text-xs text-ink-muted" aria-label={`PEX fitting lines not offered for ${name}`} data-testid={`${testId}-missing`}>
          {missing.map((l) => (
            <li key={l.id}>
              {l.label}: no published data at {size} in (published {l.sizes})
            </li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}

/**
 * A copper segment whose soldered or threaded elbows and couplings are installed as another line
 * (push-to-connect): replaces them by the line's fittings at this size (pexSubstitute.ts); tees keep
 * their data, since no tee of the line has a published loss.
 */
function CopperLineSubstitute({
  name,
  lines,
  onApply,
  testId,
}: {
  name: string;
  lines: readonly { id: CopperFittingLine; label: string }[];
  onApply: (line: CopperFittingLine) => void;
  testId: string;
}) {
  const [line, setLine] = useState<CopperFittingLine>(lines[0].id);
  return (
    <div className="mt-2 rounded border border-rule p-2 text-sm" data-testid={testId}>
      <p>
        Elbows and couplings of {name} installed as another line (push-to-connect instead of soldered)? Choose the line: its fittings replace them, at this
        size. Tees keep their data: no tee of the line has a published loss.
      </p>
      <div className="mt-1 flex flex-wrap items-end gap-2">
        <CellSelect
          className="w-72"
          label={`${name}: copper fitting line`}
          value={line}
          onChange={(e) => setLine(e.target.value as CopperFittingLine)}
          options={lines.map((l) => ({ value: l.id, label: l.label }))}
        />
        <Button variant="secondary" onClick={() => onApply(line)}>
          Use this line’s fittings on {name}
        </Button>
      </div>
    </div>
  );
}

export function FittingsStep() {
  const { ids, document, draft, readOnlyReason, catalog, live, scope } = useWalk();
  const project = useProjectEntries(ids.projectId);
  const projectFittings = project.of('fitting-type');
  const method = document.criteria?.fittingMethod ?? 'crane';
  const analysis = live.ok ? live.analysis : null;
  const flagsOf = useSegmentFlags();
  const policy = readOnlyReason ? readOnlyPolicy(readOnlyReason) : scope === 'field-change' ? CONTRACTOR_POLICY : DESIGNER_POLICY;
  // the open row's form is opened again only when its segment's fittings change from outside it
  const opened = useRef<{ id: string; json: string; epoch: number }>({ id: '', json: '', epoch: 0 });
  /** the fittings the open form last wrote, as JSON */
  const written = useRef('');
  const renderDetail = (row: TreeRow) => {
    const s = document.segments.find((x) => x.id === row.id);
    if (!s) return null;
    const json = JSON.stringify(s.fittings);
    const o = opened.current;
    if (o.id !== s.id) opened.current = { id: s.id, json, epoch: o.epoch + 1 };
    // fittings changed by this form are its own values; changed elsewhere (a bulk edit), the form reads them again
    else if (o.json !== json) opened.current = { id: s.id, json, epoch: json === written.current ? o.epoch : o.epoch + 1 };
    return (
      <ActiveFittings
        key={`${s.id}:${opened.current.epoch}`}
        segmentId={s.id}
        fittings={s.fittings}
        analysis={analysis}
        projectFittings={projectFittings}
        flags={flagsOf(s.id)}
        written={written}
      />
    );
  };
  const update = (change: (doc: SystemDocument) => SystemDocument) => draft.update(change);
  const setMethod = (value: FittingsForm['fittingMethod']) => draft.update((doc) => ({ ...doc, criteria: { ...(doc.criteria ?? {}), fittingMethod: value } }));
  return (
    <div>
      <StepIntro title="Fittings">
        Per segment, the fittings and valves by type and count: each row sums them up; open a row to change them, or select rows and add a set to all of them.
        Each type’s loss coefficient K depends on the method and, for most methods, on the size and the flow; the source of each type’s data is shown under it.
      </StepIntro>
      <form noValidate onSubmit={(ev) => ev.preventDefault()} aria-label="Fittings">
        <fieldset disabled={readOnlyReason !== null} className="flex min-w-0 flex-col gap-4">
          {scope === 'field-change' ? (
            // the loss method is one of the designer's criteria: a field change keeps it as issued
            <p className="text-sm" data-testid="fitting-method-as-issued">
              <span className="font-semibold">Loss method for fittings (as issued):</span> {METHOD_LABELS[method]}
              {analysis ? (
                <span className="block text-ink-muted">
                  In use: {analysis.methods.fittings.label} — {analysis.methods.fittings.source}
                </span>
              ) : null}
            </p>
          ) : (
            <SelectField
              label={describedField(CRITERIA, 'fittingMethod', document.unitSystem).label}
              options={METHODS.map((m) => ({ value: m, label: METHOD_LABELS[m] }))}
              hint={analysis ? `In use: ${analysis.methods.fittings.label} — ${analysis.methods.fittings.source}` : undefined}
              value={method}
              onChange={(ev) => setMethod(ev.target.value as FittingsForm['fittingMethod'])}
            />
          )}
          {document.segments.length === 0 ? <p className="text-ink-soft">No segments yet: add them at the step Risers.</p> : null}
          <TreeEditor
            label="Fittings by segment"
            document={document}
            analysis={analysis}
            policy={policy}
            catalog={catalog}
            project={project}
            onChange={update}
            reportHeld={draft.reportHeld}
            flagsOf={flagsOf}
            renderDetail={renderDetail}
          />
        </fieldset>
      </form>
    </div>
  );
}
