import { useMutation, useQueryClient } from '@tanstack/react-query';
import { UpdateUserBody, UserResponse } from '../../../shared/api/users';
import { api } from '../../../lib/api-client';
import { userKeys } from './keys';

/** Changes to an account (disable/enable, administrator flag, role) carry the version they were made on. */
export const updateUserInputSchema = UpdateUserBody;
export type UpdateUserInput = UpdateUserBody;

export async function updateUser({ userId, body }: { userId: string; body: UpdateUserInput }) {
  const { user } = await api.patch(`/api/users/${encodeURIComponent(userId)}`, updateUserInputSchema.parse(body), UserResponse);
  return user;
}

export function useUpdateUser() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateUser,
    // Refetch on failure too: a 409 means the list on screen is out of date.
    onSettled: () => queryClient.invalidateQueries({ queryKey: userKeys.lists() }),
  });
}
