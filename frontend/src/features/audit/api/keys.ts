import type { AuditListQuery } from '@toneledger/common/schemas/audit';

/** Query keys for the `audit` resource. */
export const auditKeys = {
  all: ['audit'] as const,
  lists: () => [...auditKeys.all, 'list'] as const,
  list: (query: AuditListQuery) => [...auditKeys.lists(), query] as const,
  choices: () => [...auditKeys.all, 'choices'] as const,
};
