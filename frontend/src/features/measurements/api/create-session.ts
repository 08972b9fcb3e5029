import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { MeasurementSession, sessionInputSchema } from '@toneledger/common/schemas/measurements';
import { requestData } from '@/lib/api-client';
import { measurementKeys, sessionKeys } from '@/features/measurements/api/keys';

export type SessionBody = z.input<typeof sessionInputSchema>;

export function createSession(printId: string, input: SessionBody): Promise<MeasurementSession> {
  return requestData<MeasurementSession>(`/api/prints/${encodeURIComponent(printId)}/measurement-sessions`, { method: 'POST', body: input });
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
