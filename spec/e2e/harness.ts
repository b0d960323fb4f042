/**
 * Browser end-to-end harness: starts the real server (built client, fresh PGlite data folder,
 * demo seed) as a child process on 127.0.0.1 and drives Debian's Chromium with playwright-core.
 * `useBrowserApp()` registers a spec file's hooks (one server and browser per file, a fresh
 * context and page per test).
 */
import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { chromium, type Browser, type BrowserContext, type Page } from 'playwright-core';
import { startServerProcess, type ServerProcess } from '../server-process';

export const CHROMIUM_PATH = process.env.CHROMIUM_PATH ?? '/usr/bin/chromium';
export const DEMO_PASSWORD = 'runnel-demo-2026';
export const demoEmail = (role: string) => `${role}@runnel.test`;

const repoRoot = new URL('../..', import.meta.url).pathname;

export type RunningApp = ServerProcess;

/** Starts `tsx server/main.ts` with a throw-away data folder (or the given one, to test restarts). */
export async function startApp(dataDir?: string): Promise<RunningApp> {
  if (!existsSync(join(repoRoot, 'dist/client/browser/index.html'))) {
    throw new Error('dist/client is missing: run `npx ng build` (npm test does it first)');
  }
  // Every browser test signs in from 127.0.0.1; the per-IP budget has its own API spec.
  return startServerProcess({ dataDir, env: { PASSWORD_CHECKS_PER_IP: '100000' } });
}

export async function launchBrowser(): Promise<Browser> {
  // playwright-core gives each launch a fresh, throw-away profile directory.
  return chromium.launch({
    executablePath: CHROMIUM_PATH,
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
      '--disable-quic',
    ],
  });
}

export const hasChromium = () => existsSync(CHROMIUM_PATH);

/**
 * Browser suites fail when Chromium is missing, so a machine without it cannot pass them unseen;
 * RUNNEL_SKIP_E2E=1 skips them on purpose (mocha reports them as pending).
 */
export function requireChromium(ctx: Mocha.Context): void {
  if (hasChromium()) return;
  if (process.env['RUNNEL_SKIP_E2E'] === '1') ctx.skip();
  throw new Error(`no Chromium at ${CHROMIUM_PATH}: apt-get install -y chromium, or set RUNNEL_SKIP_E2E=1 to skip the browser tests`);
}

/** Signs in through the real sign-in screen and waits for the projects list. */
export async function signIn(page: Page, baseUrl: string, role: string): Promise<void> {
  await page.goto(`${baseUrl}/sign-in`);
  await page.getByTestId('signin-email').fill(demoEmail(role));
  await page.getByTestId('signin-password').fill(DEMO_PASSWORD);
  await page.getByTestId('signin-submit').click();
  await page.waitForURL(/\/projects/);
}

export interface Viewport {
  width: number;
  height: number;
}

/** What `useBrowserApp` hands a spec file: getters, valid inside its tests and hooks. */
export interface BrowserApp {
  readonly app: RunningApp;
  readonly browser: Browser;
  /** This test's browser context (a fresh profile: no cookies from earlier tests). */
  readonly context: BrowserContext;
  /** This test's page, in `context`. */
  readonly page: Page;
  /** A further context (another window, another screen size), closed after the test. */
  newContext(viewport?: Viewport): Promise<BrowserContext>;
}

/**
 * Asks the app for its browser-test hooks (e.g. the Layout's `window.__runnelEditor`), which
 * production pages never load: the flag is set before any page script runs.
 */
export async function withTestHooks(context: BrowserContext): Promise<BrowserContext> {
  await context.addInitScript(() => {
    (window as unknown as { __runnelTestHooks?: boolean }).__runnelTestHooks = true;
  });
  return context;
}

/**
 * Registers a spec file's mocha hooks: one server and one browser for the file (skipped where
 * Chromium is missing), and a fresh context and page for each test, closed after it.
 */
export function useBrowserApp(options: { viewport?: Viewport } = {}): BrowserApp {
  const viewport = options.viewport ?? { width: 1366, height: 768 };
  let app: RunningApp | undefined;
  let browser: Browser | undefined;
  let context: BrowserContext | undefined;
  let page: Page | undefined;
  let extra: BrowserContext[] = [];
  const need = <T>(v: T | undefined, what: string): T => {
    if (v === undefined) throw new Error(`${what} is only there inside a test of this suite`);
    return v;
  };

  before(async function () {
    requireChromium(this);
    app = await startApp();
    browser = await launchBrowser();
  });
  after(async () => {
    await browser?.close();
    await app?.stop();
  });
  beforeEach(async () => {
    context = await withTestHooks(await need(browser, 'browser').newContext({ viewport }));
    page = await context.newPage();
  });
  afterEach(async () => {
    for (const c of [context, ...extra]) await c?.close();
    extra = [];
    context = undefined;
    page = undefined;
  });

  return {
    get app() {
      return need(app, 'app');
    },
    get browser() {
      return need(browser, 'browser');
    },
    get context() {
      return need(context, 'context');
    },
    get page() {
      return need(page, 'page');
    },
    async newContext(size?: Viewport) {
      const c = await withTestHooks(await need(browser, 'browser').newContext({ viewport: size ?? viewport }));
      extra.push(c);
      return c;
    },
  };
}
