import { useNavigate } from 'react-router-dom';
import { Alert } from '../../components/ui/alert';
import { PageHeader } from '../../components/ui/page-header';
import { Section } from '../../components/ui/card';
import { useCurrentUser } from '../../features/auth/api/use-current-user';
import { CreateProjectForm } from '../../features/projects/components/create-project-form';
import { canCreateProject } from '../../features/projects/permissions';
import { useDocumentTitle } from '../../hooks/use-document-title';
import { paths } from '../paths';

export function NewProjectRoute() {
  useDocumentTitle('New project');
  const user = useCurrentUser();
  const navigate = useNavigate();

  return (
    <>
      <PageHeader title="New project" subtitle="One building. You become its designer and can add the other members." />
      {canCreateProject(user) ? (
        <Section title="Project details">
          <CreateProjectForm onCreated={(project) => navigate(paths.project.getHref(project.id))} onCancel={() => navigate(paths.projects.getHref())} />
        </Section>
      ) : (
        <Alert tone="caution" title="Designer accounts create projects">
          Your account cannot create projects. Ask a designer to add you to their project.
        </Alert>
      )}
    </>
  );
}
