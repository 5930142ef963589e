import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import { ErrorView } from '../../../components/errors/error-view';
import { LiveMessage } from '../../../components/ui/alert';
import { Section } from '../../../components/ui/card';
import { Loading } from '../../../components/ui/loading';
import type { ProjectRole } from '../../../shared/api/projects';
import type { Review } from '../../../shared/api/summaries';
import type { RevisionStatus } from '../../../shared/api/systems';
import { useCurrentUser } from '../../auth/api/use-current-user';
import { useRevisionReviews } from '../../reviews/api/get-revision-reviews';
import { ReviewCard } from '../../reviews/components/review-card';
import { ReviewForm } from '../../reviews/components/review-form';
import { ReviewAnswersPanel } from '../../reviews/components/review-answers-panel';
import { itemCatalogOf } from '../../reviews/components/review-items';
import type { ItemCatalog } from '../../reviews/components/review-items';
import { useRevision } from '../../systems/api/get-revision';
import { isInFlight, useMessages } from '../api/get-messages';
import { summaryPaths } from '../paths';
import { MessagesList } from './messages-list';
import { SendSummaryDialog } from './send-summary-dialog';
import { SummaryCautions } from './summary-cautions';
import { SummaryStatus } from './summary-status';

export type RevisionSummaryPanelProps = {
  projectId: string;
  systemId: string;
  revisionId: string;
  revisionStatus: RevisionStatus;
  /** the signed-in person's role in the project; null for an administrator who is not a member */
  myRole: ProjectRole | null;
};

type Ids = { projectId: string; systemId: string; revisionId: string };

function Messages({ ids, canSend, revisionNumber }: { ids: Ids; canSend: boolean; revisionNumber: number | null }) {
  const messages = useMessages(ids.projectId, ids.systemId, ids.revisionId);
  const [sent, setSent] = useState<string | null>(null);
  const inFlight = messages.data?.filter(isInFlight).length ?? 0;
  return (
    <Section
      title="Sent to inspectors"
      headingLevel={3}
      actions={
        canSend && revisionNumber !== null ? (
          <SendSummaryDialog
            ids={ids}
            revisionNumber={revisionNumber}
            onSent={(result) =>
              setSent(`The summary is queued for ${result.messages.map((m) => m.toAddress).join(', ')}. The state of each message follows below.`)
            }
          />
        ) : null
      }
    >
      <LiveMessage tone="sound" message={sent} />
      {messages.isPending ? <Loading label="Loading the messages…" /> : null}
      {messages.isError ? <ErrorView error={messages.error} onRetry={() => void messages.refetch()} what="the messages" /> : null}
      {messages.data ? (
        <>
          {inFlight > 0 ? <p className="mb-2 text-sm text-ink-soft">{inFlight} message(s) on the way; this list updates by itself.</p> : null}
          <MessagesList projectId={ids.projectId} messages={messages.data} canRetry />
        </>
      ) : null}
      {!canSend ? <p className="mt-3 text-sm text-ink-soft">Only the issued revision is sent; this one has been superseded.</p> : null}
    </Section>
  );
}

function Reviews({
  ids,
  catalog,
  myRole,
  revisionStatus,
}: {
  ids: Ids;
  catalog: ItemCatalog | undefined;
  myRole: ProjectRole | null;
  revisionStatus: RevisionStatus;
}) {
  const user = useCurrentUser();
  const reviews = useRevisionReviews(ids.projectId, ids.systemId, ids.revisionId);
  const [decided, setDecided] = useState<string | null>(null);
  const mine = useMemo(
    () => (reviews.data ?? []).filter((r) => r.reviewer.id === user.id && r.status === 'received' && revisionStatus === 'issued').at(-1),
    [reviews.data, user.id, revisionStatus],
  );
  const others = (reviews.data ?? []).filter((r) => r !== mine);
  const onDecided = (r: Review) =>
    setDecided(
      `Revision ${r.revisionNumber} ${r.status === 'accepted' ? 'accepted' : 'returned with comments'}. The designer sees the outcome on the revision and on the project page.`,
    );

  return (
    <>
      {mine ? (
        <Section title="Your review" headingLevel={3}>
          <p className="mb-4 max-w-prose text-sm text-ink-soft">
            Sent to you by {mine.sentBy ?? 'a designer'}. Read the result and the PDF, then accept the summary or return it with comments. Comments on an item
            point the designer at a segment, a checked fixture, a device, a node or an input.
          </p>
          {catalog ? <ReviewForm review={mine} catalog={catalog} onDecided={onDecided} /> : <Loading label="Loading the revision’s items…" />}
        </Section>
      ) : null}
      <LiveMessage tone="sound" message={decided} />
      <Section title="Reviews" headingLevel={3}>
        {reviews.isPending ? <Loading label="Loading the reviews…" /> : null}
        {reviews.isError ? <ErrorView error={reviews.error} onRetry={() => void reviews.refetch()} what="the reviews" /> : null}
        {reviews.data && others.length === 0 ? (
          <p className="text-ink-soft">{myRole === 'designer' ? 'No reviews yet: send the summary to an inspector.' : 'No other reviews of this revision.'}</p>
        ) : null}
        {others.length > 0 ? (
          <ul className="flex flex-col gap-3" aria-label="Reviews of this revision">
            {others.map((r) => (
              <li key={r.id}>
                <ReviewCard review={r} catalog={catalog} />
              </li>
            ))}
          </ul>
        ) : null}
      </Section>
    </>
  );
}

/**
 * The issued summary of one revision, for its result step or overview: the PDF (with progress
 * while it is being made), sending it to inspectors and each message's state (designers), the
 * reviews with their outcome and comments, and — for the inspector it was sent to — the review form.
 */
export function RevisionSummaryPanel({ projectId, systemId, revisionId, revisionStatus, myRole }: RevisionSummaryPanelProps) {
  const ids = { projectId, systemId, revisionId };
  const revision = useRevision(projectId, systemId, revisionId);
  const catalog = useMemo(() => (revision.data ? itemCatalogOf(revision.data.document) : undefined), [revision.data]);
  const isDesigner = myRole === 'designer';

  if (revisionStatus === 'draft') {
    return (
      <Section title="Issued summary" className="print:hidden">
        <p className="text-ink-soft" data-testid="summary-draft-note">
          A draft has no summary. Issuing the revision makes its PDF, which can then be sent to inspectors.
        </p>
      </Section>
    );
  }

  return (
    <div className="flex flex-col gap-4 print:hidden" data-testid="revision-summary-panel">
      <Section title="Issued summary">
        <SummaryStatus {...ids} canRetry={isDesigner} />
        <SummaryCautions className="mt-4" />
        {myRole === 'inspector' ? (
          <p className="mt-3 text-sm">
            <Link to={summaryPaths.inbox.getHref()}>Back to your review inbox</Link>
          </p>
        ) : null}
      </Section>
      {isDesigner ? <Messages ids={ids} canSend={revisionStatus === 'issued'} revisionNumber={revision.data?.number ?? null} /> : null}
      <ReviewAnswersPanel {...ids} catalog={catalog} />
      <Reviews ids={ids} catalog={catalog} myRole={myRole} revisionStatus={revisionStatus} />
    </div>
  );
}
