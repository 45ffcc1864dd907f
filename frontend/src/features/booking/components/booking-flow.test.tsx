import { screen } from '@testing-library/react';
import userEvent from '@testing-library/user-event';
import type { Appointment, ShopDetail } from '@loamline/shared-types';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { apiError, renderRoutes, rider, serve } from '@/features/auth/testing/render-routes';
import type * as apiClient from '@/lib/api-client';
import { TIME_TAKEN } from './booking-flow';
import { ShopPage } from './shop-page';

vi.mock('@/lib/api-client', async (importOriginal) => ({
  ...(await importOriginal<typeof apiClient>()),
  api: vi.fn(),
}));

const shop: ShopDetail = {
  id: 's',
  slug: 'ridge-works',
  name: 'Ridge Works',
  town: 'Hillcombe',
  timeZone: 'Europe/London',
  currency: 'GBP',
  services: [
    {
      id: 'v',
      name: 'Fork lower service',
      description: 'Seals, foam rings, oil.',
      durationMinutes: 60,
      bufferAfterMinutes: 0,
      priceMinor: 8900,
      depositMinor: 2000,
      active: true,
      checklist: null,
    },
  ],
  cancellationWindowHours: 48,
  minNoticeMinutes: 120,
  maxDaysAhead: 60,
};

const start = '2027-06-15T10:00:00+01:00';

/** the rider's own held, unpaid appointment at 10:30 the same day */
const theirs = {
  id: 'a9',
  status: 'held',
  shop,
  service: { id: 'v', name: 'Fork lower service', durationMinutes: 60, priceMinor: 8900, depositMinor: 2000 },
  start: '2027-06-15T10:30:00+01:00',
  end: '2027-06-15T11:30:00+01:00',
} as unknown as Appointment;

function serveShop(answer409: string, fields?: Record<string, string>) {
  const post = vi.fn(() => {
    throw apiError(409, answer409, fields);
  });
  serve({
    'GET /auth/me': () => rider,
    'GET /shops/ridge-works': () => shop,
    'GET /bikes': () => [],
    'GET /baseline-sheets': () => [],
    'GET /appointments': () => [theirs],
    'POST /appointments': post,
  });
  return post;
}

const review = `/shops/ridge-works?service=v&day=2027-06-15&start=${encodeURIComponent(start)}&step=review`;
const routes = [{ path: '/shops/:slug', element: <ShopPage /> }];

describe('booking: a 409', { timeout: 30_000 }, () => {
  beforeEach(() => vi.clearAllMocks());

  it('a clash with one of the rider’s own appointments says so and links to it, not "just taken"', async () => {
    const post = serveShop('You already have an appointment at that time.');
    await renderRoutes(routes, review);
    const user = userEvent.setup();
    await user.click(await screen.findByRole('button', { name: 'Book and hold the time' }));
    const alert = (await screen.findByText('You already have an appointment at that time.')).closest(
      '.MuiAlert-root',
    )!;
    expect(post).toHaveBeenCalledTimes(1);
    // the held one is named, with the way to pay for it
    expect(await screen.findByRole('link', { name: 'Pay for that appointment' })).toHaveAttribute(
      'href',
      '/appointments/a9',
    );
    expect(alert).toHaveTextContent(/is held and not paid yet/);
    expect(screen.getByRole('link', { name: 'My appointments' })).toHaveAttribute('href', '/appointments');
    expect(screen.queryByText(TIME_TAKEN)).not.toBeInTheDocument();
    // still on the review: the time was not taken by someone else
    expect(screen.getByRole('heading', { name: 'Check and book' })).toBeInTheDocument();

    await user.click(screen.getByRole('button', { name: 'Pick another time' }));
    expect(await screen.findByRole('heading', { name: 'Pick a day and time' })).toBeInTheDocument();
  });

  it('a time someone else just took: back to the times, which are fresh', async () => {
    serveShop('That time is no longer free. Pick another one.');
    await renderRoutes(routes, review);
    const user = userEvent.setup();
    await user.click(await screen.findByRole('button', { name: 'Book and hold the time' }));
    expect(await screen.findByText(TIME_TAKEN)).toBeInTheDocument();
    expect(await screen.findByRole('heading', { name: 'Pick a day and time' })).toBeInTheDocument();
  });

  it('a time the shop does not offer (fields.start): the server’s reason, back to the times', async () => {
    serveShop("That time can't be booked: it is outside the shop's hours, too soon or too far ahead.", {
      start: 'not a time this shop offers',
    });
    await renderRoutes(routes, review);
    const user = userEvent.setup();
    await user.click(await screen.findByRole('button', { name: 'Book and hold the time' }));
    expect(
      await screen.findByText(/too soon or too far ahead\. The free times are fresh again\./),
    ).toBeInTheDocument();
    expect(screen.queryByText(TIME_TAKEN)).not.toBeInTheDocument();
  });
});
