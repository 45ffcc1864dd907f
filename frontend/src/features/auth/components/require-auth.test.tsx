import { act, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { Outlet } from 'react-router';
import type * as apiClient from '@/lib/api-client';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { owner, renderRoutes, rider, serve, signedOut, technician, Where } from '../testing/render-routes';
import { RequireAuth } from './require-auth';
import { RequireStaff } from './require-staff';
import { SignedOutNotice } from './signed-out-notice';
import { SignInPage } from './sign-in-page';
import { UnreachableNotice } from '@/components/ui/unreachable-notice';
import { UNREACHABLE_EVENT } from '@/lib/api-client';
import { apiError } from '../testing/render-routes';

vi.mock('@/lib/api-client', async (importOriginal) => ({
  ...(await importOriginal<typeof apiClient>()),
  api: vi.fn(),
}));

function Layout() {
  return (
    <>
      <Outlet />
      <SignedOutNotice />
      <UnreachableNotice />
    </>
  );
}

const routes = [
  {
    element: <Layout />,
    children: [
      { path: '/sign-in', element: <SignInPage /> },
      {
        element: <RequireAuth />,
        children: [
          { path: '/garage', element: <h1>The garage</h1> },
          {
            element: <RequireStaff />,
            children: [{ path: '/workshop', element: <h1>Shop desk</h1> }],
          },
        ],
      },
      { path: '*', element: <Where /> },
    ],
  },
];

describe('protected routes', () => {
  beforeEach(() => vi.clearAllMocks());

  it('sends a signed-out user to sign-in with ?next= and brings them back after', async () => {
    let me: () => unknown = signedOut;
    serve({
      'GET /auth/me': () => me(),
      'POST /auth/sign-in': () => {
        me = () => rider;
        return { user: rider, accessToken: 'jwt' };
      },
    });
    const { router } = await renderRoutes(routes, '/garage?bike=b-7');
    await waitFor(() => expect(router.state.location.pathname).toBe('/sign-in'));
    expect(router.state.location.search).toBe(`?next=${encodeURIComponent('/garage?bike=b-7')}`);
    expect(screen.queryByText('The garage')).toBeNull();

    const user = userEvent.setup();
    await user.type(await screen.findByLabelText('E-mail'), rider.email);
    await user.type(screen.getByLabelText('Password'), 'correct horse battery');
    await user.click(screen.getByRole('button', { name: 'Sign in' }));
    expect(await screen.findByRole('heading', { name: 'The garage' })).toBeInTheDocument();
    expect(router.state.location.pathname + router.state.location.search).toBe('/garage?bike=b-7');
  });

  it('lets a signed-in rider in, but not into Workshop', async () => {
    serve({ 'GET /auth/me': () => rider });
    const { router } = await renderRoutes(routes, '/garage');
    expect(await screen.findByRole('heading', { name: 'The garage' })).toBeInTheDocument();
    await act(() => router.navigate('/workshop'));
    expect(await screen.findByRole('heading', { name: 'Workshop is for shop staff' })).toBeInTheDocument();
    expect(screen.queryByText('Shop desk')).toBeNull();
  });

  it.each([technician, owner])('lets a $role into Workshop', async (staff) => {
    serve({ 'GET /auth/me': () => staff });
    await renderRoutes(routes, '/workshop');
    expect(await screen.findByRole('heading', { name: 'Shop desk' })).toBeInTheDocument();
  });

  it('says "You were signed out" once when a call answers 401, then asks to sign in', async () => {
    let me: () => unknown = () => rider;
    serve({ 'GET /auth/me': () => me() });
    const { router } = await renderRoutes(routes, '/garage');
    expect(await screen.findByRole('heading', { name: 'The garage' })).toBeInTheDocument();

    // The session ends on the server; the next call (any call) answers 401.
    me = signedOut;
    act(() => {
      window.dispatchEvent(new CustomEvent('loamline:signed-out'));
      window.dispatchEvent(new CustomEvent('loamline:signed-out'));
    });
    expect(await screen.findByText(/You were signed out/)).toBeInTheDocument();
    await waitFor(() => expect(router.state.location.pathname).toBe('/sign-in'));
    expect(router.state.location.search).toBe('?next=%2Fgarage');
    expect(screen.getAllByText(/You were signed out/)).toHaveLength(1);
  });

  it('keeps the rider signed in when the server cannot reach its database (503)', async () => {
    let me: () => unknown = () => rider;
    serve({ 'GET /auth/me': () => me() });
    const { router } = await renderRoutes(routes, '/garage');
    expect(await screen.findByRole('heading', { name: 'The garage' })).toBeInTheDocument();

    me = () => {
      window.dispatchEvent(new CustomEvent(UNREACHABLE_EVENT));
      throw apiError(503, "Loamline can't reach its database just now.");
    };
    await act(async () => {
      window.dispatchEvent(new Event('focus')); // SWR asks /auth/me again
      window.dispatchEvent(new CustomEvent(UNREACHABLE_EVENT));
      await Promise.resolve();
    });
    expect(await screen.findByText(/Can't reach Loamline just now/)).toBeInTheDocument();
    await new Promise((r) => setTimeout(r, 50));
    expect(router.state.location.pathname).toBe('/garage');
    expect(screen.getByRole('heading', { name: 'The garage' })).toBeInTheDocument();
    expect(screen.queryByText(/You were signed out/)).toBeNull();
  });

  it('stays quiet about 401s while nobody is signed in (a wrong password)', async () => {
    serve({ 'GET /auth/me': signedOut });
    await renderRoutes(routes, '/sign-in');
    await screen.findByRole('button', { name: 'Sign in' });
    await act(async () => {
      window.dispatchEvent(new CustomEvent('loamline:signed-out'));
      await Promise.resolve();
    });
    await new Promise((r) => setTimeout(r, 50));
    expect(screen.queryByText(/You were signed out/)).toBeNull();
  });
});
