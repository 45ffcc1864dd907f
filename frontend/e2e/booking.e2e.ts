import AxeBuilder from '@axe-core/playwright';
import { randomBytes, randomUUID } from 'node:crypto';
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import mysql from 'mysql2/promise';
import { DateTime } from 'luxon';
import type { Appointment, AvailableStart, ShopService, ShopSettings } from '@loamline/shared-types';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { request, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { at, launch, screenshot, viewports } from './browser';

/**
 * Booking, rider side (issue 9), in a phone-sized browser against the real server and MariaDB: a
 * rider picks a time signed out, signs in and comes back to the same step, loses the time to another
 * rider (409) and picks again, books a free check, sees it requested, cancels it and the time is free
 * again; a rider whose browser is in New York books a Tokyo shop's time on the shop's clock and is told
 * plainly that the paid hold will lapse; shop staff are refused. axe-core on every page.
 */

const PASSWORD = 'roots and loam 42';
const shots = join(__dirname, '..', '..', 'artifacts', 'screenshots');
const uniqueEmail = (label: string) =>
  `${label}-${Date.now().toString(36)}-${randomBytes(3).toString('hex')}@example.test`;

interface TestShop {
  slug: string;
  name: string;
  zone: string;
  services: Record<string, ShopService>;
  ownerEmail: string;
}

/** A shop with an owner (the database, as accounts.e2e.ts does), then its settings and services through the API. */
async function createShop(opts: {
  name: string;
  town: string;
  zone: string;
  currency: string;
  hours: [string, string];
  services: Record<string, Omit<ShopService, 'id' | 'active' | 'checklist'>>;
}): Promise<TestShop> {
  const api = await request.newContext({ baseURL: at('/') });
  const ownerEmail = uniqueEmail('owner');
  expect(
    (
      await api.post('/api/auth/register', {
        data: { email: ownerEmail, password: PASSWORD, name: 'Owner Tester' },
      })
    ).status(),
  ).toBe(201);
  const slug = `${opts.name.toLowerCase().replace(/\W+/g, '-')}-${randomBytes(3).toString('hex')}`;
  const db = await mysql.createConnection({
    host: process.env.DB_HOST ?? '127.0.0.1',
    port: Number(process.env.DB_PORT ?? 3307),
    user: process.env.DB_USER,
    password: process.env.DB_PASSWORD,
    database: process.env.DB_NAME,
  });
  try {
    const shopId = randomUUID();
    await db.execute(
      'INSERT INTO shops (id, slug, name, town, time_zone, currency) VALUES (?, ?, ?, ?, ?, ?)',
      [shopId, slug, opts.name, opts.town, opts.zone, opts.currency],
    );
    await db.execute("UPDATE users SET role = 'owner', shop_id = ? WHERE email = ?", [shopId, ownerEmail]);
  } finally {
    await db.end();
  }
  await api.dispose();
  const owner = await request.newContext({ baseURL: at('/') });
  expect(
    (await owner.post('/api/auth/sign-in', { data: { email: ownerEmail, password: PASSWORD } })).status(),
  ).toBe(200);
  const settings: ShopSettings = {
    timeZone: opts.zone,
    currency: opts.currency,
    benches: 1,
    hours: [1, 2, 3, 4, 5, 6, 7].map((weekday) => ({ weekday, start: opts.hours[0], end: opts.hours[1] })),
    closures: [],
    rules: {
      slotStepMinutes: 60,
      minNoticeMinutes: 0,
      maxDaysAhead: 60,
      holdMinutes: 15,
      cancellationWindowHours: 48,
    },
  };
  const put = await owner.put('/api/workshop/settings', { data: settings });
  expect(put.status(), await put.text()).toBe(200);
  const services: Record<string, ShopService> = {};
  for (const [key, body] of Object.entries(opts.services)) {
    const res = await owner.post('/api/workshop/services', { data: body });
    expect(res.status(), await res.text()).toBe(201);
    services[key] = (await res.json()) as ShopService;
  }
  await owner.dispose();
  return { slug, name: opts.name, zone: opts.zone, services, ownerEmail };
}

async function phone(
  browser: Browser,
  opts: { timezoneId: string; locale: string },
): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext({
    viewport: viewports.phone,
    deviceScaleFactor: 2,
    isMobile: true,
    hasTouch: true,
    ...opts,
  });
  return { context, page: await context.newPage() };
}

/** A rider account made through the API in this context (its cookie jar is the browser's: signed in). */
async function registerRider(context: BrowserContext, label: string): Promise<string> {
  const email = uniqueEmail(label);
  const res = await context.request.post(at('/api/auth/register'), {
    data: { email, password: PASSWORD, name: `${label[0].toUpperCase()}${label.slice(1)} Tester` },
  });
  expect(res.status()).toBe(201);
  return email;
}

/** axe-core, WCAG 2.x A and AA; serious and critical findings only. */
async function axeFindings(page: Page): Promise<string[]> {
  await still(page); // a button fading from disabled to enabled reads as low contrast mid-way
  const results = await new AxeBuilder({ page })
    .withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'])
    .analyze();
  return results.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id} (${v.impact}): ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
}

/** What a dialog looks like on the phone's screen (a full-page shot would stretch the page under it). */
async function dialogShot(page: Page, name: string): Promise<void> {
  mkdirSync(shots, { recursive: true });
  await page.screenshot({ path: join(shots, `${name}.png`) });
}

/** Waits until no finite CSS animation runs (a dialog has finished opening). */
async function still(page: Page): Promise<void> {
  await page.waitForFunction(() =>
    document
      .getAnimations()
      .every((a) => a.playState !== 'running' || a.effect?.getComputedTiming().iterations === Infinity),
  );
}

/** The day picker: open the calendar, go to the month, pick the day, OK (the phone's dialog). */
async function pickDay(
  page: Page,
  day: string,
  zone: string,
  findings: Record<string, string[]>,
  shot?: string,
) {
  await page.getByRole('button', { name: 'Choose date' }).click();
  const dialog = page.getByRole('dialog');
  await dialog.waitFor();
  const target = DateTime.fromISO(day, { zone });
  const monthName = (d: DateTime) => d.setLocale('en-GB').toFormat('LLLL yyyy');
  for (let i = 0; i < 3; i++) {
    if ((await dialog.getByRole('grid', { name: monthName(target) }).count()) > 0) break;
    await dialog.getByRole('button', { name: 'Next month' }).click();
  }
  const cell = dialog
    .getByRole('grid', { name: monthName(target) })
    .getByRole('gridcell', { name: String(target.day), exact: true });
  await expect.poll(() => cell.isEnabled()).toBe(true);
  await still(page);
  if (shot) {
    findings[shot] = await axeFindings(page);
    await dialogShot(page, shot);
  }
  await cell.click();
  // the phone's dialog closes on a pick; a wider one may wait for OK
  const ok = dialog.getByRole('button', { name: 'OK' });
  if (await ok.isVisible().catch(() => false)) await ok.click().catch(() => undefined);
  await dialog.waitFor({ state: 'hidden' });
}

const timesGroup = (page: Page) => page.getByRole('group', { name: /^Free times on / });
const timeLabels = async (page: Page) =>
  (await timesGroup(page).getByRole('button').allTextContents()).map((t) => t.trim());

describe('booking, rider side (issue 9)', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser.close();
  });

  it('books a free check after signing in mid-flow, loses a time to another rider, sees it requested, cancels, and the time is free again', async () => {
    const shop = await createShop({
      name: 'Birchfold Bench Works',
      town: 'Lower Birchfold',
      zone: 'Europe/Berlin',
      currency: 'EUR',
      hours: ['09:00', '17:00'],
      services: {
        free: {
          name: 'Free bench check',
          description: 'The spring curve on the bench.',
          durationMinutes: 60,
          bufferAfterMinutes: 0,
          priceMinor: 0,
          depositMinor: 0,
        },
        setup: {
          name: 'Air spring setup',
          description: 'Chambers set, sag checked.',
          durationMinutes: 60,
          bufferAfterMinutes: 0,
          priceMinor: 8900,
          depositMinor: 2000,
        },
      },
    });
    const day = DateTime.now().setZone(shop.zone).plus({ days: 3 }).toISODate()!;
    const { context, page } = await phone(browser, { timezoneId: 'Europe/Berlin', locale: 'en-GB' });
    const email = await registerRider(context, 'booker');
    await context.clearCookies(); // signed out: the flow asks for an account on the way
    const findings: Record<string, string[]> = {};

    // the shops list and the shop's page
    await page.goto(at('/shops'));
    await page.getByRole('heading', { level: 1, name: 'Shops' }).waitFor();
    await page.locator(`a[href="/shops/${shop.slug}"]`).waitFor();
    findings['shops'] = await axeFindings(page);
    await screenshot(page, 'booking-shops-phone');
    await page.locator(`a[href="/shops/${shop.slug}"]`).click();
    await page.getByRole('heading', { level: 1, name: shop.name }).waitFor();
    await page.getByText('Times in Berlin time').waitFor();
    await page
      .getByText('Cancel at least 48 hours before for a full refund; later, the deposit is kept.')
      .waitFor();
    const setupCard = page.getByRole('article', { name: 'Air spring setup' });
    expect(await setupCard.textContent()).toContain('€89.00');
    expect(await setupCard.textContent()).toContain(
      'A deposit of €20.00 when booking; the other €69.00 at the shop.',
    );
    expect(await page.getByRole('article', { name: 'Free bench check' }).textContent()).toContain(
      'Free: nothing to pay.',
    );
    findings['shop'] = await axeFindings(page);
    await screenshot(page, 'booking-shop-phone');

    // day and time, signed out
    await page.getByRole('button', { name: 'Book Free bench check' }).click();
    await page.getByRole('heading', { name: 'Pick a day and time' }).waitFor();
    await pickDay(page, day, shop.zone, findings, 'booking-day-picker-phone');
    await timesGroup(page).waitFor();
    expect(await timeLabels(page)).toEqual([
      '9:00',
      '10:00',
      '11:00',
      '12:00',
      '13:00',
      '14:00',
      '15:00',
      '16:00',
    ]);
    await timesGroup(page).getByRole('button', { name: '10:00' }).click();
    await page.getByText(/Your pick: .*10:00–11:00 Berlin time/).waitFor();
    findings['time'] = await axeFindings(page);
    await screenshot(page, 'booking-time-phone');

    // an account is needed: sign in, and back on the next step with the same choice
    await page.getByRole('button', { name: 'Sign in to continue' }).click();
    await page.waitForURL(/\/sign-in\?next=/);
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password', { exact: true }).fill(PASSWORD);
    await page.getByRole('button', { name: 'Sign in', exact: true }).click();
    await page.getByRole('heading', { name: 'Bike and notes' }).waitFor();
    expect(new URL(page.url()).pathname).toBe(`/shops/${shop.slug}`);
    expect(new URL(page.url()).searchParams.get('start')).toMatch(new RegExp(`^${day}T10:00:00\\+0[12]:00$`));
    await page.getByLabel('Notes for the shop').fill('Fork tops out with a clunk.');
    findings['details'] = await axeFindings(page);
    await screenshot(page, 'booking-details-phone');
    await page.getByRole('button', { name: 'Next: review' }).click();
    await page.getByRole('heading', { name: 'Check and book' }).waitFor();
    const review = (await page.locator('main').textContent()) ?? '';
    expect(review).toContain('10:00–11:00 Berlin time');
    expect(review).toContain('Fork tops out with a clunk.');
    expect(review).toContain('cancelling costs nothing');
    findings['review'] = await axeFindings(page);
    await screenshot(page, 'booking-review-phone');

    // meanwhile another rider takes 10:00: 409, "just taken", the times refreshed without it
    const other = await request.newContext({ baseURL: at('/') });
    await other.post('/api/auth/register', {
      data: { email: uniqueEmail('quick'), password: PASSWORD, name: 'Quick Tester' },
    });
    const start = new URL(page.url()).searchParams.get('start')!;
    const taken = await other.post('/api/appointments', {
      data: { shopSlug: shop.slug, serviceId: shop.services.free.id, start },
    });
    expect(taken.status()).toBe(201);
    await page.getByRole('button', { name: 'Book', exact: true }).click();
    await page.getByText('That time was just taken').waitFor();
    await page.getByRole('heading', { name: 'Pick a day and time' }).waitFor();
    await expect
      .poll(() => timeLabels(page))
      .toEqual(['9:00', '11:00', '12:00', '13:00', '14:00', '15:00', '16:00']);
    await screenshot(page, 'booking-taken-phone');
    await other.dispose();

    // 11:00 instead; book it
    await timesGroup(page).getByRole('button', { name: '11:00' }).click();
    await page.getByRole('button', { name: 'Next: bike and notes' }).click();
    expect(await page.getByLabel('Notes for the shop').inputValue()).toBe('Fork tops out with a clunk.');
    await page.getByRole('button', { name: 'Next: review' }).click();
    const booked = page.waitForResponse(
      (r) => r.url().endsWith('/api/appointments') && r.request().method() === 'POST',
    );
    await page.getByRole('button', { name: 'Book', exact: true }).click();
    expect((await booked).status()).toBe(201);
    await page.getByText(`Booked: your request is with ${shop.name}`).waitFor();
    await page.getByText('Requested', { exact: true }).waitFor();
    findings['confirmation'] = await axeFindings(page);
    await screenshot(page, 'booking-confirmation-phone');

    // My appointments, from the menu: upcoming, requested
    await page.getByRole('button', { name: 'Open menu' }).click();
    // the drawer's code comes with the first tap (app-navigation.tsx): its own link, once it is open
    await page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: 'My appointments' })
      .click();
    await page.getByRole('heading', { level: 1, name: 'My appointments' }).waitFor();
    const upcoming = page.getByRole('region', { name: 'Upcoming' });
    const row = upcoming.getByRole('link', { name: /Free bench check/ });
    await row.waitFor();
    expect(await row.textContent()).toMatch(/Requested.*11:00–12:00 Berlin time/);
    findings['appointments'] = await axeFindings(page);
    await screenshot(page, 'booking-appointments-phone');

    // the time is taken now …
    const slotsOf = async () =>
      (
        (await (
          await context.request.get(
            at(
              `/api/shops/${shop.slug}/availability?serviceId=${shop.services.free.id}&from=${day}&to=${day}`,
            ),
          )
        ).json()) as AvailableStart[]
      ).map((s) => s.start.slice(11, 16));
    expect(await slotsOf()).not.toContain('11:00');

    // … cancel it: the money consequence in words, then cancelled
    await row.click();
    await page.getByRole('heading', { level: 1, name: 'Free bench check' }).waitFor();
    findings['appointment'] = await axeFindings(page);
    await screenshot(page, 'booking-appointment-phone');
    await page.getByRole('button', { name: 'Cancel appointment' }).click();
    const dialog = page.getByRole('dialog', { name: 'Cancel this appointment?' });
    await dialog.getByText('Nothing was paid in advance, so cancelling costs nothing.').waitFor();
    await still(page);
    findings['cancel-dialog'] = await axeFindings(page);
    await dialogShot(page, 'booking-cancel-dialog-phone');
    await dialog.getByRole('button', { name: 'Cancel appointment' }).click();
    await dialog.waitFor({ state: 'hidden' });
    await page.getByText('Cancelled', { exact: true }).waitFor();
    expect(await page.getByRole('button', { name: 'Cancel appointment' }).count()).toBe(0);
    await page.evaluate(() => window.scrollTo(0, 0)); // the sticky app bar at the top of the shot
    await screenshot(page, 'booking-cancelled-phone');

    // … and 11:00 is free again at once, in the flow too
    expect(await slotsOf()).toContain('11:00');
    await page.goto(at(`/shops/${shop.slug}?service=${shop.services.free.id}&day=${day}`));
    await timesGroup(page).getByRole('button', { name: '11:00' }).waitFor();
    await page.goto(at('/appointments'));
    // still ahead, so under Upcoming (grouped by time), with its state on it
    const cancelledAhead = page
      .getByRole('region', { name: 'Upcoming' })
      .getByRole('link', { name: /Free bench check/ });
    await cancelledAhead.waitFor();
    expect(await cancelledAhead.textContent()).toContain('Cancelled');
    expect(await page.getByRole('region', { name: 'Past' }).getByRole('link').count()).toBe(0);

    expect(findings).toEqual(Object.fromEntries(Object.keys(findings).map((k) => [k, []])));
    await context.close();
  });

  it('a browser in New York sees a Tokyo shop’s times on the shop’s clock; a paid service is held and asks for the deposit', async () => {
    const shop = await createShop({
      name: 'Kurogane Fork Room',
      town: 'Eastbank',
      zone: 'Asia/Tokyo',
      currency: 'JPY',
      hours: ['09:00', '12:00'],
      services: {
        full: {
          name: 'Full air setup',
          description: 'Fork and shock.',
          durationMinutes: 60,
          bufferAfterMinutes: 0,
          priceMinor: 12000,
          depositMinor: 3000,
        },
      },
    });
    const day = DateTime.now().setZone(shop.zone).plus({ days: 4 }).toISODate()!;
    const { context, page } = await phone(browser, { timezoneId: 'America/New_York', locale: 'en-US' });
    await registerRider(context, 'traveller');
    const bike = await context.request.post(at('/api/bikes'), {
      data: {
        name: 'Long-travel trail bike',
        fork: { travelMm: 160, stanchionMm: 36, spring: 'air', spacers: 1 },
        shock: { strokeMm: 65, wheelTravelMm: 165, spring: 'air', spacers: 0, maxPressurePsi: 350 },
      },
    });
    expect(bike.status(), await bike.text()).toBe(201);
    const findings: Record<string, string[]> = {};

    await page.goto(at(`/shops/${shop.slug}`));
    await page.getByRole('heading', { level: 1, name: shop.name }).waitFor();
    expect(await page.getByRole('article', { name: 'Full air setup' }).textContent()).toContain(
      'A deposit of ¥3,000 when booking; the other ¥9,000 at the shop.',
    );
    await page.getByRole('button', { name: 'Book Full air setup' }).click();
    await pickDay(page, day, shop.zone, findings);
    await timesGroup(page).waitFor();
    // the shop's 09:00–12:00, not New York's clock (which is 13 or 14 hours behind)
    expect(await timeLabels(page)).toEqual(['9:00 AM', '10:00 AM', '11:00 AM']);
    await page.getByText(/In Tokyo time \(GMT\+9\), the shop's clock \(Asia\/Tokyo\)/).waitFor();
    await page.getByText('Your device is set to America/New_York').waitFor();
    findings['time-other-zone'] = await axeFindings(page);
    await screenshot(page, 'booking-time-other-zone-phone');

    await timesGroup(page).getByRole('button', { name: '9:00 AM' }).click();
    await page.getByRole('button', { name: 'Next: bike and notes' }).click();
    await page.getByRole('combobox', { name: 'Bike' }).click();
    await page.getByRole('option', { name: 'Long-travel trail bike' }).click();
    await page.getByRole('button', { name: 'Next: review' }).click();
    await page.getByRole('heading', { name: 'Check and book' }).waitFor();
    const review = (await page.locator('main').textContent()) ?? '';
    expect(review).toContain('9:00 AM–10:00 AM Tokyo time');
    expect(review).toContain('Long-travel trail bike');
    expect(review).toContain(
      'Cancel at least 48 hours before for a full refund; later, the deposit is kept.',
    );
    expect(review).toContain('takes you to pay online by card; nothing is charged until you pay');
    findings['review-paid'] = await axeFindings(page);
    await screenshot(page, 'booking-review-paid-phone');
    await page.getByRole('button', { name: 'Book and hold the time' }).click();

    // held: the payment step asks for the deposit, says the rest is paid at the shop and until when
    await page.getByRole('heading', { name: 'Pay the deposit to keep this time' }).waitFor();
    await page.getByText('The deposit for Full air setup; the rest, ¥9,000, at the shop.').waitFor();
    await page.getByText(/^Held for you until \d+:\d\d (AM|PM) Tokyo time/).waitFor();
    await page.getByText('Held, not paid', { exact: true }).waitFor();
    findings['confirmation-held'] = await axeFindings(page);
    await screenshot(page, 'booking-confirmation-held-phone');
    const id = new URL(page.url()).pathname.split('/').pop()!;
    const a = (await (await context.request.get(at(`/api/appointments/${id}`))).json()) as Appointment;
    expect(a.status).toBe('held');
    expect(a.start).toBe(`${day}T09:00:00+09:00`);
    expect(a.bike?.name).toBe('Long-travel trail bike');

    expect(findings).toEqual(Object.fromEntries(Object.keys(findings).map((k) => [k, []])));
    await context.close();
  });

  it('answers a shop’s proposals (accept, turn down) and moves an appointment to another free time', async () => {
    const shop = await createShop({
      name: 'Fernhollow Damper Desk',
      town: 'Fernhollow',
      zone: 'Europe/Berlin',
      currency: 'EUR',
      hours: ['09:00', '17:00'],
      services: {
        free: {
          name: 'Sag and rebound check',
          description: '',
          durationMinutes: 60,
          bufferAfterMinutes: 0,
          priceMinor: 0,
          depositMinor: 0,
        },
      },
    });
    const day = DateTime.now().setZone(shop.zone).plus({ days: 5 }).toISODate()!;
    const at_ = (hhmm: string) =>
      DateTime.fromISO(`${day}T${hhmm}`, { zone: shop.zone }).toISO({ suppressMilliseconds: true })!;
    const { context, page } = await phone(browser, { timezoneId: 'Europe/Berlin', locale: 'en-GB' });
    await registerRider(context, 'answerer');
    const book = async (hhmm: string) => {
      const res = await context.request.post(at('/api/appointments'), {
        data: { shopSlug: shop.slug, serviceId: shop.services.free.id, start: at_(hhmm) },
      });
      expect(res.status(), await res.text()).toBe(201);
      return ((await res.json()) as { id: string }).id;
    };
    const first = await book('10:00');
    const second = await book('13:00');
    const owner = await request.newContext({ baseURL: at('/') });
    await owner.post('/api/auth/sign-in', { data: { email: shop.ownerEmail, password: PASSWORD } });
    const propose = async (id: string, hhmm: string) => {
      const res = await owner.post(`/api/workshop/appointments/${id}/propose`, {
        data: { start: at_(hhmm) },
      });
      expect(res.status(), await res.text()).toBeLessThan(300);
    };
    const findings: Record<string, string[]> = {};

    // accept: the appointment moves to the proposed time, confirmed
    await propose(first, '15:00');
    await page.goto(at(`/appointments/${first}`));
    const proposal = page.getByRole('region', { name: 'The shop proposes another time' });
    await proposal.waitFor();
    expect(await proposal.textContent()).toMatch(/15:00 Berlin time .* instead of 10:00/);
    findings['proposal'] = await axeFindings(page);
    await screenshot(page, 'booking-proposal-phone');
    await proposal.getByRole('button', { name: 'Accept the new time' }).click();
    await page.getByText('Confirmed', { exact: true }).waitFor();
    await page
      .getByText(/15:00–16:00 Berlin time/)
      .first()
      .waitFor();
    expect(await proposal.count()).toBe(0);

    // turn down: the request stays at its own time
    await propose(second, '16:00');
    await page.goto(at(`/appointments/${second}`));
    await proposal.waitFor();
    await proposal.getByRole('button', { name: 'Turn it down' }).click();
    await proposal.waitFor({ state: 'hidden' });
    await page.getByText('Requested', { exact: true }).waitFor();
    await page
      .getByText(/13:00–14:00 Berlin time/)
      .first()
      .waitFor();

    // move: another free time of the day, waiting for the shop again
    await page.getByRole('button', { name: 'Move to another time' }).click();
    const move = page.getByRole('dialog', { name: 'Move to another time' });
    await move.getByRole('group', { name: /^Free times on / }).waitFor();
    const offered = (
      await move
        .getByRole('group', { name: /^Free times on / })
        .getByRole('button')
        .allTextContents()
    ).map((t) => t.trim());
    expect(offered).not.toContain('13:00'); // its own time
    expect(offered).not.toContain('15:00'); // the first one's
    await still(page);
    findings['move-dialog'] = await axeFindings(page);
    await dialogShot(page, 'booking-move-dialog-phone');
    await move.getByRole('button', { name: '9:00', exact: true }).click();
    await move.getByRole('button', { name: 'Move here' }).click();
    await move.waitFor({ state: 'hidden' });
    await page
      .getByText(/9:00–10:00 Berlin time/)
      .first()
      .waitFor();
    await page.getByText('Requested', { exact: true }).waitFor();
    const moved = (await (
      await context.request.get(at(`/api/appointments/${second}`))
    ).json()) as Appointment;
    expect(moved.start).toBe(at_('09:00'));
    await screenshot(page, 'booking-moved-phone');

    expect(findings).toEqual(Object.fromEntries(Object.keys(findings).map((k) => [k, []])));
    await owner.dispose();
    await context.close();
  });

  it('shop staff are told plainly that they cannot book, and the API refuses them', async () => {
    const shop = await createShop({
      name: 'Stonegate Spring Shop',
      town: 'Stonegate',
      zone: 'Europe/London',
      currency: 'GBP',
      hours: ['09:00', '17:00'],
      services: {
        free: {
          name: 'Sag check',
          description: '',
          durationMinutes: 30,
          bufferAfterMinutes: 0,
          priceMinor: 0,
          depositMinor: 0,
        },
      },
    });
    const day = DateTime.now().setZone(shop.zone).plus({ days: 2 }).toISODate()!;
    const { context, page } = await phone(browser, { timezoneId: 'Europe/London', locale: 'en-GB' });
    expect(
      (
        await context.request.post(at('/api/auth/sign-in'), {
          data: { email: shop.ownerEmail, password: PASSWORD },
        })
      ).status(),
    ).toBe(200);
    const start = `${day}T10:00:00${DateTime.fromISO(`${day}T10:00`, { zone: shop.zone }).toFormat('ZZ')}`;
    await page.goto(
      at(
        `/shops/${shop.slug}?service=${shop.services.free.id}&day=${day}&start=${encodeURIComponent(start)}&step=review`,
      ),
    );
    await page.getByText('Shop staff accounts can’t book appointments.').waitFor();
    expect(await page.getByRole('button', { name: 'Book', exact: true }).isDisabled()).toBe(true);
    await screenshot(page, 'booking-staff-refused-phone');
    const res = await context.request.post(at('/api/appointments'), {
      data: { shopSlug: shop.slug, serviceId: shop.services.free.id, start },
    });
    expect(res.status()).toBe(403);
    await context.close();
  });
});
