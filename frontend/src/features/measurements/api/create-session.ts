import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { measurementsApi } from '@toneledger/common/api/measurements';
import { callData } from '@/lib/api-client';
import { measurementKeys, sessionKeys } from '@/features/measurements/api/keys';

export type SessionBody = BodyIn<typeof measurementsApi.recordSession>;

export function createSession(printId: string, input: SessionBody) {
  return callData(measurementsApi.recordSession, { params: { id: printId }, body: input });
}

/** A recorded session: its detail is set; the print's analysis and the collection-wide list are asked for again. */
export function useCreateSession() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ printId, input }: { printId: string; input: SessionBody }) => createSession(printId, input),
    onSuccess: async (session) => {
      queryClient.setQueryData(sessionKeys.detail(session.id), session);
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: measurementKeys.detail(session.printId) }),
        queryClient.invalidateQueries({ queryKey: measurementKeys.lists() }),
      ]);
    },
  });
}
