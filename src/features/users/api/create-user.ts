import { useMutation, useQueryClient } from '@tanstack/react-query';
import { CreateUserBody, CreateUserResponse } from '../../../shared/api/users';
import { api } from '../../../lib/api-client';
import { userKeys } from './keys';

/** The new-user form's schema is the API's own. */
export const createUserInputSchema = CreateUserBody;
export type CreateUserInput = CreateUserBody;

/** Creates the account and its first invitation link, which is shown once to the administrator. */
export function createUser(input: CreateUserInput) {
  return api.post('/api/users', input, CreateUserResponse);
}

export function useCreateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createUser,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: userKeys.lists() }),
  });
}
