import { screen } from '@testing-library/react';
import type { AuthUser } from '@loamline/shared-types';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { owner, renderRoutes, serve, technician } from '@/features/auth/testing/render-routes';
import type * as apiClient from '@/lib/api-client';
import { WorkshopShell } from './workshop-shell';

vi.mock('@/lib/api-client', async (importOriginal) => ({
  ...(await importOriginal<typeof apiClient>()),
  api: vi.fn(),
}));

async function tabsFor(user: AuthUser) {
  serve({ 'GET /auth/me': () => user, 'GET /workshop/team': () => ({ shop: { name: 'Ridge Works' } }) });
  await renderRoutes([{ path: '*', element: <WorkshopShell>page</WorkshopShell> }], '/workshop');
  await screen.findByRole('heading', { name: 'Ridge Works' });
  return screen.getByRole('tablist', { name: 'Workshop sections' });
}

describe('Workshop sections', () => {
  beforeEach(() => vi.clearAllMocks());

  it('owners see Payments', async () => {
    const tabs = await tabsFor(owner);
    expect(await screen.findByRole('tab', { name: 'Payments' })).toHaveAttribute(
      'href',
      '/workshop/payments',
    );
    expect(tabs).toHaveTextContent('Team');
  });

  it('technicians do not', async () => {
    const tabs = await tabsFor(technician);
    expect(tabs).toHaveTextContent('Team');
    expect(screen.queryByRole('tab', { name: 'Payments' })).not.toBeInTheDocument();
  });
});
