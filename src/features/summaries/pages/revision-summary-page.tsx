import { Link, useParams } from 'react-router-dom';
import { paths } from '../../../app/paths';
import { ErrorView } from '../../../components/errors/error-view';
import { Badge } from '../../../components/ui/badge';
import { Loading } from '../../../components/ui/loading';
import { PageHeader } from '../../../components/ui/page-header';
import { useDocumentTitle } from '../../../hooks/use-document-title';
import { resultViewPath } from '../../../shared/api/summaries';
import { useProject } from '../../projects/api/get-project';
import { useRevision } from '../../systems/api/get-revision';
import { useSystem } from '../../systems/api/get-system';
import { walkPaths } from '../../walk/paths';
import { RevisionSummaryPanel } from '../components/revision-summary-panel';

const STATUS_TONE = { draft: 'standpipe', issued: 'sound', superseded: 'neutral' } as const;

/** One revision's summary on a page of its own: the PDF, its sending, the reviews and the review form. */
export function RevisionSummaryPage() {
  const { projectId = '', systemId = '', revisionId = '' } = useParams();
  const project = useProject(projectId);
  const system = useSystem(projectId, systemId);
  const revision = useRevision(projectId, systemId, revisionId);
  useDocumentTitle(system.data && revision.data ? `${system.data.system.name} · revision ${revision.data.number} · summary` : 'Summary');

  const failed = [project, system, revision].find((q) => q.isError);
  if (failed) return <ErrorView error={failed.error} onRetry={() => void failed.refetch()} what="this summary" />;
  if (!project.data || !system.data || !revision.data) return <Loading label="Loading the summary…" />;
  const r = revision.data;

  return (
    <>
      <p className="text-sm">
        <Link to={paths.project.getHref(projectId)}>{project.data.project.name}</Link>
        <span aria-hidden="true"> › </span>
        <Link to={walkPaths.system.getHref(projectId, systemId)}>{system.data.system.name}</Link>
      </p>
      <PageHeader
        title={`${system.data.system.name}: summary of revision ${r.number}`}
        subtitle={
          <span className="flex flex-wrap items-center gap-2">
            <Badge tone={STATUS_TONE[r.status]}>
              Revision {r.number} · {r.status}
            </Badge>
            <Link to={resultViewPath(projectId, systemId, revisionId)}>Read the result</Link>
          </span>
        }
      />
      <RevisionSummaryPanel projectId={projectId} systemId={systemId} revisionId={revisionId} revisionStatus={r.status} myRole={project.data.project.myRole} />
    </>
  );
}
