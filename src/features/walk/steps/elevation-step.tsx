import { useState } from 'react';
import { z } from 'zod';
import { Button } from '../../../components/ui/button';
import { Section } from '../../../components/ui/card';
import type { SystemDocument } from '../../../engine';
import { NodeSchema, SegmentSchema } from '../../../engine/model/schema';
import { useWalk } from '../draft/walk-context';
import { CellInput, CellSelect, StepIntro } from '../components/cells';
import { WarningList } from '../components/warning-list';
import { num, signed } from '../../../shared/format/quantity';
import { numberInput, plainError } from '../lib/form-values';
import { treeOrder } from '../lib/tree';
import { elevationsFromFloors, floorLevels, floorOf, planProblems, type FloorPlan } from '../lib/floors';
import { TextField } from '../../../components/ui/field';
import { useLiveForm } from '../lib/use-live-form';
import { describedField } from '../lib/described';
import { NODE, SEGMENT } from '../../../engine/model/elements';

export const elevationFormSchema = z.object({
  nodes: z.array(
    z.object({ id: z.string(), elevation: z.preprocess((v) => (typeof v === 'number' && Number.isNaN(v) ? undefined : v), NodeSchema.shape.elevation) }),
  ),
  segments: z.array(
    z.object({ id: z.string(), rise: z.preprocess((v) => (typeof v === 'number' && Number.isNaN(v) ? undefined : v), SegmentSchema.shape.rise) }),
  ),
});
/** The elevation of each node placed on a named floor (the floor's elevation + its height above it), in the document's unit. */
function floorPlacedElevations(doc: SystemDocument): Map<string, number> {
  const floorZ = new Map(doc.floors.map((f) => [f.id, f.elevation]));
  const out = new Map<string, number>();
  for (const n of doc.nodes) {
    const z = n.elevation === undefined && n.floor !== undefined ? floorZ.get(n.floor) : undefined;
    if (z !== undefined) out.set(n.id, z + (n.heightAboveFloor ?? 0));
  }
  return out;
}

type ElevationForm = { nodes: { id: string; elevation?: number }[]; segments: { id: string; rise?: number }[] };

/**
 * Writes the form into the document under the version 2 rule (one position per node): an
 * elevation typed for a node removes its feed segment's rise; a rise typed for a segment removes
 * its downstream node's elevation and floor (the node, and the nodes placed relative to it, then
 * follow the rise). Values equal to the document's change nothing.
 */
export function applyElevations(doc: SystemDocument, v: z.output<typeof elevationFormSchema>): SystemDocument {
  const oldNode = new Map(doc.nodes.map((n) => [n.id, n]));
  const onFloor = floorPlacedElevations(doc);
  const oldSeg = new Map(doc.segments.map((s) => [s.id, s]));
  const feedOf = new Map(doc.segments.map((s) => [s.to, s.id]));
  const typedElevation = new Map<string, number>();
  for (const n of v.nodes) {
    // a node on a named floor shows its floor + height: only a different value places it absolutely
    if (n.elevation !== undefined && n.elevation !== (oldNode.get(n.id)?.elevation ?? onFloor.get(n.id))) typedElevation.set(n.id, n.elevation);
  }
  const typedRise = new Map<string, number | undefined>();
  for (const s of v.segments) {
    if (s.rise !== oldSeg.get(s.id)?.rise) typedRise.set(s.id, s.rise);
  }
  const riseCleared = new Set<string>();
  for (const nodeId of typedElevation.keys()) {
    const feed = feedOf.get(nodeId);
    if (feed !== undefined) riseCleared.add(feed);
  }
  const positionCleared = new Set<string>();
  for (const [segId, r] of typedRise) {
    const seg = oldSeg.get(segId);
    if (r !== undefined && seg && !typedElevation.has(seg.to)) positionCleared.add(seg.to);
  }
  return {
    ...doc,
    nodes: doc.nodes.map((n) => {
      if (typedElevation.has(n.id)) {
        const next = { ...n, elevation: typedElevation.get(n.id)! };
        delete next.floor;
        delete next.heightAboveFloor;
        return next;
      }
      if (positionCleared.has(n.id)) {
        const next = { ...n };
        delete next.elevation;
        delete next.floor;
        delete next.heightAboveFloor;
        return next;
      }
      return n;
    }),
    segments: doc.segments.map((s) => {
      if (riseCleared.has(s.id)) {
        const next = { ...s };
        delete next.rise;
        return next;
      }
      if (!typedRise.has(s.id)) return s;
      const next = { ...s };
      const r = typedRise.get(s.id);
      if (r === undefined) delete next.rise;
      else next.rise = r;
      return next;
    }),
  };
}

type PlanText = { floors: string; typicalHeight: string; groundHeight: string; groundLevel: string; aboveFloor: string; connection: string };
const numberOf = (t: string) => (t.trim() === '' ? Number.NaN : Number(t));

/** The typed plan as numbers; an empty ground-floor height means "as the typical floors". */
export function planFromText(t: PlanText): FloorPlan {
  return {
    floors: numberOf(t.floors),
    typicalHeight: numberOf(t.typicalHeight),
    groundHeight: t.groundHeight.trim() === '' ? undefined : numberOf(t.groundHeight),
    groundLevel: numberOf(t.groundLevel),
    aboveFloor: numberOf(t.aboveFloor),
  };
}

export function ElevationStep() {
  const { document, draft, readOnlyReason, units, live } = useWalk();
  const onFloor = floorPlacedElevations(document);
  const floorName = new Map(document.floors.map((f) => [f.id, f.name]));
  const [defaults] = useState<ElevationForm>(() => ({
    nodes: document.nodes.map((n) => ({ id: n.id, elevation: n.elevation ?? onFloor.get(n.id) })),
    segments: document.segments.map((s) => ({ id: s.id, rise: s.rise })),
  }));
  const form = useLiveForm(elevationFormSchema, defaults, (v) => draft.update((doc) => applyElevations(doc, v)));
  const {
    register,
    watch,
    setValue,
    formState: { errors },
  } = form;
  const nodes = watch('nodes');
  const rises = watch('segments');
  const elevation = new Map(nodes.map((n) => [n.id, n.elevation]));
  // Version 2 has one position per node: no tolerance to compare a rise against.
  const tolerance = 0;
  const order = treeOrder(document.segments, document.source.nodeId);
  // Version 2: a contradiction cannot be entered; what is left to enter shows as incomplete reasons.
  const warnings = live.ok
    ? live.analysis.verdict.incomplete
        .filter((r) => r.code === 'node-elevation-missing' || r.code === 'source-elevation-missing')
        .map((r) => ({
          code: 'booster-gain-at-static' as const,
          severity: 'note' as const,
          message: r.message,
          elementType: 'node' as const,
          elementId: r.elementId,
        }))
    : [];
  const label = new Map(document.nodes.map((n) => [n.id, n.label || n.id]));
  const nodeFloor = new Map(document.nodes.map((n) => [n.id, n.floor]));
  const sourceNode = document.source.nodeId;
  const [planText, setPlanText] = useState<PlanText>(() => ({
    floors: '',
    typicalHeight: '',
    groundHeight: '',
    groundLevel: '0',
    aboveFloor: '0',
    connection: String(document.nodes.find((n) => n.id === sourceNode)?.elevation ?? 0),
  }));
  const [assignment, setAssignment] = useState<Map<string, number>>(() => new Map());
  const [planNote, setPlanNote] = useState<string[]>([]);
  const plan = planFromText(planText);
  const problems = planProblems(plan);
  const connectionElevation = numberOf(planText.connection);
  const floorOptions = [
    { value: '', label: '—' },
    ...(problems.length
      ? []
      : floorLevels(plan).map((lv, k) => ({ value: String(k + 1), label: `${k + 1}${k === 0 ? ' (ground)' : ''} at ${num(lv, units.elevation)}` }))),
  ];
  const planField = (key: keyof PlanText) => ({
    value: planText[key],
    onChange: (ev: { target: { value: string } }) => setPlanText((t) => ({ ...t, [key]: ev.target.value })),
  });

  const guessFloors = () => {
    if (problems.length) return setPlanNote(problems);
    const levels = floorLevels(plan);
    setAssignment(
      new Map(nodes.filter((n) => n.id !== sourceNode && Number.isFinite(n.elevation)).map((n) => [n.id, floorOf(n.elevation!, levels, plan.aboveFloor)])),
    );
    setPlanNote(['Each node is put on the floor at or below its elevation; check the list and change any that is wrong.']);
  };
  const fillElevations = () => {
    const issues = [...problems, ...(Number.isFinite(connectionElevation) ? [] : ['Give the connection’s elevation.'])];
    if (issues.length) return setPlanNote(issues);
    const next = elevationsFromFloors(
      nodes.map((n) => ({ id: n.id, elevation: n.elevation ?? Number.NaN })),
      assignment,
      plan,
      { nodeId: sourceNode, elevation: connectionElevation },
    );
    next.forEach((n, i) => {
      if (n.elevation !== nodes[i]?.elevation) setValue(`nodes.${i}.elevation`, n.elevation, { shouldValidate: true, shouldDirty: true });
    });
    const assigned = nodes.filter((n) => assignment.has(n.id) && n.id !== sourceNode).length;
    setPlanNote([
      `Elevations filled for ${assigned} node(s) on floors and the connection; nodes without a floor kept theirs. Set the rises from the elevations below if they should follow.`,
    ]);
  };

  const riseFromElevations = () =>
    document.segments.forEach((s, i) => {
      const d = (elevation.get(s.to) ?? 0) - (elevation.get(s.from) ?? 0);
      setValue(`segments.${i}.rise`, Number(d.toFixed(6)), { shouldValidate: true, shouldDirty: true });
    });

  return (
    <form noValidate onSubmit={(ev) => ev.preventDefault()} aria-label="Elevation">
      <StepIntro title="Elevation">
        Every node’s elevation on one datum (for example the ground floor at 0). The climb from the source to a fixture costs pressure; the rises entered at
        Risers are checked against these elevations, and where they disagree the elevations are used.
      </StepIntro>
      <fieldset disabled={readOnlyReason !== null} className="flex flex-col gap-6">
        <Section title="Floors" headingLevel={3}>
          <p className="mb-3 max-w-prose text-sm text-ink-soft">
            Give the floors once, put each node on its floor, and fill the elevations from them (on the same datum as the nodes). The connection is set to its
            own elevation.
          </p>
          <div className="grid max-w-3xl gap-3 sm:grid-cols-3">
            <TextField label="Number of floors" inputMode="numeric" {...planField('floors')} />
            <TextField label={`Typical floor-to-floor height (${units.length})`} inputMode="decimal" {...planField('typicalHeight')} />
            <TextField
              label={`Ground floor to floor 2 (${units.length})`}
              hint="Empty = as the typical floors"
              inputMode="decimal"
              {...planField('groundHeight')}
            />
            <TextField label={`Ground floor level (${units.elevation})`} inputMode="decimal" {...planField('groundLevel')} />
            <TextField label={`Nodes sit above their floor by (${units.length})`} inputMode="decimal" {...planField('aboveFloor')} />
            <TextField label={`Connection elevation (${units.elevation})`} inputMode="decimal" {...planField('connection')} />
          </div>
          <div className="mt-3 flex flex-wrap gap-2">
            <Button variant="secondary" onClick={guessFloors}>
              Put nodes on floors from their elevations
            </Button>
            <Button variant="secondary" onClick={fillElevations}>
              Fill the elevations from the floors
            </Button>
          </div>
          <div aria-live="polite" className="mt-2 text-sm">
            {planNote.length ? (
              <ul className="list-disc pl-5">
                {planNote.map((p) => (
                  <li key={p}>{p}</li>
                ))}
              </ul>
            ) : null}
          </div>
        </Section>
        <Section title="Node elevations" headingLevel={3}>
          <table className="w-full text-sm">
            <caption className="sr-only">Node elevations</caption>
            <thead>
              <tr className="text-left">
                <th scope="col">Node</th>
                <th scope="col">Floor</th>
                <th scope="col">Elevation ({units.elevation})</th>
              </tr>
            </thead>
            <tbody>
              {defaults.nodes.map((n, i) => (
                <tr key={n.id} className="border-t border-rule">
                  <th scope="row" className="py-1 pr-2 text-left font-normal">
                    {label.get(n.id)}
                    {n.id === document.source.nodeId ? ' (source)' : ''}
                    {onFloor.has(n.id) ? (
                      <span className="block text-xs text-ink-muted" data-testid={`on-floor-${n.id}`}>
                        on {floorName.get(nodeFloor.get(n.id) ?? '') ?? 'its floor'}; a different elevation here places it apart from the floor
                      </span>
                    ) : null}
                  </th>
                  <td className="w-48 py-1 pr-2">
                    {n.id === sourceNode ? (
                      <span className="text-ink-muted">connection</span>
                    ) : (
                      <CellSelect
                        {...describedField(NODE, 'floor', document.unitSystem, { after: `of ${label.get(n.id)}` })}
                        options={floorOptions}
                        value={String(assignment.get(n.id) ?? '')}
                        onChange={(ev) =>
                          setAssignment((a) => {
                            const next = new Map(a);
                            if (ev.target.value) next.set(n.id, Number(ev.target.value));
                            else next.delete(n.id);
                            return next;
                          })
                        }
                      />
                    )}
                  </td>
                  <td className="w-40 py-1">
                    <CellInput
                      {...describedField(NODE, 'elevation', document.unitSystem, { after: `of ${label.get(n.id)}` })}
                      type="text"
                      inputMode="decimal"
                      autoComplete="off"
                      error={plainError(errors.nodes?.[i]?.elevation?.message)}
                      {...register(`nodes.${i}.elevation`, numberInput)}
                    />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </Section>
        <Section
          title="Rises against elevations"
          headingLevel={3}
          actions={
            <Button variant="secondary" onClick={riseFromElevations}>
              Set every rise from the elevations
            </Button>
          }
        >
          <table className="w-full text-sm">
            <caption className="sr-only">Each segment’s rise and the difference of its node elevations</caption>
            <thead>
              <tr className="text-left">
                <th scope="col">Segment</th>
                <th scope="col">Rise entered ({units.length})</th>
                <th scope="col" className="text-right">
                  Elevation difference
                </th>
                <th scope="col">Check</th>
              </tr>
            </thead>
            <tbody>
              {order.map(({ index }) => {
                const s = document.segments[index];
                const i = defaults.segments.findIndex((r) => r.id === s.id);
                const d = (elevation.get(s.to) ?? Number.NaN) - (elevation.get(s.from) ?? Number.NaN);
                const r = rises[i]?.rise;
                const given = typeof r === 'number' && Number.isFinite(r);
                const agrees = given && Math.abs(r - d) <= tolerance + 1e-9;
                return (
                  <tr key={s.id} className="border-t border-rule" data-testid={`rise-check-${s.id}`}>
                    <th scope="row" className="py-1 pr-2 text-left font-normal">
                      {s.label || s.id}
                    </th>
                    <td className="w-40 py-1 pr-2">
                      <CellInput
                        {...describedField(SEGMENT, 'rise', document.unitSystem, { after: `of ${s.label || s.id}` })}
                        type="text"
                        inputMode="decimal"
                        autoComplete="off"
                        {...register(`segments.${i}.rise`, numberInput)}
                      />
                    </td>
                    <td className="py-1 pr-2 text-right tabular-nums">{num(d, units.length)}</td>
                    <td className="py-1">
                      {!given
                        ? 'No rise entered: the elevations are used'
                        : agrees
                          ? '✓ Agrees'
                          : `✗ Differs by ${signed(r - d, units.length)} ${units.length}: the elevations are used`}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </Section>
        <WarningList title="What the engine says about rises" warnings={warnings} empty="Every node has a position." />
      </fieldset>
    </form>
  );
}
