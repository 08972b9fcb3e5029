import type { z } from 'zod';
import type { loanListQuerySchema } from '@toneledger/common/schemas/loans';

export type LoanListQuery = z.output<typeof loanListQuerySchema>;

/** Query keys for the `loans` resource. */
export const loanKeys = {
  all: ['loans'] as const,
  lists: () => [...loanKeys.all, 'list'] as const,
  list: (query: LoanListQuery) => [...loanKeys.lists(), query] as const,
  details: () => [...loanKeys.all, 'detail'] as const,
  detail: (id: string) => [...loanKeys.details(), id] as const,
};
