/** Query keys for the `dev/mail` resource (messages caught by the local mail sink). */
export const devMailKeys = {
  all: ['dev-mail'] as const,
  lists: () => [...devMailKeys.all, 'list'] as const,
  list: () => [...devMailKeys.lists(), {}] as const,
};
