import { chromium } from 'playwright-core';
const base = 'http://127.0.0.1:3461';
const [email, password, ...pages] = process.argv.slice(2);
const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--no-sandbox', '--disable-gpu'] });
const ctx = await browser.newContext({ viewport: { width: 1366, height: 900 } });
const r = await ctx.request.post(base + '/api/auth/sign-in', { data: { email, password } });
console.log('sign-in', r.status());
const page = await ctx.newPage();
page.on('console', (m) => m.type() === 'error' && console.log('console:', m.text()));
page.on('pageerror', (e) => console.log('pageerror:', e.message));
for (const p of pages) {
  const [path, w] = p.split('@');
  if (w) await page.setViewportSize({ width: Number(w), height: 900 });
  await page.goto(base + path);
  await page.waitForTimeout(2500);
  const name = path.replace(/[^a-z0-9]+/gi, '_') + (w ?? '');
  await page.screenshot({ path: `/tmp/bkw-shots/${name}.png`, fullPage: true });
  console.log('shot', name);
}
await browser.close();
