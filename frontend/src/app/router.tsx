import { createBrowserRouter, type RouteObject } from 'react-router';
import { RootLayout } from '@/components/layouts/root-layout';
import { RouteError } from '@/components/layouts/route-error';
import { paths } from '@/config/paths';

/** Object routes with lazy route modules under one layout route (docs/architecture.md). */
export const routes: RouteObject[] = [
  {
    path: paths.home,
    element: <RootLayout />,
    errorElement: <RouteError />,
    children: [
      { index: true, lazy: () => import('./routes/home') },
      { path: paths.baseline, lazy: () => import('./routes/baseline') },
      { path: '*', lazy: () => import('./routes/not-found') },
    ],
  },
];

export function createAppRouter() {
  return createBrowserRouter(routes);
}
