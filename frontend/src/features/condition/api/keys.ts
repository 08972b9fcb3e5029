import type { QueryIn } from '@toneledger/common/api/endpoint';
import type { imagesApi } from '@toneledger/common/api/images';

/**
 * Query keys for the `condition-reports` resource. Lists are per print. Prints and images are read
 * through `@/lib/prints-api` and `@/lib/images-api`.
 */
export const reportKeys = {
  all: ['condition-reports'] as const,
  lists: () => [...reportKeys.all, 'list'] as const,
  list: (printId: string) => [...reportKeys.lists(), { printId }] as const,
  details: () => [...reportKeys.all, 'detail'] as const,
  detail: (id: string) => [...reportKeys.details(), id] as const,
};

/** Query keys for the `condition-terms` resource (the deterioration vocabulary). */
export const termKeys = {
  all: ['condition-terms'] as const,
  lists: () => [...termKeys.all, 'list'] as const,
  list: (query: { all?: boolean }) => [...termKeys.lists(), query] as const,
};

/** Query keys for the `settings` resource; this feature reads the condition and catalogue sections. */
export const settingsKeys = {
  all: ['settings'] as const,
  condition: () => [...settingsKeys.all, 'condition'] as const,
};

export type AlignmentQuery = QueryIn<typeof imagesApi.alignment>;

/** Query keys for the `image-alignments` resource: one saved alignment per pair of images. */
export const alignmentKeys = {
  all: ['image-alignments'] as const,
  details: () => [...alignmentKeys.all, 'detail'] as const,
  detail: (query: AlignmentQuery) => [...alignmentKeys.details(), query] as const,
};

/** Query keys for fixity alerts (`fixityApi.alerts`). */
export const fixityKeys = {
  all: ['fixity'] as const,
  alerts: () => [...fixityKeys.all, 'alerts'] as const,
};
