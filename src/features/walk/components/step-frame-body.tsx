import { Outlet } from 'react-router-dom';
import { RouteErrorBoundary } from '../../../components/errors/route-error-boundary';
import type { LiveAnalysis } from '../draft/live-analysis';
import { LedgerPanel } from './ledger-panel';

/**
 * Below a frame's header: a step beside the live ledger, or a full-width page (table, diagram,
 * side by side). Keyed by the draft's generation, so "Reload theirs" remounts the forms.
 */
export function StepFrameBody({ generation, live, withLedger }: { generation: number; live: LiveAnalysis; withLedger: boolean }) {
  return (
    <RouteErrorBoundary what="this step">
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
    </RouteErrorBoundary>
  );
}
