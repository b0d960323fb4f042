/**
 * The Layout screen in a real browser (Chromium, real server, PGlite on disk): placing from the
 * palette, drawing a pipe, editing in US units, autosave and reload, a save conflict, view-only
 * access and a 500-element network. Driven through the screen's test hook
 * (`window.__runnelEditor`, see client/src/app/layout/README.md) and data-testid selectors.
 */
import { expect } from 'chai';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Browser, Page } from 'playwright-core';
import { hasChromium, launchBrowser, signIn, startApp, type RunningApp } from '../../e2e/harness';

interface Doc { nodes: { id: string; kind: string; x_m: number; y_m: number; elevation_m: number; name?: string }[]; links: { id: string; from: string; to: string; vertices?: [number, number][]; length_m?: number }[] }

const hook = {
  doc: (page: Page) => page.evaluate(() => window.__runnelEditor!.getDocument() as unknown as Doc),
  selection: (page: Page) => page.evaluate(() => window.__runnelEditor!.getSelection()),
  at: (page: Page, x: number, y: number) => page.evaluate(([a, b]) => window.__runnelEditor!.worldToClient(a, b), [x, y] as const),
  solveMs: (page: Page) => page.evaluate(() => window.__runnelEditor!.lastSolveMs()),
};

declare global {
  interface Window {
    __runnelEditor?: {
      getDocument(): unknown; getSelection(): string[]; lastSolveMs(): number; frameTimes(): number[];
      worldToClient(x: number, y: number): { x: number; y: number };
    };
  }
}

async function api(page: Page, base: string, method: 'POST' | 'PUT', path: string, data: unknown) {
  const token = ((await (await page.request.get(`${base}/api/csrf`)).json()) as { token: string }).token;
  return page.request.fetch(`${base}${path}`, { method, data, headers: { 'x-csrf-token': token } });
}

async function openLayout(page: Page, base: string, projectId: string): Promise<void> {
  await page.goto(`${base}/projects/${projectId}/layout`);
  await page.getByTestId('layout-canvas').locator('canvas').first().waitFor();
  await page.waitForFunction(() => !!window.__runnelEditor);
}

async function dragPalette(page: Page, kind: string, to: { x: number; y: number }): Promise<void> {
  const box = (await page.getByTestId(`palette-${kind}`).boundingBox())!;
  await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
  await page.mouse.down();
  await page.mouse.move(box.x + box.width / 2 + 30, box.y + box.height / 2 + 10, { steps: 4 });
  await page.mouse.move(to.x, to.y, { steps: 8 });
  await page.mouse.up();
}

async function clickAt(page: Page, x_m: number, y_m: number): Promise<void> {
  const p = await hook.at(page, x_m, y_m);
  await page.mouse.click(p.x, p.y);
}

async function waitSaved(page: Page): Promise<void> {
  await page.waitForFunction(() => document.querySelector('[data-testid=save-status]')?.textContent?.trim() === 'Saved', null, { timeout: 15000 });
}

describe('Layout screen in a real browser', function () {
  let app: RunningApp;
  let browser: Browser;
  let page: Page;
  let projectId = '';
  let scratch = '';

  before(async function () {
    if (!hasChromium()) this.skip();
    app = await startApp();
    browser = await launchBrowser();
    scratch = mkdtempSync(join(tmpdir(), 'runnel-layout-'));
  });
  after(async () => {
    await browser?.close();
    await app?.stop();
    if (scratch) rmSync(scratch, { recursive: true, force: true });
  });
  beforeEach(async () => {
    page = await (await browser.newContext({ viewport: { width: 1366, height: 800 } })).newPage();
  });
  afterEach(async () => {
    await page?.context().close();
  });

  it('a designer places a tank and an outlet, draws a bent pipe, types an elevation in feet, and it survives a reload', async () => {
    await signIn(page, app.baseUrl, 'designer');
    const created = await api(page, app.baseUrl, 'POST', '/api/projects', { name: 'Layout check', units: 'us' });
    expect(created.status()).to.equal(201);
    projectId = ((await created.json()) as { id: string }).id;
    await openLayout(page, app.baseUrl, projectId);

    const canvas = (await page.getByTestId('layout-canvas').boundingBox())!;
    await dragPalette(page, 'tank', { x: canvas.x + canvas.width * 0.3, y: canvas.y + canvas.height * 0.3 });
    await dragPalette(page, 'outlet', { x: canvas.x + canvas.width * 0.7, y: canvas.y + canvas.height * 0.7 });
    let doc = await hook.doc(page);
    expect(doc.nodes.map((n) => `${n.id}:${n.kind}`)).to.deep.equal(['T1:tank', 'O1:outlet']);
    const [t, o] = doc.nodes;

    await clickAt(page, t.x_m, t.y_m);
    expect(await hook.selection(page)).to.deep.equal(['T1']);
    await page.getByTestId('prop-elevation').fill('135');
    await page.getByTestId('prop-elevation').press('Tab');
    doc = await hook.doc(page);
    expect(doc.nodes[0].elevation_m).to.be.closeTo(135 * 0.3048, 1e-9); // 1 ft = 0.3048 m exactly (NIST SP 811)

    await page.getByTestId('tool-pipe').click();
    await clickAt(page, t.x_m, t.y_m);
    await clickAt(page, o.x_m, t.y_m); // bend on empty ground
    await clickAt(page, o.x_m, o.y_m);
    doc = await hook.doc(page);
    expect(doc.links).to.have.length(1);
    expect(doc.links[0]).to.include({ from: 'T1', to: 'O1' });
    expect(doc.links[0].vertices).to.have.length(1);
    const [vx, vy] = doc.links[0].vertices![0];
    const drawn = Math.hypot(vx - t.x_m, vy - t.y_m) + Math.hypot(o.x_m - vx, o.y_m - vy);
    expect(doc.links[0].length_m).to.be.closeTo(drawn, 0.01);

    await waitSaved(page);
    await page.waitForFunction(() => (window.__runnelEditor?.lastSolveMs() ?? 0) > 0);
    await page.getByTestId('result-O1').waitFor();
    expect(await page.getByTestId('result-O1').textContent()).to.match(/psi/);

    await page.reload();
    await page.waitForFunction(() => ((window.__runnelEditor?.getDocument() as { nodes?: unknown[] } | undefined)?.nodes?.length ?? 0) === 2);
    doc = await hook.doc(page);
    expect(doc.links).to.have.length(1);
    expect(doc.nodes[0].elevation_m).to.be.closeTo(41.148, 1e-9);
  });

  it('a save conflict asks first; "Keep mine" saves the local edit over the newer version', async () => {
    await signIn(page, app.baseUrl, 'designer');
    await openLayout(page, app.baseUrl, projectId);
    const current = (await (await page.request.get(`${app.baseUrl}/api/projects/${projectId}/network`)).json()) as { version: number; document: Doc };
    const elsewhere = await api(page, app.baseUrl, 'PUT', `/api/projects/${projectId}/network`, {
      version: current.version, document: { ...current.document, title: 'saved elsewhere' },
    });
    expect(elsewhere.status()).to.equal(200);

    const t = (await hook.doc(page)).nodes[0];
    await clickAt(page, t.x_m, t.y_m);
    await page.getByTestId('prop-name').fill('Header tank');
    await page.getByTestId('prop-name').press('Tab');
    await page.getByTestId('conflict-keep-mine').waitFor({ timeout: 10000 });
    expect(await page.getByTestId('save-status').textContent()).to.contain('Conflict');
    await page.getByTestId('conflict-keep-mine').click();
    await waitSaved(page);
    const after = (await (await page.request.get(`${app.baseUrl}/api/projects/${projectId}/network`)).json()) as { version: number; document: Doc };
    expect(after.version).to.equal(current.version + 2);
    expect(after.document.nodes[0].name).to.equal('Header tank');
  });

  it('when the network cannot be reached the chip says Offline and the edit is saved once it comes back', async () => {
    await signIn(page, app.baseUrl, 'designer');
    await openLayout(page, app.baseUrl, projectId);
    let blocked = true;
    await page.route('**/api/projects/*/network', (route) =>
      blocked && route.request().method() === 'PUT' ? route.abort('internetdisconnected') : route.continue());
    const t = (await hook.doc(page)).nodes[0];
    await clickAt(page, t.x_m, t.y_m);
    await page.getByTestId('prop-name').fill('Offline edit');
    await page.getByTestId('prop-name').press('Tab');
    await page.waitForFunction(() => document.querySelector('[data-testid=save-status]')?.textContent?.includes('Offline'), null, { timeout: 10000 });
    blocked = false;
    await waitSaved(page);
    const after = (await (await page.request.get(`${app.baseUrl}/api/projects/${projectId}/network`)).json()) as { document: Doc };
    expect(after.document.nodes[0].name).to.equal('Offline edit');
  });

  it('undo and redo buttons step through edits; Escape abandons a pipe being drawn', async () => {
    await signIn(page, app.baseUrl, 'designer');
    await openLayout(page, app.baseUrl, projectId);
    const before = await hook.doc(page);
    const t = before.nodes[0];
    await page.getByTestId('tool-valve').click();
    await clickAt(page, t.x_m, t.y_m);
    await page.keyboard.press('Escape');
    expect((await hook.doc(page)).links).to.have.length(before.links.length);
    await page.getByTestId('tool-select').click();
    await clickAt(page, t.x_m, t.y_m);
    await page.keyboard.press('Delete');
    expect((await hook.doc(page)).nodes).to.have.length(before.nodes.length - 1);
    await page.getByTestId('undo-button').click();
    expect((await hook.doc(page)).nodes).to.have.length(before.nodes.length);
    await page.getByTestId('redo-button').click();
    expect((await hook.doc(page)).nodes).to.have.length(before.nodes.length - 1);
    await page.keyboard.press('Control+z');
    expect((await hook.doc(page)).links).to.have.length(before.links.length);
  });

  it('a reviewer sees the layout read-only: no palette, a View only chip, disabled fields', async () => {
    await signIn(page, app.baseUrl, 'reviewer');
    await openLayout(page, app.baseUrl, projectId);
    await page.getByTestId('view-only-chip').waitFor();
    expect(await page.getByTestId('palette-tank').count()).to.equal(0);
    expect(await page.getByTestId('tool-pipe').count()).to.equal(0);
    const t = (await hook.doc(page)).nodes[0];
    await clickAt(page, t.x_m, t.y_m);
    expect(await page.getByTestId('prop-name').isDisabled()).to.equal(true);
  });

  it('a 500-element network imports, solves in the worker and drags', async () => {
    const nodes: unknown[] = [{ id: 'S1', kind: 'source', elevation_m: 100, head_m: 100.5, x_m: 0, y_m: 0 }];
    const links: unknown[] = [];
    for (let i = 0; i < 249; i++) {
      nodes.push({ id: `J${i + 1}`, kind: 'tee', elevation_m: 60, demand_m3s: 0.00004, x_m: 20 + (i % 20) * 25, y_m: -20 - Math.floor(i / 20) * 25 });
    }
    for (let i = 1; i < 250; i++) {
      const parent = i <= 20 ? (i === 1 ? 'S1' : `J${i - 1}`) : `J${i - 20}`;
      links.push({ id: `P${i}`, kind: 'pipe', from: parent, to: `J${i}`, length_m: 25, diameter_m: 0.05, roughness: 140 });
    }
    links.push({ id: 'P250', kind: 'pipe', from: 'J20', to: 'J21', length_m: 25, diameter_m: 0.05, roughness: 140 });
    const file = join(scratch, 'big.json');
    writeFileSync(file, JSON.stringify({ schema: 'runnel.network/1', headloss: 'hazen-williams', nodes, links }));

    await signIn(page, app.baseUrl, 'designer');
    await openLayout(page, app.baseUrl, projectId);
    await page.getByTestId('import-file').setInputFiles(file);
    await page.waitForFunction(() => ((window.__runnelEditor?.getDocument() as { nodes?: unknown[] } | undefined)?.nodes?.length ?? 0) === 250);
    await page.waitForFunction(() => !!document.querySelector('[data-testid=result-J249]'));
    expect(await hook.solveMs(page)).to.be.greaterThan(0);

    const p = await hook.at(page, 20, -20);
    await page.mouse.move(p.x, p.y);
    await page.mouse.down();
    for (let i = 1; i <= 30; i++) await page.mouse.move(p.x + i * 3, p.y + i * 2);
    await page.mouse.up();
    const moved = (await hook.doc(page)).nodes.find((n) => n.id === 'J1')!;
    expect(moved.x_m).to.not.equal(20);
    expect(await page.evaluate(() => window.__runnelEditor!.frameTimes().length)).to.be.greaterThan(0);
  });
});
