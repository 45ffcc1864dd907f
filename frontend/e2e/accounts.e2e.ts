import { randomBytes, randomUUID } from 'node:crypto';
import mysql from 'mysql2/promise';
import type { Bike, BaselineSheetListItem } from '@loamline/shared-types';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, BrowserContext, Page } from 'playwright-core';
import { at, launch, mailUrl, newPage, screenshot } from './browser';

/**
 * Accounts (issue 4) in a real browser against the real server, MariaDB and mail fake: a rider keeps
 * a baseline sheet across sign-ins, resets a password from the e-mail, keeps bikes in the garage and
 * is refused in Workshop; an owner invites a technician who joins from the e-mailed link.
 */

const PASSWORD = 'roots and loam 42';
const uniqueEmail = (label: string) =>
  `${label}-${Date.now().toString(36)}-${randomBytes(3).toString('hex')}@example.test`;

interface MailMessage {
  subject: string;
  to: string[];
  links: string[];
}

/** The newest link in the mail fake's JSON inbox for `to` that contains `part`, once it arrives. */
async function linkFromMail(to: string, part: string): Promise<string> {
  let found: string | undefined;
  await expect
    .poll(
      async () => {
        const res = await fetch(`${mailUrl}/api/messages?to=${encodeURIComponent(to)}`);
        const messages = (await res.json()) as MailMessage[];
        found = messages.flatMap((m) => m.links).find((l) => l.includes(part));
        return found;
      },
      { timeout: 15_000, interval: 250 },
    )
    .toBeTruthy();
  return found!;
}

/** A rider account made through the API in this browser context (its cookie jar is the browser's). */
async function registerInContext(
  context: BrowserContext,
  label: string,
): Promise<{ email: string; name: string }> {
  const email = uniqueEmail(label);
  const name = `${label[0].toUpperCase()}${label.slice(1)} Tester`;
  const res = await context.request.post(at('/api/auth/register'), {
    data: { email, password: PASSWORD, name },
  });
  expect(res.status()).toBe(201);
  return { email, name };
}

async function signInInUi(page: Page, email: string, password: string): Promise<void> {
  await page.getByLabel('E-mail').fill(email);
  await page.getByLabel('Password', { exact: true }).fill(password);
  await page.getByRole('button', { name: 'Sign in', exact: true }).click();
}

/** The phone menu's Sign out; ends on the start page, signed out. */
async function signOutOnPhone(page: Page): Promise<void> {
  await page.getByRole('button', { name: 'Open menu' }).click();
  await page.getByRole('button', { name: 'Sign out' }).click();
  await page.waitForURL(at('/'));
  await page.getByRole('button', { name: 'Open menu' }).click();
  await page.getByRole('link', { name: 'Sign in' }).waitFor();
  await page.keyboard.press('Escape');
}

/** Rider and Riding steps of the wizard (a trail rider of 82 kg). */
async function riderAndRiding(page: Page): Promise<void> {
  const weight = page.getByRole('textbox', { name: /weight with riding gear/i });
  await weight.waitFor();
  await weight.fill('82');
  await page.getByRole('button', { name: /^next$/i }).click();
  await page.getByRole('heading', { name: 'How do you ride?' }).waitFor();
  await page.getByRole('button', { name: /^Trail:/ }).click();
  await page.getByRole('button', { name: /^Balanced:/ }).click();
  await page.getByRole('button', { name: /^next$/i }).click();
  await page.getByRole('heading', { name: 'Your bike' }).waitFor();
}

/** Waits until no finite CSS animation runs (a dialog or drawer has finished sliding in). */
async function still(page: Page): Promise<void> {
  await page.waitForFunction(() =>
    document
      .getAnimations()
      .every((a) => a.playState !== 'running' || a.effect?.getComputedTiming().iterations === Infinity),
  );
}

async function apiJson<T>(context: BrowserContext, path: string): Promise<T> {
  const res = await context.request.get(at(path));
  expect(res.status()).toBe(200);
  return (await res.json()) as T;
}

describe('accounts in the browser (issue 4)', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser.close();
  });

  it('a rider registers from the wizard, saves a baseline, signs out and in, finds the sheet and renames it', async () => {
    const { context, page } = await newPage(browser, 'phone');
    const email = uniqueEmail('rider');

    // a baseline, signed out
    await page.goto(at('/baseline'));
    await riderAndRiding(page);
    await page.getByRole('textbox', { name: 'Fork travel' }).fill('160');
    await page.getByRole('button', { name: '36 mm' }).click();
    await page.getByRole('textbox', { name: 'Rear wheel travel' }).fill('165');
    await page.getByRole('textbox', { name: 'Shock stroke' }).fill('65');
    await page.getByRole('button', { name: 'Get my baseline' }).click();
    const forkPressure = page.getByTestId('fork-pressure');
    await forkPressure.waitFor({ timeout: 20_000 });
    const shownBefore = await forkPressure.textContent();

    // Save needs an account: to sign-in and back, the wizard's input kept for the round trip
    await page.getByRole('button', { name: 'Save as baseline sheet' }).click();
    await page.waitForURL(/\/sign-in\?next=%2Fbaseline%3Fresume%3Dsheet$/);
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    await screenshot(page, 'accounts-sign-in-phone');
    await page.getByRole('link', { name: 'Create an account' }).click();
    await page.waitForURL(/\/register\?next=/);
    // the form checks before it sends
    await page.getByLabel('E-mail').fill('not-an-address');
    await page.getByLabel('Password', { exact: true }).fill('short');
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.getByText('That does not look like an e-mail address.').waitFor();
    await page.getByText(/Use at least \d+ characters/).waitFor();
    await screenshot(page, 'accounts-register-errors-phone');
    await page.getByLabel('Name').fill('Sam Tester');
    await page.getByLabel('E-mail').fill(email);
    await page.getByLabel('Password', { exact: true }).fill(PASSWORD);
    await page.getByRole('button', { name: 'Create account' }).click();

    // back on the Baseline step with the same result; the name dialog asks at once
    const dialog = page.getByRole('dialog', { name: 'Save as baseline sheet' });
    await dialog.waitFor({ timeout: 20_000 });
    expect(await forkPressure.textContent()).toBe(shownBefore);
    expect(await dialog.getByLabel('Sheet name').inputValue()).toMatch(/^Trail · 82 kg · /);
    await still(page);
    await screenshot(page, 'accounts-save-sheet-dialog-phone');
    await dialog.getByLabel('Sheet name').fill('Trail bike, first try');
    const saved = page.waitForResponse(
      (r) => r.url().endsWith('/api/baseline-sheets') && r.request().method() === 'POST',
    );
    await dialog.getByRole('button', { name: 'Save sheet' }).click();
    expect((await saved).status()).toBe(201);
    await page.getByText('Saved as “Trail bike, first try”.').waitFor();
    expect(new URL(page.url()).search).toBe(''); // ?resume=sheet is gone: a reload does not ask again
    await screenshot(page, 'accounts-sheet-saved-phone');

    // sign out; the sheets page then asks to sign in and comes back
    await signOutOnPhone(page);
    await page.goto(at('/sheets'));
    await page.waitForURL(/\/sign-in\?next=%2Fsheets$/);
    await signInInUi(page, email, PASSWORD);
    await page.waitForURL(at('/sheets'));
    const row = page.getByRole('link', { name: /Trail bike, first try/ });
    await row.waitFor();
    expect(await row.textContent()).toContain(shownBefore); // the headline pressure
    await screenshot(page, 'accounts-sheets-phone');

    // open it: the stored result, read-only, the same pressure as the wizard showed
    await row.click();
    await page.getByRole('heading', { level: 1, name: 'Trail bike, first try' }).waitFor();
    expect(await page.getByTestId('fork-pressure').textContent()).toBe(shownBefore);
    await page.getByRole('heading', { name: 'Before you ride' }).waitFor();
    expect(await page.getByRole('button', { name: 'Print' }).isVisible()).toBe(true);
    await screenshot(page, 'accounts-sheet-phone');

    // on paper (the wizard's print stylesheet): the sheet's name and figures, no app bar or buttons
    await page.emulateMedia({ media: 'print' });
    expect(await page.locator('header').isVisible()).toBe(false);
    expect(await page.getByRole('button', { name: 'Rename' }).isVisible()).toBe(false);
    expect(await page.getByRole('heading', { level: 1, name: 'Trail bike, first try' }).isVisible()).toBe(
      true,
    );
    expect(await page.getByTestId('fork-pressure').isVisible()).toBe(true);
    await screenshot(page, 'accounts-sheet-print');
    await page.emulateMedia({ media: 'screen' });

    // rename
    await page.getByRole('button', { name: 'Rename' }).click();
    const rename = page.getByRole('dialog', { name: 'Rename sheet' });
    await rename.getByLabel('Sheet name').fill('Trail bike, winter');
    await rename.getByRole('button', { name: 'Rename' }).click();
    await page.getByRole('heading', { level: 1, name: 'Trail bike, winter' }).waitFor();
    await page.reload();
    await page.getByRole('heading', { level: 1, name: 'Trail bike, winter' }).waitFor();
    const list = await apiJson<BaselineSheetListItem[]>(context, '/api/baseline-sheets');
    expect(list.map((s) => s.name)).toEqual(['Trail bike, winter']);
    await context.close();
  });

  it('resets a password from the link in the e-mail, end to end', async () => {
    const { context, page } = await newPage(browser, 'phone');
    const { email } = await registerInContext(context, 'forgetful');
    await context.clearCookies();

    await page.goto(at('/sign-in'));
    await page.getByRole('link', { name: 'Forgot your password?' }).click();
    await page.getByRole('heading', { name: 'Forgot your password?' }).waitFor();
    await screenshot(page, 'accounts-forgot-password-phone');
    await page.getByLabel('E-mail').fill(email);
    await page.getByRole('button', { name: 'Send me a link' }).click();
    await page.getByText(`If an account exists for ${email}, we sent it a link`).waitFor();
    await screenshot(page, 'accounts-forgot-password-sent-phone');

    const link = await linkFromMail(email, '/reset-password?token=');
    expect(new URL(link).origin).toBe(new URL(at('/')).origin);
    await page.goto(link);
    await page.getByRole('heading', { name: 'Choose a new password' }).waitFor();
    await page.getByLabel('New password', { exact: true }).fill('a new and longer passphrase');
    await page.getByLabel('New password again').fill('a new and longer passphrase');
    await screenshot(page, 'accounts-reset-password-phone');
    await page.getByRole('button', { name: 'Set new password' }).click();
    await page.getByRole('heading', { name: 'Password changed' }).waitFor();
    await screenshot(page, 'accounts-reset-password-done-phone');

    // the old password is refused, the new one works
    await page.getByRole('link', { name: 'Sign in' }).click();
    await signInInUi(page, email, PASSWORD);
    await page.getByText('E-mail or password is wrong.').waitFor();
    await screenshot(page, 'accounts-sign-in-wrong-phone');
    await page.getByLabel('Password', { exact: true }).fill('a new and longer passphrase');
    await page.getByRole('button', { name: 'Sign in', exact: true }).click();
    await page.waitForURL(at('/'));
    expect((await apiJson<{ email: string }>(context, '/api/auth/me')).email).toBe(email);

    // the link works once
    await page.goto(link);
    await page.getByLabel('New password', { exact: true }).fill('yet another passphrase');
    await page.getByLabel('New password again').fill('yet another passphrase');
    await page.getByRole('button', { name: 'Set new password' }).click();
    await page.getByText(/expired or was used already/).waitFor();
    await context.close();
  });

  it('keeps bikes in the garage: add, edit, get a baseline with one, delete', async () => {
    const { context, page } = await newPage(browser, 'phone');
    await registerInContext(context, 'garage');
    await page.goto(at('/garage'));
    await page.getByRole('heading', { name: 'No bikes yet' }).waitFor();
    await screenshot(page, 'accounts-garage-empty-phone');

    // add, with one typo caught first
    await page.getByRole('button', { name: 'Add a bike' }).click();
    const dialog = page.getByRole('dialog', { name: 'Add a bike' });
    await dialog.getByLabel('Name').fill('Long-travel enduro');
    await dialog.getByLabel('Travel', { exact: true }).fill('160');
    await dialog.getByLabel('Stanchions').fill('36');
    await dialog.getByLabel('Volume spacers').first().fill('1');
    await dialog.getByLabel('End-stroke chamber fitted').check();
    await dialog.getByLabel('End-stroke pressure').fill('180');
    await dialog.getByLabel('Stroke', { exact: true }).fill('650');
    await dialog.getByLabel('Wheel travel').fill('165');
    await dialog.getByRole('button', { name: 'Add bike' }).click();
    await dialog.getByText(/^Between \d+ and \d+ mm\.$/).waitFor();
    await still(page);
    await screenshot(page, 'accounts-garage-add-bike-phone');
    await dialog.getByLabel('Stroke', { exact: true }).fill('65');
    await dialog.getByRole('button', { name: 'Add bike' }).click();
    const card = page.getByRole('article', { name: 'Long-travel enduro' });
    await card.waitFor();
    expect(await card.textContent()).toContain(
      '160 mm travel · 36 mm stanchions · air spring, 1 spacer · end-stroke chamber 180 psi',
    );
    expect(await card.textContent()).toContain('65 mm stroke · 165 mm wheel travel');
    let [bike] = await apiJson<Bike[]>(context, '/api/bikes');
    expect(bike.fork).toEqual({
      travelMm: 160,
      stanchionMm: 36,
      spring: 'air',
      spacers: 1,
      endStroke: { pressurePsi: 180 },
    });
    expect(bike.shock).toEqual({ strokeMm: 65, wheelTravelMm: 165, spring: 'air', spacers: 0 });

    // edit: another name, two spacers, a coil shock
    await card.getByRole('button', { name: 'Edit Long-travel enduro' }).click();
    const edit = page.getByRole('dialog', { name: 'Edit Long-travel enduro' });
    await edit.getByLabel('Name').fill('Enduro, coil rear');
    await edit.getByLabel('Volume spacers').first().fill('2');
    await edit.getByRole('group', { name: 'Shock spring' }).getByRole('button', { name: 'Coil' }).click();
    await edit.getByRole('button', { name: 'Save changes' }).click();
    const edited = page.getByRole('article', { name: 'Enduro, coil rear' });
    await edited.waitFor();
    expect(await edited.textContent()).toContain('air spring, 2 spacers');
    expect(await edited.textContent()).toContain('165 mm wheel travel · coil spring');
    [bike] = await apiJson<Bike[]>(context, '/api/bikes');
    expect(bike.fork?.spacers).toBe(2);
    expect(bike.shock).toEqual({ strokeMm: 65, wheelTravelMm: 165, spring: 'coil', spacers: 0 });
    await screenshot(page, 'accounts-garage-phone');

    // "Get a baseline with this bike": the wizard's Bike step comes filled
    await edited.getByRole('link', { name: 'Get a baseline with this bike' }).click();
    await page.waitForURL(/\/baseline\?bike=/);
    await page.getByText('The Bike step is filled from “Enduro, coil rear”.', { exact: false }).waitFor();
    await riderAndRiding(page);
    expect(await page.getByRole('textbox', { name: 'Fork travel' }).inputValue()).toBe('160');
    expect(await page.getByRole('textbox', { name: 'Shock stroke' }).inputValue()).toBe('65');
    await page.getByText('From my garage').waitFor();
    await screenshot(page, 'accounts-wizard-bike-from-garage-phone');

    // or from the picker at the Bike step of a fresh wizard (this tab kept the last one: start over)
    await page.goto(at('/baseline'));
    await page.getByRole('button', { name: 'Start over' }).click();
    await page
      .getByRole('dialog', { name: 'Start over?' })
      .getByRole('button', { name: 'Start over' })
      .click();
    await riderAndRiding(page);
    expect(await page.getByRole('textbox', { name: 'Fork travel' }).inputValue()).toBe('');
    await page.getByRole('combobox', { name: 'Pick a bike' }).click();
    await page.getByRole('option', { name: 'Enduro, coil rear' }).click();
    await expect.poll(() => page.getByRole('textbox', { name: 'Fork travel' }).inputValue()).toBe('160');
    expect(await page.getByRole('textbox', { name: 'Rear wheel travel' }).inputValue()).toBe('165');

    // delete, after a confirm
    await page.goto(at('/garage'));
    await page.getByRole('button', { name: 'Delete Enduro, coil rear' }).click();
    const confirm = page.getByRole('dialog', { name: 'Delete Enduro, coil rear?' });
    await confirm.getByRole('button', { name: 'Delete bike' }).waitFor();
    await still(page);
    await screenshot(page, 'accounts-garage-delete-phone');
    await confirm.getByRole('button', { name: 'Delete bike' }).click();
    await page.getByRole('heading', { name: 'No bikes yet' }).waitFor();
    expect(await apiJson<Bike[]>(context, '/api/bikes')).toEqual([]);
    await context.close();
  });

  it('refuses a rider in Workshop: no menu entry, a clear page, and 403 from the server', async () => {
    const { context, page } = await newPage(browser, 'phone');
    await registerInContext(context, 'curious');
    await page.goto(at('/workshop'));
    await page.getByRole('heading', { name: 'Workshop is for shop staff' }).waitFor();
    await screenshot(page, 'accounts-workshop-refused-phone');
    await page.getByRole('button', { name: 'Open menu' }).click();
    const menu = page.getByRole('navigation', { name: 'Main' });
    await menu.getByRole('link', { name: 'My garage' }).waitFor();
    expect(await menu.getByRole('link', { name: 'Workshop' }).count()).toBe(0);
    await still(page);
    await screenshot(page, 'accounts-menu-rider-phone');
    expect((await context.request.get(at('/api/workshop/team'))).status()).toBe(403);
    const invite = await context.request.post(at('/api/workshop/team/invitations'), {
      data: { email: uniqueEmail('sneaky'), role: 'owner' },
    });
    expect(invite.status()).toBe(403);
    await context.close();
  });

  it('an owner invites a technician by e-mail; the technician joins from the link and reaches Workshop', async () => {
    // The demo seed makes shop owners; a test run has no seed, so the owner is a registered account
    // promoted in the database, as the seed would store one.
    const owner = await newPage(browser, 'desktop');
    const { email: ownerEmail } = await registerInContext(owner.context, 'owner');
    const db = await mysql.createConnection({
      host: process.env.DB_HOST ?? '127.0.0.1',
      port: Number(process.env.DB_PORT ?? 3307),
      user: process.env.DB_USER,
      password: process.env.DB_PASSWORD,
      database: process.env.DB_NAME,
    });
    const shopId = randomUUID();
    try {
      await db.execute(
        'INSERT INTO shops (id, slug, name, town, time_zone, currency) VALUES (?, ?, ?, ?, ?, ?)',
        [
          shopId,
          `kettle-ridge-${randomBytes(3).toString('hex')}`,
          'Kettle Ridge Suspension Lab',
          'Alder Falls',
          'America/Denver',
          'USD',
        ],
      );
      await db.execute("UPDATE users SET role = 'owner', shop_id = ? WHERE email = ?", [shopId, ownerEmail]);
    } finally {
      await db.end();
    }

    // sign in again: the session now says owner
    await owner.context.clearCookies();
    const page = owner.page;
    await page.goto(at('/sign-in'));
    await signInInUi(page, ownerEmail, PASSWORD);
    await page.waitForURL(at('/'));
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Workshop' }).click();
    await page.getByRole('heading', { level: 1, name: 'Kettle Ridge Suspension Lab' }).waitFor();
    await page.getByText('America/Denver').waitFor();
    await screenshot(page, 'accounts-workshop-desktop');

    // invite
    await page.getByRole('tab', { name: 'Team' }).click();
    await page.getByRole('heading', { name: 'Invite someone' }).waitFor();
    const techEmail = uniqueEmail('tech');
    await page.getByLabel('E-mail').fill(techEmail);
    await page.getByRole('button', { name: 'Send invitation' }).click();
    await page.getByText(`Invitation sent to ${techEmail}.`).waitFor();
    await page
      .getByRole('table', { name: /Open invitations/ })
      .getByRole('cell', { name: techEmail })
      .waitFor();

    // the technician, on a phone, follows the link in the e-mail
    const link = await linkFromMail(techEmail, '/join?token=');
    const tech = await newPage(browser, 'phone');
    await tech.page.goto(link);
    await tech.page.getByRole('heading', { name: 'Join Kettle Ridge Suspension Lab' }).waitFor();
    expect(await tech.page.getByLabel('E-mail').inputValue()).toBe(techEmail);
    await tech.page.getByLabel('Your name').fill('Kit Technician');
    await tech.page.getByLabel('Password', { exact: true }).fill(PASSWORD);
    await screenshot(tech.page, 'accounts-join-phone');
    await tech.page.getByRole('button', { name: 'Join Kettle Ridge Suspension Lab' }).click();
    await tech.page.waitForURL(at('/workshop'));
    await tech.page.getByRole('heading', { level: 1, name: 'Kettle Ridge Suspension Lab' }).waitFor();
    await screenshot(tech.page, 'accounts-workshop-technician-phone');
    await tech.page.getByRole('tab', { name: 'Team' }).click();
    await tech.page
      .getByRole('table', { name: /Staff/ })
      .getByRole('cell', { name: /Kit Technician/ })
      .waitFor();
    // a technician sees the team but may not invite: no form, and the server says 403
    expect(await tech.page.getByRole('heading', { name: 'Invite someone' }).count()).toBe(0);
    await screenshot(tech.page, 'accounts-team-phone');
    const refused = await tech.context.request.post(at('/api/workshop/team/invitations'), {
      data: { email: uniqueEmail('another'), role: 'technician' },
    });
    expect(refused.status()).toBe(403);
    await tech.page.getByRole('button', { name: 'Open menu' }).click();
    await tech.page
      .getByRole('navigation', { name: 'Main' })
      .getByRole('link', { name: 'Workshop' })
      .waitFor();
    await still(tech.page);
    await screenshot(tech.page, 'accounts-menu-technician-phone');
    await tech.context.close();

    // the owner's team page: the technician is staff now, the invitation is used
    await page.reload();
    const staff = page.getByRole('table', { name: /Staff/ });
    await staff.getByRole('cell', { name: /Kit Technician/ }).waitFor();
    expect(await staff.getByRole('row').count()).toBe(3); // header, owner, technician
    await page.getByText('None waiting.', { exact: false }).waitFor();
    await page.getByRole('button', { name: /^Account:/ }).click();
    await page.getByRole('menu').getByText('Shop owner', { exact: false }).waitFor();
    await still(page);
    await screenshot(page, 'accounts-account-menu-desktop');
    await page.keyboard.press('Escape');
    await still(page);
    await screenshot(page, 'accounts-team-desktop');
    await owner.context.close();
  });
});
