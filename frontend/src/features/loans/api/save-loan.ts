import { useMutation, useQueryClient, type QueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { loansApi } from '@toneledger/common/api/loans';
import type { LoanDetail } from '@toneledger/common/schemas/loans';
import { callData, isApiError } from '@/lib/api-client';
import { printKeys } from '@/lib/prints-api';
import { loanKeys } from '@/features/loans/api/keys';

export type LoanInput = BodyIn<typeof loansApi.create>;
export type LoanUpdate = BodyIn<typeof loansApi.update>;
export type LoanStatusInput = BodyIn<typeof loansApi.changeStatus>;
export type LoanObjectsInput = BodyIn<typeof loansApi.setObjects>;
export type BorrowedPrintInput = BodyIn<typeof loansApi.addBorrowed>;

/** A saved loan: its detail is set and the lists are fetched again. */
async function stored(queryClient: QueryClient, loan: LoanDetail) {
  queryClient.setQueryData(loanKeys.detail(loan.id), loan);
  await queryClient.invalidateQueries({ queryKey: loanKeys.lists() });
}

export function useCreateLoan() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: LoanInput) => callData(loansApi.create, { body: input }),
    onSuccess: (loan) => stored(queryClient, loan),
  });
}

export function useUpdateLoan(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (update: LoanUpdate) => callData(loansApi.update, { params: { id }, body: update }),
    onSuccess: (loan) => stored(queryClient, loan),
  });
}

export function useChangeLoanStatus(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: LoanStatusInput) => callData(loansApi.changeStatus, { params: { id }, body: input }),
    // A refusal (a report missing, someone moved the loan meanwhile) fetches the loan again; the open form keeps its input.
    onError: (error) => (isApiError(error) && error.code === 'conflict' ? queryClient.invalidateQueries({ queryKey: loanKeys.detail(id) }) : undefined),
    onSuccess: async (loan) => {
      await stored(queryClient, loan);
      // The prints' status and location follow the loan.
      await queryClient.invalidateQueries({ queryKey: printKeys.all });
    },
  });
}

export function useSetLoanObjects(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: LoanObjectsInput) => callData(loansApi.setObjects, { params: { id }, body: input }),
    onSuccess: (loan) => stored(queryClient, loan),
  });
}

export function useRemoveLoanObject(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ printId, version }: { printId: string; version: number }) =>
      callData(loansApi.removeObject, { params: { id, printId }, query: { version } }),
    onSuccess: (loan) => stored(queryClient, loan),
  });
}

/** Records a print lent to the collection and puts it on the loan; the loan is fetched again. */
export function useAddBorrowedPrint(id: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: BorrowedPrintInput) => callData(loansApi.addBorrowed, { params: { id }, body: input }),
    onSuccess: async () => {
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: loanKeys.detail(id) }),
        queryClient.invalidateQueries({ queryKey: loanKeys.lists() }),
        queryClient.invalidateQueries({ queryKey: printKeys.lists() }),
      ]);
    },
  });
}
