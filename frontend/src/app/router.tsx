import { useState, type ComponentType } from 'react';
import { createBrowserRouter, RouterProvider, type RouteObject } from 'react-router-dom';
import { ADMIN_AREAS, AREAS, type Area } from '@toneledger/common/domain/areas';
import type { Permission } from '@toneledger/common/domain/roles';
import { AuthGate } from '@/app/layout/auth-gate';
import { FullPageLoading } from '@/app/layout/full-page-loading';
import { PlainPage } from '@/app/layout/plain-page';
import { RequireArea } from '@/app/require-area';
import { RequirePermission } from '@/app/require-permission';
import { ErrorPage } from '@/app/routes/error-page';
import { NotFoundPage } from '@/app/routes/not-found-page';

type PageLoader = () => Promise<ComponentType>;

/** The screens of areas that are built. An area without an entry shows the "not built yet" page. */
const AREA_PAGES: Record<string, PageLoader> = {
  users: () => import('@/features/users/routes/users-page').then((m) => m.UsersPage),
  audit: () => import('@/features/audit/routes/audit-page').then((m) => m.AuditPage),
  mail: () => import('@/features/dev-mail/routes/mail-page').then((m) => m.MailPage),
  digests: () => import('@/features/reminders/routes/digests-page').then((m) => m.DigestsPage),
  preservation: () => import('@/features/preservation/routes/preservation-page').then((m) => m.PreservationPage),
  research: () => import('@/features/research/routes/research-page').then((m) => m.ResearchPage),
};

/** A lazily loaded screen shown only to roles that may use the area (the server enforces it anyway). */
function inArea(area: Area, load: PageLoader) {
  return async () => {
    const Page = await load();
    return {
      Component: () => (
        <RequireArea area={area}>
          <Page />
        </RequireArea>
      ),
    };
  };
}

function areaRoute(area: Area): RouteObject {
  const pending: PageLoader = () =>
    import('@/app/routes/area-pending-page').then(({ AreaPendingPage }) => () => <AreaPendingPage area={area} />);
  return { path: area.path, lazy: inArea(area, AREA_PAGES[area.id] ?? pending) };
}

/** A lazily loaded page inside an area, shown only to roles with `guard.permission` when given. */
function page(load: PageLoader, guard?: { permission: Permission; what: string }) {
  return async () => {
    const Page = await load();
    if (!guard) return { Component: Page };
    return {
      Component: () => (
        <RequirePermission permission={guard.permission} what={guard.what}>
          <Page />
        </RequirePermission>
      ),
    };
  };
}

const WRITE = 'catalogue.write' satisfies Permission;

/**
 * The catalogue: its own layout (sub-navigation) and screens. Prints and imports are ours; the
 * reference records (makers, papers, recipes, locations, enclosures, settings) have screens of their own.
 */
function catalogueRoute(area: Area): RouteObject {
  return {
    path: area.path,
    lazy: inArea(area, () => import('@/features/catalogue/routes/catalogue-layout').then((m) => m.CatalogueLayout)),
    children: [
      { index: true, lazy: page(() => import('@/features/catalogue/routes/prints-page').then((m) => m.PrintsPage)) },
      {
        path: 'prints/new',
        lazy: page(() => import('@/features/catalogue/routes/print-create-page').then((m) => m.PrintCreatePage), {
          permission: WRITE,
          what: 'Adding prints',
        }),
      },
      {
        // The print page with the panels other features add to it (composed here, not in the catalogue).
        path: 'prints/:id',
        lazy: page(() =>
          Promise.all([
            import('@/features/catalogue/routes/print-page'),
            import('@/features/light/components/light-panel'),
            import('@/features/inspections/components/print-schedule-panel'),
            import('@/features/deaccessions/deaccession-panel'),
          ]).then(
            ([{ PrintPage }, { LightPanel }, { PrintSchedulePanel }, { DeaccessionPanel }]) =>
              () => <PrintPage panels={[PrintSchedulePanel, LightPanel, DeaccessionPanel]} />,
          ),
        ),
      },
      {
        path: 'prints/:id/sheet',
        lazy: page(() => import('@/features/catalogue/routes/print-sheet-page').then((m) => m.PrintSheetPage)),
      },
      {
        path: 'prints/:id/edit',
        lazy: page(() => import('@/features/catalogue/routes/print-edit-page').then((m) => m.PrintEditPage), {
          permission: WRITE,
          what: 'Editing prints',
        }),
      },
      {
        path: 'prints/:id/process',
        lazy: page(() => import('@/features/catalogue/routes/print-steps-page').then((m) => m.PrintStepsPage), {
          permission: WRITE,
          what: 'Editing process histories',
        }),
      },
      {
        path: 'import',
        lazy: page(() => import('@/features/catalogue/routes/import-page').then((m) => m.ImportPage), {
          permission: WRITE,
          what: 'Importing prints',
        }),
      },
      { path: 'fields', lazy: page(() => import('@/features/catalogue/routes/fields-page').then((m) => m.FieldsPage)) },
      { path: 'makers', lazy: page(() => import('@/features/reference/routes/makers-page').then((m) => m.MakersPage)) },
      { path: 'papers', lazy: page(() => import('@/features/reference/routes/papers-page').then((m) => m.PapersPage)) },
      { path: 'recipes', lazy: page(() => import('@/features/reference/routes/recipes-page').then((m) => m.RecipesPage)) },
      { path: 'recipes/:id', lazy: page(() => import('@/features/reference/routes/recipe-page').then((m) => m.RecipePage)) },
      {
        path: 'locations',
        lazy: page(() => import('@/features/reference/routes/locations-page').then((m) => m.LocationsPage), {
          permission: 'catalogue.read_restricted',
          what: 'Locations',
        }),
      },
      { path: 'enclosures', lazy: page(() => import('@/features/reference/routes/enclosures-page').then((m) => m.EnclosuresPage)) },
      {
        path: 'entries',
        lazy: page(() => import('@/features/acquisitions/entries-page').then((m) => m.EntriesPage), { permission: 'catalogue.read_restricted', what: 'Entries and acquisitions' }),
      },
      {
        path: 'entries/:id',
        lazy: page(() => import('@/features/acquisitions/entry-page').then((m) => m.EntryPage), { permission: 'catalogue.read_restricted', what: 'Entries and acquisitions' }),
      },
      {
        path: 'settings',
        lazy: page(() => import('@/features/reference/routes/catalogue-settings-page').then((m) => m.CatalogueSettingsPage), {
          permission: 'settings.manage',
          what: 'Catalogue settings',
        }),
      },
      {
        path: 'light-budgets',
        lazy: page(() => import('@/features/light/routes/light-budgets-page').then((m) => m.LightBudgetsPage), {
          permission: 'light.read',
          what: 'Light budgets',
        }),
      },
      {
        path: 'light-settings',
        lazy: page(() => import('@/features/light/routes/light-settings-page').then((m) => m.LightSettingsPage), {
          permission: 'light.read',
          what: 'Light settings',
        }),
      },
      { path: '*', Component: NotFoundPage },
    ],
  };
}

/**
 * Condition and images. The area's index needs `condition.read`; a print's page opens to every role
 * that may see its images (reports are shown only to those who may read them), and each screen
 * inside carries its own permission.
 */
function conditionRoute(area: Area): RouteObject {
  return {
    path: area.path,
    children: [
      { index: true, lazy: inArea(area, () => import('@/features/condition/routes/condition-index-page').then((m) => m.ConditionIndexPage)) },
      {
        path: 'prints/:id',
        lazy: page(() => import('@/features/condition/routes/condition-print-page').then((m) => m.ConditionPrintPage), {
          permission: 'images.read',
          what: 'Condition and images',
        }),
      },
      {
        path: 'prints/:id/compare',
        lazy: page(() => import('@/features/condition/routes/compare-page').then((m) => m.ComparePage), {
          permission: 'images.read',
          what: 'Comparing images',
        }),
      },
      {
        path: 'prints/:id/reports/new',
        lazy: page(() => import('@/features/condition/routes/report-new-page').then((m) => m.ReportNewPage), {
          permission: 'condition.write',
          what: 'Writing condition reports',
        }),
      },
      {
        path: 'reports/:id',
        lazy: page(() => import('@/features/condition/routes/report-page').then((m) => m.ReportPage), {
          permission: 'condition.read',
          what: 'Condition reports',
        }),
      },
      {
        path: 'treatments',
        lazy: page(() => import('@/features/treatments/routes/treatments-page').then((m) => m.TreatmentsPage), { permission: 'condition.read', what: 'Treatments' }),
      },
      {
        path: 'treatments/:id',
        lazy: page(() => import('@/features/treatments/routes/treatment-page').then((m) => m.TreatmentPage), { permission: 'condition.read', what: 'Treatments' }),
      },
      {
        path: 'prints/:id/treatments/new',
        lazy: page(() => import('@/features/treatments/routes/treatment-new-page').then((m) => m.TreatmentNewPage), {
          permission: 'treatments.write',
          what: 'Proposing treatments',
        }),
      },
      { path: '*', Component: NotFoundPage },
    ],
  };
}

/**
 * Measurements. The area's index (the spots changing most, and opening a print) needs
 * `measurements.read`, like a print's measurements; recording a session needs `measurements.write`.
 */
function measurementsRoute(area: Area): RouteObject {
  return {
    path: area.path,
    children: [
      { index: true, lazy: inArea(area, () => import('@/features/measurements/routes/leaders-page').then((m) => m.LeadersPage)) },
      {
        path: 'prints/:id',
        lazy: page(() => import('@/features/measurements/routes/print-measurements-page').then((m) => m.PrintMeasurementsPage), {
          permission: 'measurements.read',
          what: 'Measurements',
        }),
      },
      {
        path: 'prints/:id/sessions/new',
        lazy: page(() => import('@/features/measurements/routes/session-create-page').then((m) => m.SessionCreatePage), {
          permission: 'measurements.write',
          what: 'Recording measurement sessions',
        }),
      },
      { path: '*', Component: NotFoundPage },
    ],
  };
}

/** Loans: everyone reads them (values need `valuation.read`); registrars and administrators manage them. */
function loansRoute(area: Area): RouteObject {
  const WRITE_LOANS = { permission: 'loans.write', what: 'Managing loans' } as const;
  return {
    path: area.path,
    children: [
      { index: true, lazy: inArea(area, () => import('@/features/loans/routes/loans-page').then((m) => m.LoansPage)) },
      { path: 'new', lazy: page(() => import('@/features/loans/routes/loan-form-pages').then((m) => m.LoanCreatePage), WRITE_LOANS) },
      { path: ':id', lazy: inArea(area, () => import('@/features/loans/routes/loan-page').then((m) => m.LoanPage)) },
      { path: ':id/edit', lazy: page(() => import('@/features/loans/routes/loan-form-pages').then((m) => m.LoanEditPage), WRITE_LOANS) },
      { path: '*', Component: NotFoundPage },
    ],
  };
}

/** Exhibitions: everyone reads them; registrars manage them, conservators record displays and approve prints on the page. */
function exhibitionsRoute(area: Area): RouteObject {
  const WRITE_EXHIBITIONS = { permission: 'loans.write', what: 'Managing exhibitions' } as const;
  return {
    path: area.path,
    children: [
      { index: true, lazy: inArea(area, () => import('@/features/exhibitions/routes/exhibitions-page').then((m) => m.ExhibitionsPage)) },
      { path: 'new', lazy: page(() => import('@/features/exhibitions/routes/exhibition-form-pages').then((m) => m.ExhibitionCreatePage), WRITE_EXHIBITIONS) },
      { path: ':id', lazy: inArea(area, () => import('@/features/exhibitions/routes/exhibition-page').then((m) => m.ExhibitionPage)) },
      { path: ':id/edit', lazy: page(() => import('@/features/exhibitions/routes/exhibition-form-pages').then((m) => m.ExhibitionEditPage), WRITE_EXHIBITIONS) },
      { path: '*', Component: NotFoundPage },
    ],
  };
}

/** Inspections: the work list and rounds (schedule.read reads them; conservators plan rounds on the list itself). */
function inspectionsRoute(area: Area): RouteObject {
  return {
    path: area.path,
    children: [
      { index: true, lazy: inArea(area, () => import('@/features/inspections/routes/worklist-page').then((m) => m.WorklistPage)) },
      { path: 'rounds', lazy: inArea(area, () => import('@/features/inspections/routes/rounds-page').then((m) => m.RoundsPage)) },
      { path: 'rounds/:id', lazy: inArea(area, () => import('@/features/inspections/routes/round-page').then((m) => m.RoundPage)) },
      { path: 'reminders', lazy: inArea(area, () => import('@/features/reminders/routes/reminders-page').then((m) => m.RemindersPage)) },
      { path: '*', Component: NotFoundPage },
    ],
  };
}

/** Storage climate: climate.read reads the rooms, a location's figures and the settings; conservators load logger files. */
function climateRoute(area: Area): RouteObject {
  return {
    path: area.path,
    children: [
      { index: true, lazy: inArea(area, () => import('@/features/climate/routes/climate-rooms-page').then((m) => m.ClimateRoomsPage)) },
      { path: 'locations/:id', lazy: inArea(area, () => import('@/features/climate/routes/climate-location-page').then((m) => m.ClimateLocationPage)) },
      { path: 'settings', lazy: inArea(area, () => import('@/features/climate/routes/climate-settings-page').then((m) => m.ClimateSettingsPage)) },
      { path: '*', Component: NotFoundPage },
    ],
  };
}

function PlainErrorPage() {
  return (
    <PlainPage>
      <ErrorPage />
    </PlainPage>
  );
}

/** Areas with screens of their own (the others show the "not built yet" page or a single screen). */
const AREA_ROUTES: Record<string, (area: Area) => RouteObject> = {
  catalogue: catalogueRoute,
  condition: conditionRoute,
  measurements: measurementsRoute,
  loans: loansRoute,
  exhibitions: exhibitionsRoute,
  schedule: inspectionsRoute,
  climate: climateRoute,
};

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
          ...AREAS.map((area) => (AREA_ROUTES[area.id] ?? areaRoute)(area)),
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
