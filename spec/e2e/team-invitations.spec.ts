/**
 * The team screen's invitations and the join page, in Chromium (issue 12 item 12, issue 13 item 1):
 * after sending, the e-mail field is clean; no role is chosen unseen; an existing member is warned
 * about before sending; pending invitations can be resent and revoked; a signed-in account of another
 * address is refused on the join page with a way to switch account.
 */
import { mkdirSync } from 'node:fs';
import { expect } from 'chai';
import type { Page } from 'playwright-core';
import { signIn, useBrowserApp } from './harness';

const SHOTS = process.env.RUNNEL_SHOTS_DIR;

async function shot(page: Page, name: string): Promise<void> {
  if (!SHOTS) return;
  mkdirSync(SHOTS, { recursive: true });
  await page.screenshot({ path: `${SHOTS}/${name}.png`, fullPage: true });
}

/** Latest invitation link mailed to `email`, read from the admin's outbox API. */
async function linkFor(page: Page, baseUrl: string, email: string): Promise<string> {
  const mails = (await page.evaluate(async () => (await fetch('/api/team/outbox')).json())) as { to: string; text: string }[];
  const mail = mails.find((m) => m.to.includes(email));
  const link = /\/join\/[A-Za-z0-9_-]+/.exec(mail?.text ?? '');
  if (!link) throw new Error(`no invitation mail to ${email}`);
  return baseUrl + link[0];
}

describe('Team invitations and the join page (Chromium, real server)', function () {
  const ui = useBrowserApp({ viewport: { width: 1280, height: 800 } });

  it('invites without a pre-chosen role, leaves a clean field, warns about a member, resends and revokes', async () => {
    const { app, page } = ui;
    await signIn(page, app.baseUrl, 'admin');
    await page.goto(`${app.baseUrl}/team`);
    await page.getByTestId('members-table').waitFor();
    // No role is pre-selected: sending without choosing one asks for it.
    const chosenRoles = page.getByTestId('invite-roles').locator('.mat-mdc-select-value');
    expect((await chosenRoles.textContent())?.trim()).to.equal('');
    await page.getByTestId('invite-email').fill('new-hand@example.test');
    await page.getByTestId('invite-submit').click();
    await page.getByText('Pick at least one role.').waitFor();
    await page.getByTestId('invite-roles').click();
    await page.getByRole('option', { name: /^owner/ }).click();
    await page.keyboard.press('Escape');
    expect((await chosenRoles.textContent())?.trim()).to.equal('owner');
    await page.getByTestId('invite-submit').click();
    await page.getByTestId('pending-invitation').filter({ hasText: 'new-hand@example.test' }).waitFor();
    // The emptied field is not shown as an error.
    expect(await page.getByTestId('invite-email').inputValue()).to.equal('');
    expect(await page.locator('mat-error').count(), 'no red error after sending').to.equal(0);
    expect(await page.getByTestId('invite-email').getAttribute('aria-invalid')).to.not.equal('true');
    await shot(page, 'team-after-invite');

    // An existing member is named before anything is sent.
    await page.getByTestId('invite-email').fill('Designer@runnel.test');
    await page.getByTestId('invite-warning').waitFor();
    expect(await page.getByTestId('invite-warning').textContent()).to.contain('already a member (designer)');
    expect(await page.getByTestId('invite-submit').isDisabled()).to.equal(true);
    await shot(page, 'team-existing-member');

    // Resend mails a new link; the old one stops working.
    const first = await linkFor(page, app.baseUrl, 'new-hand@example.test');
    await page.getByTestId('pending-invitation').filter({ hasText: 'new-hand@example.test' }).getByTestId('invitation-resend').click();
    await page.getByText('A new link was sent to new-hand@example.test').waitFor();
    const second = await linkFor(page, app.baseUrl, 'new-hand@example.test');
    expect(second).to.not.equal(first);

    // Revoke, after confirming: it leaves the list.
    await page.getByTestId('pending-invitation').filter({ hasText: 'new-hand@example.test' }).getByTestId('invitation-revoke').click();
    await page.getByRole('button', { name: 'Revoke', exact: true }).click();
    await page.getByTestId('pending-invitation').filter({ hasText: 'new-hand@example.test' }).waitFor({ state: 'detached' });
    const visitor = await ui.newContext();
    const visitorPage = await visitor.newPage();
    await visitorPage.goto(second);
    await visitorPage.getByTestId('join-revoked').waitFor();
  });

  it('refuses a signed-in account of another address on the join page and offers to switch', async () => {
    const { app, page } = ui;
    await signIn(page, app.baseUrl, 'admin');
    await page.goto(`${app.baseUrl}/team`);
    await page.getByTestId('invite-email').fill('field-hand@example.test');
    await page.getByTestId('invite-roles').click();
    await page.getByRole('option', { name: /^reviewer/ }).click();
    await page.keyboard.press('Escape');
    await page.getByTestId('invite-submit').click();
    await page.getByTestId('pending-invitation').filter({ hasText: 'field-hand@example.test' }).waitFor();
    const link = await linkFor(page, app.baseUrl, 'field-hand@example.test');

    // The link reaches someone of the other team, who is signed in.
    const other = await ui.newContext({ width: 390, height: 844 });
    const otherPage = await other.newPage();
    await signIn(otherPage, app.baseUrl, 'other');
    await otherPage.goto(link);
    const refusal = otherPage.getByTestId('join-wrong-account');
    await refusal.waitFor({ timeout: 10000 }).catch(async (err) => {
      await otherPage.screenshot({ path: '/tmp/shots-security/debug-join.png' });
      throw err;
    });
    expect(await refusal.textContent()).to.contain('This invitation is for field-hand@example.test, but you are signed in as other@runnel.test');
    expect(await otherPage.getByTestId('join-submit').count()).to.equal(0);
    await shot(otherPage, 'join-wrong-account-phone');
    await otherPage.getByTestId('join-switch-account').click();
    await otherPage.getByTestId('join-name').waitFor();
    await otherPage.getByTestId('join-name').fill('Field Hand');
    await otherPage.getByTestId('join-password').fill('long-enough-pw');
    await otherPage.getByTestId('join-submit').click();
    await otherPage.waitForURL(/\/projects/);
  });
});
