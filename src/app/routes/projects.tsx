import { Link } from 'react-router-dom';
import { ErrorView } from '../../components/errors/error-view';
import { Loading } from '../../components/ui/loading';
import { PageHeader } from '../../components/ui/page-header';
import { useCurrentUser } from '../../features/auth/api/use-current-user';
import { useProjects } from '../../features/projects/api/get-projects';
import { ProjectsList } from '../../features/projects/components/projects-list';
import { canCreateProject } from '../../features/projects/permissions';
import { useDocumentTitle } from '../../hooks/use-document-title';
import { paths } from '../paths';

export function ProjectsRoute() {
  useDocumentTitle('Projects');
  const user = useCurrentUser();
  const projects = useProjects();

  return (
    <>
      <PageHeader
        title="Projects"
        subtitle={user.isAdmin ? 'Every project: administrators see all of them, to manage their members.' : 'The buildings you are a member of.'}
        actions={
          canCreateProject(user) ? (
            <Link
              to={paths.newProject.getHref()}
              className="inline-flex items-center rounded-md border-2 border-standpipe bg-standpipe px-4 py-2 text-sm font-semibold text-paper no-underline hover:bg-standpipe-strong hover:text-paper"
            >
              New project
            </Link>
          ) : null
        }
      />
      {projects.isPending ? <Loading label="Loading projects…" /> : null}
      {projects.isError ? <ErrorView error={projects.error} onRetry={() => void projects.refetch()} what="your projects" /> : null}
      {projects.data ? <ProjectsList projects={projects.data} /> : null}
    </>
  );
}
