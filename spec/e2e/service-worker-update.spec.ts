/**
 * The service worker Walk mode installs must not hold a phone on an old version: after a new
 * deploy (a changed index.html and ngsw.json, as `ng build` writes them), the open app offers to
 * reload and the reload shows the new build. The server runs in-process on a copy of the built
 * client, which the test "deploys" over.
 */
import { createHash } from 'node:crypto';
import { cpSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { expect } from 'chai';
import type { Browser } from 'playwright-core';
import { startTestApp, type TestApp } from '../api/test-app';
import { launchBrowser, requireChromium, signIn } from './harness';

const built = new URL('../../dist/client/browser/', import.meta.url).pathname;

describe('Service worker: a new deploy is picked up', function () {
  this.timeout(180000);
  let t: TestApp;
  let server: import('node:http').Server;
  let browser: Browser;
  let clientDir: string;
  let baseUrl: string;
  before(async function () {
    requireChromium(this);
    clientDir = mkdtempSync(join(tmpdir(), 'runnel-sw-'));
    cpSync(built, clientDir, { recursive: true });
    t = await startTestApp({ clientDir });
    server = t.app.listen(0, '127.0.0.1');
    await new Promise((r) => server.once('listening', r));
    baseUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    browser = await launchBrowser();
  });
  after(async () => {
    await browser?.close();
    await new Promise((r) => server?.close(r));
    await t?.close();
    if (clientDir) rmSync(clientDir, { recursive: true, force: true });
  });

  it('offers the new version and reloads into it', async () => {
    const context = await browser.newContext({ viewport: { width: 390, height: 844 }, permissions: ['geolocation'] });
    try {
      const page = await context.newPage();
      await signIn(page, baseUrl, 'designer');
      const projectId = await page.evaluate(async () => ((await (await fetch('/api/projects')).json()) as { id: string }[])[0].id);
      await page.goto(`${baseUrl}/projects/${projectId}/walk`);
      await page.getByTestId('walk-screen').waitFor();
      await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined));
      await page.reload();
      await page.waitForFunction(() => navigator.serviceWorker.controller !== null);

      // Deploy: a changed index.html, and the manifest that names its new hash.
      const marker = '<meta name="runnel-build" content="second">';
      const index = readFileSync(join(clientDir, 'index.html'), 'utf8').replace('<head>', `<head>\n  ${marker}`);
      writeFileSync(join(clientDir, 'index.html'), index);
      const manifest = JSON.parse(readFileSync(join(clientDir, 'ngsw.json'), 'utf8'));
      manifest.hashTable['/index.html'] = createHash('sha1').update(index).digest('hex');
      manifest.timestamp = Date.now();
      writeFileSync(join(clientDir, 'ngsw.json'), JSON.stringify(manifest));

      // The worker looks for updates when the app is navigated to; the open page is told.
      await page.goto(`${baseUrl}/projects/${projectId}/walk`);
      const reload = page.locator('.mat-mdc-snack-bar-container').filter({ hasText: 'A new version of Runnel is ready.' });
      await reload.waitFor({ timeout: 60000 });
      expect(await page.locator('meta[name=runnel-build]').count()).to.equal(0);
      await reload.getByRole('button', { name: 'Reload' }).click();
      await page.waitForFunction(() => document.querySelector('meta[name=runnel-build]') !== null, undefined, { timeout: 30000 });
      await page.getByTestId('walk-screen').waitFor();
    } finally {
      await context.close();
    }
  });

  it('a browser that never opened Walk has no service worker', async () => {
    const context = await browser.newContext();
    try {
      const page = await context.newPage();
      await signIn(page, baseUrl, 'owner');
      await page.goto(`${baseUrl}/projects`);
      await page.getByTestId('projects-table').waitFor();
      expect(await page.evaluate(async () => (await navigator.serviceWorker.getRegistrations()).length)).to.equal(0);
    } finally {
      await context.close();
    }
  });
});
