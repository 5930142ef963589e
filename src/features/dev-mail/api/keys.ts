/** Query keys of the development mail page; every key starts with `dev-mail`. */
export const devMailKeys = {
  all: ['dev-mail'] as const,
  lists: () => [...devMailKeys.all, 'list'] as const,
  list: (to: string) => [...devMailKeys.lists(), to] as const,
};
