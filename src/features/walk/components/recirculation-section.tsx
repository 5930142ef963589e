import { useState } from 'react';
import { Section } from '../../../components/ui/card';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { checkRange, FIELD_QUANTITIES, fieldUnit } from '../../../engine';
import type { Recirculation, RecirculationAnalysis, RecirculationSegment, SystemDocument } from '../../../engine';
import { useWalk } from '../draft/walk-context';
import { CellInput, CellSelect } from './cells';
import { describedCell, describedField } from '../lib/described';
import { RECIRCULATION, RECIRCULATION_SEGMENT } from '../../../engine/model/elements';
import { num } from '../../../shared/format/quantity';

type Loop = Recirculation;
type Pipe = RecirculationSegment;
type LoopNumber = 'heatLossPerLength' | 'temperatureDrop' | 'hotTemperature' | 'fittingAllowance' | 'heaterLoss';

/**
 * A starting loop, to be replaced by the project's: out from the heater (the source node) to the end
 * of the first hot pipe and back. The drop starts at 10 °F (5 K), within the 5–20 °F designers
 * commonly allow (common practice); the heat loss is left for the designer to give.
 */
function starterLoop(doc: SystemDocument): Loop {
  const heater = doc.source.nodeId;
  const first = doc.segments.find((s) => s.from === heater);
  const far = first?.to ?? 'far-end';
  const length = first?.length ?? (doc.unitSystem === 'US' ? 50 : 15);
  const material = first?.material ?? 'copper-l';
  return {
    segments: [
      { id: 'rc-1', from: heater, to: far, length, material, ...(first?.size ? { size: first.size } : {}) },
      { id: 'rc-2', from: far, to: heater, length, material },
    ],
    temperatureDrop: doc.unitSystem === 'US' ? 10 : 5,
  };
}

function nextPipeId(loop: Loop): string {
  const used = new Set(loop.segments.map((s) => s.id));
  let n = loop.segments.length + 1;
  while (used.has(`rc-${n}`)) n++;
  return `rc-${n}`;
}

/** A number typed into a loop field: null when empty, else the number or the range message. */
function readNumber(raw: string, field: string, sys: SystemDocument['unitSystem']): { value: number | null; error?: string } {
  if (raw.trim() === '') return { value: null };
  const value = Number(raw.replace(',', '.'));
  const q = FIELD_QUANTITIES[field];
  const problem = q ? checkRange(q, value, sys) : Number.isFinite(value) ? null : 'Enter a number';
  return problem ? { value: null, error: problem } : { value };
}

/** The hot system's recirculation loop: its pipes, heat loss and allowed drop, and what Headroom computes from them. */
export function RecirculationSection() {
  const { document, draft, readOnlyReason, units, catalog, live } = useWalk();
  const loop = document.recirculation;
  const disabled = readOnlyReason !== null;
  const sys = document.unitSystem;
  const [errors, setErrors] = useState<Record<string, string>>({});
  const result: RecirculationAnalysis | undefined = live.ok ? live.analysis.recirculation : undefined;

  const setError = (key: string, error: string | undefined) =>
    setErrors((e) => {
      if ((e[key] ?? undefined) === error) return e;
      const next = { ...e };
      if (error) next[key] = error;
      else delete next[key];
      return next;
    });
  const changeLoop = (change: (l: Loop) => Loop) => draft.update((doc) => (doc.recirculation ? { ...doc, recirculation: change(doc.recirculation) } : doc));
  const setLoopNumber = (key: LoopNumber, raw: string, optional: boolean) => {
    const { value, error } = readNumber(raw, `recirculation.${key}`, sys);
    if (error || (value === null && !optional)) {
      setError(key, error ?? 'Enter a number');
      return;
    }
    setError(key, undefined);
    changeLoop((l) => {
      const next = { ...l };
      if (value === null) delete next[key];
      else next[key] = value;
      return next as Loop;
    });
  };
  const changePipe = (id: string, change: (p: Pipe) => Pipe) => changeLoop((l) => ({ ...l, segments: l.segments.map((p) => (p.id === id ? change(p) : p)) }));
  const setPipeNumber = (id: string, key: 'length' | 'heatLoss', raw: string) => {
    const { value, error } = readNumber(raw, `recirculation.segments[].${key}`, sys);
    const errKey = `${id}.${key}`;
    if (error || (value === null && key === 'length')) {
      setError(errKey, error ?? 'Enter the length');
      return;
    }
    setError(errKey, undefined);
    changePipe(id, (p) => {
      const next = { ...p };
      if (value === null) delete next[key as 'heatLoss'];
      else next[key] = value;
      return next;
    });
  };
  const setPipeText = (id: string, key: 'from' | 'to', raw: string) => {
    const value = raw.trim();
    const errKey = `${id}.${key}`;
    if (value === '' || value.length > 200) {
      setError(errKey, 'Name a node (1–200 characters)');
      return;
    }
    setError(errKey, undefined);
    changePipe(id, (p) => ({ ...p, [key]: value }));
  };
  const materialOptions = catalog.materials.map((m) => ({ value: m.id, label: m.label }));
  const nodeListId = `recirculation-nodes-${document.id}`;

  if (!loop) {
    return (
      <Section title="Recirculation" headingLevel={3}>
        <div className="flex flex-col gap-3 text-sm" data-testid="recirculation">
          <p className="max-w-prose">
            No recirculation loop is described. Where the hot water must reach far fixtures without a long wait, a loop from the heater out and back, with a
            pump, keeps it hot; Headroom computes the loop flow, the return sizes and the pump from the loop&apos;s heat loss and the drop you allow.
          </p>
          {!disabled ? (
            <p>
              <Button variant="secondary" onClick={() => draft.update((doc) => ({ ...doc, recirculation: starterLoop(doc) }))}>
                Describe a recirculation loop
              </Button>
            </p>
          ) : null}
        </div>
      </Section>
    );
  }

  // Each field's label, unit and help come from the description (RECIRCULATION); the leaving
  // temperature's hint names the system's own temperature, which it defaults to.
  const described = (key: LoopNumber) => describedField(RECIRCULATION, key, sys);
  const loopFields: { key: LoopNumber; label: string; optional: boolean; hint?: string }[] = [
    {
      key: 'heatLossPerLength',
      ...described('heatLossPerLength'),
      optional: true,
    },
    { key: 'temperatureDrop', ...described('temperatureDrop'), optional: false },
    {
      key: 'hotTemperature',
      label: described('hotTemperature').label,
      optional: true,
      hint: `Empty: the system's ${num(document.waterTemperature, units.temperature)} ${units.temperature}.`,
    },
    {
      key: 'fittingAllowance',
      ...described('fittingAllowance'),
      optional: true,
    },
    {
      key: 'heaterLoss',
      ...described('heaterLoss'),
      optional: true,
    },
  ];

  return (
    <Section title="Recirculation" headingLevel={3}>
      <div className="flex flex-col gap-4 text-sm" data-testid="recirculation">
        <p className="max-w-prose">
          The loop leaves the heater (the source node, <strong>{document.source.nodeId}</strong>) and comes back to it. Give each pipe in order; a pipe without
          a size is a return pipe, and Headroom chooses its size.
        </p>
        <div className="grid gap-3 md:grid-cols-2">
          {loopFields.map((f) => (
            <TextField
              key={f.key}
              label={f.label}
              hint={f.hint}
              error={errors[f.key]}
              type="text"
              inputMode="decimal"
              autoComplete="off"
              disabled={disabled}
              defaultValue={loop[f.key] === undefined ? '' : String(loop[f.key])}
              onChange={(e) => setLoopNumber(f.key, e.target.value, f.optional)}
            />
          ))}
        </div>
        <datalist id={nodeListId}>
          {document.nodes.map((n) => (
            <option key={n.id} value={n.id}>
              {n.label ?? n.id}
            </option>
          ))}
        </datalist>
        <div className="overflow-x-auto">
          <table className="w-full text-sm" data-testid="recirculation-pipes">
            <caption className="sr-only">Pipes of the recirculation loop, from the heater back to it</caption>
            <thead>
              <tr className="border-b-2 border-rule text-left align-bottom">
                <th scope="col" className="py-1 pr-2">
                  From
                </th>
                <th scope="col" className="py-1 pr-2">
                  To
                </th>
                <th scope="col" className="py-1 pr-2">
                  Length ({units.length})
                </th>
                <th scope="col" className="py-1 pr-2">
                  Material
                </th>
                <th scope="col" className="py-1 pr-2">
                  Size
                </th>
                <th scope="col" className="py-1 pr-2">
                  Heat loss ({fieldUnit('loopHeatLoss', sys)})
                </th>
                <th scope="col" className="py-1">
                  <span className="sr-only">Remove</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {loop.segments.map((p, i) => {
                const name = `loop pipe ${i + 1}`;
                const material = catalog.material(p.material);
                const sizeOptions = [
                  { value: '', label: 'Chosen by Headroom (return)' },
                  ...(material?.data.sizes ?? []).map((z) => ({ value: z.key, label: z.key })),
                  ...(p.size && !material?.data.sizes.some((z) => z.key === p.size) ? [{ value: p.size, label: `${p.size} (not in the catalog)` }] : []),
                ];
                return (
                  <tr key={p.id} className="border-b border-rule align-top">
                    <td className="py-1 pr-2">
                      <CellInput
                        {...describedCell(`Loop pipe ${i + 1}`, RECIRCULATION_SEGMENT, 'from', sys)}
                        list={nodeListId}
                        disabled={disabled}
                        defaultValue={p.from}
                        error={errors[`${p.id}.from`]}
                        onChange={(e) => setPipeText(p.id, 'from', e.target.value)}
                      />
                    </td>
                    <td className="py-1 pr-2">
                      <CellInput
                        {...describedCell(`Loop pipe ${i + 1}`, RECIRCULATION_SEGMENT, 'to', sys)}
                        list={nodeListId}
                        disabled={disabled}
                        defaultValue={p.to}
                        error={errors[`${p.id}.to`]}
                        onChange={(e) => setPipeText(p.id, 'to', e.target.value)}
                      />
                    </td>
                    <td className="py-1 pr-2">
                      <CellInput
                        {...describedCell(`Loop pipe ${i + 1}`, RECIRCULATION_SEGMENT, 'length', sys)}
                        inputMode="decimal"
                        autoComplete="off"
                        disabled={disabled}
                        defaultValue={String(p.length)}
                        error={errors[`${p.id}.length`]}
                        onChange={(e) => setPipeNumber(p.id, 'length', e.target.value)}
                      />
                    </td>
                    <td className="py-1 pr-2">
                      <CellSelect
                        {...describedCell(`Loop pipe ${i + 1}`, RECIRCULATION_SEGMENT, 'material', sys)}
                        disabled={disabled}
                        value={p.material}
                        options={material ? materialOptions : [...materialOptions, { value: p.material, label: `${p.material} (not in the catalog)` }]}
                        onChange={(e) =>
                          changePipe(p.id, (x) => {
                            const next = { ...x, material: e.target.value };
                            delete next.size;
                            return next;
                          })
                        }
                      />
                    </td>
                    <td className="py-1 pr-2">
                      <CellSelect
                        {...describedCell(`Loop pipe ${i + 1}`, RECIRCULATION_SEGMENT, 'size', sys)}
                        disabled={disabled}
                        value={p.size ?? ''}
                        options={sizeOptions}
                        onChange={(e) =>
                          changePipe(p.id, (x) => {
                            const next = { ...x };
                            if (e.target.value === '') delete next.size;
                            else next.size = e.target.value;
                            return next;
                          })
                        }
                      />
                    </td>
                    <td className="py-1 pr-2">
                      <CellInput
                        {...describedCell(`Loop pipe ${i + 1}`, RECIRCULATION_SEGMENT, 'heatLoss', sys)}
                        inputMode="decimal"
                        autoComplete="off"
                        placeholder="per length"
                        disabled={disabled}
                        defaultValue={p.heatLoss === undefined ? '' : String(p.heatLoss)}
                        error={errors[`${p.id}.heatLoss`]}
                        onChange={(e) => setPipeNumber(p.id, 'heatLoss', e.target.value)}
                      />
                    </td>
                    <td className="py-1">
                      {!disabled ? (
                        <Button
                          variant="quiet"
                          aria-label={`Remove ${name}`}
                          onClick={() => changeLoop((l) => ({ ...l, segments: l.segments.filter((x) => x.id !== p.id) }))}
                        >
                          Remove
                        </Button>
                      ) : null}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
        {!disabled ? (
          <div className="flex flex-wrap gap-2">
            <Button
              variant="secondary"
              onClick={() =>
                changeLoop((l) => {
                  const last = l.segments[l.segments.length - 1];
                  return {
                    ...l,
                    segments: [
                      ...l.segments,
                      {
                        id: nextPipeId(l),
                        from: last?.to ?? document.source.nodeId,
                        to: document.source.nodeId,
                        length: last?.length ?? 10,
                        material: last?.material ?? 'copper-l',
                      },
                    ],
                  };
                })
              }
            >
              Add a loop pipe
            </Button>
            <Button
              variant="quiet"
              onClick={() =>
                draft.update((doc) => {
                  const next = { ...doc };
                  delete next.recirculation;
                  return next;
                })
              }
            >
              Remove the recirculation loop
            </Button>
          </div>
        ) : null}
        <RecirculationResultView result={result} liveOk={live.ok} />
      </div>
    </Section>
  );
}

/** What Headroom computed from the loop: flow, pump, return sizes, each with its unit and its source; or the named error. */
export function RecirculationResultView({ result, liveOk }: { result: RecirculationAnalysis | undefined; liveOk: boolean }) {
  if (!liveOk) return <p className="text-ink-soft">The loop is computed with the rest of the analysis, which cannot run yet (see the error above).</p>;
  if (!result) return null;
  if (!result.ok) {
    return (
      <p role="alert" className="font-semibold text-fault" data-testid="recirculation-error">
        <span aria-hidden="true">⚠ </span>
        {result.error.field ? `${result.error.field}: ` : ''}
        {result.error.message} The result is Incomplete until the loop can be computed.
      </p>
    );
  }
  const u = result.units;
  return (
    <div className="flex flex-col gap-2" data-testid="recirculation-result">
      <dl className="grid max-w-prose grid-cols-[auto_1fr] gap-x-4 gap-y-1">
        <dt>Heat lost by the loop</dt>
        <dd data-testid="recirculation-heat-loss">
          {num(result.heatLoss, u.heat)} {u.heat}
        </dd>
        <dt>Loop flow = pump flow</dt>
        <dd data-testid="recirculation-pump-flow" title="Q = heat loss / (ρ·c·ΔT); in US units gpm = Btu/h / (500·ΔT °F)">
          {num(result.pumpFlow, u.flow, 'loop flow')} {u.flow}
        </dd>
        <dt>Pump head</dt>
        <dd data-testid="recirculation-pump-head" title="Σ pipe friction × (1 + fitting allowance) + heater loss">
          {num(result.pumpHead, u.pressure)} {u.pressure} ({num(result.pumpHeadLength, u.length)} {u.length} of water)
        </dd>
      </dl>
      <div className="overflow-x-auto">
        <table className="w-full text-sm" data-testid="recirculation-sizes">
          <caption className="sr-only">Each loop pipe at the loop flow: size, velocity, friction loss and heat loss</caption>
          <thead>
            <tr className="border-b-2 border-rule text-left align-bottom">
              <th scope="col" className="py-1 pr-3">
                Pipe
              </th>
              <th scope="col" className="py-1 pr-3">
                Size
              </th>
              <th scope="col" className="py-1 pr-3 text-right">
                Velocity ({u.velocity}), limit
              </th>
              <th scope="col" className="py-1 pr-3 text-right">
                Friction loss ({u.pressure})
              </th>
              <th scope="col" className="py-1 pr-3 text-right">
                Heat loss ({u.heat})
              </th>
              <th scope="col" className="py-1">
                Limits
              </th>
            </tr>
          </thead>
          <tbody>
            {result.pipes.map((p) => (
              <tr key={p.segmentId} className="border-b border-rule">
                <td className="py-1 pr-3">{p.label}</td>
                <td className="py-1 pr-3" data-testid={`recirculation-size-${p.segmentId}`}>
                  {p.size} {p.sizeChosen ? '(chosen)' : '(given)'}
                </td>
                <td className="py-1 pr-3 text-right">
                  {num(p.velocity, u.velocity)} of {num(p.velocityLimit, u.velocity)}
                </td>
                <td className="py-1 pr-3 text-right">{num(p.frictionLoss, u.pressure)}</td>
                <td className="py-1 pr-3 text-right">{num(p.heatLoss, u.heat)}</td>
                <td className="py-1">{p.withinLimits ? 'within' : <strong className="text-fault">⚠ over the velocity or friction limit</strong>}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <div className="max-w-prose text-ink-soft" data-testid="recirculation-sources">
        <p className="font-semibold">Sources</p>
        <ul className="list-disc pl-5">
          {result.sources.map((s) => (
            <li key={s}>{s}</li>
          ))}
        </ul>
        <p>
          The friction limit and the fitting allowance are designers&apos; rules of thumb, not code limits; the adopted code, the AHJ and the pump maker&apos;s
          data govern.
        </p>
      </div>
    </div>
  );
}
