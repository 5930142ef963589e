import { Link } from 'react-router-dom';
import { ErrorView } from '../../../components/errors/error-view';
import { Section } from '../../../components/ui/card';
import { Loading } from '../../../components/ui/loading';
import { resultViewPath } from '../../../shared/api/summaries';
import type { Review } from '../../../shared/api/summaries';
import { useProjectReviews } from '../api/get-project-reviews';
import { ReviewCard } from './review-card';
import { reviewStatusWord } from './review-status';

function tally(reviews: readonly Review[]): string {
  const counts = { received: 0, accepted: 0, returned: 0 };
  for (const r of reviews) counts[r.status] += 1;
  return `${counts.accepted} accepted · ${counts.returned} returned · ${counts.received} awaiting a decision`;
}

/**
 * The project page's reviews: every inspector's outcome and comments across the project's
 * revisions, newest revision first, each linked to the revision's result.
 */
export function ProjectReviewsPanel({ projectId }: { projectId: string }) {
  const reviews = useProjectReviews(projectId);
  return (
    <Section title="Reviews">
      {reviews.isPending ? <Loading label="Loading the reviews…" /> : null}
      {reviews.isError ? <ErrorView error={reviews.error} onRetry={() => void reviews.refetch()} what="the reviews" /> : null}
      {reviews.data && reviews.data.length === 0 ? <p className="text-ink-soft">No summary of this project has been sent for review yet.</p> : null}
      {reviews.data && reviews.data.length > 0 ? (
        <>
          <p className="mb-3 text-sm text-ink-soft" data-testid="reviews-tally">
            {tally(reviews.data)}
          </p>
          <ul className="flex flex-col gap-3" aria-label="Reviews in this project">
            {[...reviews.data]
              .sort((a, b) => (b.decidedAt ?? b.receivedAt).localeCompare(a.decidedAt ?? a.receivedAt))
              .map((r) => (
                <li key={r.id}>
                  <ReviewCard
                    review={r}
                    heading={
                      <Link
                        to={resultViewPath(r.projectId, r.systemId, r.revisionId)}
                        aria-label={`${r.systemName}, revision ${r.revisionNumber}: ${reviewStatusWord(r.status)} by ${r.reviewer.name}`}
                      >
                        {r.systemName} · revision {r.revisionNumber}
                        {r.revisionStatus === 'superseded' ? ' (superseded)' : ''}
                      </Link>
                    }
                  />
                </li>
              ))}
          </ul>
        </>
      ) : null}
    </Section>
  );
}
