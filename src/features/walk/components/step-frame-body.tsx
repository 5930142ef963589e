import { useContext } from 'react';
import { Outlet } from 'react-router-dom';
import { RouteErrorBoundary } from '../../../components/errors/route-error-boundary';
import type { LiveAnalysis } from '../draft/live-analysis';
import { WalkContext } from '../draft/walk-context';
import { LedgerPanel } from './ledger-panel';
import { VerdictBar } from './verdict-bar';

/**
 * Below a frame's header: a step beside the live ledger, or a full-width page (table, diagram,
 * side by side). Keyed by the draft's generation, so "Reload theirs" remounts the forms.
 * Every step (and the table) has the compact verdict bar, sticky at the top of the window.
 */
export function StepFrameBody({
  generation,
  live,
  withLedger,
  withBar = withLedger,
}: {
  generation: number;
  live: LiveAnalysis;
  withLedger: boolean;
  withBar?: boolean;
}) {
  const walk = useContext(WalkContext);
  const resultHref = walk && walk.scope === 'design' ? walk.links.step('result') : null;
  return (
    <RouteErrorBoundary what="this step">
      <div>
        {withBar ? <VerdictBar live={live} resultHref={resultHref} /> : null}
        {withLedger ? (
          <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_22rem]">
            <div key={generation} className="min-w-0">
              <Outlet />
            </div>
            <LedgerPanel live={live} />
          </div>
        ) : (
          <div key={generation}>
            <Outlet />
          </div>
        )}
      </div>
    </RouteErrorBoundary>
  );
}
