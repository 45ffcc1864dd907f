import { randomBytes, randomUUID } from 'node:crypto';
import AxeBuilder from '@axe-core/playwright';
import mysql from 'mysql2/promise';
import type { AvailableStart, WorkshopAppointment } from '@loamline/shared-types';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { at, launch, newPage, screenshot as fullPageShot } from './browser';

/**
 * Issue 9, the shop side ("Shop confirms", "Run the shop") in a real browser against the real server:
 * an owner sets hours, a closure and a service; a rider (made through the API) books twice; the
 * technician confirms one in Requests, declines the other with a reason, and finds the confirmed one
 * in the Schedule. axe-core finds nothing serious or critical on the four Workshop pages.
 */

const PASSWORD = 'bench and lane 42';
const ZONE = 'Europe/Berlin';
const tag = randomBytes(3).toString('hex');
const email = (label: string) => `${label}-${tag}-${randomBytes(2).toString('hex')}@example.test`;
const riderName = `Tamsin Bramblegate ${tag}`;
const serviceName = `Air spring setup ${tag}`;

/** `YYYY-MM-DD` in the shop's zone, `days` from today. */
function dayInZone(days: number): string {
  const d = new Date(Date.now() + days * 86_400_000);
  return new Intl.DateTimeFormat('en-CA', {
    timeZone: ZONE,
    year: 'numeric',
    month: '2-digit',
    day: '2-digit',
  }).format(d);
}

async function account(context: BrowserContext, label: string, name: string): Promise<string> {
  const address = email(label);
  const res = await context.request.post(at('/api/auth/register'), {
    data: { email: address, password: PASSWORD, name },
  });
  expect(res.status()).toBe(201);
  return address;
}

async function signIn(context: BrowserContext, address: string): Promise<void> {
  const res = await context.request.post(at('/api/auth/sign-in'), {
    data: { email: address, password: PASSWORD },
  });
  expect(res.status()).toBe(200);
}

/** A full-page screenshot from the top (the sticky app bar stays where it belongs). */
async function screenshot(page: Page, name: string): Promise<void> {
  await page.evaluate(() => window.scrollTo(0, 0));
  await page.waitForTimeout(200);
  await fullPageShot(page, name);
}

async function axeFindings(page: Page): Promise<string[]> {
  const results = await new AxeBuilder({ page })
    .withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'])
    .analyze();
  return results.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id} (${v.impact}): ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
}

describe('Workshop: run the shop, confirm a booking (desktop)', () => {
  let browser: Browser;
  let owner: { context: BrowserContext; page: Page };
  let tech: { context: BrowserContext; page: Page };
  let rider: { context: BrowserContext; page: Page };
  let slug = '';
  const findings: Record<string, string[]> = {};

  beforeAll(async () => {
    browser = await launch();
    owner = await newPage(browser, 'desktop');
    tech = await newPage(browser, 'desktop');
    rider = await newPage(browser, 'desktop');
    const ownerEmail = await account(owner.context, 'owner', `Owner ${tag}`);
    const techEmail = await account(tech.context, 'tech', `Technician ${tag}`);
    // A test run has no seed: the shop and its staff are stored as the seed would store them.
    const db = await mysql.createConnection({
      host: process.env.DB_HOST ?? '127.0.0.1',
      port: Number(process.env.DB_PORT ?? 3307),
      user: process.env.DB_USER,
      password: process.env.DB_PASSWORD,
      database: process.env.DB_NAME,
    });
    const shopId = randomUUID();
    slug = `hollow-fern-${tag}`;
    try {
      await db.execute(
        'INSERT INTO shops (id, slug, name, town, time_zone, currency) VALUES (?, ?, ?, ?, ?, ?)',
        [shopId, slug, 'Hollow Fern Suspension Bench', 'Fernbrook', ZONE, 'EUR'],
      );
      await db.execute("UPDATE users SET role = 'owner', shop_id = ? WHERE email = ?", [shopId, ownerEmail]);
      await db.execute("UPDATE users SET role = 'technician', shop_id = ? WHERE email = ?", [
        shopId,
        techEmail,
      ]);
    } finally {
      await db.end();
    }
    await signIn(owner.context, ownerEmail);
    await signIn(tech.context, techEmail);
    await account(rider.context, 'rider', riderName);
  });

  afterAll(async () => {
    await browser?.close();
  });

  it('the owner sets opening hours, benches and a closure; the server’s field errors land on their input', async () => {
    const { page } = owner;
    await page.goto(at('/workshop/hours'));
    await page.getByRole('heading', { name: 'Opening hours' }).waitFor();
    for (const day of ['Monday', 'Tuesday', 'Wednesday', 'Thursday', 'Friday', 'Saturday', 'Sunday'])
      await page.getByRole('button', { name: `Add opening hours on ${day}` }).click();
    // a lunch break on Monday: a second interval
    await page.getByLabel('Monday, interval 1, closes').fill('12:30');
    await page.getByRole('button', { name: 'Add opening hours on Monday' }).click();
    await page.getByLabel('Monday, interval 2, opens').fill('13:30');
    await page.getByLabel('Monday, interval 2, closes').fill('18:00');
    await page.getByLabel('Benches').fill('2');
    await page.getByLabel('Minimum notice').fill('60');
    // off the 5-minute grid: only the server checks that, and says so under the Opens input
    await page.getByLabel('Tuesday, interval 1, opens').fill('09:03');
    await page.getByRole('button', { name: 'Save hours and rules' }).click();
    const tuesday = page.getByRole('group', { name: 'Tuesday' });
    await tuesday.getByText('Opening times must be on the 5-minute grid.').waitFor();
    await screenshot(page, 'workshop-hours-field-error-desktop');
    await page.getByLabel('Tuesday, interval 1, opens').fill('09:00');

    await page.getByRole('button', { name: 'Add a closure' }).click();
    await page.getByLabel('First day').fill(dayInZone(9));
    await page.getByLabel('Last day').fill(dayInZone(10));
    await page.getByLabel('Reason').fill('Stocktake');
    await page.getByRole('button', { name: 'Save hours and rules' }).click();
    await page.getByText('Saved. New bookings follow these hours and rules.').waitFor();
    await page.reload();
    await expect.poll(() => page.getByLabel('Monday, interval 2, opens').inputValue()).toBe('13:30');
    expect(await page.getByLabel('Benches').inputValue()).toBe('2');
    await page.getByRole('button', { name: 'Make a calendar link' }).click();
    const link = await page.getByLabel('Your calendar link').inputValue();
    expect(link).toMatch(/\/calendar\/.+\.ics$/);
    await screenshot(page, 'workshop-hours-desktop');
    findings['Hours & rules'] = await axeFindings(page);
  });

  it('the owner adds a service: deposit above the price is refused, money goes in minor units', async () => {
    const { page } = owner;
    await page.goto(at('/workshop/services'));
    await page.getByRole('button', { name: 'Add a service' }).click();
    const dialog = page.getByRole('dialog', { name: 'Add a service' });
    await dialog.getByLabel('Name').fill(serviceName);
    await dialog.getByLabel('Description').fill('Chambers set for your weight, sag checked front and rear.');
    await dialog.getByLabel('Duration').fill('60');
    await dialog.getByLabel('Buffer after').fill('15');
    await dialog.getByLabel('Price').fill('45');
    await dialog.getByLabel('Deposit at booking').fill('50');
    await dialog.getByRole('button', { name: 'Add service' }).click();
    await dialog.getByText('At most the price').waitFor();
    // no deposit: the booking goes straight to the shop as a request
    await dialog.getByLabel('Deposit at booking').fill('0');
    await dialog.getByRole('button', { name: 'Add service' }).click();
    await dialog.waitFor({ state: 'detached' });
    const row = page.getByRole('row', { name: new RegExp(serviceName) });
    await row.getByText('€45.00').waitFor();
    await screenshot(page, 'workshop-services-desktop');
    findings.Services = await axeFindings(page);
  });

  let confirmId = '';
  let declineId = '';
  let bookedDay = '';

  it('a rider books twice through the API', async () => {
    const services = (await (await rider.context.request.get(at(`/api/shops/${slug}`))).json()) as {
      services: { id: string; name: string; priceMinor: number }[];
    };
    const service = services.services.find((s) => s.name === serviceName)!;
    expect(service.priceMinor).toBe(4500);
    const from = dayInZone(2);
    const to = dayInZone(6);
    const res = await rider.context.request.get(
      at(`/api/shops/${slug}/availability?serviceId=${service.id}&from=${from}&to=${to}`),
    );
    const starts = (await res.json()) as AvailableStart[];
    expect(starts.length).toBeGreaterThan(2);
    const book = async (start: string, notes: string) => {
      const r = await rider.context.request.post(at('/api/appointments'), {
        data: { shopSlug: slug, serviceId: service.id, start, notes },
      });
      expect(r.status()).toBe(201);
      return ((await r.json()) as { id: string; status: string }).id;
    };
    confirmId = await book(starts[0].start, 'Fork feels harsh on roots.');
    declineId = await book(starts[starts.length - 1].start, 'Second bike, same weekend.');
    bookedDay = starts[0].start.slice(0, 10);
  });

  it('the technician confirms one in Requests and declines the other with a reason', async () => {
    const { page } = tech;
    await page.goto(at('/workshop/requests'));
    await page.getByRole('grid', { name: 'Appointments' }).waitFor();
    await page.getByLabel('Search rider or bike').fill(riderName);
    const confirm = page.getByRole('button', { name: new RegExp(`^Confirm: ${riderName}`) });
    await expect.poll(() => confirm.count()).toBe(2);
    await screenshot(page, 'workshop-requests-desktop');
    findings.Requests = await axeFindings(page);

    await confirm.first().click();
    await expect.poll(() => confirm.count()).toBe(1);
    await page.getByRole('grid').getByText('Confirmed').first().waitFor();

    await page
      .getByRole('button', { name: new RegExp(`^Decline: ${riderName}`) })
      .last()
      .click();
    const dialog = page.getByRole('dialog', { name: 'Decline this appointment?' });
    await dialog.getByRole('button', { name: 'Decline appointment' }).click();
    await dialog.getByText('Say why, so the rider knows what to do next.').waitFor();
    await dialog.getByLabel('Reason for the rider').fill('Both benches are booked for a race team that day.');
    await screenshot(page, 'workshop-decline-dialog-desktop');
    await dialog.getByRole('button', { name: 'Decline appointment' }).click();
    await dialog.waitFor({ state: 'detached' });

    const get = async (id: string) =>
      (await (
        await tech.context.request.get(at(`/api/workshop/appointments/${id}`))
      ).json()) as WorkshopAppointment;
    expect(await get(confirmId)).toMatchObject({ status: 'confirmed' });
    expect(await get(declineId)).toMatchObject({
      status: 'declined',
      declineReason: 'Both benches are booked for a race team that day.',
    });
    // the declined one leaves the open list and shows under Declined
    await page.getByRole('combobox', { name: 'State' }).click();
    await page.getByRole('option', { name: 'Declined' }).click();
    await page.getByRole('grid').getByText('Declined').first().waitFor();
  });

  it('the technician sees the confirmed appointment in the Schedule and opens it', async () => {
    const { page } = tech;
    await page.goto(at(`/workshop/schedule?date=${bookedDay}&view=week`));
    const block = page.getByRole('link', { name: new RegExp(`${riderName}, ${serviceName}, Confirmed`) });
    await block.waitFor();
    await page.getByText(/Times in Europe\/Berlin/).waitFor();
    await screenshot(page, 'workshop-schedule-week-desktop');
    findings.Schedule = await axeFindings(page);
    await page.goto(at(`/workshop/schedule?date=${bookedDay}&view=day`));
    await page.getByText('Bench 2').first().waitFor();
    await screenshot(page, 'workshop-schedule-day-desktop');
    await page.getByRole('link', { name: new RegExp(`${riderName}, ${serviceName}, Confirmed`) }).click();
    await page.getByRole('heading', { name: `${serviceName} · ${riderName}` }).waitFor();
    await page.getByText('Fork feels harsh on roots.').waitFor();
    await page.getByText(/^Confirmed · Technician/).waitFor();
    // confirmed and not started: decline, propose and cancel; complete waits for the start
    const actions = page.getByRole('group', { name: 'Actions' });
    expect(await actions.getByRole('button').allTextContents()).toEqual([
      'Decline…',
      'Propose another time…',
      'Cancel…',
    ]);
    await screenshot(page, 'workshop-appointment-desktop');
    findings.Appointment = await axeFindings(page);

    // propose another time: the dialog lists the service's free starts
    await actions.getByRole('button', { name: 'Propose another time…' }).click();
    const dialog = page.getByRole('dialog', { name: 'Propose another time' });
    const starts = dialog.getByRole('group', { name: 'Free starts' }).getByRole('button');
    await expect.poll(() => starts.count()).toBeGreaterThan(1);
    await starts.nth(1).click();
    await screenshot(page, 'workshop-propose-dialog-desktop');
    await dialog.getByRole('button', { name: /^Propose / }).click();
    await dialog.waitFor({ state: 'detached' });
    await page.getByText(/^Proposed instead: /).waitFor();
    await page.getByText(/^Another time proposed to .* · Technician/).waitFor();
  });

  it('the closure shows in the schedule and a rider is refused in Workshop', async () => {
    await tech.page.goto(at(`/workshop/schedule?date=${dayInZone(9)}&view=day`));
    await tech.page.getByText('Closed: Stocktake').waitFor();
    await rider.page.goto(at('/workshop/requests'));
    await rider.page.getByRole('heading', { name: 'Workshop is for shop staff' }).waitFor();
    expect((await rider.context.request.get(at('/api/workshop/appointments'))).status()).toBe(403);
  });

  it('axe-core: nothing serious or critical on Requests, Schedule, Services, Hours & rules', () => {
    expect(findings).toEqual({
      'Hours & rules': [],
      Services: [],
      Requests: [],
      Schedule: [],
      Appointment: [],
    });
  });
}, 120_000);
