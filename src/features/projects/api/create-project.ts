import { useMutation, useQueryClient } from '@tanstack/react-query';
import { CreateProjectBody, PermitFormFields, ProjectResponse } from '../../../shared/api/projects';
import { api } from '../../../lib/api-client';
import { projectKeys } from './keys';

/** The new-project form's schema: the API's own body, with every field present in the form. */
export const createProjectInputSchema = CreateProjectBody.required().extend({ permit: PermitFormFields });
export type CreateProjectInput = CreateProjectBody;

export async function createProject(input: CreateProjectInput) {
  const { project } = await api.post('/api/projects', input, ProjectResponse);
  return project;
}

export function useCreateProject() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createProject,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: projectKeys.lists() }),
  });
}
