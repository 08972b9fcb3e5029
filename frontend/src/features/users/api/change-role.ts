import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RoleChange, User } from '@toneledger/common/schemas/users';
import { requestData } from '@/lib/api-client';
import { meKeys } from '@/lib/auth';
import { userKeys } from '@/features/users/api/keys';

export function changeRole(id: string, change: RoleChange): Promise<User> {
  return requestData<User>(`/api/users/${encodeURIComponent(id)}/role`, { method: 'PATCH', body: change });
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
