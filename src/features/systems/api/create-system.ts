import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { CreateSystemBody, CreateSystemResponse } from '../../../shared/api/systems';
import { api } from '../../../lib/api-client';
import { systemKeys } from './keys';
import { systemUrls } from './urls';

/**
 * The new-system form: the API's body without the imported document. An empty temperature
 * field means "the usual one for the service" (the server fills it in).
 */
export const createSystemInputSchema = CreateSystemBody.omit({ document: true }).extend({
  waterTemperature: z.preprocess(
    (v) => (v === '' || v === null || (typeof v === 'number' && Number.isNaN(v)) ? undefined : typeof v === 'string' ? Number(v) : v),
    CreateSystemBody.shape.waterTemperature,
  ),
});
export type CreateSystemInput = z.input<typeof CreateSystemBody>;

export type CreateSystemVariables = { projectId: string; body: CreateSystemInput };

export function createSystem({ projectId, body }: CreateSystemVariables) {
  return api.post(systemUrls.list(projectId), body, CreateSystemResponse);
}

export function useCreateSystem() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createSystem,
    onSuccess: (_data, { projectId }) => queryClient.invalidateQueries({ queryKey: systemKeys.list(projectId) }),
  });
}
