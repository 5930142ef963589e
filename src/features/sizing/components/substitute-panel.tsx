import { useEffect, useRef, useState } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/field';
import { DEFAULT_SUBSTITUTE_MATERIAL, fromSI } from '../../../engine';
import type { SystemDocument } from '../../../engine';
import { useWalk } from '../../walk/draft/walk-context';
import { num, signed } from '../../../shared/format/quantity';
import { treeOrder } from '../../walk/lib/tree';
import { applySubstitution, undoSubstitution, type PipeBefore } from '../lib/apply';
import type { SizingReply } from '../lib/compute';
import { runSizing, type SizingRun } from '../lib/run-sizing';

/**
 * The contractor's sizing on a field change: the segments ticked take the chosen material (PEX by
 * default) at the smallest sizes that still pass every velocity and every fixture — the designer's
 * sizing limited to what a field change may change (material and size of existing segments).
 * Nothing changes until "Use these sizes", which is one change of the field change, undoable.
 * `onChanged` lets the step's form follow the document.
 */
export function SubstitutePanel({ onChanged }: { onChanged: (doc: SystemDocument) => void }) {
  const { document, draft, units, catalog, readOnlyReason } = useWalk();
  const sys = document.unitSystem;
  const [material, setMaterial] = useState<string>(DEFAULT_SUBSTITUTE_MATERIAL);
  const [picked, setPicked] = useState<Set<string>>(new Set());
  const [running, setRunning] = useState(false);
  const [answer, setAnswer] = useState<{ reply: SizingReply; document: SystemDocument } | null>(null);
  const [applied, setApplied] = useState<PipeBefore[] | null>(null);
  const run = useRef<SizingRun | null>(null);
  useEffect(() => () => run.current?.cancel(), []);
  if (readOnlyReason !== null) return null;

  const order = treeOrder(document.segments, document.source.nodeId)
    .map(({ index }) => document.segments[index])
    .filter((s) => s && s.material && !s.custom);
  const materialOptions = catalog.materials.map((m) => ({ value: m.id, label: m.label }));
  const toggle = (id: string, on: boolean) =>
    setPicked((prev) => {
      const next = new Set(prev);
      if (on) next.add(id);
      else next.delete(id);
      return next;
    });

  const find = async () => {
    run.current?.cancel();
    setRunning(true);
    setApplied(null);
    const from = document;
    const current = runSizing({ document: from, options: {}, substitute: { segmentIds: [...picked], material } });
    run.current = current;
    const reply = await current.answer;
    if (run.current !== current) return;
    run.current = null;
    setAnswer({ reply, document: from });
    setRunning(false);
  };

  const reply = answer?.reply ?? null;
  const result = reply?.ok ? reply.result : null;
  const sub = reply?.ok ? reply.substitute : null;
  const stale = answer !== null && answer.document !== document && applied === null;
  const rows = result && sub ? result.segments.filter((r) => sub.substituted.includes(r.segmentId)) : [];
  const issued = new Map((answer?.document ?? document).segments.map((s) => [s.id, s]));
  const materialLabel = (id: string | undefined | null) => (id ? (catalog.material(id)?.label ?? id) : '—');
  const p = (pa: number | null | undefined) => (pa === null || pa === undefined ? '—' : signed(fromSI('pressure', pa, sys), units.pressure));

  const use = () => {
    if (!result?.feasible || !sub || stale) return;
    const { document: next, before } = applySubstitution(document, sub.material, result.segments, sub.substituted);
    draft.update(() => next);
    onChanged(next);
    setApplied(before);
  };
  const undo = () => {
    if (!applied) return;
    const next = undoSubstitution(document, applied);
    draft.update(() => next);
    onChanged(next);
    setApplied(null);
    setAnswer(null);
  };

  return (
    <section
      className="mb-6 flex flex-col gap-3 rounded-lg border-2 border-rule bg-surface p-4"
      aria-label="Smallest sizes in another material"
      data-testid="substitute-panel"
    >
      <h3 className="text-lg font-semibold">Smallest sizes that still pass, in another material</h3>
      <p className="max-w-prose text-sm">
        Tick the segments you want to run in another material. Headroom finds, for them only, the smallest sizes that keep every velocity within its limit and
        every checked fixture at its minimum; every other segment stays as issued. Add the fittings you will actually use (insert or press fittings) on the
        fittings step: they change the answer. The designer of record reviews the field change.
      </p>
      <SelectField
        label="Material to substitute"
        options={materialOptions}
        value={material}
        onChange={(e) => setMaterial(e.target.value)}
        className="max-w-md"
      />
      <details>
        <summary className="cursor-pointer text-sm font-semibold">Segments to substitute ({picked.size} ticked)</summary>
        <ul className="mt-2 grid gap-1 text-sm sm:grid-cols-2">
          {order.map((s) => (
            <li key={s.id}>
              <label className="flex items-center gap-2">
                <input
                  type="checkbox"
                  checked={picked.has(s.id)}
                  onChange={(e) => toggle(s.id, e.target.checked)}
                  aria-label={`Substitute ${s.label || s.id}`}
                />
                {s.label || s.id}{' '}
                <span className="text-ink-soft">
                  ({materialLabel(s.material)}, {s.size})
                </span>
              </label>
            </li>
          ))}
        </ul>
      </details>
      <div>
        <Button onClick={() => void find()} pending={running} pendingLabel="Finding sizes…" disabled={picked.size === 0}>
          Find the smallest sizes
        </Button>
      </div>
      <div aria-live="polite" className="flex flex-col gap-2">
        {reply && !reply.ok ? (
          <Alert tone="fault" title="No sizes found">
            {reply.message} Nothing was changed.
          </Alert>
        ) : null}
        {result && sub ? (
          <div className="flex flex-col gap-2" data-testid="substitute-answer" data-feasible={result.feasible ? 'yes' : 'no'}>
            {result.feasible ? (
              <ul className="text-sm">
                {rows.map((r) => {
                  const was = issued.get(r.segmentId);
                  const why =
                    r.governing === 'velocity'
                      ? 'velocity'
                      : r.governing === 'smallest'
                        ? 'smallest size'
                        : typeof r.governing === 'object'
                          ? `pressure at ${r.governing.fixtureLabel}`
                          : r.governing;
                  return (
                    <li key={r.segmentId} data-testid={`substitute-${r.segmentId}`}>
                      {r.label || r.segmentId}: {materialLabel(was?.material)} {was?.size ?? '—'} → {materialLabel(sub.material)} {r.after} ({why};{' '}
                      {num(r.velocityAfter === null ? null : fromSI('velocity', r.velocityAfter, sys), units.velocity)} {units.velocity})
                    </li>
                  );
                })}
              </ul>
            ) : (
              <Alert tone="fault" title="No sizes of this material pass">
                Even at its largest sizes, the worst fixture stays {num(fromSI('pressure', result.shortfallPa, sys), units.pressure)} {units.pressure} short.
                Nothing was changed.
              </Alert>
            )}
            {sub.skipped.length ? (
              <p className="text-sm">
                Left as issued:{' '}
                {sub.skipped
                  .map((x) => `${issued.get(x.segmentId)?.label || x.segmentId} (${x.reason === 'locked' ? 'size locked by the designer' : 'custom pipe'})`)
                  .join('; ')}
                .
              </p>
            ) : null}
            {result.feasible ? (
              <p className="text-sm">
                Lowest fixture margin with these sizes: {p(result.minMarginAfterPa)} {units.pressure}.
              </p>
            ) : null}
            {stale ? <p className="text-sm font-semibold text-caution">The field change changed since this answer: find the sizes again.</p> : null}
            {result.feasible && !applied ? (
              <div>
                <Button onClick={use} disabled={stale}>
                  Use these sizes
                </Button>
              </div>
            ) : null}
            {applied ? (
              <div className="flex flex-wrap items-center gap-3 rounded-md border-2 border-rule bg-paper-deep p-3 text-sm" data-testid="substitute-applied">
                <p>
                  Used: {applied.length} segment{applied.length === 1 ? '' : 's'} changed in this field change.
                </p>
                <Button variant="secondary" onClick={undo}>
                  Undo
                </Button>
              </div>
            ) : null}
          </div>
        ) : null}
      </div>
    </section>
  );
}
