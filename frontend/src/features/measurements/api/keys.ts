import type { z } from 'zod';
import type { leadersQuerySchema } from '@toneledger/common/schemas/measurements';

export type LeadersQuery = z.infer<typeof leadersQuerySchema>;

/**
 * Query keys for the `measurements` resource: the collection-wide list of spots changing most
 * (`/api/measurements/leaders`) and, per print, its spots with their analysis and sessions
 * (`/api/prints/:id/measurements`).
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

export interface PrintSearchQuery {
  q: string;
  pageSize: number;
}

/** Query keys for the `prints` resource, as this feature reads it (the same values the catalogue uses). */
export const printKeys = {
  all: ['prints'] as const,
  lists: () => [...printKeys.all, 'list'] as const,
  list: (query: PrintSearchQuery) => [...printKeys.lists(), query] as const,
  details: () => [...printKeys.all, 'detail'] as const,
  detail: (id: string) => [...printKeys.details(), id] as const,
};

/** Query keys for the `images` resource. Lists are per print. */
export const imageKeys = {
  all: ['images'] as const,
  lists: () => [...imageKeys.all, 'list'] as const,
  list: (printId: string) => [...imageKeys.lists(), { printId }] as const,
};

/** Query keys for the `settings` resource; this feature reads its own section. */
export const settingsKeys = {
  all: ['settings'] as const,
  measurements: () => [...settingsKeys.all, 'measurements'] as const,
};
