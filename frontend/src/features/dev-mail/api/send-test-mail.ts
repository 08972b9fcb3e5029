import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import type { testMailSchema } from '@toneledger/common/schemas/system';
import { requestData } from '@/lib/api-client';
import { devMailKeys } from '@/features/dev-mail/api/keys';

export type TestMail = z.infer<typeof testMailSchema>;

export function sendTestMail(input: TestMail): Promise<{ messageId: string }> {
  return requestData<{ messageId: string }>('/api/dev/mail/test', { method: 'POST', body: input });
}

export function useSendTestMail() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: sendTestMail,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: devMailKeys.lists() }),
  });
}
