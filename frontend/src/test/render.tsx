import type { ReactElement } from 'react';
import { render } from '@testing-library/react';
import { QueryClient, QueryClientProvider } from '@tanstack/react-query';
import { createMemoryRouter, RouterProvider, type RouteObject } from 'react-router-dom';
import type { Me } from '@toneledger/common/schemas/users';
import { meKeys } from '@/lib/auth';

export function createTestQueryClient(): QueryClient {
  return new QueryClient({
    defaultOptions: { queries: { retry: false, staleTime: Infinity, refetchOnWindowFocus: false }, mutations: { retry: false } },
  });
}

/** Renders routes in a memory router with a fresh query client, optionally already signed in. */
export function renderRoutes(routes: RouteObject[], { path = '/', me }: { path?: string; me?: Me } = {}) {
  const queryClient = createTestQueryClient();
  if (me) queryClient.setQueryData(meKeys.all, me);
  const router = createMemoryRouter(routes, { initialEntries: [path] });
  const result = render(
    <QueryClientProvider client={queryClient}>
      <RouterProvider router={router} />
    </QueryClientProvider>,
  );
  return { ...result, router, queryClient };
}

/** Renders one element at `path` (for pages that read search params). */
export function renderPage(element: ReactElement, options: { path?: string; me?: Me } = {}) {
  return renderRoutes([{ path: '*', element }], options);
}
