import { Link } from 'react-router-dom';
import { formatDateTime } from '../../../lib/labels';
import type { InboxItem } from '../../../shared/api/summaries';
import { ReviewStatusMark } from '../../reviews/components/review-status';
import { DownloadPdfLink } from '../../summaries/components/summary-status';
import { summaryPaths } from '../../summaries/paths';

function SummaryState({ item }: { item: InboxItem }) {
  const s = item.summary;
  if (!s) return <span className="text-sm text-ink-soft">No PDF yet</span>;
  if (s.status === 'ready') return <DownloadPdfLink summary={s} label={`Download the PDF (${s.pageCount ?? '?'} page(s))`} />;
  if (s.status === 'pending') return <span className="text-sm">The PDF is being made…</span>;
  return <span className="text-sm text-fault">The PDF could not be made: {s.error ?? 'no reason given'}</span>;
}

function InboxRow({ item }: { item: InboxItem }) {
  const { review, project } = item;
  const title = `${project.name} · ${review.systemName} · revision ${review.revisionNumber}`;
  return (
    <li className="rounded-md border-2 border-rule bg-surface px-4 py-3" data-testid="inbox-item" aria-label={title}>
      <div className="flex flex-wrap items-start justify-between gap-3">
        <div>
          <p className="text-lg font-semibold">
            <Link to={item.viewPath}>{title}</Link>
          </p>
          <p className="text-sm text-ink-soft">
            {project.address || 'No address given'} · received {formatDateTime(review.receivedAt)}
            {review.sentBy ? ` from ${review.sentBy}` : ''}
          </p>
          {review.revisionStatus === 'superseded' ? (
            <p className="mt-1 text-sm">A newer revision has superseded this one{review.status === 'received' ? '; it can no longer be decided' : ''}.</p>
          ) : null}
        </div>
        <ReviewStatusMark status={review.status} />
      </div>
      <div className="mt-3 flex flex-wrap items-center gap-3">
        <SummaryState item={item} />
        <Link to={item.viewPath} className="font-semibold">
          Read the result{review.status === 'received' && review.revisionStatus === 'issued' ? ' and review' : ''}
        </Link>
        <Link to={summaryPaths.revisionSummary.getHref(review.projectId, review.systemId, review.revisionId)}>Summary and reviews</Link>
      </div>
    </li>
  );
}

export function InboxList({ items, label, empty }: { items: readonly InboxItem[]; label: string; empty: string }) {
  if (items.length === 0) return <p className="text-ink-soft">{empty}</p>;
  return (
    <ul className="flex flex-col gap-2" aria-label={label}>
      {items.map((item) => (
        <InboxRow key={item.review.id} item={item} />
      ))}
    </ul>
  );
}
