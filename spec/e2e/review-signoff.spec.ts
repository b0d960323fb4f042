/**
 * Review in a real browser: the reviewer reads the demo's checklist, pins a comment on the line
 * near its rating and returns the design; the designer sees the pin on the Layout, fixes the pipe
 * class (a new version), resolves the comment and submits; the reviewer approves; the designer's
 * mail carries a working link to the approved version. A second comment is pinned to a point
 * clicked on the plan (and, on a phone, tapped). Screenshots at 1280×800 and 390×844.
 */
import { mkdirSync } from 'node:fs';
import { join } from 'node:path';
import { expect } from 'chai';
import type { Page } from 'playwright-core';
import { signIn, useBrowserApp } from './harness';
import { apiCall, findProject, getNetwork, waitForLayout } from './layout-helpers';

const SHOTS = process.env.RUNNEL_SHOTS ?? new URL('../.tmp/', import.meta.url).pathname;
async function shot(page: Page, name: string): Promise<void> {
  mkdirSync(SHOTS, { recursive: true });
  await page.screenshot({ path: join(SHOTS, `review-${name}.png`), fullPage: false });
}

describe('review sign-off in a real browser', function () {
  const ui = useBrowserApp({ viewport: { width: 1280, height: 800 } });

  it('submit → return with a pin → fix → approve, with the mail link opening the approved version', async () => {
    const { app } = ui;
    const reviewer = ui.page;
    await signIn(reviewer, app.baseUrl, 'reviewer');
    const projectId = await findProject(reviewer, app.baseUrl, 'Hillside smallholding');

    // The seeded version 1 waits for review; its checklist shows the dip line working near its rating.
    await reviewer.goto(`${app.baseUrl}/projects/${projectId}/review`);
    await reviewer.getByTestId('version-status').filter({ hasText: 'Submitted for review' }).waitFor();
    const caution = reviewer.getByTestId('check-pipe-working-share:L-TR4');
    await caution.waitFor();
    expect(await caution.getAttribute('data-status')).to.equal('caution');
    expect(await reviewer.getByTestId('check-profile-high-point:L-TR4@240').getAttribute('data-status')).to.equal('caution');
    await shot(reviewer, 'checklist-desktop');

    // Every single failure runs in the review worker; the main below the tanks starves every outlet.
    await reviewer.getByTestId('whatif-section').locator('mat-expansion-panel-header').click();
    await reviewer.getByTestId('whatif-run').click();
    await reviewer.getByTestId('whatif-table').waitFor();
    const worst = reviewer.getByTestId('whatif-table').locator('tr.mat-mdc-row').first();
    expect(await worst.textContent()).to.match(/no supply/);
    await reviewer.getByTestId('whatif-table').scrollIntoViewIfNeeded();
    await shot(reviewer, 'whatifs-desktop');
    await reviewer.getByTestId('whatif-section').locator('mat-expansion-panel-header').click();

    // Pin a comment to the line and return the design.
    await reviewer.getByTestId('comments-section').locator('mat-expansion-panel-header').click();
    await reviewer.getByTestId('comment-element').click();
    await reviewer.getByRole('option', { name: /^L-TR4/ }).click();
    await reviewer.getByTestId('comment-body').fill('L-TR4 works above 72 % of its rating at the bottom of the dip: use SIDR 9.');
    await reviewer.getByTestId('comment-add').click();
    await reviewer.getByTestId('thread-L-TR4').waitFor();

    // A comment pinned to a point clicked on the plan keeps that point (the plan's centre here).
    await reviewer.getByTestId('comment-element').click();
    await reviewer.getByTestId('comment-at-point').click();
    const plan = reviewer.getByTestId('plan-point-picker');
    await plan.waitFor();
    const box = (await plan.boundingBox())!;
    await plan.click({ position: { x: box.width / 2, y: box.height / 2 } });
    await reviewer.getByTestId('plan-point-new').waitFor();
    await reviewer.getByTestId('comment-body').fill('The fence line crosses the main here: keep the trench clear of the posts.');
    await shot(reviewer, 'plan-point-desktop');
    await reviewer.getByTestId('comment-add').click();
    await reviewer.getByTestId('thread-point').waitFor();
    const doc1 = (await getNetwork(reviewer, app.baseUrl, projectId)).document;
    const xs = doc1.nodes.map((n) => n.x_m as number);
    const ys = doc1.nodes.map((n) => n.y_m as number);
    const threads = (await (await apiCall(reviewer, app.baseUrl, 'GET', `/api/projects/${projectId}/comments`)).json()) as {
      threads: { body: string; element: string | null; x_m: number | null; y_m: number | null }[];
    };
    const pinned = threads.threads.find((t) => t.body.startsWith('The fence line'))!;
    const span = Math.max(Math.max(...xs) - Math.min(...xs), Math.max(...ys) - Math.min(...ys));
    expect(pinned.x_m).to.be.closeTo((Math.max(...xs) + Math.min(...xs)) / 2, span / 100);
    expect(pinned.y_m).to.be.closeTo((Math.max(...ys) + Math.min(...ys)) / 2, span / 100);

    await reviewer.getByTestId('signoff-note').fill('One pipe class to change; see the pin on L-TR4.');
    await reviewer.getByTestId('signoff-return').click();
    await reviewer.getByTestId('version-status').filter({ hasText: 'Returned' }).waitFor();

    // The designer sees the returned version's open comment and its pin on the Layout.
    const designerContext = await ui.newContext({ width: 1280, height: 800 });
    const designer = await designerContext.newPage();
    await signIn(designer, app.baseUrl, 'designer');
    await designer.goto(`${app.baseUrl}/projects/${projectId}/review`);
    await designer.getByTestId('returned-banner').waitFor();
    await designer.getByTestId('thread-L-TR4').scrollIntoViewIfNeeded();
    await shot(designer, 'returned-comments-desktop');
    await designer.getByTestId('thread-L-TR4').getByTestId('thread-element').click();
    await designer.waitForURL(/\/layout\?select=L-TR4/);
    await waitForLayout(designer);
    await designer.waitForFunction(() =>
      (window as unknown as { __runnelEditor?: { getSelection(): string[] } }).__runnelEditor?.getSelection().includes('L-TR4'),
    );
    // Both open comments stand as pins on the plan: one on the line, one at the clicked point.
    const pins = await designer.waitForFunction(() => {
      const hook = (window as unknown as { __runnelEditor?: { planMarkers(): { kind: string; at: { element?: string; point?: { x: number; y: number } } }[] } })
        .__runnelEditor;
      const list = hook?.planMarkers().filter((m) => m.kind === 'pin') ?? [];
      return list.some((m) => m.at.point) && list.some((m) => m.at.element) ? list : null;
    });
    const onPlan = (await pins.jsonValue()) as { at: { element?: string; point?: { x: number; y: number } } }[];
    expect(onPlan.some((m) => m.at.element === 'L-TR4')).to.equal(true);
    expect(
      onPlan.some((m) => m.at.point?.x === pinned.x_m && m.at.point?.y === pinned.y_m),
      JSON.stringify(onPlan),
    ).to.equal(true);
    await shot(designer, 'layout-pin-selected');

    // Fix: the line becomes SIDR 9 (same bore, higher rating) — a new version through the same save path.
    const net = await getNetwork(designer, app.baseUrl, projectId);
    const fixed = { ...net.document, links: net.document.links.map((l) => (l.id === 'L-TR4' ? { ...l, series: 'pe-sidr9', rating_m: 112.49 } : l)) };
    const saved = await apiCall(designer, app.baseUrl, 'PUT', `/api/projects/${projectId}/network`, { version: net.version, document: fixed });
    expect(saved.status()).to.equal(200);
    await designer.goto(`${app.baseUrl}/projects/${projectId}/review`);
    await designer.getByTestId('version-status').filter({ hasText: 'Draft' }).waitFor();
    const fixedRow = designer.getByTestId('check-pipe-working-share:L-TR4');
    await fixedRow.waitFor();
    expect(await fixedRow.getAttribute('data-status')).to.equal('pass');
    await designer.getByTestId('thread-L-TR4').getByTestId('reply-body').fill('Changed to SIDR 9 in this version.');
    await designer.getByTestId('thread-L-TR4').getByTestId('reply-send').click();
    await designer.getByTestId('thread-L-TR4').getByText('Changed to SIDR 9').waitFor();
    await designer.getByTestId('thread-L-TR4').getByTestId('thread-resolve').click();
    await designer.getByTestId('thread-L-TR4').getByText('resolved', { exact: true }).waitFor();
    await designer.getByTestId('signoff-note').fill('L-TR4 now SIDR 9.');
    await designer.getByTestId('signoff-submit').click();
    await designer.getByTestId('version-status').filter({ hasText: 'Submitted for review' }).waitFor();

    // The reviewer approves the new version.
    await reviewer.goto(`${app.baseUrl}/projects/${projectId}/review`);
    await reviewer.getByTestId('version-status').filter({ hasText: 'Submitted for review' }).waitFor();
    await reviewer.getByTestId('signoff-approve').click();
    await reviewer.getByTestId('version-status').filter({ hasText: 'Approved' }).waitFor();
    await shot(reviewer, 'approved-desktop');

    // The designer's mail is in the outbox with a link that opens the approved version.
    const adminContext = await ui.newContext();
    const admin = await adminContext.newPage();
    await signIn(admin, app.baseUrl, 'admin');
    const outbox = (await (await apiCall(admin, app.baseUrl, 'GET', '/api/team/outbox')).json()) as { to: string; subject: string; text: string }[];
    const mail = outbox.find((m) => m.to.includes('designer@runnel.test') && /version 2 approved/.test(m.subject));
    expect(mail, JSON.stringify(outbox.map((m) => m.subject))).to.exist;
    const link = /(http\S+\/review\?version=2)/.exec(mail!.text)![1];
    const path = new URL(link).pathname + new URL(link).search;
    await designer.goto(`${app.baseUrl}${path}`);
    await designer.getByTestId('version-status').filter({ hasText: 'Approved' }).waitFor();
    expect(await designer.getByTestId('signoff-submit').count()).to.equal(0);

    // An approved version refuses change: a late return is a clear 409.
    const late = await apiCall(reviewer, app.baseUrl, 'POST', `/api/projects/${projectId}/versions/2/return`, { note: 'late' });
    expect(late.status()).to.equal(409);
    expect(((await late.json()) as { error: { message: string } }).error.message).to.match(/approved and frozen/);

    // Version 1 opens read-only on the Layout from a link; a phone shows the review.
    await designer.goto(`${app.baseUrl}/projects/${projectId}/layout?version=1`);
    await designer.getByTestId('version-banner').waitFor();
    await designer.getByTestId('view-only-chip').waitFor();
    await shot(designer, 'layout-version-1');
    const phoneContext = await ui.newContext({ width: 390, height: 844 });
    const phone = await phoneContext.newPage();
    await signIn(phone, app.baseUrl, 'owner');
    await phone.goto(`${app.baseUrl}/projects/${projectId}/review?version=1`);
    await phone.getByTestId('check-pipe-working-share:L-TR4').waitFor();
    // The checklist fits the phone: one card per check, nothing wider than the screen.
    expect(await phone.evaluate(() => document.documentElement.scrollWidth)).to.be.at.most(390);
    const card = phone.getByTestId('check-pipe-working-share:L-TR4');
    await card.scrollIntoViewIfNeeded();
    expect(await card.locator('td.mat-column-limit').isVisible()).to.equal(true);
    expect(await card.locator('td.mat-column-limit').textContent()).to.match(/72 %/);
    expect(await card.locator('td.mat-column-source').isVisible()).to.equal(true);
    await shot(phone, 'checklist-phone');
    // The owner pins a comment to a point with a tap on the plan.
    // The panel opens by itself while comments are open; open it only if it is not.
    const phoneHeader = phone.getByTestId('comments-section').locator('mat-expansion-panel-header');
    if ((await phoneHeader.getAttribute('aria-expanded')) !== 'true') await phoneHeader.click();
    await phone.getByTestId('comment-element').click();
    await phone.getByTestId('comment-at-point').click();
    const phonePlan = phone.getByTestId('plan-point-picker');
    await phonePlan.scrollIntoViewIfNeeded();
    await phonePlan.click({ position: { x: 60, y: 60 } });
    await phone.getByTestId('plan-point-new').waitFor();
    expect(await phone.getByTestId('plan-point-hint').textContent()).to.match(/Pinned at -?[\d.]+, -?[\d.]+ m/);
    await shot(phone, 'plan-point-phone');
  });
});
