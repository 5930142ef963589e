import { memo, useMemo, useRef } from 'react';
import { ledgerFor } from '../../../engine';
import type { Analysis, PressureLedger } from '../../../engine';
import { fixtureVerdict, VerdictMark } from '../../systems/components/verdict-mark';
import type { LiveAnalysis } from '../draft/live-analysis';
import { num, signed } from '../../../shared/format/quantity';
import { liveStatus, plural } from '../lib/verdict';

export function criticalLedger(analysis: Analysis): PressureLedger | null {
  return analysis.criticalFixtureId ? ledgerFor(analysis, analysis.criticalFixtureId) : null;
}

/** The ledger as a table: start, each deduction, what is left. */
export function LedgerTable({ ledger, caption }: { ledger: PressureLedger; caption: string }) {
  const u = ledger.pressureUnit;
  return (
    <table className="w-full text-sm" data-testid="ledger-table">
      <caption className="sr-only">{caption}</caption>
      <thead>
        <tr className="border-b-2 border-rule text-left">
          <th scope="col" className="py-1 pr-2 font-semibold">
            Item
          </th>
          <th scope="col" className="py-1 pr-2 text-right font-semibold">
            Change ({u})
          </th>
          <th scope="col" className="py-1 text-right font-semibold">
            Left ({u})
          </th>
        </tr>
      </thead>
      <tbody>
        {ledger.lines.map((line) => (
          <tr key={line.step} className="border-b border-rule align-top">
            <th scope="row" className="py-1 pr-2 text-left font-normal">
              {line.label}
            </th>
            <td className="py-1 pr-2 text-right tabular-nums">{line.kind === 'start' ? '' : signed(line.change, u)}</td>
            <td className="py-1 text-right tabular-nums">{num(line.pressureAfter, u)}</td>
          </tr>
        ))}
      </tbody>
      <tfoot>
        <tr className="border-t-2 border-rule">
          <th scope="row" className="py-1 pr-2 text-left">
            Residual pressure
          </th>
          <td />
          <td className="py-1 text-right font-semibold tabular-nums">{num(ledger.residual, u)}</td>
        </tr>
        <tr>
          <th scope="row" className="py-1 pr-2 text-left">
            Minimum flow pressure
          </th>
          <td />
          <td className="py-1 text-right tabular-nums">{num(ledger.required, u)}</td>
        </tr>
        <tr>
          <th scope="row" className="py-1 pr-2 text-left">
            Margin
          </th>
          <td />
          <td className="py-1 text-right font-semibold tabular-nums">{signed(ledger.margin, u)}</td>
        </tr>
      </tfoot>
    </table>
  );
}

/**
 * The side panel of every step: the live pressure ledger to the critical fixture and its
 * margin, from the engine run in the browser on the draft as it is now.
 */
export const LedgerPanel = memo(function LedgerPanel({ live }: { live: LiveAnalysis }) {
  const stamp = useRef(0);
  const ledger = useMemo(() => (live.ok ? criticalLedger(live.analysis) : null), [live]);
  // Changes with every new analysis, so a test can tell when the panel has caught up.
  // eslint-disable-next-line react-hooks/exhaustive-deps -- `live` is the trigger: a new analysis object, a new stamp
  const renderStamp = useMemo(() => ++stamp.current, [live]);

  let body: React.ReactNode;
  if (!live.ok) {
    body = (
      <div className="rounded-md border-2 border-caution bg-caution-soft p-3 text-sm" data-testid="ledger-error">
        <p className="font-semibold">Not computed yet</p>
        <p className="mt-1">{live.message}</p>
        {live.element ? <p className="mt-1 text-ink-soft">At: {live.element}</p> : null}
      </div>
    );
  } else if (!ledger) {
    body = (
      <p className="text-sm text-ink-soft">
        No checked fixtures yet. Add them at the step “Remote fixture”; the ledger then runs to the one with the smallest margin.
      </p>
    );
  } else {
    const fixture = live.analysis.fixtures.find((f) => f.id === ledger.fixtureId);
    body = (
      <>
        <div aria-live="polite" aria-atomic="true" className="mb-3">
          <p className="text-sm text-ink-soft">Critical fixture</p>
          <p className="font-semibold" data-testid="critical-fixture">
            {fixture?.label ?? ledger.fixtureId}
          </p>
          <p className="mt-2 flex flex-wrap items-baseline gap-2">
            <span className="text-sm text-ink-soft">Margin</span>
            <span className="text-2xl font-bold tabular-nums" data-testid="live-margin">
              {signed(ledger.margin, ledger.pressureUnit)} {ledger.pressureUnit}
            </span>
            <VerdictMark verdict={fixtureVerdict(ledger.pass, liveStatus(live))} />
          </p>
        </div>
        <LedgerTable ledger={ledger} caption="Pressure ledger to the critical fixture" />
      </>
    );
  }

  return (
    <aside
      aria-labelledby="ledger-heading"
      className="rounded-lg border-2 border-rule bg-surface p-4 lg:sticky lg:top-14 lg:max-h-[calc(100vh-4.5rem)] lg:self-start lg:overflow-y-auto"
      data-testid="ledger-panel"
      data-stamp={renderStamp}
    >
      <h2 id="ledger-heading" className="mb-3 text-lg">
        Live pressure ledger
      </h2>
      {body}
      <p className="mt-3 text-xs text-ink-muted">
        Recomputed in your browser on every change ({num(live.millis, 'ms')} ms){live.ok ? ` · ${plural(live.analysis.warnings.length, 'warning')}` : ''}.
      </p>
    </aside>
  );
});
