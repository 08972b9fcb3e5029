import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { BodyIn } from '@toneledger/common/api/endpoint';
import { devMailApi } from '@toneledger/common/api/dev-mail';
import { callData } from '@/lib/api-client';
import { devMailKeys } from '@/features/dev-mail/api/keys';

export type TestMail = BodyIn<typeof devMailApi.sendTest>;

export function sendTestMail(input: TestMail) {
  return callData(devMailApi.sendTest, { body: input });
}

export function useSendTestMail() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: sendTestMail,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: devMailKeys.lists() }),
  });
}
