import { createBrowserRouter, type RouteObject } from 'react-router';
import { AppLoading } from '@/components/layouts/app-loading';
import { RootLayout } from '@/components/layouts/root-layout';
import { RouteError } from '@/components/layouts/route-error';
import { paths } from '@/config/paths';
import { RequireAuth } from '@/features/auth/components/require-auth';
import { RequireStaff } from '@/features/auth/components/require-staff';

/** Object routes with lazy route modules under one layout route (docs/architecture.md). */
export const routes: RouteObject[] = [
  {
    path: paths.home,
    element: <RootLayout />,
    // the first page's lazy module is still loading: the frame and a loading state (index.html's
    // inline shell shows the same before any script runs)
    hydrateFallbackElement: <AppLoading />,
    errorElement: <RouteError />,
    children: [
      { index: true, lazy: () => import('./routes/home') },
      { path: paths.baseline, lazy: () => import('./routes/baseline') },
      { path: paths.signIn, lazy: () => import('./routes/sign-in') },
      { path: paths.register, lazy: () => import('./routes/register') },
      { path: paths.forgotPassword, lazy: () => import('./routes/forgot-password') },
      { path: paths.resetPassword, lazy: () => import('./routes/reset-password') },
      { path: paths.join, lazy: () => import('./routes/join') },
      // booking, rider side (issue 9): shops are public, appointments need an account
      { path: paths.shops, lazy: () => import('./routes/shops') },
      { path: paths.shop, lazy: () => import('./routes/shop') },
      {
        // Signed out: to sign-in with ?next=, and back here after.
        element: <RequireAuth />,
        children: [
          { path: paths.garage, lazy: () => import('./routes/garage') },
          { path: paths.sheets, lazy: () => import('./routes/sheets') },
          { path: paths.sheet, lazy: () => import('./routes/sheet') },
          // booking, rider side (issue 9)
          { path: paths.appointments, lazy: () => import('./routes/appointments') },
          { path: paths.appointment, lazy: () => import('./routes/appointment') },
          {
            // Technicians and owners only; riders see "Workshop is for shop staff".
            element: <RequireStaff />,
            children: [
              { path: paths.workshop, lazy: () => import('./routes/workshop') },
              { path: paths.workshopTeam, lazy: () => import('./routes/workshop-team') },
              // Workshop › booking (issue 9, shop side)
              { path: paths.workshopRequests, lazy: () => import('./routes/workshop-requests') },
              { path: paths.workshopAppointment, lazy: () => import('./routes/workshop-appointment') },
              { path: paths.workshopSchedule, lazy: () => import('./routes/workshop-schedule') },
              { path: paths.workshopServices, lazy: () => import('./routes/workshop-services') },
              { path: paths.workshopSettings, lazy: () => import('./routes/workshop-settings') },
              // Workshop › payments (owner; the page says so to technicians, the server answers 403)
              { path: paths.workshopPayments, lazy: () => import('./routes/workshop-payments') },
            ],
          },
        ],
      },
      { path: '*', lazy: () => import('./routes/not-found') },
    ],
  },
];

export function createAppRouter() {
  return createBrowserRouter(routes);
}
