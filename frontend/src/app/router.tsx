import { useState, type ComponentType } from 'react';
import { createBrowserRouter, RouterProvider, type RouteObject } from 'react-router-dom';
import { ADMIN_AREAS, AREAS, type Area } from '@toneledger/common/domain/areas';
import { AuthGate } from '@/app/layout/auth-gate';
import { FullPageLoading } from '@/app/layout/full-page-loading';
import { PlainPage } from '@/app/layout/plain-page';
import { RequireArea } from '@/app/require-area';
import { ErrorPage } from '@/app/routes/error-page';
import { NotFoundPage } from '@/app/routes/not-found-page';

type PageLoader = () => Promise<ComponentType>;

/** The screens of areas that are built. An area without an entry shows the "not built yet" page. */
const AREA_PAGES: Record<string, PageLoader> = {
  users: () => import('@/features/users/routes/users-page').then((m) => m.UsersPage),
  audit: () => import('@/features/audit/routes/audit-page').then((m) => m.AuditPage),
  mail: () => import('@/features/dev-mail/routes/mail-page').then((m) => m.MailPage),
};

function areaRoute(area: Area): RouteObject {
  return {
    path: area.path,
    lazy: async () => {
      const load = AREA_PAGES[area.id];
      if (load) {
        const Page = await load();
        return {
          Component: () => (
            <RequireArea area={area}>
              <Page />
            </RequireArea>
          ),
        };
      }
      const { AreaPendingPage } = await import('@/app/routes/area-pending-page');
      return {
        Component: () => (
          <RequireArea area={area}>
            <AreaPendingPage area={area} />
          </RequireArea>
        ),
      };
    },
  };
}

function PlainErrorPage() {
  return (
    <PlainPage>
      <ErrorPage />
    </PlainPage>
  );
}

export const routes: RouteObject[] = [
  {
    path: '/signed-out',
    lazy: () => import('@/app/routes/signed-out-page').then((m) => ({ Component: m.SignedOutPage })),
    errorElement: <PlainErrorPage />,
    hydrateFallbackElement: <FullPageLoading />,
  },
  {
    element: <AuthGate />,
    errorElement: <PlainErrorPage />,
    hydrateFallbackElement: <FullPageLoading />,
    children: [
      {
        // Errors inside a page render inside the shell, so navigation stays usable.
        errorElement: <ErrorPage />,
        children: [
          { index: true, lazy: () => import('@/app/routes/home-page').then((m) => ({ Component: m.HomePage })) },
          ...AREAS.map(areaRoute),
          ...ADMIN_AREAS.map(areaRoute),
          { path: '*', Component: NotFoundPage },
        ],
      },
    ],
  },
];

export function AppRouter() {
  const [router] = useState(() => createBrowserRouter(routes));
  return <RouterProvider router={router} />;
}
