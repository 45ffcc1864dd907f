import { screen, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import { describe, expect, it, vi } from 'vitest';
import { renderRoutes, serve } from '@/features/auth/testing/render-routes';
import type * as apiClient from '@/lib/api-client';
import { DEFAULT_UNITS } from '@/lib/units';
import { goodFit, poorFit } from '../testing/fixtures';
import type { FitResult } from '../types';
import { FitPanel } from './fit-panel';

vi.mock('@/lib/api-client', async (importOriginal) => ({
  ...(await importOriginal<typeof apiClient>()),
  api: vi.fn(),
}));

const base = '/workshop/appointments/a1';

async function renderPanel(fit: FitResult | null) {
  await renderRoutes(
    [
      {
        path: '/',
        element: <FitPanel appointmentId="a1" part="fork" runs={2} fit={fit} hasBike prefs={DEFAULT_UNITS} />,
      },
    ],
    '/',
  );
  return screen.findByRole('region', { name: 'Fork: the bike’s measured spring' });
}

describe('the fit panel', () => {
  it('fits on request and shows the geometry, residual and what the data pinned down; a good fit stores at once', async () => {
    const store = vi.fn((body: unknown) => ({ ...goodFit, stored: true, body }));
    serve({
      [`POST ${base}/fits`]: () => goodFit,
      [`POST ${base}/fits/fit-1/store`]: store,
    });
    const panel = await renderPanel(null);
    const user = userEvent.setup();
    await user.click(within(panel).getByRole('button', { name: 'Fit the bike’s spring' }));
    expect(await within(panel).findByText('Good fit')).toBeInTheDocument();
    expect(panel).toHaveTextContent('Residual 14 N rms (2.1 % of the measured force) over 1 run');
    const table = within(panel).getByRole('table', { name: 'Fork: fitted geometry' });
    expect(
      within(table).getByRole('row', { name: /Positive air column.*212 mm.*pinned down/ }),
    ).toBeInTheDocument();
    expect(
      within(table).getByRole('row', { name: /End-stroke chamber volume.*21\.5 cm³.*not pinned down/ }),
    ).toBeInTheDocument();
    await user.click(within(panel).getByRole('button', { name: 'Store on the bike' }));
    expect(await within(panel).findByText('Stored on the bike')).toBeInTheDocument();
    expect(store).toHaveBeenCalledWith({});
    expect(screen.queryByRole('dialog')).not.toBeInTheDocument();
  });

  it('a poor fit shows its reasons and is stored only after an explicit confirmation', async () => {
    const store = vi.fn(() => ({ ...poorFit, stored: true }));
    serve({ [`POST ${base}/fits/fit-2/store`]: store });
    const panel = await renderPanel(poorFit);
    expect(within(panel).getByText('Poor fit')).toBeInTheDocument();
    expect(panel).toHaveTextContent('The curve is straight: it looks like a coil spring, not air.');
    const user = userEvent.setup();
    await user.click(within(panel).getByRole('button', { name: 'Store on the bike' }));
    const dialog = await screen.findByRole('dialog', { name: 'Store a poor fit on the bike?' });
    const confirm = within(dialog).getByRole('button', { name: 'Store the poor fit' });
    expect(confirm).toBeDisabled();
    expect(store).not.toHaveBeenCalled();
    await user.click(within(dialog).getByRole('checkbox', { name: /store it anyway/ }));
    await user.click(confirm);
    expect(await within(panel).findByText('Stored on the bike')).toBeInTheDocument();
    expect(store).toHaveBeenCalledWith({ confirmPoor: true });
  });

  it('rejects a fit', async () => {
    const reject = vi.fn(() => ({ ...poorFit, rejected: true }));
    serve({ [`POST ${base}/fits/fit-2/reject`]: reject });
    const panel = await renderPanel(poorFit);
    await userEvent.setup().click(within(panel).getByRole('button', { name: 'Reject' }));
    expect(await within(panel).findByText('Rejected')).toBeInTheDocument();
    expect(within(panel).queryByRole('button', { name: 'Store on the bike' })).not.toBeInTheDocument();
  });
});
