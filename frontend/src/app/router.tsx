import { lazy, type ComponentType } from 'react';
import { useRoutes, type RouteObject } from 'react-router';
import { RootLayout } from '@/components/layouts/root-layout';
import { paths } from '@/config/paths';
import { RequireAuth } from '@/features/auth/components/require-auth';
import { RequireStaff } from '@/features/auth/components/require-staff';

/**
 * A route module's page, loaded when the route is first drawn (React.lazy): each route's code is its
 * own chunk. The root layout's Suspense shows a loading state on the first page; a navigation keeps
 * the current page, with a bar under the app bar, until the next one's code is in (app/browser-router.tsx).
 */
function page(load: () => Promise<{ Component: ComponentType }>) {
  const Page = lazy(() => load().then((m) => ({ default: m.Component })));
  return <Page />;
}

/** Object routes with lazy route modules under one layout route (docs/architecture.md). */
export const routes: RouteObject[] = [
  {
    path: paths.home,
    element: <RootLayout />,
    children: [
      { index: true, element: page(() => import('./routes/home')) },
      { path: paths.baseline, element: page(() => import('./routes/baseline')) },
      { path: paths.signIn, element: page(() => import('./routes/sign-in')) },
      { path: paths.register, element: page(() => import('./routes/register')) },
      { path: paths.forgotPassword, element: page(() => import('./routes/forgot-password')) },
      { path: paths.resetPassword, element: page(() => import('./routes/reset-password')) },
      { path: paths.join, element: page(() => import('./routes/join')) },
      // booking, rider side (issue 9): shops are public, appointments need an account
      { path: paths.shops, element: page(() => import('./routes/shops')) },
      { path: paths.shop, element: page(() => import('./routes/shop')) },
      {
        // Signed out: to sign-in with ?next=, and back here after.
        element: <RequireAuth />,
        children: [
          { path: paths.garage, element: page(() => import('./routes/garage')) },
          { path: paths.sheets, element: page(() => import('./routes/sheets')) },
          { path: paths.sheet, element: page(() => import('./routes/sheet')) },
          // booking, rider side (issue 9)
          { path: paths.appointments, element: page(() => import('./routes/appointments')) },
          { path: paths.appointment, element: page(() => import('./routes/appointment')) },
          {
            // Technicians and owners only; riders see "Workshop is for shop staff".
            element: <RequireStaff />,
            children: [
              { path: paths.workshop, element: page(() => import('./routes/workshop')) },
              { path: paths.workshopTeam, element: page(() => import('./routes/workshop-team')) },
              // Workshop › booking (issue 9, shop side)
              { path: paths.workshopRequests, element: page(() => import('./routes/workshop-requests')) },
              {
                path: paths.workshopAppointment,
                element: page(() => import('./routes/workshop-appointment')),
              },
              { path: paths.workshopSchedule, element: page(() => import('./routes/workshop-schedule')) },
              { path: paths.workshopServices, element: page(() => import('./routes/workshop-services')) },
              { path: paths.workshopSettings, element: page(() => import('./routes/workshop-settings')) },
              // Workshop › payments (owner; the page says so to technicians, the server answers 403)
              { path: paths.workshopPayments, element: page(() => import('./routes/workshop-payments')) },
            ],
          },
        ],
      },
      { path: '*', element: page(() => import('./routes/not-found')) },
    ],
  },
];

export function AppRoutes() {
  return useRoutes(routes);
}
