import AxeBuilder from '@axe-core/playwright';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser, Locator, Page } from 'playwright-core';
import { join } from 'node:path';
import { at, baseUrl, launch, newPage, screenshot } from './browser';

const shots = join(__dirname, '..', '..', 'artifacts', 'screenshots');

/**
 * The baseline wizard's shell on a phone, against the real server: the first HTML paints the app's
 * frame before any script, a reload keeps the step and every value, every step passes axe-core's
 * WCAG 2.x A/AA rules with no serious or critical finding, and the whole wizard works from the
 * keyboard alone.
 */

/** Full-page screenshot from the top, the sticky bars in the flow (as baseline.e2e.ts does). */
async function shot(page: Page, name: string): Promise<void> {
  await page.addStyleTag({ content: 'header.MuiAppBar-root, .wizard-nav { position: static !important; }' });
  await page.evaluate(() => window.scrollTo(0, 0));
  await page.waitForTimeout(400);
  await screenshot(page, name);
}

/** axe-core with the WCAG 2.0/2.1/2.2 A and AA rules (axe-core's tags); serious and critical only. */
async function axeFindings(page: Page): Promise<string[]> {
  const results = await new AxeBuilder({ page })
    .withTags(['wcag2a', 'wcag2aa', 'wcag21a', 'wcag21aa', 'wcag22aa'])
    .analyze();
  return results.violations
    .filter((v) => v.impact === 'serious' || v.impact === 'critical')
    .map((v) => `${v.id} (${v.impact}): ${v.nodes.map((n) => n.target.join(' ')).join(', ')}`);
}

/** Tab (Shift+Tab with `back`) until `target` has the focus; fails after `max` presses. */
async function tabTo(page: Page, target: Locator, max = 40, back = false): Promise<void> {
  const passed: string[] = [];
  for (let i = 0; i < max; i++) {
    if (await target.evaluate((el) => el === document.activeElement)) return;
    await page.keyboard.press(back ? 'Shift+Tab' : 'Tab');
    passed.push(
      await page.evaluate(() => {
        const el = document.activeElement;
        if (!el) return '(none)';
        const name = el.getAttribute('aria-label') ?? el.textContent?.slice(0, 30) ?? '';
        return `${el.tagName.toLowerCase()} "${name}"`;
      }),
    );
  }
  throw new Error(`Tab never reached ${target.toString()}; it went: ${passed.join(' → ')}`);
}

/**
 * A choice in a group of toggle buttons: Tab reaches the group once (a roving tab stop), the arrow
 * keys move between its choices (WAI-ARIA practice for a group of toggles).
 */
async function reachChoice(page: Page, target: Locator, arrow: 'ArrowDown' | 'ArrowRight'): Promise<void> {
  const inGroup = () =>
    target.evaluate((el) => {
      const group = el.closest('[role="group"]');
      return !!group && !!document.activeElement && group.contains(document.activeElement);
    });
  for (let i = 0; i < 40 && !(await inGroup()); i++) await page.keyboard.press('Tab');
  for (let i = 0; i < 12; i++) {
    if (await target.evaluate((el) => el === document.activeElement)) return;
    await page.keyboard.press(arrow);
  }
  throw new Error(`the arrow keys never reached ${target.toString()}`);
}

const focusedHeading = (page: Page): Promise<string | null> =>
  page.evaluate(() => {
    const el = document.activeElement;
    return el && /^H[12]$/.test(el.tagName) ? el.textContent : null;
  });

async function fillBike(page: Page): Promise<void> {
  await page.getByRole('textbox', { name: 'Fork travel' }).fill('160');
  await page.getByRole('button', { name: '36 mm' }).click();
  await page.getByRole('button', { name: 'Yes, it has one' }).click();
  await page.getByRole('textbox', { name: 'End-stroke pressure' }).fill('180');
  await page.getByRole('textbox', { name: 'Rear wheel travel' }).fill('165');
  await page.getByRole('textbox', { name: 'Shock stroke' }).fill('65');
}

describe('baseline wizard shell on a phone', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser.close();
  });

  it('paints the app bar and a loading state from the first HTML, then the lazy route’s own', async () => {
    // the HTML alone, as a slow phone gets it first: the frame is there, with nothing to fetch
    const html = await (await fetch(at('/baseline'))).text();
    expect(html).toMatch(/<header class="boot-bar">/);
    expect(html).toMatch(/Loading Loamline…/);
    const shell = html.slice(html.indexOf('<div id="root">'), html.indexOf('<noscript>'));
    expect(shell).not.toMatch(/(src|href)="https?:/); // no request leaves for another host
    expect(shell).not.toMatch(/<(img|link|script)\b/); // and none at all before React

    const { context, page } = await newPage(browser, 'phone');
    // hold every script back: what shows is index.html's inline shell; then hold the Baseline
    // route's lazy module alone: what shows is the router's hydrate fallback
    let release: () => void = () => undefined;
    const held = new Promise<void>((r) => (release = r));
    let releaseRoute: () => void = () => undefined;
    const routeHeld = new Promise<void>((r) => (releaseRoute = r));
    await page.route(`${baseUrl}/assets/*.js`, async (route) => {
      await held;
      if (/\/assets\/baseline-[^/]*\.js$/.test(route.request().url())) await routeHeld;
      await route.continue();
    });
    await page.goto(at('/baseline'), { waitUntil: 'commit' });
    await page.locator('.boot-bar').waitFor();
    const look = await page.evaluate(() => ({
      bar: getComputedStyle(document.querySelector('.boot-bar')!).backgroundColor,
      body: getComputedStyle(document.body).backgroundColor,
      text: document.querySelector('.boot')?.textContent?.replace(/\s+/g, ' ').trim(),
    }));
    expect(look.bar).toBe('rgb(47, 93, 80)'); // pine 500, the app bar's colour
    expect(look.body).toBe('rgb(247, 245, 240)'); // paper
    expect(look.text).toBe('Loamline Loading Loamline…');
    await screenshot(page, 'shell-1-first-paint-phone');

    // scripts arrive, but the Baseline route's module is late: the router's hydrate fallback
    release();
    await page.getByRole('status').filter({ hasText: 'Loading Loamline…' }).waitFor();
    await expect.poll(() => page.locator('.boot').count()).toBe(0); // React replaced the inline shell
    expect(await page.locator('header.MuiAppBar-root').isVisible()).toBe(true);
    await screenshot(page, 'shell-2-route-loading-phone');
    releaseRoute();
    await page.getByRole('textbox', { name: /weight with riding gear/i }).waitFor();
    await page.unrouteAll({ behavior: 'ignoreErrors' });
    await context.close();
  });

  it('keeps every value and the step through a reload on the Bike step', async () => {
    const { context, page } = await newPage(browser, 'phone');
    await page.goto(at('/baseline'));
    await page.getByRole('textbox', { name: /weight with riding gear/i }).fill('82');
    await page.getByRole('button', { name: /^next$/i }).click();
    await page.getByRole('button', { name: /^Enduro:/ }).click();
    await page.getByRole('button', { name: /^Supple:/ }).click();
    await page.getByRole('button', { name: /^next$/i }).click();
    await page.getByRole('heading', { name: 'Your bike' }).waitFor();
    await fillBike(page);
    const rear = page.getByRole('region', { name: 'Rear shock', exact: true });
    await rear.getByRole('button', { name: 'Coil', exact: true }).click();

    await page.reload();
    await page.getByRole('heading', { name: 'Your bike' }).waitFor();
    expect(await page.getByRole('textbox', { name: 'Fork travel' }).inputValue()).toBe('160');
    expect(await page.getByRole('button', { name: '36 mm' }).getAttribute('aria-pressed')).toBe('true');
    expect(await page.getByRole('textbox', { name: 'End-stroke pressure' }).inputValue()).toBe('180');
    expect(await page.getByRole('textbox', { name: 'Rear wheel travel' }).inputValue()).toBe('165');
    expect(await page.getByRole('textbox', { name: 'Shock stroke' }).inputValue()).toBe('65');
    expect(await rear.getByRole('button', { name: 'Coil', exact: true }).getAttribute('aria-pressed')).toBe(
      'true',
    );
    await shot(page, 'shell-3-reloaded-bike-phone');

    // the back gesture still goes a step back, with what was chosen
    await page.goBack();
    await page.getByRole('heading', { name: 'How do you ride?' }).waitFor();
    expect(await page.getByRole('button', { name: /^Enduro:/ }).getAttribute('aria-pressed')).toBe('true');
    expect(await page.getByRole('button', { name: /^Supple:/ }).getAttribute('aria-pressed')).toBe('true');
    await page.goBack();
    expect(await page.getByRole('textbox', { name: /weight with riding gear/i }).inputValue()).toBe('82');
    await page.goForward();
    await page.goForward();
    await page.getByRole('heading', { name: 'Your bike' }).waitFor();

    // another page and back through the app's own link: the same step and values
    await page.getByRole('link', { name: 'Loamline home' }).click();
    await page.waitForURL(at('/'));
    await page.getByRole('link', { name: 'Get my baseline' }).first().click();
    await page.getByRole('heading', { name: 'Your bike' }).waitFor();
    expect(await page.getByRole('textbox', { name: 'Shock stroke' }).inputValue()).toBe('65');
    await context.close();
  });

  it('passes axe-core (WCAG 2.x A and AA) on every step with no serious or critical finding', async () => {
    const { context, page } = await newPage(browser, 'phone');
    const findings: Record<string, string[]> = {};
    await page.goto(at('/baseline'));
    const weight = page.getByRole('textbox', { name: /weight with riding gear/i });
    await weight.waitFor();
    findings.Rider = await axeFindings(page);
    await weight.fill('82');
    await page.getByRole('button', { name: /^next$/i }).click();
    await page.getByRole('heading', { name: 'How do you ride?' }).waitFor();
    findings.Riding = await axeFindings(page);
    await page.getByRole('button', { name: /^Trail:/ }).click();
    await page.getByRole('button', { name: /^next$/i }).click();
    await page.getByRole('heading', { name: 'Your bike' }).waitFor();
    await fillBike(page);
    await page.getByRole('button', { name: /^advanced/i }).click(); // the advanced fields too
    await page.getByRole('textbox', { name: /altitude where you ride/i }).waitFor();
    findings.Bike = await axeFindings(page);
    await page.getByRole('button', { name: 'Get my baseline' }).click();
    await page.getByTestId('fork-pressure').waitFor({ timeout: 20_000 });
    await page.getByRole('figure', { name: /Fork: force against travel/ }).waitFor();
    findings.Baseline = await axeFindings(page);
    await page.getByRole('button', { name: 'Check my sag' }).click();
    await page.getByRole('heading', { name: 'Sag check' }).waitFor();
    findings['Sag check'] = await axeFindings(page);
    // and the units dialog, open
    await page.getByRole('button', { name: /^Units:/ }).click();
    await page.getByRole('dialog', { name: 'Units' }).waitFor();
    await page.waitForFunction(() => document.getAnimations().every((a) => a.playState !== 'running'));
    await page.waitForTimeout(400); // MUI's grow transition is a CSS transition, not always listed
    findings.Units = await axeFindings(page);
    expect(findings).toEqual({ Rider: [], Riding: [], Bike: [], Baseline: [], 'Sag check': [], Units: [] });
    await screenshot(page, 'shell-6-units-phone');

    // imperial: the Bike step's lengths, volumes, altitude and temperature in in, in³, ft and °F
    await page
      .getByRole('dialog', { name: 'Units' })
      .getByRole('button', { name: /^Imperial:/ })
      .click();
    await page.keyboard.press('Escape');
    await page.getByRole('button', { name: /^back$/i }).click();
    await page.getByRole('button', { name: /^back$/i }).click();
    await page.getByRole('heading', { name: 'Your bike' }).waitFor();
    const unitOf = (name: RegExp | string) =>
      page
        .getByRole('textbox', { name })
        .first()
        .locator('xpath=..')
        .locator('.MuiInputAdornment-root')
        .textContent();
    expect(await page.getByRole('textbox', { name: 'Fork travel' }).inputValue()).toBe('6.3'); // 160 / 25.4
    expect(await unitOf('Fork travel')).toBe('in');
    expect(await unitOf(/altitude where you ride/i)).toBe('ft');
    expect(await unitOf(/air temperature/i)).toBe('°F');
    expect(await unitOf(/volume of one spacer/i)).toBe('in³');
    await shot(page, 'shell-7-bike-imperial-phone');
    // the conditions as the rider sees them on the screen (a full page is too tall to read)
    await page.getByRole('textbox', { name: /air temperature/i }).scrollIntoViewIfNeeded();
    await page.screenshot({ path: join(shots, 'shell-8-conditions-imperial-phone.png') });
    await context.close();
  });

  it('walks the wizard with the keyboard alone (Tab, Enter, Space), the focus always visible', async () => {
    const { context, page } = await newPage(browser, 'phone');
    await page.goto(at('/baseline'));
    const weight = page.getByRole('textbox', { name: /weight with riding gear/i });
    await weight.waitFor();
    await expect.poll(() => weight.evaluate((el) => el === document.activeElement)).toBe(true); // autofocus
    await page.keyboard.type('82');
    await page.keyboard.press('Enter'); // Enter in a field is Next
    await page.getByRole('heading', { name: 'How do you ride?' }).waitFor();
    await expect.poll(() => focusedHeading(page)).toBe('How do you ride?');

    const trail = page.getByRole('button', { name: /^Trail:/ });
    await reachChoice(page, trail, 'ArrowDown');
    // the ring is drawn by the theme's :focus-visible rule: 3 px, pine 700
    const ring = await trail.evaluate((el) => {
      const s = getComputedStyle(el);
      return { visible: el.matches(':focus-visible'), style: s.outlineStyle, width: s.outlineWidth };
    });
    expect(ring).toEqual({ visible: true, style: 'solid', width: '3px' });
    await shot(page, 'shell-4-keyboard-focus-phone');
    await page.keyboard.press('Space');
    expect(await trail.getAttribute('aria-pressed')).toBe('true');
    await tabTo(page, page.getByRole('button', { name: /^next$/i }));
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { name: 'Your bike' }).waitFor();
    await expect.poll(() => focusedHeading(page)).toBe('Your bike');

    await tabTo(page, page.getByRole('textbox', { name: 'Fork travel' }));
    await page.keyboard.type('160');
    await reachChoice(page, page.getByRole('button', { name: '36 mm' }), 'ArrowRight');
    await page.keyboard.press('Enter');
    await tabTo(page, page.getByRole('textbox', { name: 'Rear wheel travel' }));
    await page.keyboard.type('165');
    await tabTo(page, page.getByRole('textbox', { name: 'Shock stroke' }));
    await page.keyboard.type('65');
    await page.keyboard.press('Enter'); // Get my baseline
    await page.getByTestId('fork-pressure').waitFor({ timeout: 20_000 });
    await expect.poll(() => focusedHeading(page)).toBe('Your baseline');

    const check = page.getByRole('button', { name: 'Check my sag' });
    await tabTo(page, check, 120);
    await page.keyboard.press('Enter');
    await page.getByRole('heading', { name: 'Sag check' }).waitFor();
    await expect.poll(() => focusedHeading(page)).toBe('Sag check');
    await shot(page, 'shell-5-keyboard-sag-check-phone');
    await context.close();
  });
});
