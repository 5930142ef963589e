import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { PermitFormFields, ProjectResponse, UpdateProjectBody } from '../../../shared/api/projects';
import type { Project } from '../../../shared/api/projects';
import { api } from '../../../lib/api-client';
import { projectKeys } from './keys';
import { systemKeys } from '../../systems/api/keys';
import type { getProject } from './get-project';

/**
 * The edit form's fields: the API's update body without `version` and `archived`, every field
 * present (the permit fields too). `version` is not a form field: the form sends the version it was opened with, so a
 * change made meanwhile by someone else answers 409 instead of being overwritten.
 */
export const updateProjectInputSchema = UpdateProjectBody.omit({ version: true, archived: true }).required().extend({ permit: PermitFormFields });
export type UpdateProjectInput = z.infer<typeof updateProjectInputSchema>;

export type UpdateProjectVariables = { projectId: string; body: UpdateProjectBody };

export async function updateProject({ projectId, body }: UpdateProjectVariables): Promise<Project> {
  const { project } = await api.patch(`/api/projects/${encodeURIComponent(projectId)}`, body, ProjectResponse);
  return project;
}

type ProjectDetail = Awaited<ReturnType<typeof getProject>>;

export function useUpdateProject() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateProject,
    onSuccess: (project) => {
      queryClient.setQueryData<ProjectDetail>(projectKeys.detail(project.id), (old) => (old ? { ...old, project } : old));
      return Promise.all([
        queryClient.invalidateQueries({ queryKey: projectKeys.detail(project.id) }),
        queryClient.invalidateQueries({ queryKey: projectKeys.lists() }),
        // a switch of the unit system converts the project's drafts on the server (systems service convertDrafts)
        queryClient.invalidateQueries({ queryKey: systemKeys.all }),
      ]);
    },
  });
}
