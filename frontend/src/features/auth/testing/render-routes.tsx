import { render } from '@testing-library/react';
import type { ApiError, AuthUser } from '@loamline/shared-types';
import type { ReactElement } from 'react';
import { createMemoryRouter, RouterProvider, useLocation, type RouteObject } from 'react-router';
import { SWRConfig, mutate } from 'swr';
import { vi } from 'vitest';
import { api, ApiRequestError } from '@/lib/api-client';
import { AppTheme } from '@/theme/app-theme';

/*
 * Unit-test helpers for account pages. Tests fake only the api client module
 * (`vi.mock('@/lib/api-client', …)` with `fakeApiClient`); everything else is the real code.
 */

type Handler = (body: unknown) => unknown;

/** What the faked server answers, by "METHOD /path"; a missing route answers 404. */
export function serve(routes: Record<string, Handler>) {
  vi.mocked(api).mockImplementation(async (path: string, init: { method?: string; body?: unknown } = {}) => {
    await Promise.resolve();
    const method = init.method ?? (init.body ? 'POST' : 'GET');
    const handler = routes[`${method} ${path}`];
    if (!handler) throw apiError(404, 'Not found');
    return handler(init.body);
  });
}

/** An error as `api()` throws it, also dispatching the signed-out event on 401 like the real client. */
export function apiError(status: number, message: string, fields?: Record<string, string>): ApiRequestError {
  const body: ApiError = { statusCode: status, error: String(status), message, fields };
  if (status === 401) window.dispatchEvent(new CustomEvent('loamline:signed-out'));
  return new ApiRequestError(status, body);
}

export const signedOut = () => {
  throw apiError(401, 'Sign in first.');
};

export const rider: AuthUser = {
  id: 'u-1',
  email: 'ria@example.test',
  name: 'Ria Rider',
  role: 'rider',
  shopId: null,
};
export const technician: AuthUser = {
  id: 'u-2',
  email: 'tom@example.test',
  name: 'Tam Tech',
  role: 'technician',
  shopId: 's-1',
};
export const owner: AuthUser = {
  id: 'u-3',
  email: 'olu@example.test',
  name: 'Olu Owner',
  role: 'owner',
  shopId: 's-1',
};

/** Shows where the router is, so tests can check redirects. */
export function Where() {
  const { pathname, search } = useLocation();
  return <output aria-label="location">{pathname + search}</output>;
}

/** Renders routes in a memory router with Loamline's theme and an emptied SWR cache (the app's global one, which the api files mutate). */
export async function renderRoutes(routes: RouteObject[], at: string, extra?: ReactElement) {
  // Let the last test's requests settle (SWR joins a new hook to a request in flight), then forget them.
  await new Promise((resolve) => setTimeout(resolve, 20));
  await mutate(() => true, undefined, { revalidate: false });
  const router = createMemoryRouter(routes, { initialEntries: [at] });
  const view = render(
    <AppTheme>
      <SWRConfig value={{ dedupingInterval: 0, revalidateOnFocus: false }}>
        <RouterProvider router={router} />
        {extra}
      </SWRConfig>
    </AppTheme>,
  );
  return { router, ...view };
}
