import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Browser } from 'playwright-core';
import { at, launch, newPage, screenshot } from './browser';

describe('home page', () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser.close();
  });

  for (const size of ['phone', 'desktop'] as const) {
    it(`loads at ${size} size in Loamline's colours and Roboto`, async () => {
      const { context, page } = await newPage(browser, size);
      await page.goto(at('/'));
      await expect
        .poll(() => page.getByRole('heading', { level: 1 }).textContent())
        .toMatch(/sag and air pressure/i);
      await page.evaluate(() => document.fonts.ready);
      const look = await page.evaluate(() => {
        const bar = document.querySelector('header');
        return {
          bar: bar ? getComputedStyle(bar).backgroundColor : '',
          body: getComputedStyle(document.body).backgroundColor,
          font: getComputedStyle(document.body).fontFamily,
          roboto: document.fonts.check('16px Roboto'),
        };
      });
      expect(look.bar).toBe('rgb(47, 93, 80)'); // pine #2F5D50 (theme/primitives.ts)
      expect(look.body).toBe('rgb(247, 245, 240)'); // paper #F7F5F0
      expect(look.font).toMatch(/^Roboto/);
      expect(look.roboto).toBe(true);
      await screenshot(page, `home-${size}`);
      await context.close();
    });
  }

  it("renders under the server's Content-Security-Policy with no violation and no console error", async () => {
    const { context, page } = await newPage(browser, 'desktop');
    const problems: string[] = [];
    page.on('console', (m) => {
      // (the signed-out GET /api/auth/me answers 401 on purpose; Chromium logs that as an error)
      if (m.type() === 'error' && /Content Security Policy|Refused to/i.test(m.text()))
        problems.push(`console: ${m.text()}`);
    });
    page.on('pageerror', (e) => problems.push(`page: ${e.message}`));
    await page.addInitScript(() => {
      document.addEventListener('securitypolicyviolation', (e) => {
        (window as unknown as { cspViolations: string[] }).cspViolations ??= [];
        (window as unknown as { cspViolations: string[] }).cspViolations.push(
          `${e.violatedDirective} ${e.blockedURI}`,
        );
      });
    });
    const res = await page.goto(at('/baseline'));
    const csp = res?.headers()['content-security-policy'] ?? '';
    expect(csp).toContain("frame-ancestors 'none'");
    expect(csp).toContain("script-src 'self'");
    await expect.poll(() => page.getByRole('heading', { level: 1 }).count()).toBeGreaterThan(0);
    await page.evaluate(() => document.fonts.ready);
    const violations = await page.evaluate(
      () => (window as unknown as { cspViolations?: string[] }).cspViolations ?? [],
    );
    expect(violations).toEqual([]);
    expect(problems).toEqual([]);
    const styled = await page.evaluate(() => ({
      roboto: document.fonts.check('16px Roboto'),
      bar: getComputedStyle(document.querySelector('header')!).backgroundColor,
    }));
    expect(styled).toEqual({ roboto: true, bar: 'rgb(47, 93, 80)' });
    await context.close();
  });

  it('shows a not-found page for an unknown address', async () => {
    const { context, page } = await newPage(browser, 'phone');
    const res = await page.goto(at('/no-such-page'));
    expect(res?.status()).toBe(200); // the SPA answers; the page says so
    await expect.poll(() => page.getByRole('heading', { name: 'Off the trail' }).count()).toBe(1);
    await screenshot(page, 'not-found-phone');
    await context.close();
  });
});
