/**
 * Invitations (issue 13 item 1, issue 12 item 12): acceptance is tied to the invited address (or
 * to the admin's audited any-account override), an existing member or an open invitation is not
 * invited twice, and an admin can revoke or resend.
 */
import { expect } from 'chai';
import { DEMO_PASSWORD } from '../../server/seed';
import { startTestApp, type ApiAgent, type TestApp } from './test-app';

describe('API: invitations are for the invited address', () => {
  let t: TestApp;
  let admin: ApiAgent;
  before(async () => {
    t = await startTestApp();
    admin = await t.signInAs('admin');
  });
  after(async () => {
    await t.close();
  });

  /** The token of the newest mail to `email` in the outbox. */
  async function tokenMailedTo(email: string): Promise<string> {
    const outbox = await admin.get('/api/team/outbox').expect(200);
    const mail = outbox.body.find((m: { to: string }) => m.to.includes(email));
    return /\/join\/([A-Za-z0-9_-]+)/.exec(mail.text)![1];
  }

  it('refuses a signed-in account of another address (403, saying who it is for) and keeps the link usable', async () => {
    await admin.post('/api/team/invitations', { email: 'invited-admin@example.test', roles: ['admin'] }).expect(201);
    const token = await tokenMailedTo('invited-admin@example.test');
    // Someone of another team got the forwarded link.
    const stranger = await t.signInAs('other');
    const preview = await stranger.get(`/api/invitations/${token}`).expect(200);
    expect(preview.body).to.include({ mayAccept: false, signedInAs: 'other@runnel.test' });
    const refused = await stranger.post(`/api/invitations/${token}/accept`, {}).expect(403);
    expect(refused.body.error.code).to.equal('forbidden');
    expect(refused.body.error.message).to.contain('This invitation is for invited-admin@example.test, but you are signed in as other@runnel.test');
    const me = await stranger.get('/api/auth/me').expect(200);
    expect(me.body.teams.map((x: { id: string }) => x.id)).to.not.include(t.seeded!.demoTeamId);
    // The invited person still can.
    const invited = await t.anonymous();
    const ok = await invited.post(`/api/invitations/${token}/accept`, { name: 'Invited Admin', password: 'long-enough-pw' }).expect(200);
    expect(ok.body.roles).to.deep.equal(['admin']);
  });

  it('compares addresses without regard to case', async () => {
    await admin.post('/api/team/invitations', { email: 'Other@Runnel.TEST', roles: ['reviewer'] }).expect(201);
    const token = await tokenMailedTo('other@runnel.test');
    const other = await t.signIn('OTHER@runnel.test', DEMO_PASSWORD);
    await other.post(`/api/invitations/${token}/accept`, {}).expect(200);
  });

  it("an admin's any-account override lets another account accept, and both steps are audited", async () => {
    await admin.post('/api/team/invitations', { email: 'home-address@example.test', roles: ['owner'], anyAccount: true }).expect(201);
    const token = await tokenMailedTo('home-address@example.test');
    const stranger = await t.signIn('estimator@runnel.test', DEMO_PASSWORD);
    const preview = await stranger.get(`/api/invitations/${token}`).expect(200);
    expect(preview.body).to.include({ anyAccount: true, mayAccept: true });
    await stranger.post(`/api/invitations/${token}/accept`, {}).expect(200);
    const log = await admin.get('/api/team/audit').expect(200);
    const created = log.body.find((e: { action: string; target: string }) => e.action === 'invitation.create' && e.target === 'home-address@example.test');
    expect(created.detail).to.contain('anyAccount');
    const accepted = log.body.find((e: { action: string; target: string }) => e.action === 'invitation.accept' && e.target === 'home-address@example.test');
    expect(accepted.userEmail).to.equal('estimator@runnel.test');
    expect(accepted.detail).to.contain('acceptedAs: estimator@runnel.test');
  });

  it('warns instead of inviting an existing member or an address with an open invitation (409 naming the e-mail field)', async () => {
    const member = await admin.post('/api/team/invitations', { email: 'Designer@runnel.test', roles: ['owner'] }).expect(409);
    expect(member.body.error.message).to.contain('designer@runnel.test is already a member of this team (designer)');
    expect(member.body.error.fields).to.deep.equal([{ path: 'email', message: 'is already a member of this team' }]);
    await admin.post('/api/team/invitations', { email: 'twice@example.test', roles: ['owner'] }).expect(201);
    const twice = await admin.post('/api/team/invitations', { email: 'twice@example.test', roles: ['reviewer'] }).expect(409);
    expect(twice.body.error.fields[0]).to.deep.equal({ path: 'email', message: 'already has an open invitation' });
  });

  it('revokes: the link stops working and the invitation leaves the list', async () => {
    const created = await admin.post('/api/team/invitations', { email: 'revoke-me@example.test', roles: ['owner'] }).expect(201);
    const token = await tokenMailedTo('revoke-me@example.test');
    await admin.delete(`/api/team/invitations/${created.body.id}`).expect(204);
    const list = await admin.get('/api/team/invitations').expect(200);
    expect(list.body.map((i: { id: string }) => i.id)).to.not.include(created.body.id);
    const visitor = await t.anonymous();
    expect((await visitor.get(`/api/invitations/${token}`).expect(200)).body.revoked).to.equal(true);
    const res = await visitor.post(`/api/invitations/${token}/accept`, { name: 'Late', password: 'long-enough-pw' }).expect(409);
    expect(res.body.error.message).to.match(/withdrawn/);
    await admin.delete(`/api/team/invitations/${created.body.id}`).expect(404);
    // Once revoked, the address may be invited again.
    await admin.post('/api/team/invitations', { email: 'revoke-me@example.test', roles: ['owner'] }).expect(201);
  });

  it('resends with a fresh link: the old one stops working, the new one works; an accepted one cannot be resent', async () => {
    const created = await admin.post('/api/team/invitations', { email: 'resend-me@example.test', roles: ['reviewer'] }).expect(201);
    const oldToken = await tokenMailedTo('resend-me@example.test');
    const resent = await admin.post(`/api/team/invitations/${created.body.id}/resend`).expect(200);
    expect(resent.body.id).to.equal(created.body.id);
    const newToken = await tokenMailedTo('resend-me@example.test');
    expect(newToken).to.not.equal(oldToken);
    const visitor = await t.anonymous();
    await visitor.get(`/api/invitations/${oldToken}`).expect(404);
    await visitor.post(`/api/invitations/${newToken}/accept`, { name: 'Resent', password: 'long-enough-pw' }).expect(200);
    const again = await admin.post(`/api/team/invitations/${created.body.id}/resend`).expect(409);
    expect(again.body.error.message).to.contain('already accepted');
    const log = await admin.get('/api/team/audit').expect(200);
    expect(log.body.some((e: { action: string; target: string }) => e.action === 'invitation.resend' && e.target === 'resend-me@example.test')).to.equal(true);
  });

  it("another team's invitation id is 404 for revoke and resend", async () => {
    const created = await admin.post('/api/team/invitations', { email: 'ours@example.test', roles: ['owner'] }).expect(201);
    const other = await t.signInAs('other');
    await other.post('/api/auth/current-team', { teamId: t.seeded!.otherTeamId }).expect(200);
    await other.delete(`/api/team/invitations/${created.body.id}`).expect(404);
    await other.post(`/api/team/invitations/${created.body.id}/resend`).expect(404);
    await other.delete('/api/team/invitations/not-a-uuid').expect(404);
  });
});
