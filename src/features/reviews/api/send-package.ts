import { useMutation, useQueryClient } from '@tanstack/react-query';
import { SendPackageBody, SendPackageResponse } from '../../../shared/api/reviewLoop';
import { api } from '../../../lib/api-client';
import { reviewKeys } from './keys';

const e = encodeURIComponent;
export const packageUrl = (projectId: string) => `/api/projects/${e(projectId)}/submissions`;

/** The form's schema is the API's own. */
export const sendPackageInputSchema = SendPackageBody;

/** One submission for a building: the chosen systems' issued revisions to the chosen inspectors, one e-mail each. */
export async function sendPackage({ projectId, body }: { projectId: string; body: SendPackageBody }) {
  return api.post(packageUrl(projectId), body, SendPackageResponse);
}

export function useSendPackage() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: sendPackage, onSuccess: () => queryClient.invalidateQueries({ queryKey: reviewKeys.all }) });
}
