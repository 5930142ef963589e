import type { ReactNode } from 'react';
import { formatDateTime } from '../../../lib/labels';
import type { Review } from '../../../shared/api/summaries';
import { describeItem } from './review-items';
import type { ItemCatalog } from './review-items';
import { ReviewStatusMark } from './review-status';

/** One inspector's review: who, the outcome, when, the overall comment and the comments per item. */
export function ReviewCard({ review, catalog, heading, extra }: { review: Review; catalog?: ItemCatalog; heading?: ReactNode; extra?: ReactNode }) {
  const decided = review.status !== 'received';
  return (
    <article className="rounded-md border-2 border-rule bg-surface p-4" data-testid={`review-${review.id}`} aria-label={`Review by ${review.reviewer.name}`}>
      <div className="flex flex-wrap items-baseline justify-between gap-3">
        <div>
          {heading ? <div className="font-semibold">{heading}</div> : null}
          <p className="text-sm text-ink-soft">
            Inspector <span className="font-semibold text-ink">{review.reviewer.name}</span> ({review.reviewer.email}) · received{' '}
            {formatDateTime(review.receivedAt)}
            {review.sentBy ? `, sent by ${review.sentBy}` : ''}
          </p>
        </div>
        <p className="flex flex-wrap items-center gap-2">
          <ReviewStatusMark status={review.status} />
          {decided && review.decidedAt ? <span className="text-sm text-ink-soft">on {formatDateTime(review.decidedAt)}</span> : null}
        </p>
      </div>
      {review.status === 'received' && review.revisionStatus === 'superseded' ? (
        <p className="mt-2 text-sm text-ink-soft">Revision {review.revisionNumber} has been superseded, so this review can no longer be decided.</p>
      ) : null}
      {review.comment ? (
        <div className="mt-3">
          <p className="text-sm font-semibold">Comment</p>
          <p className="whitespace-pre-wrap">{review.comment}</p>
        </div>
      ) : null}
      {review.items.length > 0 ? (
        <div className="mt-3">
          <p className="text-sm font-semibold">Comments on items ({review.items.length})</p>
          <ul className="mt-1 flex flex-col gap-2" aria-label={`Comments on items by ${review.reviewer.name}`}>
            {review.items.map((item, index) => (
              <li key={index} className="rounded border-l-4 border-copper bg-paper px-3 py-2" data-testid="review-item">
                <p className="text-sm font-semibold">{describeItem(item.itemType, item.itemId, catalog)}</p>
                <p className="whitespace-pre-wrap">{item.comment}</p>
                {item.reply ? (
                  <p className="mt-1 text-sm" data-testid="review-item-reply">
                    <span className="font-semibold">Designer’s reply{item.reply.by ? ` (${item.reply.by})` : ''}: </span>
                    <span className="whitespace-pre-wrap">{item.reply.text}</span>
                  </p>
                ) : null}
              </li>
            ))}
          </ul>
        </div>
      ) : null}
      {decided && !review.comment && review.items.length === 0 ? <p className="mt-2 text-sm text-ink-soft">No comments.</p> : null}
      {review.answeredIn ? (
        <p className="mt-2 text-sm text-ink-soft">Answered by revision {review.answeredIn.revisionNumber}; the replies are frozen.</p>
      ) : null}
      {review.acceptanceRecord ? (
        <p className="mt-3">
          <a href={review.acceptanceRecord.url} download={review.acceptanceRecord.fileName} className="font-semibold" data-testid="acceptance-record-link">
            Download the acceptance record (PDF)
          </a>
        </p>
      ) : null}
      {extra}
    </article>
  );
}
