import { QueryCache, QueryClient } from '@tanstack/react-query';
import { isApiError } from '@/lib/api-client';
import { meKeys } from '@/lib/auth';

/** Client errors (4xx) will not change on a retry; network and server errors might. */
function shouldRetry(failureCount: number, error: unknown): boolean {
  if (isApiError(error) && error.status >= 400 && error.status < 500) return false;
  return failureCount < 2;
}

export function createQueryClient(): QueryClient {
  const queryClient: QueryClient = new QueryClient({
    queryCache: new QueryCache({
      onError: (error, query) => {
        // A session that ended while the page was open: ask again who is signed in, so the
        // shell can offer the sign-in page instead of a broken screen.
        if (isApiError(error) && error.code === 'unauthenticated' && query.queryKey[0] !== meKeys.all[0]) {
          void queryClient.invalidateQueries({ queryKey: meKeys.all });
        }
      },
    }),
    defaultOptions: {
      queries: {
        staleTime: 30_000,
        retry: shouldRetry,
        refetchOnWindowFocus: true,
      },
      mutations: { retry: false },
    },
  });
  return queryClient;
}
