import type { z } from 'zod';
import type { leadersQuerySchema } from '@toneledger/common/schemas/measurements';

/** The leaders list's query as the page reads it from its URL (defaults filled in). */
export type LeadersQuery = z.infer<typeof leadersQuerySchema>;

/**
 * Query keys for the `measurements` resource: the collection-wide list of spots changing most
 * (`measurementsApi.leaders`) and, per print, its spots with their analysis and sessions
 * (`measurementsApi.forPrint`). Prints and images are read through `@/lib/prints-api` and `@/lib/images-api`.
 */
export const measurementKeys = {
  all: ['measurements'] as const,
  lists: () => [...measurementKeys.all, 'list'] as const,
  list: (query: LeadersQuery) => [...measurementKeys.lists(), query] as const,
  details: () => [...measurementKeys.all, 'detail'] as const,
  /** One print's measurements (its spots, their analysis and its sessions). */
  detail: (printId: string) => [...measurementKeys.details(), printId] as const,
};

/** Query keys for the `measurement-spots` resource. */
export const spotKeys = {
  all: ['measurement-spots'] as const,
  details: () => [...spotKeys.all, 'detail'] as const,
  detail: (id: string) => [...spotKeys.details(), id] as const,
};

/** Query keys for the `measurement-sessions` resource. */
export const sessionKeys = {
  all: ['measurement-sessions'] as const,
  details: () => [...sessionKeys.all, 'detail'] as const,
  detail: (id: string) => [...sessionKeys.details(), id] as const,
};
