/** Query keys of the inbox feature; every key starts with `inbox`. */
export const inboxKeys = {
  all: ['inbox'] as const,
  list: () => [...inboxKeys.all, 'list'] as const,
};
