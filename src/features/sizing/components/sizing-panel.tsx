import { useEffect, useRef, useState } from 'react';
import { Alert } from '../../../components/ui/alert';
import { Button } from '../../../components/ui/button';
import { CheckboxField, TextField } from '../../../components/ui/field';
import { fromSI, sizingBasisText, toSI } from '../../../engine';
import type { SegmentSizing, SizingBasis, SizingResult, SystemDocument } from '../../../engine';
import { useWalk } from '../../walk/draft/walk-context';
import { num, signed } from '../../../shared/format/quantity';
import { applySizing, changedRows, lockedSegmentKeys, setSizeLocked, setUnitSegmentSizeLocked, undoSizing } from '../lib/apply';
import type { SizingReply } from '../lib/compute';
import { runSizing, type SizingRun } from '../lib/run-sizing';

/** The answer with the draft it was computed on (an answer for an older draft is not applied). */
interface Answered {
  reply: SizingReply;
  document: SystemDocument;
  /** The margin asked for, Pa (recorded with the sizes when applied). */
  marginPa: number;
}

const UNIT_LEFT_REASON = {
  'custom-pipe': 'a custom pipe',
  'no-catalog-size': 'no catalog material and size',
  'material-override': 'a placement changes its material',
  device: 'a device sits in the unit’s piping',
} as const;

/** What was applied, to take it back. */
interface Applied {
  rows: SegmentSizing[];
  /** The sizing basis the draft had before, restored by undo. */
  previousBasis: SizingBasis | undefined;
}

function governingText(row: SegmentSizing, velocityUnit: string, sys: SystemDocument['unitSystem']): string {
  const g = row.governing;
  if (g === 'locked') return 'Locked by the designer';
  if (g === 'unchanged') return 'Not sized (outside the selection, or not a catalog pipe)';
  if (g === 'smallest') return 'Smallest size allowed';
  if (g === 'velocity') {
    const limit = row.velocityLimit === null ? '—' : num(fromSI('velocity', row.velocityLimit, sys), velocityUnit);
    return row.velocityMet
      ? `Velocity in this segment (limit ${limit} ${velocityUnit})`
      : `Velocity in this segment: above the limit of ${limit} ${velocityUnit} even at the largest size`;
  }
  return `Pressure at ${g.fixtureLabel}`;
}

/**
 * Automatic sizing on the result step: the smallest catalog size of every segment that keeps
 * each velocity within its limit and each checked fixture at its minimum plus the margin set
 * here, run off the page's thread. Nothing changes until "Apply to draft", which is one change
 * of the draft (saved as any edit) and can be undone.
 */
export function SizingPanel() {
  const { document, draft, units, readOnlyReason, project, scope } = useWalk();
  const sys = document.unitSystem;
  const editable = readOnlyReason === null && project.myRole === 'designer' && scope === 'design';
  const [marginText, setMarginText] = useState('0');
  const [running, setRunning] = useState(false);
  const [answered, setAnswered] = useState<Answered | null>(null);
  const [applied, setApplied] = useState<Applied | null>(null);
  const [showAll, setShowAll] = useState(false);
  const run = useRef<SizingRun | null>(null);
  useEffect(() => () => run.current?.cancel(), []);

  const margin = Number(marginText);
  const marginError = marginText.trim() === '' || !Number.isFinite(margin) || margin < 0 ? `Enter a margin of 0 ${units.pressure} or more` : undefined;

  const size = async () => {
    if (marginError) return;
    run.current?.cancel();
    setRunning(true);
    setApplied(null);
    const sizedFrom = document;
    const marginPa = toSI('pressure', margin, sys);
    const current = runSizing({ document: sizedFrom, options: { marginPa } });
    run.current = current;
    const reply = await current.answer;
    if (run.current !== current) return;
    run.current = null;
    setAnswered({ reply, document: sizedFrom, marginPa });
    setRunning(false);
  };

  const reply = answered?.reply ?? null;
  const result: SizingResult | null = reply?.ok ? reply.result : null;
  const stale = answered !== null && answered.document !== document && applied === null;
  const rows = result ? result.segments : [];
  const changed = changedRows(rows);
  const shownRows = showAll ? rows : rows.filter((r) => r.before !== r.after || r.governing === 'locked' || typeof r.governing === 'object');
  const p = (pa: number | null | undefined) => (pa === null || pa === undefined ? '—' : num(fromSI('pressure', pa, sys), units.pressure));
  const ps = (pa: number | null | undefined) => (pa === null || pa === undefined ? '—' : signed(fromSI('pressure', pa, sys), units.pressure));
  const v = (ms: number | null) => (ms === null ? '—' : num(fromSI('velocity', ms, sys), units.velocity));

  const apply = () => {
    if (!answered || !result || !result.feasible || stale) return;
    const at = new Date();
    draft.update((doc) => applySizing(doc, result, answered.marginPa, at));
    setApplied({ rows: changed, previousBasis: document.sizingBasis });
  };
  const undo = () => {
    if (!applied) return;
    draft.update((doc) => undoSizing(doc, applied.rows, applied.previousBasis));
    setApplied(null);
    setAnswered(null);
  };
  // A lock is one change of the draft: a main segment's `sizeLocked`, or the unit type's for a unit type segment (every placement).
  const lock = (row: SegmentSizing, locked: boolean) => {
    const unit = row.unitType;
    draft.update((doc) => (unit ? setUnitSegmentSizeLocked(doc, unit.id, unit.segmentId, locked) : setSizeLocked(doc, row.segmentId, locked)));
  };
  const lockedNow = lockedSegmentKeys(document);

  return (
    <div className="flex flex-col gap-4" data-testid="sizing-panel">
      <p className="max-w-prose text-sm">
        Headroom chooses the smallest catalog size of each segment’s material that keeps every velocity within its limit and every checked fixture at its
        minimum flow pressure plus the margin below, on the supply’s minimum pressure. Locked segments keep their size. Nothing changes until you apply the
        answer to the draft. Check the sizes against the adopted code and the pipe actually available; the AHJ and your judgement govern.
      </p>
      <p className="max-w-prose text-sm" data-testid="sizing-basis">
        <span className="font-semibold">Sizing basis: </span>
        {sizingBasisText(document)}
      </p>
      <div className="flex flex-wrap items-end gap-3">
        <TextField
          label={`Margin to keep at every fixture (${units.pressure})`}
          inputMode="decimal"
          value={marginText}
          onChange={(e) => setMarginText(e.target.value)}
          error={marginError}
          className="w-64"
        />
        <Button onClick={() => void size()} pending={running} pendingLabel="Sizing…" disabled={marginError !== undefined}>
          Size the pipes
        </Button>
      </div>
      <div aria-live="polite" className="flex flex-col gap-3">
        {reply && !reply.ok ? (
          <Alert tone="fault" title="Sizing could not start">
            {reply.message} Nothing was changed.
          </Alert>
        ) : null}
        {result ? (
          <div className="flex flex-col gap-3" data-testid="sizing-answer" data-feasible={result.feasible ? 'yes' : 'no'}>
            {result.feasible ? (
              <p data-testid="sizing-summary">
                {changed.length === 0
                  ? 'Every segment already has its smallest passing size.'
                  : `${changed.length} segment${changed.length === 1 ? '' : 's'} change size.`}{' '}
                Lowest fixture margin {ps(result.minMarginBeforePa)} → {ps(result.minMarginAfterPa)} {units.pressure}; pipe volume{' '}
                {num(result.volumeBeforeM3 * 1000, 'L')} → {num((result.volumeAfterM3 ?? 0) * 1000, 'L')} L.
              </p>
            ) : (
              <Alert tone="fault" title="No choice of sizes passes">
                <span data-testid="sizing-shortfall">
                  With every pipe at its largest allowed size, the worst fixture is still {p(result.shortfallPa)} {units.pressure} short.
                  {result.boosterPressurePa !== null
                    ? ` A booster adding about ${p(result.boosterPressurePa)} ${units.pressure} at the design flow, at the source, would let the velocity-sized pipes pass.`
                    : ''}{' '}
                  Nothing was changed.
                </span>
              </Alert>
            )}
            {result.frictionBudget ? (
              <p className="text-sm text-ink-soft" data-testid="friction-budget">
                Hand check (the model codes’ pressure-available-for-friction method, common practice): to {result.frictionBudget.label}, the supply’s{' '}
                {p(result.frictionBudget.supplyPa)} less devices {p(result.frictionBudget.devicesPa)}, elevation {p(result.frictionBudget.elevationPa)}, the
                minimum {p(result.frictionBudget.requiredPa)}
                {result.frictionBudget.marginPa > 0 ? ` and the margin ${p(result.frictionBudget.marginPa)}` : ''} leaves {p(result.frictionBudget.availablePa)}{' '}
                {units.pressure} for friction over{' '}
                {num(fromSI('length', result.frictionBudget.developedLengthM + result.frictionBudget.fittingsEquivalentLengthM, sys), units.length)}{' '}
                {units.length} of pipe and fittings:{' '}
                {result.frictionBudget.perHundredFtPa === null
                  ? '—'
                  : `${num(fromSI('pressurePerLength', result.frictionBudget.availablePa / (result.frictionBudget.developedLengthM + result.frictionBudget.fittingsEquivalentLengthM), sys), units.pressurePerLength)} ${units.pressurePerLength}`}
                .
              </p>
            ) : null}
            {result.unitPiping && (result.unitPiping.left.length > 0 || !result.unitPiping.leastProven) ? (
              <p className="text-sm text-ink-soft" data-testid="sizing-unit-piping">
                {result.unitPiping.left.length > 0
                  ? `Left at their sizes inside typical units: ${result.unitPiping.left.map((l) => `${l.label} (${UNIT_LEFT_REASON[l.reason]})`).join('; ')}; the margins above include them as entered. `
                  : ''}
                {result.unitPiping.leastProven
                  ? ''
                  : 'The unit types’ choices were too many to compare one by one: these sizes pass, but are not proven the least.'}
              </p>
            ) : null}
            {stale ? (
              <p className="text-sm font-semibold text-caution" data-testid="sizing-stale">
                The draft changed since this answer: size again before applying.
              </p>
            ) : null}
            {editable && result.feasible && !applied ? (
              <div>
                <Button onClick={apply} disabled={stale || changed.length === 0}>
                  Apply to draft
                </Button>
              </div>
            ) : null}
            {applied ? (
              <div className="flex flex-wrap items-center gap-3 rounded-md border-2 border-rule bg-paper-deep p-3 text-sm" data-testid="sizing-applied">
                <p>
                  Applied: {applied.rows.length} size{applied.rows.length === 1 ? '' : 's'} changed in the draft.
                </p>
                <Button variant="secondary" onClick={undo}>
                  Undo sizing
                </Button>
              </div>
            ) : null}
            <CheckboxField label="Show every segment" checked={showAll} onChange={(e) => setShowAll(e.target.checked)} />
            <div className="overflow-x-auto">
              <table className="w-full text-sm" data-testid="sizing-table">
                <caption className="sr-only">Size of each segment before and after sizing, and what governs it</caption>
                <thead>
                  <tr className="border-b-2 border-rule text-left">
                    <th scope="col" className="py-1 pr-3">
                      Segment
                    </th>
                    <th scope="col" className="py-1 pr-3">
                      Size before → after
                    </th>
                    <th scope="col" className="py-1 pr-3">
                      Governed by
                    </th>
                    <th scope="col" className="py-1 pr-3 text-right">
                      Velocity ({units.velocity})
                    </th>
                    <th scope="col" className="py-1 pr-3">
                      Worst fixture below: margin ({units.pressure})
                    </th>
                    {editable ? (
                      <th scope="col" className="py-1">
                        Lock
                      </th>
                    ) : null}
                  </tr>
                </thead>
                <tbody>
                  {shownRows.map((r) => {
                    const name = r.label || r.segmentId;
                    const locked = lockedNow.has(r.segmentId);
                    return (
                      <tr key={r.segmentId} className="border-b border-rule" data-testid={`sizing-row-${r.segmentId}`}>
                        <th scope="row" className="py-1 pr-3 text-left font-normal">
                          {name}
                          {r.unitType ? (
                            <span className="block text-xs text-ink-soft" data-testid={`sizing-applies-${r.segmentId}`}>
                              unit type segment: applies to {r.unitType.placements} placement{r.unitType.placements === 1 ? '' : 's'}
                            </span>
                          ) : null}
                        </th>
                        <td className="py-1 pr-3" data-testid={`sizing-after-${r.segmentId}`}>
                          {r.before ?? '—'} → {r.after ?? '—'}
                          {r.before !== r.after ? <strong className="ml-1">changed</strong> : null}
                        </td>
                        <td className="py-1 pr-3">{governingText(r, units.velocity, sys)}</td>
                        <td className="py-1 pr-3 text-right tabular-nums">
                          {v(r.velocityBefore)} → {v(r.velocityAfter)}
                        </td>
                        <td className="py-1 pr-3">
                          {r.worstFixture ? `${r.worstFixture.label}: ${ps(r.worstFixture.marginBeforePa)} → ${ps(r.worstFixture.marginAfterPa)}` : '—'}
                        </td>
                        {editable ? (
                          <td className="py-1">
                            <input type="checkbox" aria-label={`Lock the size of ${name}`} checked={locked} onChange={(e) => lock(r, e.target.checked)} />
                          </td>
                        ) : null}
                      </tr>
                    );
                  })}
                </tbody>
              </table>
            </div>
          </div>
        ) : null}
      </div>
    </div>
  );
}
