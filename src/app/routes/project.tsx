import { useState } from 'react';
import { useParams } from 'react-router-dom';
import { useQueryClient } from '@tanstack/react-query';
import { ErrorView } from '../../components/errors/error-view';
import { Badge } from '../../components/ui/badge';
import { ReturnedProjectMark } from '../../features/reviews/components/returned-marker';
import { Button } from '../../components/ui/button';
import { Section } from '../../components/ui/card';
import { Loading } from '../../components/ui/loading';
import { PageHeader } from '../../components/ui/page-header';
import { useMembers } from '../../features/members/api/get-members';
import type { MemberMutationConfig } from '../../features/members/api/mutation-config';
import { AddMemberForm } from '../../features/members/components/add-member-form';
import { MembersList } from '../../features/members/components/members-list';
import { useProject } from '../../features/projects/api/get-project';
import { projectKeys } from '../../features/projects/api/keys';
import { ArchiveControl } from '../../features/projects/components/archive-control';
import { EditProjectForm } from '../../features/projects/components/edit-project-form';
import { ProjectDetails } from '../../features/projects/components/project-details';
import { useCurrentUser } from '../../features/auth/api/use-current-user';
import { canEditProject, canManageMembers } from '../../features/projects/permissions';
import { useDocumentTitle } from '../../hooks/use-document-title';
import { myRoleLabel } from '../../lib/labels';
import type { Project } from '../../shared/api/projects';
import { ProjectSystemsPanel } from '../../features/systems/components/project-systems-panel';
import { ProjectReviewsPanel } from '../../features/reviews/components/project-reviews-panel';
import { SendPackagePanel } from '../../features/reviews/components/send-package-panel';
import { ProjectAuditPanel } from '../../features/summaries/components/project-audit-panel';
import { Link } from 'react-router-dom';
import { catalogPaths } from '../../features/catalog/paths';
import { ProjectFieldChangesPanel } from '../../features/field-changes/components/project-field-changes-panel';

function MembersSection({ project, canManage, config }: { project: Project; canManage: boolean; config: MemberMutationConfig }) {
  const members = useMembers(project.id);
  return (
    <Section title="Members">
      {members.isPending ? <Loading label="Loading members…" /> : null}
      {members.isError ? <ErrorView error={members.error} onRetry={() => void members.refetch()} what="the members" /> : null}
      {members.data ? <MembersList projectId={project.id} members={members.data} canManage={canManage} config={config} /> : null}
      {canManage ? (
        <div className="mt-6 border-t-2 border-rule pt-5">
          <AddMemberForm projectId={project.id} config={config} />
        </div>
      ) : null}
    </Section>
  );
}

export function ProjectRoute() {
  const { projectId = '' } = useParams();
  const query = useProject(projectId);
  const queryClient = useQueryClient();
  const user = useCurrentUser();
  const [editing, setEditing] = useState(false);
  useDocumentTitle(query.data?.project.name ?? 'Project');

  if (query.isPending) return <Loading label="Loading the project…" />;
  if (query.isError) return <ErrorView error={query.error} onRetry={() => void query.refetch()} what="this project" />;

  const { project } = query.data;
  const canEdit = canEditProject(project);
  const canManage = canManageMembers(project, user);
  const reload = async () => (await query.refetch()).data?.project;
  // A change of membership may change the person's own role here, so the project is fetched again.
  const memberConfig: MemberMutationConfig = {
    onChanged: () =>
      Promise.all([
        queryClient.invalidateQueries({ queryKey: projectKeys.detail(project.id) }),
        queryClient.invalidateQueries({ queryKey: projectKeys.lists() }),
      ]),
  };

  return (
    <>
      <PageHeader
        title={project.name}
        subtitle={
          <span className="flex flex-wrap items-center gap-2">
            <span>Your role:</span>
            <Badge tone={project.myRole ? 'standpipe' : 'neutral'}>{myRoleLabel(project.myRole)}</Badge>
            {project.archived ? <Badge tone="caution">Archived</Badge> : null}
            <ReturnedProjectMark count={project.returnedSystems} myRole={project.myRole} />
          </span>
        }
      />
      {!canEdit ? (
        <p className="mb-6 max-w-prose text-ink-soft" data-testid="read-only-note">
          {canManage
            ? 'As an administrator you can manage the members of this project. Its designers change the details.'
            : 'You can read this project. Its designers change the details and the members.'}
        </p>
      ) : null}
      <div className="flex flex-col gap-6">
        <Section
          title="Details"
          actions={
            canEdit && !editing ? (
              <Button variant="secondary" onClick={() => setEditing(true)}>
                Edit details
              </Button>
            ) : null
          }
        >
          {editing ? (
            <EditProjectForm project={project} reload={reload} onSaved={() => setEditing(false)} onCancel={() => setEditing(false)} />
          ) : (
            <ProjectDetails project={project} />
          )}
        </Section>
        {project.myRole ? <ProjectSystemsPanel projectId={project.id} canEdit={project.myRole === 'designer' && !project.archived} /> : null}
        {project.myRole ? <ProjectFieldChangesPanel projectId={project.id} /> : null}
        {project.myRole === 'designer' && !project.archived ? <SendPackagePanel projectId={project.id} /> : null}
        {project.myRole ? <ProjectReviewsPanel projectId={project.id} /> : null}
        {project.myRole ? (
          <Section title="Project catalog">
            <p className="text-ink-soft">
              This project’s own pipe materials, fitting types, fixture types and device templates, with their sources.{' '}
              <Link className="font-semibold text-standpipe underline" to={catalogPaths.projectCatalog.getHref(project.id)}>
                Open the project catalog
              </Link>
            </p>
          </Section>
        ) : null}
        <MembersSection project={project} canManage={canManage} config={memberConfig} />
        {project.myRole === 'designer' ? <ProjectAuditPanel projectId={project.id} /> : null}
        {canEdit ? (
          <Section title="Archive">
            <ArchiveControl project={project} reload={() => query.refetch()} />
          </Section>
        ) : null}
      </div>
    </>
  );
}
