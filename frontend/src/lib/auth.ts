import { queryOptions, useMutation, useSuspenseQuery } from '@tanstack/react-query';
import type { Me } from '@toneledger/common/schemas/users';
import { requestData } from '@/lib/api-client';
import { browser } from '@/lib/browser';

/** The signed-in person. Rooted at the API resource `me`. */
export const meKeys = {
  all: ['me'] as const,
};

export function getMe(signal?: AbortSignal): Promise<Me> {
  return requestData<Me>('/api/me', { signal });
}

export function meQueryOptions() {
  return queryOptions({
    queryKey: meKeys.all,
    queryFn: ({ signal }) => getMe(signal),
    staleTime: 60_000,
  });
}

/** The signed-in person; only used below the shell, which has already loaded it. */
export function useMe(): Me {
  return useSuspenseQuery(meQueryOptions()).data;
}

/** Where the browser goes to sign in, coming back to `returnTo` afterwards. */
export function signInHref(returnTo: string): string {
  const safe = returnTo.startsWith('/') && !returnTo.startsWith('//') ? returnTo : '/';
  return `/auth/login?returnTo=${encodeURIComponent(safe)}`;
}

export async function signOut(): Promise<string> {
  const { redirectTo } = await requestData<{ redirectTo: string }>('/auth/logout', { method: 'POST', body: {} });
  return redirectTo;
}

/** Signs out on the server, then lets the browser end the provider session. */
export function useSignOut() {
  return useMutation({
    mutationFn: signOut,
    onSuccess: (redirectTo) => browser.leaveTo(redirectTo),
  });
}
