/**
 * Helpers for the Layout screen's browser tests: reading the editor through its test hook
 * (`window.__runnelEditor`, read-only use: state and element positions), driving the canvas and
 * the palette with the real mouse, and calling the HTTP API with the page's own session.
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import type { BrowserContext, Page } from 'playwright-core';
import { signIn } from './harness';
import type { NetworkDocument } from '../../engine/network-document';

/** The parts of the network document these tests read (engine/network-document.ts). */
export interface E2eNode {
  id: string;
  kind: string;
  name?: string;
  x_m: number;
  y_m: number;
  elevation_m: number;
  [k: string]: unknown;
}
export interface E2eLink {
  id: string;
  kind: string;
  from: string;
  to: string;
  length_m?: number;
  vertices?: [number, number][];
  [k: string]: unknown;
}
export interface E2eDoc {
  schema: string;
  headloss: string;
  nodes: E2eNode[];
  links: E2eLink[];
  layout?: Record<string, unknown>;
  [k: string]: unknown;
}
export interface NetworkRecord {
  version: number;
  document: E2eDoc;
  results: unknown;
  updatedAt: string | null;
  updatedBy: string | null;
}

/**
 * The editor's test hook, as client/src/app/screens/layout/screen/test-hook.ts declares it (RunnelEditorHook).
 * The one declaration for every browser spec; keep the two in step.
 */
export interface RunnelEditorHook {
  getDocument(): NetworkDocument;
  getSelection(): string[];
  lastSolveMs(): number;
  frameTimes(): number[];
  /** Page (client) coordinates of a site point, for driving the canvas with a real mouse. */
  worldToClient(x_m: number, y_m: number): { x: number; y: number };
  /** Labels shown on the canvas now (element id, or bank:<id>), as page (client) boxes. */
  labelBoxes(): LabelBox[];
}
export interface LabelBox {
  id: string;
  x: number;
  y: number;
  w: number;
  h: number;
  /** Content variant placed: for a node with a badge 0 badge over name, 1 badge and name on a line, 2 badge alone. */ variant?: number;
}

declare global {
  interface Window {
    __runnelEditor?: RunnelEditorHook;
  }
}

/** A small gravity line, stored through the API: tank on the hill, pipe down to an outlet. */
export function smallNetwork(title: string): E2eDoc {
  return {
    schema: 'runnel.network/1',
    headloss: 'hazen-williams',
    title,
    nodes: [
      { id: 'T1', kind: 'tank', name: 'T1', elevation_m: 40, diameter_m: 1.6, level_m: 1.2, min_level_m: 0.1, max_level_m: 1.5, x_m: 0, y_m: 0 },
      {
        id: 'O1',
        kind: 'outlet',
        name: 'O1',
        elevation_m: 10,
        demand_m3s: 0.0003,
        min_pressure_m: 7,
        outlet_type: 'hose-bib',
        demand_model: { type: 'fixed' },
        x_m: 40,
        y_m: -30,
      },
    ],
    links: [{ id: 'P1', kind: 'pipe', from: 'T1', to: 'O1', length_m: 50, diameter_m: 0.025, roughness: 140 }],
  };
}

/** Screenshots go to spec/.tmp/ (git-ignored) so a person can look at what the test saw. */
export const SHOT_DIR = new URL('../.tmp/', import.meta.url).pathname;
export async function shot(page: Page, name: string): Promise<string> {
  mkdirSync(SHOT_DIR, { recursive: true });
  const path = join(SHOT_DIR, `layout-${name}.png`);
  await page.screenshot({ path });
  return path;
}

export const editorHook = {
  doc: (page: Page) => page.evaluate(() => window.__runnelEditor!.getDocument() as unknown as E2eDoc),
  selection: (page: Page) => page.evaluate(() => window.__runnelEditor!.getSelection()),
  solveMs: (page: Page) => page.evaluate(() => window.__runnelEditor!.lastSolveMs()),
  frameTimes: (page: Page) => page.evaluate(() => window.__runnelEditor!.frameTimes()),
  labels: (page: Page) => page.evaluate(() => window.__runnelEditor!.labelBoxes()),
  toClient: (page: Page, x_m: number, y_m: number) => page.evaluate(([x, y]) => window.__runnelEditor!.worldToClient(x, y), [x_m, y_m] as const),
};

/** What a document looks like once stored as JSON (drops `undefined` members; key order is irrelevant to deep-equal). */
export const asStored = <T>(v: T): T => JSON.parse(JSON.stringify(v)) as T;

/** Calls the API with the page's session cookie and a fresh CSRF token (server/API.md). */
export async function apiCall(page: Page, baseUrl: string, method: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE', path: string, data?: unknown) {
  if (method === 'GET') return page.request.get(`${baseUrl}${path}`);
  const token = ((await (await page.request.get(`${baseUrl}/api/csrf`)).json()) as { token: string }).token;
  return page.request.fetch(`${baseUrl}${path}`, { method, data, headers: { 'x-csrf-token': token } });
}

export async function getNetwork(page: Page, baseUrl: string, projectId: string): Promise<NetworkRecord> {
  const res = await apiCall(page, baseUrl, 'GET', `/api/projects/${projectId}/network`);
  if (res.status() !== 200) throw new Error(`GET network: ${res.status()}`);
  return (await res.json()) as NetworkRecord;
}

/** The id of the project listed under `name` for the signed-in user. */
export async function findProject(page: Page, baseUrl: string, name: string): Promise<string> {
  const res = await apiCall(page, baseUrl, 'GET', '/api/projects');
  if (res.status() !== 200) throw new Error(`GET projects: ${res.status()}`);
  const project = ((await res.json()) as { id: string; name: string }[]).find((p) => p.name === name);
  if (!project) throw new Error(`no project "${name}" listed`);
  return project.id;
}

/** Waits until the editor has solved at least once (the worker reported a solve time). */
export async function waitSolved(page: Page, timeout = 15000): Promise<void> {
  await page.waitForFunction(() => (window.__runnelEditor?.lastSolveMs() ?? 0) > 0, null, { timeout });
}

export async function createProject(page: Page, baseUrl: string, name: string, units: 'si' | 'us' = 'si'): Promise<string> {
  const res = await apiCall(page, baseUrl, 'POST', '/api/projects', { name, units });
  if (res.status() !== 201) throw new Error(`create project: ${res.status()} ${await res.text()}`);
  return ((await res.json()) as { id: string }).id;
}

/** Waits until the Layout screen has its canvas, its hook and a loaded document. */
export async function waitForLayout(page: Page): Promise<void> {
  await page.getByTestId('layout-canvas').locator('canvas').first().waitFor();
  await page.waitForFunction(() => !!window.__runnelEditor);
  // The chip leaves "Loading…" once the network has been fetched (or says View only).
  await page.waitForFunction(() => {
    const chip = document.querySelector('[data-testid=save-status]');
    return !!document.querySelector('[data-testid=view-only-chip]') || (!!chip && !/Loading/.test(chip.textContent ?? ''));
  });
}

export async function openLayout(page: Page, baseUrl: string, projectId: string): Promise<void> {
  await page.goto(`${baseUrl}/projects/${projectId}/layout`);
  await waitForLayout(page);
}

export async function saveStatus(page: Page): Promise<string> {
  return ((await page.getByTestId('save-status').textContent()) ?? '').trim();
}

export async function waitSaved(page: Page, timeout = 15000): Promise<void> {
  await page.waitForFunction(() => document.querySelector('[data-testid=save-status]')?.textContent?.trim() === 'Saved', null, { timeout });
}

/**
 * After an edit: waits for the chip to leave "Saved" (the edit is noted; autosave waits 1.5 s),
 * then for "Saved" again. The first wait is bounded because a fast save may already be over.
 */
export async function waitSavedAfterEdit(page: Page, timeout = 15000): Promise<void> {
  await page
    .waitForFunction(() => document.querySelector('[data-testid=save-status]')?.textContent?.trim() !== 'Saved', null, { timeout: 3000 })
    .catch(() => undefined);
  await waitSaved(page, timeout);
}

/** Waits until the editor's document has `n` nodes. */
export async function waitForNodeCount(page: Page, n: number, timeout = 15000): Promise<void> {
  await page.waitForFunction((count) => window.__runnelEditor?.getDocument().nodes.length === count, n, { timeout });
}

/**
 * Drags a palette item onto a page point the way a person does with the CDK drag: press, nudge
 * past the drag threshold, travel in several steps, release.
 */
export async function dragFromPalette(page: Page, kind: string, to: { x: number; y: number }): Promise<void> {
  const box = (await page.getByTestId(`palette-${kind}`).boundingBox())!;
  const from = { x: box.x + box.width / 2, y: box.y + box.height / 2 };
  await page.mouse.move(from.x, from.y);
  await page.mouse.down();
  await page.mouse.move(from.x + 8, from.y + 4, { steps: 3 });
  await page.mouse.move((from.x + to.x) / 2, (from.y + to.y) / 2, { steps: 6 });
  await page.mouse.move(to.x, to.y, { steps: 6 });
  await page.mouse.up();
}

/** A page point at fractions of the canvas box. */
export async function canvasPoint(page: Page, fx: number, fy: number): Promise<{ x: number; y: number }> {
  const box = (await page.getByTestId('layout-canvas').boundingBox())!;
  return { x: box.x + box.width * fx, y: box.y + box.height * fy };
}

/** Clicks the canvas at a site point (found through worldToClient). */
export async function clickWorld(page: Page, x_m: number, y_m: number): Promise<void> {
  const p = await editorHook.toClient(page, x_m, y_m);
  await page.mouse.click(p.x, p.y);
}

export async function clickNode(page: Page, id: string): Promise<void> {
  const n = (await editorHook.doc(page)).nodes.find((m) => m.id === id);
  if (!n) throw new Error(`no node ${id}`);
  await clickWorld(page, n.x_m, n.y_m);
}

/** Types into a property field and leaves it (fields commit on blur). */
export async function setProperty(page: Page, testid: string, value: string): Promise<void> {
  const field = page.getByTestId(testid);
  await field.click();
  await field.fill(value);
  await field.press('Tab');
}

/** Text of the snack bar currently shown, or '' after the timeout. */
export async function snackText(page: Page, timeout = 10000): Promise<string> {
  const bar = page.locator('mat-snack-bar-container, .mat-mdc-snack-bar-container').first();
  await bar.waitFor({ timeout });
  return ((await bar.textContent()) ?? '').trim();
}

/**
 * The same designer with the project's Layout open in two windows: `pageA` is the suite's page
 * (already signed in), `pageB` a second signed-in context the harness closes after the test.
 */
export async function openInTwoWindows(
  ui: { page: Page; newContext(): Promise<BrowserContext> },
  baseUrl: string,
  projectId: string,
): Promise<{ pageA: Page; pageB: Page }> {
  const pageA = ui.page;
  const pageB = await (await ui.newContext()).newPage();
  await signIn(pageB, baseUrl, 'designer');
  await openLayout(pageA, baseUrl, projectId);
  await openLayout(pageB, baseUrl, projectId);
  return { pageA, pageB };
}
