import { launchBrowser, signIn, startApp } from './e2e/harness';
import { findProject } from './e2e/layout-helpers';
const OUT = '/tmp/shots-review';
const app = await startApp();
const browser = await launchBrowser();
try {
  for (const [w, h] of [[390, 844], [1280, 800]]) {
    const ctx = await browser.newContext({ viewport: { width: w, height: h } });
    const page = await ctx.newPage();
    await signIn(page, app.baseUrl, 'reviewer');
    const id = await findProject(page, app.baseUrl, 'Hillside smallholding');
    await page.goto(`${app.baseUrl}/projects/${id}/review`);
    await page.getByTestId('check-pipe-working-share:L-TR4').waitFor();
    await page.getByTestId('checklist-table').scrollIntoViewIfNeeded();
    await page.screenshot({ path: `${OUT}/${process.argv[2] ?? 'now'}-review-${w}.png` });
    if (w === 390) {
      const over = await page.evaluate(() => { const s = document.querySelector('.rn-checklist-scroll') as HTMLElement; return [s.scrollWidth, s.clientWidth, document.documentElement.scrollWidth]; });
      console.log('scroll widths', over);
    }
    await ctx.close();
  }
} finally { await browser.close(); await app.stop(); }
