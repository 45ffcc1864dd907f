import { screen, waitFor, within } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { ServiceReport, ServiceReportInput } from '@loamline/shared-types';
import { describe, expect, it, vi } from 'vitest';
import { apiError, renderRoutes, serve } from '@/features/auth/testing/render-routes';
import type * as apiClient from '@/lib/api-client';
import { DEFAULT_UNITS } from '@/lib/units';
import { report } from '../testing/fixtures';
import { ReportForm } from './report-form';

vi.mock('@/lib/api-client', async (importOriginal) => ({
  ...(await importOriginal<typeof apiClient>()),
  api: vi.fn(),
}));

const KEY = '/workshop/appointments/a1/report';

async function renderForm(r: ServiceReport = report(), onReload = vi.fn(() => Promise.resolve(r))) {
  await renderRoutes(
    [
      {
        path: '/',
        element: (
          <ReportForm
            appointmentId="a1"
            report={r}
            prefs={DEFAULT_UNITS}
            zone="Europe/London"
            onReload={onReload}
          />
        ),
      },
    ],
    '/',
  );
  await screen.findByRole('form', { name: 'Service report' });
  return { onReload };
}

describe('the service report form', () => {
  it('refuses a setting out of range before saving, saying the range in the unit shown', async () => {
    const put = vi.fn();
    serve({ [`PUT ${KEY}`]: put });
    await renderForm();
    const user = userEvent.setup();
    await user.type(screen.getByRole('textbox', { name: 'Fork: Main chamber (psi)' }), '1200');
    await user.type(screen.getByRole('textbox', { name: 'Fork: Rebound, clicks from closed' }), '7.5');
    await user.click(screen.getByRole('button', { name: 'Save draft' }));
    expect(await screen.findByText('Between 1 and 1,000 psi')).toBeInTheDocument();
    expect(screen.getByText('Enter a whole number')).toBeInTheDocument();
    expect(put).not.toHaveBeenCalled();
    expect(screen.getByTestId('report-save-state')).toHaveTextContent('Unsaved changes');
  });

  it('saves the draft in the API units and says when it was saved', async () => {
    let sent: ServiceReportInput | undefined;
    serve({
      [`PUT ${KEY}`]: (body) => {
        sent = body as ServiceReportInput;
        return { ...report(), ...sent, updatedAt: '2027-06-15T10:42:00+01:00', updatedBy: 'Tam Tech' };
      },
    });
    await renderForm();
    const user = userEvent.setup();
    expect(screen.getByTestId('report-save-state')).toHaveTextContent('Not saved yet');
    await user.click(screen.getByRole('checkbox', { name: 'Lower legs serviced' }));
    await user.type(screen.getByRole('textbox', { name: 'Add an item' }), 'Bushings checked');
    await user.click(screen.getByRole('button', { name: 'Add' }));
    await user.type(screen.getByRole('textbox', { name: 'Fork: Main chamber (psi)' }), '85');
    await user.type(screen.getByRole('textbox', { name: 'Fork: Sag measured (mm)' }), '38');
    await user.type(screen.getByRole('textbox', { name: 'Notes for the rider' }), 'New seals.');
    expect(screen.getByTestId('report-save-state')).toHaveTextContent('Unsaved changes');
    await user.click(screen.getByRole('button', { name: 'Save draft' }));
    await waitFor(() => expect(screen.getByTestId('report-save-state')).toHaveTextContent('by Tam Tech'));
    expect(screen.getByTestId('report-save-state')).toHaveTextContent(/Saved at .*10:42/);
    expect(sent).toEqual({
      version: 0, // the version the edit started from (a first save)
      checklist: [
        { label: 'Lower legs serviced', done: true },
        { label: 'Air spring serviced', done: false },
        { label: 'Bushings checked', done: true },
      ],
      notes: 'New seals.',
      fork: {
        mainPsi: 85,
        endStrokePsi: null,
        spacers: null,
        springRateLbPerIn: null,
        reboundClicks: null,
        compressionClicks: null,
        sagMm: 38,
      },
      shock: null,
    });
  });

  it('a 409 says someone else saved first and offers a reload', async () => {
    serve({
      [`PUT ${KEY}`]: () => {
        throw apiError(409, 'The report was saved by someone else at 10:41.');
      },
    });
    const theirs = report({
      notes: 'Their notes',
      updatedAt: '2027-06-15T10:41:00+01:00',
      updatedBy: 'Olu Owner',
    });
    const { onReload } = await renderForm(
      report(),
      vi.fn(() => Promise.resolve(theirs)),
    );
    const user = userEvent.setup();
    await user.type(screen.getByRole('textbox', { name: 'Notes for the rider' }), 'Mine');
    await user.click(screen.getByRole('button', { name: 'Save draft' }));
    const alert = await screen.findByRole('alert');
    expect(alert).toHaveTextContent('Someone else saved this report first');
    expect(alert).toHaveTextContent('The report was saved by someone else at 10:41.');
    await user.click(within(alert).getByRole('button', { name: 'Reload the report' }));
    expect(onReload).toHaveBeenCalled();
    await waitFor(() =>
      expect(screen.getByRole('textbox', { name: 'Notes for the rider' })).toHaveValue('Their notes'),
    );
    expect(screen.queryByRole('alert')).not.toBeInTheDocument();
  });
});
