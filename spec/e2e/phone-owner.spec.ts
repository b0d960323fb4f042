/**
 * The owner's phone (390 × 844, touch) and a small phone (360 × 740) on the demo: projects list,
 * project tabs, the Layout with every outlet's pressure in the results list, the review state and
 * comments. Screenshots go to /tmp/shots-field/ to be looked at; the checks say nothing is cut off:
 * no sideways scrolling of the page, and what matters sits inside the screen's width.
 */
import { expect } from 'chai';
import type { Page } from 'playwright-core';
import { signIn, useBrowserApp, withTestHooks } from './harness';
import { findProject } from './layout-helpers';

const SHOTS = '/tmp/shots-field';

/** The page does not scroll sideways, and each element found lies within the viewport's width. */
async function nothingCutOff(page: Page, selectors: string[]): Promise<void> {
  const width = page.viewportSize()!.width;
  const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
  expect(overflow, 'page scrolls sideways').to.be.at.most(0);
  for (const sel of selectors) {
    const boxes = await page.locator(sel).evaluateAll((els) =>
      els.map((e) => {
        const r = e.getBoundingClientRect();
        return { l: r.left, r: r.right, w: r.width };
      }),
    );
    expect(boxes.length, `${sel} present`).to.be.greaterThan(0);
    for (const b of boxes) {
      expect(b.l, `${sel} left edge`).to.be.at.least(-0.5);
      expect(b.r, `${sel} right edge`).to.be.at.most(width + 0.5);
    }
  }
}

describe('Phone: the owner opens the demo', function () {
  this.timeout(180000);
  const b = useBrowserApp({ viewport: { width: 390, height: 844 } });

  for (const size of [
    { width: 390, height: 844 },
    { width: 360, height: 740 },
  ]) {
    it(`at ${size.width} px: projects, tabs, every outlet's pressure, the review state and a comment`, async () => {
      const context = await withTestHooks(await b.browser.newContext({ viewport: size, isMobile: true, hasTouch: true }));
      try {
        const page = await context.newPage();
        await signIn(page, b.app.baseUrl, 'owner');
        await page.getByTestId('projects-table').waitFor();
        await page.screenshot({ path: `${SHOTS}/owner-projects-${size.width}.png` });
        await nothingCutOff(page, ['[data-testid=project-row]', '[data-testid=project-filter]']);

        const id = await findProject(page, b.app.baseUrl, 'Hillside smallholding');
        await page.goto(`${b.app.baseUrl}/projects/${id}/layout`);
        await page.getByTestId('layout-canvas').waitFor();
        await page.getByTestId('view-only-chip').waitFor();
        await page.screenshot({ path: `${SHOTS}/owner-layout-${size.width}.png` });
        await nothingCutOff(page, ['[data-testid=project-name]', '[data-testid=layout-canvas]', '[data-testid=tab-layout]']);
        const canvas = (await page.getByTestId('layout-canvas').boundingBox())!;
        expect(canvas.width, 'canvas fills the width').to.be.at.least(size.width - 2);
        expect(canvas.height, 'canvas has room').to.be.at.least(size.height * 0.35);

        // Two fingers pinch the plan open (CDP touch events, as a phone sends them).
        await page.waitForFunction(() => !!(window as unknown as { __runnelEditor?: unknown }).__runnelEditor);
        const span = () =>
          page.evaluate(() => {
            const ed = (window as unknown as { __runnelEditor: { worldToClient(x: number, y: number): { x: number; y: number } } }).__runnelEditor;
            const a = ed.worldToClient(0, 0);
            const c = ed.worldToClient(100, 0);
            return c.x - a.x;
          });
        const before = await span();
        const cdp = await context.newCDPSession(page);
        const mid = { x: canvas.x + canvas.width / 2, y: canvas.y + canvas.height / 2 };
        const fingers = (d: number) => [
          { x: mid.x - d, y: mid.y, id: 1 },
          { x: mid.x + d, y: mid.y, id: 2 },
        ];
        await cdp.send('Input.dispatchTouchEvent', { type: 'touchStart', touchPoints: fingers(30) });
        for (const d of [45, 60, 75, 90]) await cdp.send('Input.dispatchTouchEvent', { type: 'touchMove', touchPoints: fingers(d) });
        await cdp.send('Input.dispatchTouchEvent', { type: 'touchEnd', touchPoints: [] });
        const after = await span();
        expect(after / before, 'pinch zoom factor').to.be.closeTo(3, 0.3);
        // One finger pans a view-only plan.
        const origin = await page.evaluate(() =>
          (window as unknown as { __runnelEditor: { worldToClient(x: number, y: number): { x: number; y: number } } }).__runnelEditor.worldToClient(0, 0),
        );
        await cdp.send('Input.dispatchTouchEvent', { type: 'touchStart', touchPoints: [{ x: mid.x, y: mid.y }] });
        for (const dx of [10, 25, 40]) await cdp.send('Input.dispatchTouchEvent', { type: 'touchMove', touchPoints: [{ x: mid.x + dx, y: mid.y + dx / 2 }] });
        await cdp.send('Input.dispatchTouchEvent', { type: 'touchEnd', touchPoints: [] });
        const moved = await page.evaluate(() =>
          (window as unknown as { __runnelEditor: { worldToClient(x: number, y: number): { x: number; y: number } } }).__runnelEditor.worldToClient(0, 0),
        );
        expect(moved.x - origin.x).to.be.closeTo(40, 2);
        expect(moved.y - origin.y).to.be.closeTo(20, 2);
        await page.getByTestId('fit-button').click();

        // Every outlet's pressure, readable in the bottom sheet's results list.
        await page.getByTestId('sheet-toggle').click();
        const list = page.getByTestId('results-list');
        await list.waitFor();
        await page.screenshot({ path: `${SHOTS}/owner-results-${size.width}.png` });
        await nothingCutOff(page, ['[data-testid=results-list]', '[data-testid=sheet-toggle]']);
        const text = await list.innerText();
        for (const outlet of ['North-west trough', 'West trough', 'East trough', 'South trough']) expect(text).to.include(outlet);
        expect(text).to.match(/\d+(\.\d+)? (kPa|m)/);

        // The tabs do not fit: the strip scrolls under the finger (no paging arrows on a touch screen),
        // and a real tap reaches the Review tab, which shows the state.
        expect(await page.locator('.rn-project-tabs .mat-mdc-tab-header-pagination').first().isVisible()).to.equal(false);
        expect(await page.getByTestId('project-tab-strip').evaluate((el) => el.scrollWidth > el.clientWidth)).to.equal(true);
        await page.getByTestId('tab-review').tap();
        await page
          .getByTestId('review-screen')
          .waitFor({ timeout: 8000 })
          .catch(async (e) => {
            await page.screenshot({ path: `${SHOTS}/owner-review-fail-${size.width}.png` });
            throw new Error(`${e} at ${page.url()}`);
          });
        await page.getByTestId('version-status').first().waitFor();
        await page.screenshot({ path: `${SHOTS}/owner-review-${size.width}.png` });
        await nothingCutOff(page, ['[data-testid=version-status]', '[data-testid=review-screen]']);
        // The comments panel opens by itself only when comments are open; otherwise the owner opens it.
        const comments = page.getByTestId('comments-section');
        await comments.scrollIntoViewIfNeeded();
        if (!(await page.getByTestId('comment-element').isVisible())) await comments.locator('mat-expansion-panel-header').tap();
        // The owner comments from the phone, pinned to a trough.
        await page.getByTestId('comment-element').tap();
        await page
          .getByRole('option', { name: /East trough/ })
          .first()
          .tap();
        await page.getByTestId('comment-body').fill(`From the phone (${size.width} px): can the east trough move 10 m downhill?`);
        await page.getByTestId('comment-add').tap();
        await page
          .locator('[data-testid^=thread-]')
          .filter({ hasText: `From the phone (${size.width} px)` })
          .first()
          .waitFor();
        await page.screenshot({ path: `${SHOTS}/owner-review-comments-${size.width}.png` });
        await nothingCutOff(page, ['[data-testid=comment-form]', '[data-testid=comment-add]']);
      } finally {
        await context.close();
      }
    });
  }
});
