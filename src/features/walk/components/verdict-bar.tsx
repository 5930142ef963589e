import { memo } from 'react';
import { Link } from 'react-router-dom';
import { VerdictMark, verdictOfStatus } from '../../systems/components/verdict-mark';
import type { LiveAnalysis } from '../draft/live-analysis';
import { signed } from '../../../shared/format/quantity';
import { liveStatus, plural } from '../lib/verdict';

const STATUS_WORDS = { pass: 'Pass', fail: 'Fail', incomplete: 'Incomplete' } as const;

/**
 * The live verdict in one line, kept on screen at every scroll position of every step: the
 * critical fixture by its name, its margin with the unit, and pass / fail / incomplete. Small on
 * purpose — the full ledger is in the side panel and at the result step.
 */
export const VerdictBar = memo(function VerdictBar({ live, resultHref }: { live: LiveAnalysis; resultHref: string | null }) {
  const status = liveStatus(live);
  let detail: React.ReactNode;
  if (!live.ok) {
    detail = <span className="truncate">Not computed: {live.message}</span>;
  } else {
    const a = live.analysis;
    const critical = a.fixtures.find((f) => f.id === a.criticalFixtureId);
    const missing = a.verdict.incomplete?.length ?? 0;
    detail = (
      <>
        {critical ? (
          <span className="min-w-0 truncate">
            <span className="text-ink-soft">Critical: </span>
            <span className="font-semibold" data-testid="bar-critical">
              {critical.label}
            </span>
            <span className="ml-2 font-semibold tabular-nums" data-testid="bar-margin">
              {signed(critical.margin, a.units.pressure)} {a.units.pressure}
            </span>
          </span>
        ) : (
          <span className="text-ink-soft">No checked fixture yet</span>
        )}
        {status === 'incomplete' ? <span className="text-caution">{plural(missing, 'item')} missing</span> : null}
        {status === 'fail' ? <span className="text-fault">{plural(a.verdict.failures, 'check')} not met</span> : null}
      </>
    );
  }
  return (
    <div
      className="sticky top-0 z-30 -mx-2 mb-3 flex flex-wrap items-center gap-x-4 gap-y-1 rounded-b-md border-2 border-t-0 border-rule bg-surface px-3 py-1.5 text-sm shadow-sm print:hidden"
      role="status"
      aria-label="Live verdict"
      data-testid="verdict-bar"
      data-status={status ?? 'unknown'}
    >
      <VerdictMark verdict={verdictOfStatus(status)}>{status ? STATUS_WORDS[status] : 'Not computed'}</VerdictMark>
      {detail}
      {resultHref && status !== 'pass' ? (
        <Link to={resultHref} className="ml-auto text-sm">
          {status === 'incomplete' ? 'What is missing' : 'See the result'}
        </Link>
      ) : null}
    </div>
  );
});
