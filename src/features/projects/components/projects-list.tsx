import { Link } from 'react-router-dom';
import { paths } from '../../../app/paths';
import { Badge } from '../../../components/ui/badge';
import { ReturnedProjectMark } from '../../reviews/components/returned-marker';
import { formatDate, myRoleLabel } from '../../../lib/labels';
import type { Project } from '../../../shared/api/projects';

function ProjectRow({ project }: { project: Project }) {
  return (
    <li className="flex flex-wrap items-center justify-between gap-3 rounded-md border-2 border-rule bg-surface px-4 py-3">
      <div>
        <Link to={paths.project.getHref(project.id)} className="text-lg font-semibold">
          {project.name}
        </Link>
        <p className="text-sm text-ink-soft">{project.address || 'No address given'}</p>
      </div>
      <div className="flex items-center gap-2 text-sm">
        <span className="text-ink-muted">Changed {formatDate(project.updatedAt)}</span>
        <Badge tone={project.myRole ? 'standpipe' : 'neutral'}>
          <span className="sr-only">Your role: </span>
          {myRoleLabel(project.myRole)}
        </Badge>
        {project.archived ? <Badge tone="caution">Archived</Badge> : null}
        <ReturnedProjectMark count={project.returnedSystems} myRole={project.myRole} />
      </div>
    </li>
  );
}

/** The person's projects: active ones first, archived ones in their own list below. */
export function ProjectsList({ projects }: { projects: readonly Project[] }) {
  const active = projects.filter((p) => !p.archived);
  const archived = projects.filter((p) => p.archived);
  return (
    <div className="flex flex-col gap-8">
      <section aria-labelledby="active-projects">
        <h2 id="active-projects" className="mb-3 text-xl">
          Active projects ({active.length})
        </h2>
        {active.length === 0 ? (
          <p className="text-ink-soft">No active projects. A designer adds you to a project, or you create one.</p>
        ) : (
          <ul className="flex flex-col gap-2" aria-label="Active projects">
            {active.map((project) => (
              <ProjectRow key={project.id} project={project} />
            ))}
          </ul>
        )}
      </section>
      {archived.length > 0 ? (
        <section aria-labelledby="archived-projects">
          <h2 id="archived-projects" className="mb-3 text-xl">
            Archived projects ({archived.length})
          </h2>
          <ul className="flex flex-col gap-2" aria-label="Archived projects">
            {archived.map((project) => (
              <ProjectRow key={project.id} project={project} />
            ))}
          </ul>
        </section>
      ) : null}
    </div>
  );
}
