import { queryOptions, useMutation, useSuspenseQuery } from '@tanstack/react-query';
import { authApi } from '@toneledger/common/api/auth';
import { meApi } from '@toneledger/common/api/users';
import type { Me } from '@toneledger/common/schemas/users';
import { callData, urlOf } from '@/lib/api-client';
import { browser } from '@/lib/browser';

/** The signed-in person. Rooted at the API resource `me`. */
export const meKeys = {
  all: ['me'] as const,
};

export function meQueryOptions() {
  return queryOptions({
    queryKey: meKeys.all,
    queryFn: ({ signal }) => callData(meApi.get, { signal }),
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
  return urlOf(authApi.login, { query: { returnTo: safe } });
}

export async function signOut(): Promise<string> {
  const { redirectTo } = await callData(authApi.logout, { body: {} });
  return redirectTo;
}

/** Signs out on the server, then lets the browser end the provider session. */
export function useSignOut() {
  return useMutation({
    mutationFn: signOut,
    onSuccess: (redirectTo) => browser.leaveTo(redirectTo),
  });
}
