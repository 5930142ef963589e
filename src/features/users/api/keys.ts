/** Query keys of the users feature; every key starts with `users`. */
export const userKeys = {
  all: ['users'] as const,
  lists: () => [...userKeys.all, 'list'] as const,
};
