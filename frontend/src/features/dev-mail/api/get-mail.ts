import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CapturedMail } from '@toneledger/common/schemas/system';
import { requestData } from '@/lib/api-client';
import { devMailKeys } from '@/features/dev-mail/api/keys';

export function getMail(signal?: AbortSignal): Promise<CapturedMail[]> {
  return requestData<CapturedMail[]>('/api/dev/mail', { signal });
}

export function mailQueryOptions() {
  return queryOptions({
    queryKey: devMailKeys.list(),
    queryFn: ({ signal }) => getMail(signal),
    // The sink receives mail on its own schedule; look again now and then while the page is open.
    refetchInterval: 5_000,
  });
}

export function useMail() {
  return useQuery(mailQueryOptions());
}
