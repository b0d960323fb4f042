/**
 * Every screen on a phone (390 × 844, touch; the screens with wide tables also at 360 × 740) and on a
 * tablet (768 × 1024 upright, 1024 × 768 on its side), each as the demo role that uses it: the page never scrolls sideways, each primary action lies
 * within the screen's width and takes a tap (nothing covers it), and the numbers that matter carry
 * their units. Screenshots go to /tmp/shots-field/ to be looked at.
 * One signed-in context per role, resized between the phone and tablet passes.
 */
import { mkdirSync } from 'node:fs';
import { expect } from 'chai';
import type { BrowserContext, Locator, Page } from 'playwright-core';
import { signIn, useBrowserApp, withTestHooks } from './harness';
import { editorHook, findProject } from './layout-helpers';

const SHOTS = '/tmp/shots-field';

interface ScreenCheck {
  name: string;
  role: 'admin' | 'designer' | 'reviewer' | 'estimator' | 'owner';
  /** An app path (starts with /) or a tab of the demo project. */
  path: string;
  /** Test id that says the screen has loaded. */
  ready: string;
  /** Primary actions (test ids, or CSS for a family such as the option buttons): the first of each is checked. */
  actions: string[] | ((width: number) => string[]);
  /** Shown but legitimately disabled until something is typed or changed: only required to be in sight. */
  shown?: string[];
  /** Test id whose text must show a number with its unit. */
  numbers?: [string, RegExp][];
  /** Before the checks (e.g. open the Layout's bottom sheet). */
  prepare?: (page: Page) => Promise<void>;
}

const NUMBER = String.raw`\d[\d,]*(\.\d+)?`;
const withUnit = (units: string) => new RegExp(`${NUMBER}\\s?(${units})\\b`);

const SCREENS: ScreenCheck[] = [
  { name: 'projects', role: 'designer', path: '/projects', ready: 'projects-table', actions: ['new-project', 'project-filter', 'project-actions'] },
  {
    name: 'team',
    role: 'admin',
    path: '/team',
    ready: 'members-table',
    actions: ['member-roles', 'member-remove', 'invite-email', 'invite-roles', 'invite-submit'],
  },
  { name: 'outbox', role: 'admin', path: '/outbox', ready: 'outbox-refresh', actions: ['outbox-refresh'] },
  { name: 'audit', role: 'admin', path: '/audit', ready: 'audit-who', actions: [], shown: ['audit-who'] },
  {
    // On a phone the toolbar is a sideways strip (its later buttons scroll in) and the side panel a bottom sheet.
    name: 'layout',
    role: 'designer',
    path: 'layout',
    ready: 'layout-canvas',
    actions: (w) =>
      w < 700 ? ['tool-select', 'tool-pipe', 'palette-open', 'sheet-toggle'] : ['tool-select', 'tool-pipe', 'fit-button', 'file-menu', 'palette-tank'],
    numbers: [['results-list', withUnit('kPa')]],
    prepare: async (page) => {
      if (await page.getByTestId('sheet-toggle').isVisible()) await page.getByTestId('sheet-toggle').tap();
      await page.getByTestId('results-list').waitFor();
    },
  },
  {
    name: 'budget',
    role: 'designer',
    path: 'budget',
    ready: 'budget-uses',
    actions: ['budget-add-use', 'use-edit', 'use-remove'],
    shown: ['budget-save', 'budget-discard'],
    numbers: [
      ['budget-peak-daily', withUnit('L/day')],
      ['budget-outlets', withUnit('L/s')],
    ],
  },
  {
    name: 'profile',
    role: 'designer',
    path: 'profile',
    ready: 'profile-chart',
    actions: ['profile-from', 'profile-to', 'profile-csv', 'profile-png'],
    numbers: [['profile-margin', withUnit('kPa')]],
  },
  { name: 'timeline', role: 'designer', path: 'timeline', ready: 'timeline-run', actions: ['timeline-days', 'timeline-step', 'timeline-run'] },
  {
    name: 'review',
    role: 'reviewer',
    path: 'review',
    ready: 'version-status',
    actions: ['version-select', 'signoff-note', 'signoff-approve'],
    shown: ['signoff-return'],
    numbers: [
      ['review-screen', withUnit('kPa')],
      ['review-screen', withUnit('L/s')],
    ],
  },
  {
    name: 'options',
    role: 'designer',
    path: 'options',
    ready: 'options-compare',
    actions: ['option-name', 'option-create', '[data-testid^=size-]', '[data-testid^=promote-]'],
    numbers: [
      ['lowest-outlet', withUnit('kPa')],
      ['total-estimate', /\$\d[\d,]*\.\d\d/],
    ],
  },
  { name: 'options-owner', role: 'owner', path: 'options', ready: 'options-compare', actions: ['[data-testid^=prefer-]'] },
  {
    name: 'takeoff',
    role: 'estimator',
    path: 'takeoff',
    ready: 'takeoff-table',
    actions: ['export-xlsx', 'export-csv', 'print-summary', 'labour-rate', 'save-settings', '[data-testid^="price-"][type=number]'],
    numbers: [
      ['estimate-total', /\$\d[\d,]*\.\d\d/],
      ['takeoff-table', withUnit('m')],
    ],
  },
  { name: 'takeoff-owner', role: 'owner', path: 'takeoff', ready: 'takeoff-table', actions: ['accept-estimate'] },
  { name: 'walk', role: 'designer', path: 'walk', ready: 'walk-screen', actions: ['walk-name', 'walk-start'] },
  {
    name: 'files',
    role: 'designer',
    path: 'files',
    ready: 'file-row',
    actions: ['file-download', 'file-preview-toggle', 'file-rename', 'file-delete'],
    numbers: [['file-row', withUnit('KB')]],
  },
];

/** Neither the document nor the app's scrolling content area scrolls sideways. */
async function pageOverflow(page: Page): Promise<number> {
  return page.evaluate(() => {
    const content = document.querySelector('.rn-content');
    const doc = document.documentElement.scrollWidth - document.documentElement.clientWidth;
    return Math.max(doc, content ? content.scrollWidth - content.clientWidth : 0);
  });
}

/** Lies within the screen's width as laid out (no sideways scrolling needed), and a tap would land on it. */
async function expectTappable(page: Page, loc: Locator, what: string): Promise<void> {
  const width = page.viewportSize()!.width;
  // A text field is tapped anywhere in its outline (the floating label lies over the input).
  if (await loc.evaluate((el) => !!el.closest('mat-form-field'))) loc = loc.locator('xpath=ancestor::mat-form-field[1]');
  const box = await loc.evaluate((el) => {
    const r = el.getBoundingClientRect();
    return { l: r.left, r: r.right, w: r.width };
  });
  expect(box.w, `${what} has width`).to.be.greaterThan(0);
  expect(box.l, `${what} left edge`).to.be.at.least(-0.5);
  expect(box.r, `${what} right edge`).to.be.at.most(width + 0.5);
  // Playwright's trial tap: visible, stable, enabled, and the element receives the tap (not covered).
  await loc.tap({ trial: true, timeout: 5000 });
}

const pick = (page: Page, sel: string) => (sel.startsWith('[') ? page.locator(sel) : page.getByTestId(sel)).first();

describe('Every screen on a phone and a tablet', function () {
  this.timeout(240000);
  const b = useBrowserApp();
  const contexts = new Map<string, BrowserContext>();
  let projectId = '';
  mkdirSync(SHOTS, { recursive: true });

  async function pageFor(role: string, size: { width: number; height: number }): Promise<Page> {
    let context = contexts.get(role);
    if (!context) {
      context = await withTestHooks(await b.browser.newContext({ viewport: size, isMobile: true, hasTouch: true }));
      contexts.set(role, context);
      const page = await context.newPage();
      await signIn(page, b.app.baseUrl, role);
      if (!projectId) projectId = await findProject(page, b.app.baseUrl, 'Hillside smallholding');
    }
    const page = context.pages()[0];
    await page.setViewportSize(size);
    return page;
  }

  after(async () => {
    for (const c of contexts.values()) await c.close();
  });

  async function check(s: ScreenCheck, size: { width: number; height: number }): Promise<void> {
    const page = await pageFor(s.role, size);
    const url = s.path.startsWith('/') ? s.path : `/projects/${projectId}/${s.path}`;
    await page.goto(b.app.baseUrl + url);
    await page.getByTestId(s.ready).first().waitFor({ timeout: 20000 });
    await s.prepare?.(page);
    await page.screenshot({ path: `${SHOTS}/screen-${s.name}-${size.width}.png` });
    expect(await pageOverflow(page), `${s.name}: page scrolls sideways`).to.be.at.most(0);
    const actions = typeof s.actions === 'function' ? s.actions(size.width) : s.actions;
    for (const a of actions) await expectTappable(page, pick(page, a), `${s.name}: ${a}`);
    for (const a of s.shown ?? []) {
      const loc = pick(page, a);
      await loc.scrollIntoViewIfNeeded();
      expect(await loc.isVisible(), `${s.name}: ${a} visible`).to.equal(true);
      const r = await loc.evaluate((el) => el.getBoundingClientRect().right);
      expect(r, `${s.name}: ${a} right edge`).to.be.at.most(size.width + 0.5);
    }
    for (const [id, unit] of s.numbers ?? []) expect(await page.getByTestId(id).first().innerText(), `${s.name}: ${id}`).to.match(unit);
  }

  // The smallest phone and the landscape tablet keep to the screens with wide tables; the rest are covered at 390 and upright.
  const WIDE_TABLES = ['team', 'audit', 'options', 'takeoff', 'review', 'budget', 'layout', 'files'];
  for (const size of [
    { width: 390, height: 844 },
    { width: 360, height: 740 },
    { width: 768, height: 1024 },
    { width: 1024, height: 768 },
  ]) {
    for (const s of SCREENS) {
      if ((size.width === 1024 || size.width === 360) && !WIDE_TABLES.includes(s.name)) continue;
      it(`${s.name} as ${s.role} at ${size.width} × ${size.height}`, () => check(s, size));
    }
  }

  it('the project tabs scroll under the finger at 390 px, and a tab far along takes a tap', async () => {
    const page = await pageFor('owner', { width: 390, height: 844 });
    await page.goto(`${b.app.baseUrl}/projects/${projectId}/layout`);
    await page.getByTestId('tab-layout').waitFor();
    expect(await page.locator('.rn-project-tabs .mat-mdc-tab-header-pagination').first().isVisible(), 'no paging arrows on a touch screen').to.equal(false);
    const strip = page.getByTestId('project-tab-strip');
    expect(await strip.evaluate((el) => el.scrollWidth > el.clientWidth), 'tabs wider than the phone').to.equal(true);
    // A real tap (Playwright scrolls the strip as a finger would, then taps the tab's middle).
    await page.getByTestId('tab-files').tap();
    await page.waitForURL(/\/files$/);
    await page.getByTestId('files-screen').waitFor();
    // Opened directly at a tab far along, that tab is in sight.
    await page.goto(`${b.app.baseUrl}/projects/${projectId}/walk`);
    await page.getByTestId('tab-walk').waitFor();
    await page.waitForFunction(
      () => {
        const t = document.querySelector('[data-testid=tab-walk]')!.getBoundingClientRect();
        return t.left >= 0 && t.right <= window.innerWidth + 1;
      },
      undefined,
      { timeout: 5000 },
    );
    // And back to the first tab, now scrolled out of sight to the left.
    await page.getByTestId('tab-layout').tap();
    await page.waitForURL(/\/layout$/);
  });

  it('a designer on a phone adds a tank from the bottom sheet and places it with a tap', async () => {
    const page = await pageFor('designer', { width: 390, height: 844 });
    await page.goto(`${b.app.baseUrl}/projects/${projectId}/layout`);
    await page.waitForFunction(() => !!window.__runnelEditor && window.__runnelEditor.getDocument().nodes.length > 0);
    const before = (await editorHook.doc(page)).nodes.filter((n) => n.kind === 'tank').length;
    await page.getByTestId('palette-open').tap();
    const sheet = page.getByTestId('palette-sheet');
    await sheet.waitFor();
    await page.getByTestId('sheet-palette-outlet').tap({ trial: true }); // waits for the sheet to stop sliding
    await page.screenshot({ path: `${SHOTS}/screen-layout-palette-sheet-390.png` });
    // The sheet spans the phone and names what each element is for.
    const box = (await page.locator('mat-bottom-sheet-container').boundingBox())!;
    expect(box.x, 'sheet left').to.be.at.least(-0.5);
    expect(box.x + box.width, 'sheet right').to.be.at.most(390.5);
    expect(await sheet.innerText()).to.match(/Tank[\s\S]*high ground/);
    await page.getByTestId('sheet-palette-tank').tap();
    await sheet.waitFor({ state: 'detached' });
    await page.getByTestId('palette-placing').waitFor();
    // A tap on an empty corner of the plan places it there.
    const canvas = (await page.getByTestId('layout-canvas').boundingBox())!;
    await page.touchscreen.tap(canvas.x + 40, canvas.y + 40);
    await page.waitForFunction((n) => window.__runnelEditor!.getDocument().nodes.filter((x) => x.kind === 'tank').length === n + 1, before);
    await page.screenshot({ path: `${SHOTS}/screen-layout-placed-390.png` });
    expect(await page.getByTestId('palette-placing').count(), 'the place tool is done').to.equal(0);
    // Leave the demo as it was for any later test.
    await page.getByTestId('undo-button').tap();
    await page.waitForFunction((n) => window.__runnelEditor!.getDocument().nodes.filter((x) => x.kind === 'tank').length === n, before);
  });
});
