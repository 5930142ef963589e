import { ErrorView } from '../../../components/errors/error-view';
import { Section } from '../../../components/ui/card';
import { Loading } from '../../../components/ui/loading';
import { PageHeader } from '../../../components/ui/page-header';
import { useDocumentTitle } from '../../../hooks/use-document-title';
import { isAwaitingDecision, useInbox } from '../api/get-inbox';
import { InboxList } from '../components/inbox-list';

/** The inspector's review inbox: summaries sent to them across their projects, awaiting ones first. */
export function InboxPage() {
  useDocumentTitle('Review inbox');
  const inbox = useInbox();
  const items = [...(inbox.data ?? [])].sort((a, b) => b.review.receivedAt.localeCompare(a.review.receivedAt));
  const waiting = items.filter(isAwaitingDecision);
  const rest = items.filter((i) => !isAwaitingDecision(i));
  return (
    <>
      <PageHeader title="Review inbox" subtitle="Calculation summaries sent to you for review, across your projects." />
      {inbox.isPending ? <Loading label="Loading your inbox…" /> : null}
      {inbox.isError ? <ErrorView error={inbox.error} onRetry={() => void inbox.refetch()} what="your inbox" /> : null}
      {inbox.data ? (
        <div className="flex flex-col gap-6">
          <Section title={`Awaiting your decision (${waiting.length})`}>
            <InboxList items={waiting} label="Awaiting your decision" empty="Nothing is waiting for you." />
          </Section>
          <Section title={`Decided or superseded (${rest.length})`}>
            <InboxList items={rest} label="Decided or superseded" empty="No decided reviews yet." />
          </Section>
        </div>
      ) : null}
    </>
  );
}
