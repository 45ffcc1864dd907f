import { screen, within } from '@testing-library/react';
import type { BaselineSheet } from '@loamline/shared-types';
import { describe, expect, it, vi } from 'vitest';
import { apiError, renderRoutes, serve } from '@/features/auth/testing/render-routes';
import { part } from '@/features/baseline/testing/wizard-test-utils';
import type * as apiClient from '@/lib/api-client';
import { appointment, curve, goodFit, photo, report } from '../testing/fixtures';
import { bookAgainPath, RiderReport } from './rider-report';

vi.mock('@/lib/api-client', async (importOriginal) => ({
  ...(await importOriginal<typeof apiClient>()),
  api: vi.fn(),
}));

const fork = { ...part(150, 42, 80), endStroke: null };
const sheet = {
  id: 'sheet-1',
  name: 'Summer trail',
  input: { fork: { spacers: 1 }, shock: null },
  result: { fork, shock: null, cautions: [], assumptions: [] },
  createdAt: '2027-05-01T10:00:00Z',
  updatedAt: '2027-05-01T10:00:00Z',
} as unknown as BaselineSheet;

const final = report({
  status: 'final',
  completedAt: '2027-06-15T11:10:00+01:00',
  checklist: [
    { label: 'Lower legs serviced', done: true },
    { label: 'Air spring serviced', done: false },
  ],
  notes: 'Seals replaced.',
  fork: {
    mainPsi: 86,
    endStrokePsi: null,
    spacers: 2,
    springRateLbPerIn: null,
    reboundClicks: 8,
    compressionClicks: 4,
    sagMm: 40,
  },
  shock: null,
  attachments: [photo, curve],
  fits: [{ ...goodFit, stored: true }],
});

async function open(routes: Record<string, (b: unknown) => unknown>) {
  serve(routes);
  await renderRoutes(
    [{ path: '/appointments/:id', element: <RiderReport a={appointment()} /> }],
    '/appointments/a1',
  );
  return screen.findByRole('region', { name: 'Service report' });
}

describe('the rider’s report', () => {
  it('shows the settings the shop left, fork and shock side by side, with units', async () => {
    await open({ 'GET /appointments/a1/report': () => final, 'GET /baseline-sheets/sheet-1': () => sheet });
    const table = await screen.findByRole('table', { name: 'Settings the shop left' });
    expect(within(table).getByRole('row', { name: 'Main chamber 86 psi —' })).toBeInTheDocument();
    expect(within(table).getByRole('row', { name: 'Rebound 8 clicks from closed —' })).toBeInTheDocument();
    expect(within(table).getByRole('row', { name: 'Sag measured 40 mm —' })).toBeInTheDocument();
    // nothing recorded for it on either part: left out
    expect(within(table).queryByRole('row', { name: /End-stroke/ })).not.toBeInTheDocument();
    expect(screen.getByText('Seals replaced.')).toBeInTheDocument();
    expect(screen.getByRole('button', { name: 'Open photo lowers.jpg' })).toBeInTheDocument();
    expect(screen.getByRole('article', { name: 'End-stroke 190 psi' })).toBeInTheDocument();
    expect(screen.getByTestId('bump-stop')).toHaveTextContent('at 138 mm, where the curve leaves the model');
  });

  it('puts the rider’s own baseline beside what the shop set, with the difference', async () => {
    await open({ 'GET /appointments/a1/report': () => final, 'GET /baseline-sheets/sheet-1': () => sheet });
    const table = await screen.findByRole('table', { name: 'Fork: your baseline and the shop’s settings' });
    expect(
      within(table).getByRole('row', { name: 'Main chamber 80 psi 86 psi +6 psi (+7.5 %)' }),
    ).toBeInTheDocument();
    expect(within(table).getByRole('row', { name: 'Volume spacers 1 2 +1' })).toBeInTheDocument();
    expect(
      within(table).getByRole('row', { name: 'Sag 42 mm target 40 mm measured −2 mm (−4.8 %)' }),
    ).toBeInTheDocument();
  });

  it('says the report is not ready while the shop writes it (404), and offers to book again', async () => {
    await open({
      'GET /appointments/a1/report': () => {
        throw apiError(404, 'Not found');
      },
    });
    expect(await screen.findByText(/has not finished the report yet/)).toBeInTheDocument();
    expect(screen.getByRole('link', { name: 'Book this again' })).toHaveAttribute(
      'href',
      '/shops/ridge-works?service=svc-1&bike=bike-1&sheet=sheet-1',
    );
    expect(bookAgainPath(appointment({ bike: null, baselineSheetId: null }))).toBe(
      '/shops/ridge-works?service=svc-1',
    );
  });
});
