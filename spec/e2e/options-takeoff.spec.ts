/**
 * Options and Takeoff in Chromium against the real server and the demo seed (issue 9): a designer
 * makes an option and sizes it, the comparison shows every design; the owner marks the preferred
 * option and accepts the estimate; the estimator edits a price and exports the workbook; a
 * reviewer only reads. Screenshots at desktop and phone width when RUNNEL_SHOTS_DIR is set.
 */
import { mkdirSync } from 'node:fs';
import { expect } from 'chai';
import type { Page } from 'playwright-core';
import ExcelJS from 'exceljs';
import { signIn, useBrowserApp } from './harness';
import { apiCall } from './layout-helpers';

const SHOTS = process.env.RUNNEL_SHOTS_DIR;

async function shot(page: Page, name: string): Promise<void> {
  if (!SHOTS) return;
  mkdirSync(SHOTS, { recursive: true });
  await page.screenshot({ path: `${SHOTS}/${name}.png`, fullPage: true });
}

async function demoProject(page: Page): Promise<string> {
  const projects = (await page.evaluate(async () => (await fetch('/api/projects')).json())) as { id: string; name: string }[];
  return projects.find((p) => p.name === 'Hillside smallholding')!.id;
}

describe('Options and Takeoff (Chromium, real server)', function () {
  const ui = useBrowserApp({ viewport: { width: 1280, height: 800 } });

  it('a designer makes an option, sizes it and compares it with the others', async () => {
    const { app, page } = ui;
    page.on('dialog', (d) => void d.accept());
    await signIn(page, app.baseUrl, 'designer');
    const id = await demoProject(page);
    await page.goto(`${app.baseUrl}/projects/${id}/options`);
    await page.getByTestId('options-compare').waitFor();
    await page.getByTestId('option-name').fill('Sized by the designer');
    await page.getByTestId('option-create').click();
    await page.getByTestId('option-Sized by the designer').waitFor();
    await page.getByTestId('size-Sized by the designer').click();
    const report = page.getByTestId('option-Sized by the designer').getByTestId('sizing-report');
    await report.waitFor({ timeout: 60000 });
    expect(await report.textContent()).to.contain('Sized: every outlet passes.');
    expect(await report.textContent()).to.contain('exact dynamic programming');
    // current design + two demo options + the new one, each with a plan
    // the plans appear once every design's document has loaded
    await page.getByTestId('options-compare').locator('rn-mini-plan svg').nth(3).waitFor();
    expect(await page.getByTestId('options-compare').locator('thead th').count()).to.equal(5);
    expect(await page.getByTestId('options-compare').locator('rn-mini-plan svg').count()).to.equal(4);
    await page.waitForFunction(() => document.querySelectorAll('[data-testid="total-estimate"]').length === 4);
    const totals = await page.getByTestId('total-estimate').allTextContents();
    expect(new Set(totals).size, 'the designs cost different amounts').to.be.greaterThan(2);
    await shot(page, 'options-designer-desktop');
    if (SHOTS) await page.getByTestId('options-compare').screenshot({ path: `${SHOTS}/options-compare-desktop.png` });
    const phone = await (await ui.newContext({ width: 390, height: 844 })).newPage();
    await signIn(phone, app.baseUrl, 'designer');
    await phone.goto(`${app.baseUrl}/projects/${id}/options`);
    await phone.getByTestId('options-compare').waitFor();
    await shot(phone, 'options-designer-phone');
  });

  it('the owner marks the preferred option and accepts the estimate, and cannot edit', async () => {
    const { app, page } = ui;
    page.on('dialog', (d) => void d.accept());
    await signIn(page, app.baseUrl, 'owner');
    const id = await demoProject(page);
    await page.goto(`${app.baseUrl}/projects/${id}/options`);
    await page.getByTestId('options-compare').waitFor();
    expect(await page.getByTestId('option-new').count()).to.equal(0);
    expect(await page.getByTestId('size-Mainline 2 in').count()).to.equal(0);
    await page.getByTestId('prefer-Mainline 2 in').click();
    const note = page.getByTestId('option-Mainline 2 in').getByTestId('preferred-note');
    await note.waitFor();
    expect(await note.textContent()).to.contain('Preferred by Morgan Owner');
    await shot(page, 'options-owner-desktop');
    await page.goto(`${app.baseUrl}/projects/${id}/takeoff`);
    await page.getByTestId('estimate-total').waitFor();
    expect(await page.getByTestId('price-table').locator('input').count(), 'owners do not edit prices').to.equal(0);
    await page.getByTestId('accept-estimate').click();
    await page.getByTestId('acceptance').first().waitFor();
    expect(await page.getByTestId('acceptance').first().textContent()).to.contain('Accepted by Morgan Owner');
    await shot(page, 'takeoff-owner-desktop');
  });

  it('the estimator edits a price, sees the total change and exports the workbook; a reviewer only reads', async () => {
    const { app, page } = ui;
    await signIn(page, app.baseUrl, 'estimator');
    const id = await demoProject(page);
    await page.goto(`${app.baseUrl}/projects/${id}/takeoff`);
    await page.getByTestId('estimate-total').waitFor();
    const before = await page.getByTestId('estimate-total').textContent();
    const trench = page.getByTestId('price-other/trenching');
    await trench.fill('5.5');
    await trench.press('Tab');
    await page.getByTestId('takeoff-message').waitFor();
    await page.waitForFunction((old) => document.querySelector('[data-testid="estimate-total"]')?.textContent !== old, before);
    const download = page.waitForEvent('download');
    await page.getByTestId('export-xlsx').click();
    const file = await download;
    expect(file.suggestedFilename()).to.match(/\.xlsx$/);
    // The workbook read back carries the project's units in its headers (the demo is SI).
    const book = new ExcelJS.Workbook();
    await book.xlsx.readFile((await file.path())!);
    expect((book.getWorksheet('Pipes')!.getRow(1).values as unknown[]).map(String)).to.include.members(['Length (m)', 'Static pressure (kPa)']);
    await shot(page, 'takeoff-estimator-desktop');
    // Prices kept in New Zealand dollars: every money figure on Options follows.
    const settings = ((await (await apiCall(page, app.baseUrl, 'GET', `/api/projects/${id}/takeoff`)).json()) as { settings: Record<string, unknown> })
      .settings;
    expect((await apiCall(page, app.baseUrl, 'PUT', `/api/projects/${id}/takeoff/settings`, { ...settings, currency: 'NZD' })).status()).to.equal(200);
    const phone = await (await ui.newContext({ width: 390, height: 844 })).newPage();
    await signIn(phone, app.baseUrl, 'estimator');
    await phone.goto(`${app.baseUrl}/projects/${id}/takeoff`);
    await phone.getByTestId('estimate-total').waitFor();
    await shot(phone, 'takeoff-estimator-phone');

    const reviewer = await (await ui.newContext()).newPage();
    await signIn(reviewer, app.baseUrl, 'reviewer');
    await reviewer.goto(`${app.baseUrl}/projects/${id}/takeoff`);
    await reviewer.getByTestId('estimate-total').waitFor();
    expect(await reviewer.getByTestId('price-table').locator('input').count()).to.equal(0);
    expect(await reviewer.getByTestId('accept-estimate').count()).to.equal(0);
    await reviewer.goto(`${app.baseUrl}/projects/${id}/options`);
    await reviewer.getByTestId('options-compare').waitFor();
    await reviewer.getByTestId('total-estimate').first().waitFor();
    for (const text of [...(await reviewer.getByTestId('total-estimate').allTextContents()), ...(await reviewer.getByTestId('pipe-cost').allTextContents())]) {
      expect(text)
        .to.match(/NZ\$/)
        .and.not.match(/(^|[^Z])\$|USD/);
    }
    await shot(reviewer, 'options-reviewer-nzd-desktop');
    expect(await reviewer.getByTestId('option-new').count()).to.equal(0);
    expect(await reviewer.locator('[data-testid^="prefer-"]').count()).to.equal(0);
  });
});
