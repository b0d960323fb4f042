/**
 * Screenshots of the demo plan for a person to look at (not a test): whole-site and zoomed in,
 * in both unit systems, at 1280×800 and 390×844. Run after `npx ng build`:
 *   npx tsx spec/e2e/layout-shots.ts <tag>      → /tmp/shots-layout/<tag>-*.png
 */
import { mkdirSync } from 'node:fs';
import { launchBrowser, signIn, startApp, withTestHooks } from './harness';
import { apiCall, editorHook, findProject, openLayout } from './layout-helpers';

const tag = process.argv[2] ?? 'now';
const dir = '/tmp/shots-layout';
mkdirSync(dir, { recursive: true });
const app = await startApp();
const browser = await launchBrowser();
try {
  for (const [w, h] of [
    [1280, 800],
    [390, 844],
  ] as const) {
    const page = await (await withTestHooks(await browser.newContext({ viewport: { width: w, height: h } }))).newPage();
    await signIn(page, app.baseUrl, 'designer');
    const id = await findProject(page, app.baseUrl, 'Hillside smallholding');
    for (const units of ['us', 'si'] as const) {
      if (w < 500 && units === 'si') continue;
      await apiCall(page, app.baseUrl, 'PATCH', `/api/projects/${id}`, { units });
      try {
        await openLayout(page, app.baseUrl, id);
      } catch (e) {
        await page.screenshot({ path: `${dir}/${tag}-${w}-${units}-failed.png` });
        throw e;
      }
      await page.waitForFunction(() => (window.__runnelEditor?.lastSolveMs() ?? 0) > 0);
      await page.waitForTimeout(600);
      await page.screenshot({ path: `${dir}/${tag}-${w}-${units}-site.png` });
      // Zoom in on the yard and house (tees, hydrant, shed, house, garden).
      const c = await editorHook.toClient(page, 200, 200);
      await page.mouse.move(c.x, c.y);
      for (let i = 0; i < 3; i++) await page.mouse.wheel(0, -300);
      await page.waitForTimeout(600);
      await page.screenshot({ path: `${dir}/${tag}-${w}-${units}-zoom.png` });
      // Select the wellhead to show its properties and the side panel.
      if (w > 500) {
        await page.getByTestId('fit-button').click();
        await page.waitForTimeout(300);
        const doc = await editorHook.doc(page);
        const n = doc.nodes.find((x) => x.id === 'HYD')!;
        const p = await editorHook.toClient(page, n.x_m, n.y_m);
        await page.mouse.click(p.x, p.y);
        await page.waitForTimeout(500);
        await page.screenshot({ path: `${dir}/${tag}-${w}-${units}-selected.png` });
      }
    }
  }
} finally {
  await browser.close();
  await app.stop();
}
console.log(`screenshots in ${dir}`);
