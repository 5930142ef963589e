import { Badge } from '../../../components/ui/badge';
import type { ProjectRole } from '../../../shared/api/projects';
import type { ReturnedMarker } from '../../../shared/api/systems';

/** The designer reads "Returned to you"; other members read who it went back to. */
const words = (myRole: ProjectRole | null) => (myRole === 'designer' ? 'Returned to you' : 'Returned to the designer');

/**
 * "Returned to you" on a system: the newest review of its issued revision is Returned and no newer
 * revision is issued yet. Says how many of the review's comments are answered.
 */
export function ReturnedSystemMark({ marker, myRole }: { marker: ReturnedMarker | null | undefined; myRole: ProjectRole | null }) {
  if (!marker) return null;
  return (
    <span className="inline-flex flex-wrap items-center gap-2" data-testid="returned-marker">
      <Badge tone="caution">{words(myRole)}</Badge>
      <span className="text-sm text-ink-soft">
        revision {marker.revisionNumber} by {marker.reviewerName}
        {marker.comments > 0 ? ` · ${marker.answered} of ${marker.comments} comment${marker.comments === 1 ? '' : 's'} answered` : ''}
      </span>
    </span>
  );
}

/** On a project: how many of its systems are returned (nothing when none). */
export function ReturnedProjectMark({ count, myRole }: { count: number | undefined; myRole: ProjectRole | null }) {
  if (!count) return null;
  return (
    <span data-testid="returned-project-marker">
      <Badge tone="caution">
        {words(myRole)}
        {count > 1 ? ` (${count} systems)` : ''}
      </Badge>
    </span>
  );
}
