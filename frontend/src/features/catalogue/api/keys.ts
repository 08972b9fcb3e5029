/** Query keys for the `imports` resource (CSV import jobs). Prints: `printKeys` in `@/lib/prints-api`. */
export const importKeys = {
  all: ['imports'] as const,
  details: () => [...importKeys.all, 'detail'] as const,
  detail: (id: string) => [...importKeys.details(), id] as const,
};
