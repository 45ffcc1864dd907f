import type { Bike } from '@loamline/shared-types';
import { render, screen, waitFor } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { MemoryRouter } from 'react-router';
import { SWRConfig } from 'swr';
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import type { SessionUser } from '@/features/auth/types';
import { BaselineWizard } from '@/features/baseline/components/baseline-wizard';
import { BaselineWizardProvider } from '@/features/baseline/hooks/use-baseline-wizard';
import { api } from '@/lib/api-client';
import type * as ApiClient from '@/lib/api-client';
import { AppTheme } from '@/theme/app-theme';
import { BikeFromQuery } from './garage-picker';

// The API client is faked in this component test only; the browser test runs the real server.
vi.mock('@/lib/api-client', async (importOriginal) => ({
  ...(await importOriginal<typeof ApiClient>()),
  api: vi.fn(),
}));
const apiMock = vi.mocked(api);
vi.setConfig({ testTimeout: 90_000 });

const rider: SessionUser = {
  id: 'u-1',
  email: 'rider@example.test',
  name: 'Test Rider',
  role: 'rider',
  shopId: null,
};
const bike: Bike = {
  id: 'b-1',
  name: 'Hill bike',
  fork: { travelMm: 150, stanchionMm: 36, spring: 'air', spacers: 1 },
  shock: null,
  createdAt: '2026-11-01T10:00:00.000Z',
  updatedAt: '2026-11-01T10:00:00.000Z',
};

beforeEach(() => {
  window.localStorage.clear();
  window.sessionStorage.clear();
  apiMock.mockReset();
});
afterEach(() => vi.clearAllMocks());

describe('a garage bike from ?bike=', () => {
  it('arriving after the rider has moved on (a slow network), it fills the Bike step and leaves the rider where they are', async () => {
    let answer: (b: Bike) => void = () => undefined;
    apiMock.mockImplementation((path: string) => {
      if (path === '/auth/me') return Promise.resolve(rider);
      if (path === '/bikes/b-1') return new Promise<Bike>((r) => (answer = r));
      return Promise.reject(new Error(`unexpected ${path}`));
    });
    const user = userEvent.setup({ delay: null });
    render(
      <AppTheme>
        <SWRConfig value={{ provider: () => new Map(), dedupingInterval: 0 }}>
          <MemoryRouter initialEntries={['/baseline?bike=b-1']} useTransitions={false}>
            <BaselineWizardProvider>
              <BikeFromQuery />
              <BaselineWizard />
            </BaselineWizardProvider>
          </MemoryRouter>
        </SWRConfig>
      </AppTheme>,
    );
    await waitFor(() => expect(apiMock).toHaveBeenCalledWith('/bikes/b-1'));
    await user.type(screen.getByRole('textbox', { name: /weight with riding gear/i }), '78');
    await user.click(screen.getByRole('button', { name: /^next$/i }));
    await screen.findByRole('heading', { name: 'How do you ride?' });

    answer(bike);
    expect(
      await screen.findByText('The Bike step is filled from “Hill bike”. Start with your weight.'),
    ).toBeVisible();
    // still on the Riding step (before, the bike's arrival sent the rider back to the first step)
    expect(screen.getByRole('heading', { name: 'How do you ride?' })).toBeVisible();
    await user.click(screen.getByRole('button', { name: /^back$/i }));
    expect(await screen.findByRole('textbox', { name: /weight with riding gear/i })).toHaveValue('78');
    await user.click(screen.getByRole('button', { name: /^next$/i }));
    await user.click(await screen.findByRole('button', { name: /^Trail:/ }));
    await user.click(screen.getByRole('button', { name: /^next$/i }));
    await screen.findByRole('heading', { name: 'Your bike' });
    expect(screen.getByRole('textbox', { name: 'Fork travel' })).toHaveValue('150');
  });
});
