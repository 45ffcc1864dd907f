import AxeBuilder from '@axe-core/playwright';
import { randomBytes, randomUUID } from 'node:crypto';
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import mysql from 'mysql2/promise';
import { DateTime } from 'luxon';
import type { Appointment, AvailableStart, ShopService, ShopSettings } from '@loamline/shared-types';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  request,
  type APIRequestContext,
  type Browser,
  type BrowserContext,
  type Page,
} from 'playwright-core';
import { at, launch, mailUrl, screenshot as fullPageShot, viewports } from './browser';

/**
 * Paying online, in a phone-sized browser against the real server, MariaDB, the payment fake (its
 * stripe.js stand-in in the page, its webhooks to the app) and the mail fake: a rider books a service
 * with a deposit, pays it by card, the shop confirms, the rider cancels in good time and gets the
 * deposit back; declined and short cards keep the form and a retry works; a card that asks for
 * authentication gets the fake's overlay, completed and failed; the owner sees the payments by day
 * and refunds part of one by hand, and more than is left is refused. axe-core on the payment step,
 * the receipt and Workshop → Payments.
 */

const PASSWORD = 'roots and loam 42';
const ZONE = 'Europe/Berlin';
const shots = join(__dirname, '..', '..', 'artifacts', 'screenshots');
const tag = randomBytes(3).toString('hex');
const uniqueEmail = (label: string) =>
  `${label}-${Date.now().toString(36)}-${randomBytes(3).toString('hex')}@example.test`;
const SHOP_NAME = `Mossbank Damper Room ${tag}`;
const SERVICE = 'Fork lower service';

interface MailMessage {
  subject: string;
  to: string[];
  text?: string;
}

/** axe-core, WCAG 2.x A and AA; serious and critical findings only. */
async function axeFindings(page: Page): Promise<string[]> {
  await still(page);
  const results = await new AxeBuilder({ page })
    .withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'])
    .analyze();
  return results.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id} (${v.impact}): ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
}

/** Waits until no finite CSS animation runs (a dialog has finished opening). */
async function still(page: Page): Promise<void> {
  await page.waitForFunction(() =>
    document
      .getAnimations()
      .every((a) => a.playState !== 'running' || a.effect?.getComputedTiming().iterations === Infinity),
  );
}

/** A full-page screenshot from the top (the sticky app bar stays where it belongs). */
async function screenshot(page: Page, name: string): Promise<void> {
  await page.evaluate(() => window.scrollTo(0, 0));
  await still(page);
  await fullPageShot(page, name);
}

/** What the phone's screen shows (a dialog or overlay over the page). */
async function screenShot(page: Page, name: string): Promise<void> {
  mkdirSync(shots, { recursive: true });
  await still(page);
  await page.screenshot({ path: join(shots, `${name}.png`) });
}

async function phone(browser: Browser): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext({
    viewport: viewports.phone,
    deviceScaleFactor: 2,
    isMobile: true,
    hasTouch: true,
    timezoneId: ZONE,
    locale: 'en-GB',
  });
  return { context, page: await context.newPage() };
}

/** A rider account made through the API in this context (its cookie jar is the browser's: signed in). */
async function registerRider(context: BrowserContext, name: string): Promise<string> {
  const email = uniqueEmail('rider');
  const res = await context.request.post(at('/api/auth/register'), {
    data: { email, password: PASSWORD, name },
  });
  expect(res.status()).toBe(201);
  return email;
}

/** The subjects of the mails to `to` so far. */
async function subjects(to: string): Promise<string[]> {
  const res = await fetch(`${mailUrl}/api/messages?to=${encodeURIComponent(to)}`);
  return ((await res.json()) as MailMessage[]).map((m) => m.subject);
}

/** Types a card into the card form (the stand-in's plain inputs), as a rider would. */
async function typeCard(page: Page, number: string): Promise<void> {
  const form = page.getByRole('group', { name: 'Card details' });
  await form.getByLabel('Card number').fill('');
  await form.getByLabel('Card number').pressSequentially(number.replace(/\s/g, ''));
  const expiry = form.getByLabel(/^Expiry/);
  await expiry.fill('');
  await expiry.pressSequentially(`12${String((DateTime.now().year + 3) % 100).padStart(2, '0')}`);
  await form.getByLabel('CVC').fill('');
  await form.getByLabel('CVC').pressSequentially('123');
}

const payButton = (page: Page) => page.getByRole('button', { name: /^Pay €/ });

describe('paying online (deposit, cards, refunds)', () => {
  let browser: Browser;
  let owner: APIRequestContext;
  let slug = '';
  let ownerEmail = '';
  let service: ShopService;
  const findings: Record<string, string[]> = {};
  /** free starts, one a day from 10 days out (beyond the 48-hour window) */
  const starts: string[] = [];

  beforeAll(async () => {
    browser = await launch();
    const api = await request.newContext({ baseURL: at('/') });
    ownerEmail = uniqueEmail('owner');
    expect(
      (
        await api.post('/api/auth/register', {
          data: { email: ownerEmail, password: PASSWORD, name: 'Owner Tester' },
        })
      ).status(),
    ).toBe(201);
    await api.dispose();
    slug = `mossbank-${tag}`;
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
        [shopId, slug, SHOP_NAME, 'Mossbank', ZONE, 'EUR'],
      );
      await db.execute("UPDATE users SET role = 'owner', shop_id = ? WHERE email = ?", [shopId, ownerEmail]);
    } finally {
      await db.end();
    }
    owner = await request.newContext({ baseURL: at('/') });
    expect(
      (await owner.post('/api/auth/sign-in', { data: { email: ownerEmail, password: PASSWORD } })).status(),
    ).toBe(200);
    const settings: ShopSettings = {
      timeZone: ZONE,
      currency: 'EUR',
      benches: 1,
      hours: [1, 2, 3, 4, 5, 6, 7].map((weekday) => ({ weekday, start: '09:00', end: '17:00' })),
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
    const res = await owner.post('/api/workshop/services', {
      data: {
        name: SERVICE,
        description: 'Lowers off, seals cleaned, fresh oil.',
        durationMinutes: 60,
        bufferAfterMinutes: 0,
        priceMinor: 6900,
        depositMinor: 2000,
      },
    });
    expect(res.status(), await res.text()).toBe(201);
    service = (await res.json()) as ShopService;
    const from = DateTime.now().setZone(ZONE).plus({ days: 10 }).toISODate()!;
    const to = DateTime.now().setZone(ZONE).plus({ days: 14 }).toISODate()!;
    const free = (await (
      await owner.get(`/api/shops/${slug}/availability?serviceId=${service.id}&from=${from}&to=${to}`)
    ).json()) as AvailableStart[];
    starts.push(...free.map((s) => s.start));
    expect(starts.length).toBeGreaterThan(8);
  });

  afterAll(async () => {
    await owner?.dispose();
    await browser?.close();
  });

  /** A held booking through the API; the rider's page for it. */
  async function bookHeld(context: BrowserContext, start: string): Promise<string> {
    const res = await context.request.post(at('/api/appointments'), {
      data: { shopSlug: slug, serviceId: service.id, start },
    });
    expect(res.status(), await res.text()).toBe(201);
    const booked = (await res.json()) as { id: string; status: string };
    expect(booked.status).toBe('held');
    return booked.id;
  }

  const riderName = `Rider Tester ${tag}`;
  let paidId = '';

  it('a rider pays the deposit, the shop confirms, the rider cancels in good time and the deposit comes back', async () => {
    const { context, page } = await phone(browser);
    const email = await registerRider(context, riderName);
    const start = starts[0];
    const day = start.slice(0, 10);

    // the review step of the booking flow, then Book: the payment step
    await page.goto(
      at(`/shops/${slug}?service=${service.id}&day=${day}&start=${encodeURIComponent(start)}&step=review`),
    );
    await page.getByRole('heading', { name: 'Check and book' }).waitFor();
    await page.getByRole('button', { name: 'Book and hold the time' }).click();
    await page.getByRole('heading', { name: 'Pay the deposit to keep this time' }).waitFor();
    const step = page.getByRole('region', { name: 'Pay the deposit to keep this time' });
    expect(await step.textContent()).toContain('€20.00');
    await step.getByText(`The deposit for ${SERVICE}; the rest, €49.00, at the shop.`).waitFor();
    await step.getByText(/^Held for you until \d\d?:\d\d Berlin time/).waitFor();
    // the heading has the focus: a screen reader starts at what to do
    expect(await page.evaluate(() => document.activeElement?.id)).toBe('pay-title');
    await payButton(page).waitFor();
    expect(await payButton(page).textContent()).toBe('Pay €20.00');
    findings['payment-step'] = await axeFindings(page);
    await screenshot(page, 'pay-step-phone');
    paidId = new URL(page.url()).pathname.split('/').pop()!;

    await typeCard(page, '4242 4242 4242 4242');
    await screenshot(page, 'pay-card-typed-phone');
    await payButton(page).click();
    await page.getByText('Paid — the shop will confirm your time').waitFor();
    // the receipt, once the payment is recorded (the sync or the webhook)
    const receipt = page.getByRole('region', { name: 'Receipt' });
    await receipt.waitFor({ timeout: 15_000 });
    await expect.poll(() => receipt.textContent(), { timeout: 15_000 }).toContain('Visa ····4242');
    const text = (await receipt.textContent()) ?? '';
    expect(text).toContain('Price of the service€69.00');
    expect(text).toMatch(/Paid online \(deposit\) on .*€20\.00/);
    expect(text).toContain('To pay at the shop€49.00');
    await page.getByText('Requested', { exact: true }).waitFor();
    findings['receipt-paid'] = await axeFindings(page);
    await screenshot(page, 'pay-paid-receipt-phone');
    await expect
      .poll(() => subjects(email), { timeout: 15_000 })
      .toContain(`Payment received: €20.00 for ${SERVICE}`);

    // the owner confirms it in Workshop: Requests → the appointment → Confirm
    const shop = await phone(browser);
    const signIn = await shop.context.request.post(at('/api/auth/sign-in'), {
      data: { email: ownerEmail, password: PASSWORD },
    });
    expect(signIn.status()).toBe(200);
    await shop.page.goto(at('/workshop/requests'));
    // on a phone Requests is a list of cards (the table is for wider screens)
    await shop.page.getByRole('list', { name: 'Appointments' }).waitFor();
    // the list asks again once typing stops, and re-renders its rows: tap after that
    const searched = shop.page.waitForResponse(
      (r) => r.url().includes('/api/workshop/appointments?') && r.url().includes('q='),
    );
    await shop.page.getByLabel('Search rider or bike').fill(riderName);
    await searched;
    const list = shop.page.getByRole('list', { name: 'Appointments' });
    await expect.poll(() => list.getByRole('listitem').count()).toBe(1);
    await still(shop.page);
    await list.locator(`a[href="/workshop/appointments/${paidId}"]`).click();
    await shop.page.waitForURL(`**/workshop/appointments/${paidId}`);
    await shop.page.getByRole('heading', { name: `${SERVICE} · ${riderName}` }).waitFor();
    const staffReceipt = shop.page.getByRole('region', { name: 'Payment' });
    expect(await staffReceipt.textContent()).toContain('€20.00');
    await screenshot(shop.page, 'pay-workshop-appointment-phone');
    await shop.page.getByRole('group', { name: 'Actions' }).getByRole('button', { name: 'Confirm' }).click();
    await shop.page.getByText(/^Confirmed · /).waitFor();
    await shop.context.close();

    // the rider cancels 10 days ahead: the dialog says the 20.00 comes back
    await page.reload();
    await page.getByText('Confirmed', { exact: true }).waitFor();
    await page.getByRole('button', { name: 'Cancel appointment' }).click();
    const dialog = page.getByRole('dialog', { name: 'Cancel this appointment?' });
    await dialog.waitFor();
    expect(await dialog.textContent()).toMatch(/€20\.00/);
    findings['cancel-dialog'] = await axeFindings(page);
    await screenShot(page, 'pay-cancel-dialog-phone');
    await dialog.getByRole('button', { name: 'Cancel appointment' }).click();
    await dialog.waitFor({ state: 'hidden' });
    await page.getByText('Cancelled', { exact: true }).waitFor();
    // the refund: perhaps "on its way" for a moment, then refunded
    await expect.poll(() => receipt.textContent()).toMatch(/Refund on .*You cancelled/);
    await screenshot(page, 'pay-refund-pending-phone');
    // … and the page updates by itself once it is made (no reload)
    await expect
      .poll(() => receipt.textContent(), { timeout: 30_000, interval: 500 })
      .not.toContain('on its way');
    await page.getByText('€20.00 went back to your card; it can take a few days to show.').waitFor();
    const refunded = (await receipt.textContent()) ?? '';
    expect(refunded).toMatch(/Refund on .*You cancelled.*[−-]€20\.00/);
    expect(refunded).toContain('Net paid€0.00');
    expect(refunded).not.toContain('To pay at the shop');
    findings['receipt-refunded'] = await axeFindings(page);
    await screenshot(page, 'pay-refunded-receipt-phone');
    await expect.poll(() => subjects(email), { timeout: 15_000 }).toContain(`Refund: €20.00 for ${SERVICE}`);
    await context.close();
  });

  it('a declined card and one with insufficient funds keep the form; then a good card pays the same appointment', async () => {
    const { context, page } = await phone(browser);
    await registerRider(context, `Second Rider ${tag}`);
    const id = await bookHeld(context, starts[1]);
    await page.goto(at(`/appointments/${id}`));
    await payButton(page).waitFor();

    await typeCard(page, '4000 0000 0000 0002');
    await payButton(page).click();
    const error = page.getByRole('alert').filter({ hasText: 'declined' });
    await error.waitFor();
    expect(await error.textContent()).toBe('Your card was declined. Nothing was charged. Try another card.');
    expect(await page.getByRole('group', { name: 'Card details' }).isVisible()).toBe(true);
    await screenshot(page, 'pay-declined-phone');

    await typeCard(page, '4000 0000 0000 9995');
    await payButton(page).click();
    await page.getByRole('alert').filter({ hasText: 'insufficient funds' }).waitFor();
    expect(await payButton(page).isEnabled()).toBe(true);
    await screenshot(page, 'pay-insufficient-phone');

    await typeCard(page, '4242 4242 4242 4242');
    await payButton(page).click();
    await page.getByText('Paid — the shop will confirm your time').waitFor();
    const receipt = page.getByRole('region', { name: 'Receipt' });
    await expect.poll(() => receipt.textContent(), { timeout: 15_000 }).toContain('Visa ····4242');
    expect(await receipt.textContent()).toMatch(/Paid online \(deposit\).*€20\.00/);
    const a = (await (await context.request.get(at(`/api/appointments/${id}`))).json()) as Appointment;
    expect(a.status).toBe('requested');
    expect(a.payment?.paidMinor).toBe(2000);
    await context.close();
  });

  it('a card that asks for authentication: the overlay completed pays; failed, the form stays', async () => {
    const { context, page } = await phone(browser);
    await registerRider(context, `Third Rider ${tag}`);
    const id = await bookHeld(context, starts[2]);
    await page.goto(at(`/appointments/${id}`));
    await payButton(page).waitFor();
    await typeCard(page, '4000 0027 6000 3184');
    await payButton(page).click();
    const overlay = page.getByRole('dialog', { name: 'Test authentication' });
    await overlay.waitFor();
    const frame = page.frameLocator('iframe[title="Test authentication"]');
    await frame.getByRole('button', { name: 'Complete authentication' }).waitFor();
    await screenShot(page, 'pay-authentication-phone');
    // by keyboard: the first button has the focus, Tab reaches the other, and never the page behind
    const focused = (name: string) =>
      frame.getByRole('button', { name }).evaluate((b) => b === document.activeElement);
    await expect.poll(() => focused('Complete authentication')).toBe(true);
    await page.keyboard.press('Tab');
    expect(await focused('Fail authentication')).toBe(true);
    await page.keyboard.press('Shift+Tab');
    expect(await focused('Complete authentication')).toBe(true);
    // the page behind is out of reach while the overlay is up
    expect(await page.locator('#root').evaluate((el) => (el as HTMLElement).inert)).toBe(true);
    // Enter submits the authentication page as it goes down, and the overlay goes with its answer;
    // the key comes up once the overlay has gone. Not keyboard.press: its key-up would go to the
    // frame while it is being removed (the frame has the focus, and it runs in a process of its own:
    // another origin under the app's Origin-Agent-Cluster), the browser never acknowledges a key
    // event whose frame goes away first, and keyboard.press waits for that with no timeout.
    await page.keyboard.down('Enter');
    await overlay.waitFor({ state: 'detached' });
    await page.keyboard.up('Enter');
    await page.getByText('Paid — the shop will confirm your time').waitFor();
    await expect
      .poll(() => page.getByRole('region', { name: 'Receipt' }).textContent(), { timeout: 15_000 })
      .toContain('····3184');

    // a second booking: the authentication fails
    const second = await bookHeld(context, starts[3]);
    await page.goto(at(`/appointments/${second}`));
    await payButton(page).waitFor();
    await typeCard(page, '4000 0027 6000 3184');
    await payButton(page).click();
    await frame.getByRole('button', { name: 'Fail authentication' }).click();
    await overlay.waitFor({ state: 'detached' });
    const failed = page.getByRole('alert').filter({ hasText: 'confirm it was you' });
    await failed.waitFor();
    expect(await failed.textContent()).toContain('nothing was charged');
    expect(await payButton(page).isEnabled()).toBe(true);
    await screenshot(page, 'pay-authentication-failed-phone');
    await context.close();
  });

  it('the owner sees the payments by day and refunds part of one; more than is left is refused', async () => {
    const { context, page } = await phone(browser);
    const signIn = await context.request.post(at('/api/auth/sign-in'), {
      data: { email: ownerEmail, password: PASSWORD },
    });
    expect(signIn.status()).toBe(200);
    await page.goto(at('/workshop/payments'));
    await page.getByRole('grid', { name: 'Payments' }).waitFor();
    const totals = page.getByRole('region', { name: 'Totals for these days' });
    // paid today: 3 × €20.00 received, €20.00 refunded (the cancellation)
    await expect.poll(() => totals.textContent()).toMatch(/Received€60\.00.*Refunded[−-]€20\.00.*Net€40\.00/);
    const days = page.getByRole('region', { name: 'By day' });
    const today = DateTime.now().setZone(ZONE);
    const todayRow = days.getByRole('row', { name: new RegExp(today.toFormat('d LLL yyyy')) });
    expect(await todayRow.textContent()).toContain('€60.00');
    findings['workshop-payments'] = await axeFindings(page);
    await screenshot(page, 'pay-workshop-payments-phone');

    // the second rider's payment: details, then refund €5.00
    const row = page.getByRole('row', { name: new RegExp(`Second Rider ${tag}`) });
    await row.click();
    const details = page.getByRole('dialog', { name: new RegExp(`Second Rider ${tag}`) });
    await details.waitFor();
    await screenShot(page, 'pay-workshop-details-phone');
    await details.getByRole('button', { name: 'Refund…' }).click();
    const refund = page.getByRole('dialog', { name: `Refund Second Rider ${tag}` });
    await refund.waitFor();
    expect(await refund.getByLabel('Amount to refund').inputValue()).toBe('20.00');
    await refund.getByLabel('Amount to refund').fill('5');
    await refund.getByRole('button', { name: 'Refund €5.00' }).click();
    await refund.getByText('Say why: it goes on the receipt and in your books.').waitFor();
    await refund.getByLabel('Reason').fill('Seal kit was cheaper than quoted.');
    await refund.getByText('€15.00 of this payment stays with the shop').waitFor();
    findings['refund-dialog'] = await axeFindings(page);
    await screenShot(page, 'pay-workshop-refund-dialog-phone');
    await refund.getByRole('button', { name: 'Refund €5.00' }).click();
    await refund.waitFor({ state: 'detached' });
    await page.getByText(`Refunded €5.00 to Second Rider ${tag}.`).waitFor();
    // a phone shows who, the net and the actions; the rest is in the details
    await expect.poll(() => row.textContent()).toContain('€15.00');
    expect(await row.getByRole('button', { name: `Refund Second Rider ${tag}` }).isVisible()).toBe(true);
    await screenshot(page, 'pay-workshop-refunded-phone');

    // more than is left: refused, with what is left
    await row.click();
    await details.getByRole('button', { name: 'Refund…' }).click();
    await refund.waitFor();
    expect(await refund.getByLabel('Amount to refund').inputValue()).toBe('15.00');
    await refund.getByLabel('Amount to refund').fill('16');
    await refund.getByLabel('Reason').fill('Trying too much.');
    await refund.getByRole('button', { name: /^Refund/ }).click();
    await refund.getByText('At most €15.00 is left to refund.').waitFor();
    await screenShot(page, 'pay-workshop-refund-too-much-phone');
    await refund.getByRole('button', { name: 'Keep the money' }).click();
    await refund.waitFor({ state: 'detached' });

    // the same page on a desktop: every column at once
    await page.setViewportSize(viewports.desktop);
    await page.getByRole('columnheader', { name: 'Paid at' }).waitFor();
    await expect.poll(() => row.textContent()).toMatch(/[−-]€5\.00/);
    expect(await row.textContent()).toContain('Partly refunded');
    await screenshot(page, 'pay-workshop-payments-desktop');

    // the server refuses too (the browser's check is a courtesy)
    const list = (await (await context.request.get(at('/api/workshop/payments'))).json()) as {
      rows: { id: string; rider: { name: string }; refundedMinor: number }[];
    };
    const p = list.rows.find((r) => r.rider.name === `Second Rider ${tag}`)!;
    expect(p.refundedMinor).toBe(500);
    const over = await context.request.post(at(`/api/workshop/payments/${p.id}/refunds`), {
      data: { amountMinor: 1600, reason: 'Too much', requestId: randomUUID() },
    });
    expect(over.status()).toBe(400);
    await context.close();
  });

  it('axe-core: nothing serious or critical on the payment step, the receipt and Workshop → Payments', () => {
    expect(findings).toEqual(Object.fromEntries(Object.keys(findings).map((k) => [k, []])));
  });
}, 120_000);
