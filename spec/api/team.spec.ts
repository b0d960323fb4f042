import { expect } from 'chai';
import { startTestApp, type TestApp } from './test-app';

describe('API: team, invitations through the mail sink', () => {
  let t: TestApp;
  before(async () => {
    t = await startTestApp();
  });
  after(async () => {
    await t.close();
  });

  it('invites by e-mail; the mail lands in the outbox; a new user accepts and holds the role', async () => {
    const admin = await t.signInAs('admin');
    const invite = await admin.post('/api/team/invitations', { email: 'Newhand@Example.test', roles: ['estimator', 'owner'] }).expect(201);
    expect(invite.body).to.include({ email: 'newhand@example.test', acceptedAt: null });

    const outbox = await admin.get('/api/team/outbox').expect(200);
    const mail = outbox.body.find((m: { to: string }) => m.to.includes('newhand@example.test'));
    expect(mail, 'invitation mail captured by the sink').to.exist;
    expect(mail.subject).to.equal('You are invited to Ridgeback Water Co-op on Runnel');
    const link = /http:\/\/runnel\.test\/join\/([A-Za-z0-9_-]+)/.exec(mail.text);
    expect(link, mail.text).to.not.equal(null);
    const token = link![1];

    const visitor = await t.anonymous();
    const info = await visitor.get(`/api/invitations/${token}`).expect(200);
    expect(info.body).to.deep.equal({
      teamName: 'Ridgeback Water Co-op',
      email: 'newhand@example.test',
      roles: ['estimator', 'owner'],
      anyAccount: false,
      expired: false,
      accepted: false,
      revoked: false,
    });

    const missing = await visitor.post(`/api/invitations/${token}/accept`, {}).expect(400);
    expect(missing.body.error.fields.map((f: { path: string }) => f.path)).to.have.members(['name', 'password']);

    const accepted = await visitor.post(`/api/invitations/${token}/accept`, { name: 'New Hand', password: 'long-enough-pw' }).expect(200);
    expect(accepted.body.user.email).to.equal('newhand@example.test');
    expect(accepted.body.roles).to.have.members(['estimator', 'owner']);
    expect(accepted.body.currentTeamId).to.equal(t.seeded!.demoTeamId);

    // Signed in as the new member (session regenerated: fetch a fresh token).
    await visitor.refreshCsrf();
    const me = await visitor.get('/api/auth/me').expect(200);
    expect(me.body.permissions).to.not.include('project.create');
    const again = await (await t.anonymous()).post(`/api/invitations/${token}/accept`, { name: 'X', password: 'long-enough-pw' });
    expect(again.status).to.equal(409);

    const members = await admin.get('/api/team/members').expect(200);
    const member = members.body.find((m: { email: string }) => m.email === 'newhand@example.test');
    expect(member.roles).to.have.members(['estimator', 'owner']);
    const fresh = await t.signIn('newhand@example.test', 'long-enough-pw');
    const me2 = await fresh.get('/api/auth/me').expect(200);
    expect(me2.body.roles).to.have.members(['estimator', 'owner']);
  });

  it('stores only a hash of the token', async () => {
    const admin = await t.signInAs('admin');
    await admin.post('/api/team/invitations', { email: 'hash-check@example.test', roles: ['owner'] }).expect(201);
    const outbox = await admin.get('/api/team/outbox').expect(200);
    const token = /\/join\/([A-Za-z0-9_-]+)/.exec(outbox.body.find((m: { to: string }) => m.to.includes('hash-check')).text)![1];
    const rows = await t.db.query.invitations.findMany();
    expect(rows.some((r) => r.tokenHash === token)).to.equal(false);
    expect(rows.every((r) => /^[0-9a-f]{64}$/.test(r.tokenHash))).to.equal(true);
  });

  it('a signed-in user accepts with an empty body and gains the team', async () => {
    const admin = await t.signInAs('admin');
    await admin.post('/api/team/invitations', { email: 'other@runnel.test', roles: ['reviewer'] }).expect(201);
    const outbox = await admin.get('/api/team/outbox').expect(200);
    const token = /\/join\/([A-Za-z0-9_-]+)/.exec(outbox.body.find((m: { to: string }) => m.to.includes('other@runnel.test')).text)![1];
    const other = await t.signInAs('other');
    const res = await other.post(`/api/invitations/${token}/accept`, {}).expect(200);
    expect(res.body.teams.map((x: { name: string }) => x.name)).to.have.members(['Cold Creek Growers', 'Ridgeback Water Co-op']);
    expect(res.body.currentTeamId).to.equal(t.seeded!.demoTeamId);
    expect(res.body.roles).to.deep.equal(['reviewer']);
  });

  it('an unknown invitation token is 404', async () => {
    const a = await t.anonymous();
    await a.get('/api/invitations/nope').expect(404);
    await a.post('/api/invitations/nope/accept', { name: 'N', password: 'long-enough-pw' }).expect(404);
  });

  it("the outbox of one team does not show another team's mail", async () => {
    const other = await t.signInAs('other');
    await other.post('/api/auth/current-team', { teamId: t.seeded!.otherTeamId }).expect(200);
    const res = await other.get('/api/team/outbox').expect(200);
    expect(res.body.map((m: { to: string }) => m.to).join(' ')).to.not.include('newhand@example.test');
  });

  it('cannot take the admin role from the last admin (409) nor remove them', async () => {
    const admin = await t.signInAs('admin');
    const me = await admin.get('/api/auth/me').expect(200);
    const res = await admin.patch(`/api/team/members/${me.body.user.id}`, { roles: ['designer'] }).expect(409);
    expect(res.body.error.message).to.match(/at least one admin/);
    await admin.delete(`/api/team/members/${me.body.user.id}`).expect(409);
    const members = await admin.get('/api/team/members').expect(200);
    expect(members.body.find((m: { userId: string }) => m.userId === me.body.user.id).roles).to.deep.equal(['admin']);
  });

  it("changes a member's roles (admin may add designer) and validates role names", async () => {
    const admin = await t.signInAs('admin');
    const members = await admin.get('/api/team/members').expect(200);
    const reviewer = members.body.find((m: { email: string }) => m.email === 'reviewer@runnel.test');
    const bad = await admin.patch(`/api/team/members/${reviewer.userId}`, { roles: ['boss'] }).expect(400);
    expect(bad.body.error.fields[0].path).to.equal('roles.0');
    const ok = await admin.patch(`/api/team/members/${reviewer.userId}`, { roles: ['reviewer', 'estimator'] }).expect(200);
    expect(ok.body.roles).to.deep.equal(['reviewer', 'estimator']);
    await admin.patch(`/api/team/members/${reviewer.userId}`, { roles: ['reviewer'] }).expect(200);
  });

  it('answers 404, not a server error, for a member id that is not a user id', async () => {
    const admin = await t.signInAs('admin');
    const patched = await admin.patch('/api/team/members/not-a-uuid', { roles: ['owner'] }).expect(404);
    expect(patched.body.error.code).to.equal('not-found');
    await admin.delete('/api/team/members/not-a-uuid').expect(404);
  });

  it('GET /api/team gives the current team', async () => {
    const a = await t.signInAs('estimator');
    const res = await a.get('/api/team').expect(200);
    expect(res.body).to.deep.equal({ id: t.seeded!.demoTeamId, name: 'Ridgeback Water Co-op' });
  });
});
