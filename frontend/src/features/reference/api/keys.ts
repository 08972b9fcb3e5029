/**
 * Query keys of this feature's own resources. The five reference lists (makers, papers, recipes,
 * locations, enclosures) use the shared keys in `@/lib/reference-api`.
 */
export const settingsKeys = {
  all: ['settings'] as const,
  catalogue: () => [...settingsKeys.all, 'catalogue'] as const,
};
