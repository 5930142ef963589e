import { Link } from 'react-router-dom';
import { ErrorView } from '../../../components/errors/error-view';
import { Loading } from '../../../components/ui/loading';
import { formatDateTime } from '../../../lib/labels';
import type { FieldChangeSummary } from '../../../shared/api/fieldChanges';
import { fieldChangePaths } from '../paths';
import { FieldChangeStatusBadge } from './status-badge';

/** Field changes as a table: number, system, what, by whom, state, last change. */
export function FieldChangesTable({ fieldChanges, showSystem }: { fieldChanges: FieldChangeSummary[]; showSystem: boolean }) {
  if (fieldChanges.length === 0) return <p className="text-ink-soft">No field changes.</p>;
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-sm" data-testid="field-changes-table">
        <thead>
          <tr className="border-b-2 border-rule text-left">
            <th scope="col" className="py-1 pr-2">
              Field change
            </th>
            {showSystem ? (
              <th scope="col" className="py-1 pr-2">
                System
              </th>
            ) : null}
            <th scope="col" className="py-1 pr-2">
              On revision
            </th>
            <th scope="col" className="py-1 pr-2">
              By
            </th>
            <th scope="col" className="py-1 pr-2">
              State
            </th>
            <th scope="col" className="py-1 pr-2">
              Changes
            </th>
            <th scope="col" className="py-1">
              Updated
            </th>
          </tr>
        </thead>
        <tbody>
          {fieldChanges.map((fc) => (
            <tr key={fc.id} className="border-b border-rule">
              <th scope="row" className="py-1 pr-2 text-left font-normal">
                <Link to={fieldChangePaths.view.getHref(fc.projectId, fc.systemId, fc.id)}>
                  {fc.number}. {fc.title}
                </Link>
              </th>
              {showSystem ? <td className="py-1 pr-2">{fc.systemName}</td> : null}
              <td className="py-1 pr-2">{fc.baseRevision.number}</td>
              <td className="py-1 pr-2">{fc.createdBy.name}</td>
              <td className="py-1 pr-2">
                <FieldChangeStatusBadge status={fc.status} />
              </td>
              <td className="py-1 pr-2">
                {fc.changes.length} · {fc.attachmentCount} file{fc.attachmentCount === 1 ? '' : 's'}
              </td>
              <td className="py-1">{formatDateTime(fc.updatedAt)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export function FieldChangesQueryView({
  query,
  showSystem,
}: {
  query: { data?: FieldChangeSummary[]; isError: boolean; error: unknown; refetch: () => unknown };
  showSystem: boolean;
}) {
  if (query.isError) return <ErrorView error={query.error} onRetry={() => void query.refetch()} what="the field changes" />;
  if (!query.data) return <Loading label="Loading field changes…" />;
  return <FieldChangesTable fieldChanges={query.data} showSystem={showSystem} />;
}
