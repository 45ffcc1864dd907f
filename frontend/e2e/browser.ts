import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';

/** The app under test, started by `npm test` (scripts/stack.ts). */
export const baseUrl = process.env.APP_URL ?? 'http://127.0.0.1:3000';
/** An absolute address in the app under test. */
export const at = (path: string): string => new URL(path, baseUrl).toString();

export const mailUrl = process.env.MAIL_URL ?? 'http://127.0.0.1:8025';

export const viewports = {
  phone: { width: 390, height: 844 },
  desktop: { width: 1366, height: 900 },
} as const;

const screenshots = join(__dirname, '..', '..', 'artifacts', 'screenshots');

/** Debian's Chromium with the flags this machine needs (docs/architecture.md). */
export function launch(): Promise<Browser> {
  return chromium.launch({
    executablePath: process.env.CHROMIUM_PATH ?? '/usr/bin/chromium',
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-quic',
      '--no-first-run',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
    ],
  });
}

export async function newPage(
  browser: Browser,
  size: keyof typeof viewports,
): Promise<{ context: BrowserContext; page: Page }> {
  const context = await browser.newContext({
    viewport: viewports[size],
    deviceScaleFactor: size === 'phone' ? 2 : 1,
    isMobile: size === 'phone',
    hasTouch: size === 'phone',
  });
  const page = await context.newPage();
  return { context, page };
}

export async function screenshot(page: Page, name: string): Promise<string> {
  mkdirSync(screenshots, { recursive: true });
  const path = join(screenshots, `${name}.png`);
  await page.screenshot({ path, fullPage: true });
  return path;
}
