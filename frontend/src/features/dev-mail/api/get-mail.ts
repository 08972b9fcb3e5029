import { queryOptions, useQuery } from '@tanstack/react-query';
import { devMailApi } from '@toneledger/common/api/dev-mail';
import { callData } from '@/lib/api-client';
import { devMailKeys } from '@/features/dev-mail/api/keys';

export function mailQueryOptions() {
  return queryOptions({
    queryKey: devMailKeys.list(),
    queryFn: ({ signal }) => callData(devMailApi.list, { signal }),
    // The sink receives mail on its own schedule; look again now and then while the page is open.
    refetchInterval: 5_000,
  });
}

export function useMail() {
  return useQuery(mailQueryOptions());
}
