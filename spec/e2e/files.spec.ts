/**
 * The Files tab in a real browser: the demo's walk survey previewed as a plan and a table (in the
 * project's units and the viewer's other units), an uploaded site photo previewed, renamed and
 * deleted by a designer; an owner on a phone previews under the file and sees no rename or delete.
 * Screenshots go to /tmp/shots-layout/files-*.png for a person to look at.
 */
import { expect } from 'chai';
import type { Page } from 'playwright-core';
import { signIn, useBrowserApp } from './harness';
import { apiCall, findProject } from './layout-helpers';

const SHOTS = '/tmp/shots-layout';

/** Draws a small aerial-looking picture in the page and uploads it as a PNG backdrop. */
async function uploadPicture(page: Page, baseUrl: string, projectId: string, filename: string): Promise<void> {
  const token = ((await (await page.request.get(`${baseUrl}/api/csrf`)).json()) as { token: string }).token;
  const status = await page.evaluate(
    async ({ projectId, filename, token }) => {
      const c = document.createElement('canvas');
      c.width = 480;
      c.height = 320;
      const g = c.getContext('2d')!;
      g.fillStyle = '#9bb07a';
      g.fillRect(0, 0, 480, 320);
      g.fillStyle = '#7b9360';
      g.beginPath();
      g.ellipse(300, 140, 150, 90, 0.4, 0, Math.PI * 2);
      g.fill();
      g.strokeStyle = '#c9b68a';
      g.lineWidth = 6;
      g.beginPath();
      g.moveTo(0, 260);
      g.bezierCurveTo(160, 220, 260, 300, 480, 210);
      g.stroke();
      const blob = await new Promise<Blob>((r) => c.toBlob((b) => r(b!), 'image/png'));
      const form = new FormData();
      form.append('kind', 'backdrop');
      form.append('file', blob, filename);
      const res = await fetch(`/api/projects/${projectId}/files`, { method: 'POST', body: form, headers: { 'x-csrf-token': token } });
      return res.status;
    },
    { projectId, filename, token },
  );
  expect(status).to.equal(201);
}

const row = (page: Page, name: string) => page.locator(`[data-testid="file-row"][data-file="${name}"]`);

describe('Files tab', function () {
  this.timeout(120000);
  const b = useBrowserApp({ viewport: { width: 1280, height: 800 } });

  it('a designer previews the walk survey and a photo, renames and deletes the photo', async () => {
    const { page } = b;
    const base = b.app.baseUrl;
    await signIn(page, base, 'designer');
    const id = await findProject(page, base, 'Hillside smallholding');
    await uploadPicture(page, base, id, 'IMG_0042.png');
    await page.goto(`${base}/projects/${id}/files`);
    await page.getByTestId('files-list').waitFor();

    // The demo walk's GPX: who added it, and its points on a plan and in a table, in metres.
    const walk = page.locator('[data-testid="file-row"]', { hasText: 'Survey (GPX)' }).first();
    expect(await walk.getByTestId('file-who').innerText()).to.match(/^Added by Dana Designer, \d{1,2} \w{3} \d{4}, \d\d:\d\d$/);
    await walk.getByTestId('file-preview-toggle').click();
    const preview = page.getByTestId('file-preview');
    await preview.getByTestId('survey-table').waitFor();
    const summary = await preview.getByTestId('survey-summary').innerText();
    const count = Number(/^(\d+) points/.exec(summary)?.[1]);
    expect(count).to.be.greaterThan(1);
    expect(summary).to.match(/ground [\d.,]+ m to [\d.,]+ m · spread [\d.,]+ m × [\d.,]+ m/);
    expect(await preview.locator('[data-testid="survey-plan"] path.peg').count()).to.equal(count);
    expect(await preview.locator('tbody tr').count()).to.equal(Math.min(count, 25));
    await page.screenshot({ path: `${SHOTS}/files-1280-si-survey.png` });

    // The viewer's own unit switch (project page) shows the same survey in feet.
    await page.evaluate((pid) => localStorage.setItem(`runnel.units.${pid}`, 'us'), id);
    await page.reload();
    await page.locator('[data-testid="file-row"]', { hasText: 'Survey (GPX)' }).first().getByTestId('file-preview-toggle').click();
    expect(await page.getByTestId('survey-summary').innerText()).to.match(/ground [\d.,]+ ft to [\d.,]+ ft/);
    await page.screenshot({ path: `${SHOTS}/files-1280-us-survey.png` });

    // The photo shows itself.
    await row(page, 'IMG_0042.png').getByTestId('file-preview-toggle').click();
    const img = page.getByTestId('file-preview-image');
    await page.waitForFunction(() => ((document.querySelector('[data-testid="file-preview-image"]') as HTMLImageElement | null)?.naturalWidth ?? 0) > 0);
    expect(await img.evaluate((el: HTMLImageElement) => el.naturalWidth)).to.equal(480);
    await page.screenshot({ path: `${SHOTS}/files-1280-us-image.png` });

    // Rename keeps the extension; the list and the preview heading follow.
    await row(page, 'IMG_0042.png').getByTestId('file-rename').click();
    await page.getByTestId('file-rename-input').fill('Ridge aerial');
    await page.getByTestId('file-rename-save').click();
    await row(page, 'Ridge aerial.png').waitFor();
    expect(await page.getByTestId('file-preview').locator('h3').innerText()).to.equal('Ridge aerial.png');

    // An empty name is refused in words, not sent.
    await row(page, 'Ridge aerial.png').getByTestId('file-rename').click();
    await page.getByTestId('file-rename-input').fill('   ');
    await page.getByTestId('file-rename-input').press('Enter');
    expect(await page.getByTestId('files-error').innerText()).to.equal('A file needs a name.');
    await page.getByTestId('file-rename-input').press('Escape');

    // Delete asks first, then the file is gone for good.
    await row(page, 'Ridge aerial.png').getByTestId('file-delete').click();
    await page.getByTestId('confirm-ok').click();
    await row(page, 'Ridge aerial.png').waitFor({ state: 'detached' });
    const listed = (await (await apiCall(page, base, 'GET', `/api/projects/${id}/files`)).json()) as { filename: string }[];
    expect(listed.map((f) => f.filename)).to.not.include('Ridge aerial.png');
  });

  it('an owner on a phone previews under the file, cannot rename or delete, and nothing runs off the screen', async () => {
    const context = await b.newContext({ width: 390, height: 844 });
    const page = await context.newPage();
    const base = b.app.baseUrl;
    await signIn(page, base, 'owner');
    const id = await findProject(page, base, 'Hillside smallholding');
    await page.goto(`${base}/projects/${id}/files`);
    await page.getByTestId('files-list').waitFor();
    const walk = page.locator('[data-testid="file-row"]', { hasText: 'Survey (GPX)' }).first();
    expect(await walk.getByTestId('file-download').count()).to.equal(1);
    expect(await page.getByTestId('file-rename').count()).to.equal(0);
    expect(await page.getByTestId('file-delete').count()).to.equal(0);
    await walk.getByTestId('file-preview-toggle').click();
    // On a phone the preview opens inside the file's own card.
    await walk.getByTestId('survey-table').waitFor();
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - window.innerWidth);
    expect(overflow).to.be.at.most(0);
    await page.screenshot({ path: `${SHOTS}/files-390-si-survey.png`, fullPage: true });
  });
});
