import type { Review } from '../../../shared/api/summaries';
import { cx } from '../../../components/ui/cx';

type Status = Review['status'];

const WORDS: Record<Status, string> = { received: 'Awaiting decision', accepted: 'Accepted', returned: 'Returned with comments' };

/**
 * The outcome of a review said by a word and a shape (a disc with a tick, a square with a
 * return arrow, an open circle while waiting); the colour only repeats them.
 */
function Shape({ status }: { status: Status }) {
  if (status === 'accepted') {
    return (
      <svg width="16" height="16" viewBox="0 0 16 16" aria-hidden="true" className="inline-block shrink-0 text-sound">
        <circle cx="8" cy="8" r="7" fill="currentColor" />
        <path d="M4.5 8.3 7 10.8 11.6 5.6" fill="none" stroke="white" strokeWidth="2" strokeLinecap="round" strokeLinejoin="round" />
      </svg>
    );
  }
  if (status === 'returned') {
    return (
      <svg width="16" height="16" viewBox="0 0 16 16" aria-hidden="true" className="inline-block shrink-0 text-caution">
        <rect x="1" y="1" width="14" height="14" rx="2" fill="currentColor" />
        <path d="M11.5 11V8.5a2 2 0 0 0-2-2H5M7 4.3 4.6 6.5 7 8.7" fill="none" stroke="white" strokeWidth="1.8" strokeLinecap="round" strokeLinejoin="round" />
      </svg>
    );
  }
  return (
    <svg width="16" height="16" viewBox="0 0 16 16" aria-hidden="true" className="inline-block shrink-0 text-standpipe">
      <circle cx="8" cy="8" r="6.5" fill="none" stroke="currentColor" strokeWidth="2" />
      <path d="M8 4.5V8l2.2 1.6" fill="none" stroke="currentColor" strokeWidth="1.8" strokeLinecap="round" />
    </svg>
  );
}

export function ReviewStatusMark({ status, className }: { status: Status; className?: string }) {
  return (
    <span
      className={cx(
        'inline-flex items-center gap-1.5 font-semibold',
        status === 'accepted' ? 'text-sound' : status === 'returned' ? 'text-caution' : 'text-standpipe',
        className,
      )}
      data-review-status={status}
    >
      <Shape status={status} />
      <span>{WORDS[status]}</span>
    </span>
  );
}

export const reviewStatusWord = (status: Status) => WORDS[status];
