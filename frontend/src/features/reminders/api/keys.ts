import type { z } from 'zod';
import type { digestListQuerySchema } from '@toneledger/common/schemas/inspections';

export type DigestListQuery = z.output<typeof digestListQuerySchema>;

/** Query keys for my reminders and, for administrators, the weekly digests sent. */
export const reminderKeys = {
  all: ['reminders'] as const,
  mine: () => [...reminderKeys.all, 'mine'] as const,
  digests: () => [...reminderKeys.all, 'digests'] as const,
  digestList: (query: DigestListQuery) => [...reminderKeys.digests(), query] as const,
};
