/**
 * Walk mode on a phone, out of signal: a 390 × 844 touch viewport, emulated geolocation, the network
 * switched off. Five points and a photo recorded offline survive closing the page, sync once when
 * the network returns, and the track becomes a pipe with its ground profile. A walk also syncs when
 * the signal returns while another screen is open.
 */
import { expect } from 'chai';
import type { BrowserContext, CDPSession, Page } from 'playwright-core';
import { launchBrowser, requireChromium, signIn, startApp, type RunningApp } from './harness';
import { apiCall, createProject, getNetwork } from './layout-helpers';
import type { Browser } from 'playwright-core';

const PHONE = { width: 390, height: 844 };
const SHOTS = '/tmp/shots-field';
/** Metres north/east of a made-up place to degrees (small offsets; 1° latitude ≈ 111.1 km). */
const ORIGIN = { lat: 44.5, lon: -122.1 };
const at = (east_m: number, north_m: number) => ({
  latitude: ORIGIN.lat + north_m / 111132,
  longitude: ORIGIN.lon + east_m / (111320 * Math.cos((ORIGIN.lat * Math.PI) / 180)),
});

async function placePhone(cdp: CDPSession, east_m: number, north_m: number, accuracy = 4, altitude?: number): Promise<void> {
  const { latitude, longitude } = at(east_m, north_m);
  await cdp.send('Emulation.setGeolocationOverride', { latitude, longitude, accuracy, ...(altitude === undefined ? {} : { altitude }) });
}

async function openWalk(context: BrowserContext, baseUrl: string, projectId: string): Promise<{ page: Page; cdp: CDPSession }> {
  const page = await context.newPage();
  const cdp = await context.newCDPSession(page);
  await placePhone(cdp, 0, 0);
  await page.goto(`${baseUrl}/projects/${projectId}/walk`);
  await page.getByTestId('walk-screen').waitFor();
  return { page, cdp };
}

describe('Walk mode: recording on a phone without signal', function () {
  this.timeout(240000);
  let app: RunningApp;
  let browser: Browser;
  before(async function () {
    requireChromium(this);
    app = await startApp();
    browser = await launchBrowser();
  });
  after(async () => {
    await browser?.close();
    await app?.stop();
  });

  it('records five points and a photo offline, keeps them over a closed page, syncs once, and builds a pipe from the track', async () => {
    const context = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true, permissions: ['geolocation'] });
    try {
      const setup = await context.newPage();
      await signIn(setup, app.baseUrl, 'designer');
      const projectId = await createProject(setup, app.baseUrl, 'Walked paddock line', 'si');
      await setup.close();

      // In signal: open Walk once, so the app and the project are kept for offline use.
      let { page, cdp } = await openWalk(context, app.baseUrl, projectId);
      await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined));
      await page.reload();
      await page.getByTestId('walk-screen').waitFor();
      await page.waitForFunction(() => navigator.serviceWorker.controller !== null);
      await page.getByTestId('walk-name').fill('North line');
      await page.getByTestId('walk-start').click();
      await page.getByTestId('walk-title').waitFor();

      await context.setOffline(true);
      await page.getByTestId('walk-network').filter({ hasText: 'Offline' }).waitFor();
      await page.getByTestId('walk-interval').selectOption('2');
      await page.getByTestId('walk-track-toggle').click();

      // Bad input first: a poor fix is refused with the limit named, and nothing typed is lost.
      await placePhone(cdp, 0, 0, 80);
      await page.getByTestId('walk-fix').filter({ hasText: 'Poor fix' }).waitFor();
      await page.getByTestId('walk-label').fill('Spring');
      await page.getByTestId('walk-kind').selectOption('spring-box');
      await page.getByTestId('walk-elevation').fill('320');
      await page.getByTestId('walk-record').click();
      expect(await page.getByTestId('walk-message').innerText()).to.match(/±80\.0 m, worse than the 10\.0 m limit/);
      await page.screenshot({ path: `${SHOTS}/walk-poor-fix-390.png` });
      expect(await page.getByTestId('walk-label').inputValue()).to.equal('Spring');
      // An oversized photo: a clear message, the point's fields stay.
      await page.getByTestId('walk-photo').setInputFiles({ name: 'huge.jpg', mimeType: 'image/jpeg', buffer: Buffer.alloc(26 * 1024 * 1024) });
      await placePhone(cdp, 0, 0, 4);
      await page
        .getByTestId('walk-fix')
        .filter({ hasText: /^.?Fix/ })
        .waitFor();
      await page.getByTestId('walk-record').click();
      // the photo is checked asynchronously: wait for its message to replace the poor-fix one
      await page
        .getByTestId('walk-message')
        .filter({ hasText: /huge\.jpg" is 26\.0 MB; photos up to 25\.0 MB/ })
        .waitFor();
      expect(await page.getByTestId('walk-elevation').inputValue()).to.equal('320');
      // A real photo, made in the page as a camera would (4000 × 3000 JPEG).
      const jpeg = Buffer.from(
        await page.evaluate(async () => {
          const c = new OffscreenCanvas(4000, 3000);
          const g = c.getContext('2d')!;
          g.fillStyle = '#6b8f3a';
          g.fillRect(0, 0, 4000, 3000);
          g.fillStyle = '#2f6f8f';
          g.fillRect(800, 900, 2400, 1200);
          return [...new Uint8Array(await (await c.convertToBlob({ type: 'image/jpeg', quality: 0.95 })).arrayBuffer())];
        }),
      );
      await page.getByTestId('walk-photo').setInputFiles({ name: 'spring-box.jpg', mimeType: 'image/jpeg', buffer: jpeg });
      await page.getByTestId('walk-record').click();
      await page.getByTestId('walk-saved').filter({ hasText: 'Recorded Spring with its photo' }).waitFor();

      // Four more points down the line, the track following between them.
      const stops: [string, string, number, number, number][] = [
        ['Bend by the oak', 'bend', 60, 5, 314],
        ['Creek crossing', 'crossing', 120, 40, 305],
        ['Paddock tee', 'tee', 180, 60, 303],
        ['Trough 4', 'trough', 240, 120, 298],
      ];
      let fixes = 0;
      let previous = [0, 0];
      for (const [label, kind, east, north, z] of stops) {
        // Half-way from the last stop, then at the stop; the phone's own altitude reads 30 m high.
        for (const f of [0.5, 1]) {
          await placePhone(cdp, previous[0] + (east - previous[0]) * f, previous[1] + (north - previous[1]) * f, 4, z + 30);
          fixes++;
          await page
            .getByTestId('walk-track-count')
            .filter({ hasText: new RegExp(`^(${fixes}|${fixes + 1}|${fixes + 2}) fix`) })
            .waitFor({ timeout: 15000 });
        }
        await page.getByTestId('walk-label').fill(label);
        await page.getByTestId('walk-kind').selectOption(kind);
        await page.getByTestId('walk-elevation').fill(String(z));
        await page.getByTestId('walk-record').click();
        await page
          .getByTestId('walk-saved')
          .filter({ hasText: `Recorded ${label}` })
          .waitFor();
        previous = [east, north];
      }
      expect(await page.getByTestId('walk-point').count()).to.equal(5);
      expect(await page.getByTestId('walk-waiting').innerText()).to.match(/Waiting to sync: 5 points, \d+ fix(es)?, 1 photo/);
      await page.screenshot({ path: `${SHOTS}/walk-offline-390.png` });
      await page.getByTestId('walk-points').scrollIntoViewIfNeeded();
      await page.screenshot({ path: `${SHOTS}/walk-offline-list-390.png` });

      // Close the page, still offline; reopen it from the phone's own copy.
      await page.close();
      ({ page, cdp } = await openWalk(context, app.baseUrl, projectId));
      await page.getByTestId('walk-title').filter({ hasText: 'North line' }).waitFor();
      expect(await page.getByTestId('walk-point').count()).to.equal(5);
      expect(await page.locator('[data-testid=walk-point][data-synced="0"]').count()).to.equal(5);
      await page.getByTestId('walk-point-photo').waitFor();

      // Signal again: it syncs by itself, once.
      await context.setOffline(false);
      await page
        .getByTestId('walk-waiting')
        .filter({ hasText: 'All synced' })
        .waitFor({ timeout: 20000 })
        .catch(async (e) => {
          throw new Error(
            `${e}\nsync status: ${await page
              .getByTestId('walk-sync-status')
              .textContent()
              .catch(() => '(none)')}`,
          );
        });
      expect(await page.locator('[data-testid=walk-point][data-synced="1"]').count()).to.equal(5);
      const files = (await (await apiCall(page, app.baseUrl, 'GET', `/api/projects/${projectId}/files`)).json()) as {
        id: string;
        kind: string;
        filename: string;
      }[];
      expect(files.map((f) => f.kind).sort()).to.deep.equal(['photo', 'survey']);
      const survey = files.find((f) => f.kind === 'survey')!;
      expect(survey.filename).to.equal('walk-North line.gpx');
      const gpx = await (await apiCall(page, app.baseUrl, 'GET', `/api/projects/${projectId}/files/${survey.id}`)).text();
      expect(gpx.match(/<wpt /g)).to.have.length(5);
      for (const label of ['Spring', 'Bend by the oak', 'Creek crossing', 'Paddock tee', 'Trough 4'])
        expect(gpx.split(`<name>${label}</name>`)).to.have.length(2);
      // A retried sync (as when an answer is lost on the way back) adds nothing twice.
      await page.evaluate(
        () =>
          new Promise<void>((resolve, reject) => {
            const open = indexedDB.open('runnel-walk');
            open.onerror = () => reject(open.error);
            open.onsuccess = () => {
              const tx = open.result.transaction('points', 'readwrite');
              const store = tx.objectStore('points');
              store.openCursor().onsuccess = (e) => {
                const cursor = (e.target as IDBRequest<IDBCursorWithValue | null>).result;
                if (cursor) {
                  cursor.update({ ...cursor.value, synced: 0 });
                  cursor.continue();
                }
              };
              tx.oncomplete = () => {
                open.result.close();
                resolve();
              };
            };
          }),
      );
      await page.reload();
      await page.getByTestId('walk-waiting').filter({ hasText: 'All synced' }).waitFor({ timeout: 20000 });
      const again = await (await apiCall(page, app.baseUrl, 'GET', `/api/projects/${projectId}/files/${survey.id}`)).text();
      expect(again.match(/<wpt /g)).to.have.length(5);
      expect((await (await apiCall(page, app.baseUrl, 'GET', `/api/projects/${projectId}/files`)).json()).length).to.equal(2);

      // Build: elements from the points, one pipe along the track with its profile.
      await page.getByTestId('walk-build').click();
      await page.getByTestId('walk-build-result').waitFor({ timeout: 20000 });
      await page.getByTestId('walk-build-result').scrollIntoViewIfNeeded();
      await page.screenshot({ path: `${SHOTS}/walk-built-390.png` });
      const net = await getNetwork(page, app.baseUrl, projectId);
      const names = net.document.nodes.map((n) => n.name);
      expect(names).to.include.members(['Spring', 'Paddock tee', 'Trough 4']);
      const pipe = net.document.links.find((l) => l.kind === 'pipe' && l['name'] === 'North line')!;
      expect(pipe, 'pipe built from the track').to.not.equal(undefined);
      const profile = pipe['profile'] as [number, number][];
      expect(profile.length).to.be.greaterThan(3);
      expect(profile[0][1]).to.equal(320);
      expect(pipe['length_source']).to.equal('survey');
      // The walked line is 277.8 m in plan (spring → four stops); along the ground a little more: the sloped
      // length along its profile, Σ √(Δchainage² + Δz²) (Pythagoras, C)
      const sloped = profile.slice(1).reduce((sum, [c, z], i) => sum + Math.hypot(c - profile[i][0], z - profile[i][1]), 0);
      expect(pipe['length_m'] as number).to.be.closeTo(sloped, 0.01);
      expect(pipe['length_m'] as number).to.be.within(278, 320);
      expect((net.document.layout?.['geo'] as { source: string }).source).to.equal('walk');
    } finally {
      await context.close();
    }
  });

  it('a walk recorded offline syncs when the signal returns while another screen is open', async () => {
    const context = await browser.newContext({ viewport: PHONE, isMobile: true, hasTouch: true, permissions: ['geolocation'] });
    try {
      const setup = await context.newPage();
      await signIn(setup, app.baseUrl, 'designer');
      const projectId = await createProject(setup, app.baseUrl, 'Back-paddock line', 'si');
      await setup.close();
      const { page } = await openWalk(context, app.baseUrl, projectId);
      await page.evaluate(() => navigator.serviceWorker.ready.then(() => undefined));
      await page.reload();
      await page.waitForFunction(() => navigator.serviceWorker.controller !== null);
      await page.getByTestId('walk-name').fill('Back line');
      await page.getByTestId('walk-start').click();
      await page.getByTestId('walk-title').waitFor();

      await context.setOffline(true);
      await page.getByTestId('walk-network').filter({ hasText: 'Offline' }).waitFor();
      for (const [label, z] of [
        ['Gate', '210'],
        ['Far trough', '204'],
      ]) {
        await page.getByTestId('walk-label').fill(label);
        await page.getByTestId('walk-elevation').fill(z);
        await page.getByTestId('walk-record').click();
        await page
          .getByTestId('walk-saved')
          .filter({ hasText: `Recorded ${label}` })
          .waitFor();
      }
      // Still out of signal, the designer moves on to the project list (the app is kept on the phone).
      await page.getByTestId('back-to-projects').tap();
      await page.waitForURL(/\/projects$/);
      const filesNow = async () =>
        (await (await apiCall(page, app.baseUrl, 'GET', `/api/projects/${projectId}/files`)).json()) as { kind: string; filename: string }[];
      expect(await filesNow()).to.deep.equal([]);

      await context.setOffline(false);
      await page.locator('mat-snack-bar-container').filter({ hasText: 'Walk synced: "Back line" (2 points' }).waitFor({ timeout: 20000 });
      const files = await filesNow();
      expect(files.map((f) => f.filename)).to.deep.equal(['walk-Back line.gpx']);
    } finally {
      await context.close();
    }
  });
});
