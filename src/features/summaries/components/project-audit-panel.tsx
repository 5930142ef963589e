import { Button } from '../../../components/ui/button';
import { Section } from '../../../components/ui/card';
import { ErrorView } from '../../../components/errors/error-view';
import { Loading } from '../../../components/ui/loading';
import { formatDateTime } from '../../../lib/labels';
import type { AuditEntry } from '../../../shared/api/summaries';
import { useAudit } from '../api/get-audit';

/** What each recorded action says in the log; an action not listed here is shown by its code. */
const ACTIONS: Record<string, string> = {
  'project.created': 'Created the project',
  'project.updated': 'Changed the project',
  'member.added': 'Added a member',
  'member.removed': 'Removed a member',
  'member.role-changed': 'Changed a member’s role',
  'user.created': 'Created an account',
  'user.invited': 'Invited a person',
  'user.updated': 'Changed an account',
  'invitation.accepted': 'Accepted an invitation',
  'system.created': 'Created a system',
  'revision.saved': 'Saved a draft',
  'revision.drafted': 'Started a new draft',
  'revision.issued': 'Issued a revision',
  'summary.ready': 'Summary PDF made',
  'summary.retried': 'Made the summary PDF again',
  'summary.sent': 'Sent the summary',
  'message.sent': 'E-mail delivered to the mail server',
  'message.failed': 'E-mail failed',
  'message.requeued': 'E-mail queued again',
  'review.accepted': 'Accepted the summary',
  'review.returned': 'Returned the summary with comments',
  'review.comment-answered': 'Answered a review comment',
  'summary.package-sent': 'Sent systems as one submission',
};

function detailText(value: unknown): string {
  if (value === null || value === undefined) return '—';
  if (Array.isArray(value)) return value.map(detailText).join(', ');
  if (typeof value === 'object') return JSON.stringify(value);
  return String(value);
}

function Details({ details }: { details: AuditEntry['details'] }) {
  const entries = Object.entries(details);
  if (entries.length === 0) return <span className="text-ink-muted">—</span>;
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-2 text-xs">
      {entries.map(([key, value]) => (
        <div key={key} className="contents">
          <dt className="font-semibold">{key}</dt>
          <dd className="break-all">{detailText(value)}</dd>
        </div>
      ))}
    </dl>
  );
}

/** The project's audit log for its designers: who did what and when, newest first, a page at a time. */
export function ProjectAuditPanel({ projectId }: { projectId: string }) {
  const audit = useAudit(projectId);
  const entries = audit.data?.pages.flatMap((p) => p.entries) ?? [];
  return (
    <Section title="Audit log">
      {audit.isPending ? <Loading label="Loading the audit log…" /> : null}
      {audit.isError ? <ErrorView error={audit.error} onRetry={() => void audit.refetch()} what="the audit log" /> : null}
      {audit.data && entries.length === 0 ? <p className="text-ink-soft">Nothing recorded yet.</p> : null}
      {entries.length > 0 ? (
        <div className="overflow-x-auto">
          <table className="w-full text-sm" data-testid="audit-table">
            <caption className="sr-only">Audit log of this project, newest first</caption>
            <thead>
              <tr className="border-b-2 border-rule text-left">
                <th scope="col" className="py-1 pr-3">
                  When
                </th>
                <th scope="col" className="py-1 pr-3">
                  Who
                </th>
                <th scope="col" className="py-1 pr-3">
                  What
                </th>
                <th scope="col" className="py-1">
                  Details
                </th>
              </tr>
            </thead>
            <tbody>
              {entries.map((e) => (
                <tr key={e.id} className="border-b border-rule align-top">
                  <td className="py-1.5 pr-3 whitespace-nowrap">{formatDateTime(e.at)}</td>
                  <td className="py-1.5 pr-3">{e.actor?.name ?? 'Headroom'}</td>
                  <th scope="row" className="py-1.5 pr-3 text-left font-normal">
                    {ACTIONS[e.action] ?? e.action}
                    <span className="block text-xs text-ink-muted">
                      {e.subjectType}
                      {e.subjectId ? ` ${e.subjectId.slice(0, 8)}` : ''}
                    </span>
                  </th>
                  <td className="py-1.5">
                    <Details details={e.details} />
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      ) : null}
      {audit.hasNextPage ? (
        <div className="mt-3">
          <Button variant="secondary" onClick={() => void audit.fetchNextPage()} pending={audit.isFetchingNextPage} pendingLabel="Loading older entries…">
            Show older entries
          </Button>
        </div>
      ) : entries.length > 0 ? (
        <p className="mt-3 text-sm text-ink-soft">{entries.length} entries: the beginning of the log.</p>
      ) : null}
      {audit.isFetchNextPageError ? <ErrorView error={audit.error} onRetry={() => void audit.fetchNextPage()} what="older entries" /> : null}
    </Section>
  );
}
