import type { PrintListQuery } from '@toneledger/common/schemas/catalogue';

/** Query keys for the `condition-reports` resource. Lists are per print. */
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

export interface ImageListQuery {
  includeWithdrawn?: boolean;
}

/** Query keys for the `images` resource. Lists are per print; fixity history sits under an image. */
export const imageKeys = {
  all: ['images'] as const,
  lists: () => [...imageKeys.all, 'list'] as const,
  list: (printId: string, query: ImageListQuery = {}) => [...imageKeys.lists(), { printId, ...query }] as const,
  details: () => [...imageKeys.all, 'detail'] as const,
  detail: (id: string) => [...imageKeys.details(), id] as const,
  fixity: (id: string) => [...imageKeys.detail(id), 'fixity'] as const,
};

export interface AlignmentQuery {
  baseImageId: string;
  otherImageId: string;
}

/** Query keys for the `image-alignments` resource: one saved alignment per pair of images. */
export const alignmentKeys = {
  all: ['image-alignments'] as const,
  details: () => [...alignmentKeys.all, 'detail'] as const,
  detail: (query: AlignmentQuery) => [...alignmentKeys.details(), query] as const,
};

/** Query keys for fixity alerts (`/api/admin/fixity`). */
export const fixityKeys = {
  all: ['fixity'] as const,
  alerts: () => [...fixityKeys.all, 'alerts'] as const,
};

/** Query keys for the `prints` resource, as this feature reads it (the same values the catalogue uses). */
export const printKeys = {
  all: ['prints'] as const,
  lists: () => [...printKeys.all, 'list'] as const,
  list: (query: Pick<PrintListQuery, 'q' | 'pageSize'>) => [...printKeys.lists(), query] as const,
  details: () => [...printKeys.all, 'detail'] as const,
  detail: (id: string) => [...printKeys.details(), id] as const,
  timeline: (id: string) => [...printKeys.detail(id), 'timeline'] as const,
};
