import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { usersApi } from '@toneledger/common/api/users';
import { callData } from '@/lib/api-client';
import { meKeys } from '@/lib/auth';
import { userKeys } from '@/features/users/api/keys';

export type RoleChange = BodyIn<typeof usersApi.changeRole>;

export function changeRole(id: string, change: RoleChange) {
  return callData(usersApi.changeRole, { params: { id }, body: change });
}

export function useChangeRole() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: ({ id, change }: { id: string; change: RoleChange }) => changeRole(id, change),
    onSuccess: async (user) => {
      queryClient.setQueryData(userKeys.detail(user.id), user);
      // The signed-in person may have changed their own role.
      await Promise.all([
        queryClient.invalidateQueries({ queryKey: userKeys.lists() }),
        queryClient.invalidateQueries({ queryKey: meKeys.all }),
      ]);
    },
  });
}
