import { Link } from 'react-router-dom';
import { formatDateTime } from '../../../lib/labels';
import type { RevisionOrigin } from '../../../shared/api/systems';
import { fieldChangePaths } from '../../field-changes/paths';
import type { WalkIds } from '../draft/walk-context';

/** A revision made from an accepted field change says so: who proposed what, and when it was accepted. */
export function RevisionOriginNote({ origin, ids }: { origin: RevisionOrigin; ids: WalkIds }) {
  return (
    <section className="mb-4 rounded-md border-2 border-copper bg-surface p-3 text-sm" aria-label="Where this revision came from" data-testid="revision-origin">
      <p className="font-semibold">
        Made from{' '}
        <Link to={fieldChangePaths.view.getHref(ids.projectId, ids.systemId, origin.fieldChangeId)}>
          field change {origin.number} (“{origin.title}”)
        </Link>{' '}
        on revision {origin.baseRevisionNumber}: proposed by {origin.proposedBy} {formatDateTime(origin.proposedAt)}, accepted by {origin.acceptedBy}{' '}
        {formatDateTime(origin.acceptedAt)}.
      </p>
      {origin.comment ? <p className="mt-1">Designer’s comment: {origin.comment}</p> : null}
      <ul className="mt-1 list-disc pl-5">
        {origin.changes.map((c) => (
          <li key={c}>{c}</li>
        ))}
      </ul>
    </section>
  );
}
