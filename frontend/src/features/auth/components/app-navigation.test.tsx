import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { AuthUser } from '@loamline/shared-types';
import type * as apiClient from '@/lib/api-client';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { owner, renderRoutes, rider, serve, signedOut, technician, Where } from '../testing/render-routes';
import { AppNavigation } from './app-navigation';

vi.mock('@/lib/api-client', async (importOriginal) => ({
  ...(await importOriginal<typeof apiClient>()),
  api: vi.fn(),
}));

/** jsdom has no layout: pretend the window is `width` px wide for MUI's useMediaQuery. */
function windowWidth(width: number) {
  vi.stubGlobal('matchMedia', (query: string) => {
    const min = /min-width:\s*(\d+)/.exec(query);
    return {
      matches: min ? width >= Number(min[1]) : false,
      media: query,
      addEventListener: () => undefined,
      removeEventListener: () => undefined,
      addListener: () => undefined,
      removeListener: () => undefined,
      onchange: null,
      dispatchEvent: () => false,
    };
  });
}

const routes = [
  {
    path: '*',
    element: (
      <>
        <AppNavigation />
        <Where />
      </>
    ),
  },
];

async function desktopNav(user: AuthUser | null) {
  windowWidth(1366);
  serve({ 'GET /auth/me': user ? () => user : signedOut, 'POST /auth/sign-out': () => undefined });
  const view = await renderRoutes(routes, '/baseline');
  if (user) await screen.findByRole('button', { name: `Account: ${user.name}` });
  else await screen.findByRole('link', { name: 'Sign in' });
  return { ...view, nav: screen.getByRole('navigation', { name: 'Main' }) };
}

const linkNames = (nav: HTMLElement) =>
  within(nav)
    .getAllByRole('link')
    .map((a) => a.textContent);

describe('AppNavigation', () => {
  beforeEach(() => vi.clearAllMocks());
  afterEach(() => vi.unstubAllGlobals());

  it('signed out: Baseline, Shops and Sign in (coming back here after)', async () => {
    const { nav } = await desktopNav(null);
    expect(linkNames(nav)).toEqual(['Baseline', 'Shops', 'Sign in']);
    expect(within(nav).getByRole('link', { name: 'Sign in' })).toHaveAttribute(
      'href',
      '/sign-in?next=%2Fbaseline',
    );
  });

  it('a rider sees the garage, sheets, shops and appointments, never Workshop', async () => {
    const { nav } = await desktopNav(rider);
    expect(linkNames(nav)).toEqual(['Baseline', 'My garage', 'Baseline sheets', 'Shops', 'My appointments']);
  });

  it.each([technician, owner])('a $role also sees Workshop', async (staff) => {
    const { nav } = await desktopNav(staff);
    expect(linkNames(nav)).toEqual(['Baseline', 'My garage', 'Baseline sheets', 'Shops', 'Workshop']);
    expect(within(nav).getByRole('link', { name: 'Workshop' })).toHaveAttribute('href', '/workshop');
  });

  it('the account menu shows name and role, and signs out', async () => {
    const { router } = await desktopNav(owner);
    const user = userEvent.setup();
    await user.click(screen.getByRole('button', { name: 'Account: Olu Owner' }));
    const menu = await screen.findByRole('menu');
    expect(menu).toHaveTextContent('Olu Owner');
    expect(menu).toHaveTextContent('Shop owner · olu@example.test');
    await user.click(within(menu).getByRole('menuitem', { name: 'Sign out' }));
    expect(await screen.findByRole('link', { name: 'Sign in' })).toBeInTheDocument();
    expect(router.state.location.pathname).toBe('/');
    const { api } = await import('@/lib/api-client');
    expect(vi.mocked(api)).toHaveBeenCalledWith('/auth/sign-out', { method: 'POST' });
  });

  it('on a phone, one menu button opens a drawer with the same sections', async () => {
    windowWidth(390);
    serve({ 'GET /auth/me': () => technician });
    await renderRoutes(routes, '/');
    const user = userEvent.setup();
    await user.click(await screen.findByRole('button', { name: 'Open menu' }));
    const drawer = await screen.findByRole('navigation', { name: 'Main' });
    await within(drawer).findByRole('link', { name: 'Workshop' });
    expect(linkNames(drawer)).toEqual(['Baseline', 'My garage', 'Baseline sheets', 'Shops', 'Workshop']);
    expect(screen.getByText('Technician')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Sign out' })).toBeInTheDocument();
  });
});
