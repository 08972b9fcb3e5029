import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { usersApi } from '@toneledger/common/api/users';
import { callData } from '@/lib/api-client';
import { userKeys } from '@/features/users/api/keys';

export type Deactivation = BodyIn<typeof usersApi.deactivate>;

/** Deactivates (kept in the record, cannot sign in, sessions end) or reactivates a person. */
export function useActivation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, deactivate, body }: { id: string; deactivate: boolean; body?: Deactivation }) =>
      deactivate ? callData(usersApi.deactivate, { params: { id }, body: body ?? {} }) : callData(usersApi.reactivate, { params: { id } }),
    onSuccess: async (user) => {
      queryClient.setQueryData(userKeys.detail(user.id), user);
      await queryClient.invalidateQueries({ queryKey: userKeys.lists() });
    },
  });
}
