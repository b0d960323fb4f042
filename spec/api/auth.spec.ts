import { expect } from 'chai';
import { openDatabase } from '../../server/db';
import supertest from 'supertest';
import { permissionsFor } from '../../server/permissions';
import { SIGNUP_ANSWER } from '../../server/routes/signup';
import { DEMO_PASSWORD } from '../../server/seed';
import { confirmTokenIn, mailTo } from './mail-helpers';
import { startTestApp, type TestApp } from './test-app';

describe('API: auth, CSRF, errors', () => {
  let t: TestApp;
  before(async () => {
    t = await startTestApp({ signinLimit: { max: 3, windowMs: 60_000 } });
  });
  after(async () => {
    await t.close();
  });

  it('signs up by e-mail: the link in the mail creates the user and a team where they are admin, and signs them in', async () => {
    const a = await t.anonymous();
    const res = await a.post('/api/auth/signup', {
      email: 'Newcomer@Example.test',
      name: 'New Comer',
      teamName: 'Fresh Spring Team',
    });
    expect(res.status, JSON.stringify(res.body)).to.equal(202);
    expect(res.body).to.deep.equal({ status: 'check-email', message: SIGNUP_ANSWER });
    await a.get('/api/auth/me').expect(401);
    const mail = await mailTo(t, 'newcomer@example.test');
    const token = confirmTokenIn(mail);
    // the password is chosen on the page the link opens
    const done = await a.post('/api/auth/signup/confirm', { token, password: 'long-enough-pw' });
    expect(done.status, JSON.stringify(done.body)).to.equal(201);
    expect(done.body.user.email).to.equal('newcomer@example.test');
    expect(done.body.teams).to.have.length(1);
    expect(done.body.teams[0]).to.include({ name: 'Fresh Spring Team' });
    expect(done.body.roles).to.deep.equal(['admin']);
    expect(done.body.permissions).to.include('team.manage');
    await a.refreshCsrf();
    const me = await a.get('/api/auth/me').expect(200);
    expect(me.body.user.email).to.equal('newcomer@example.test');
    await (await t.signIn('newcomer@example.test', 'long-enough-pw')).get('/api/auth/me').expect(200);
  });

  it('a registered e-mail gets the same answer; its owner is mailed and nothing changes', async () => {
    const a = await t.anonymous();
    const res = await a.post('/api/auth/signup', { email: 'admin@runnel.test', name: 'X', teamName: 'Y' });
    expect(res.status).to.equal(202);
    expect(res.body).to.deep.equal({ status: 'check-email', message: SIGNUP_ANSWER });
    const mail = await mailTo(t, 'admin@runnel.test');
    expect(mail.subject).to.match(/already|your address/i);
    expect(mail.text).to.include('http://runnel.test/sign-in').and.not.include('/sign-up/confirm');
    await a.get('/api/auth/me').expect(401);
    await t.signInAs('admin');
  });

  it('signs in, reports me with permissions of the current team, and signs out', async () => {
    const a = await t.signInAs('reviewer');
    const me = await a.get('/api/auth/me').expect(200);
    expect(me.body.roles).to.deep.equal(['reviewer']);
    // Exactly what the one table grants a reviewer (features add permissions; the matrix checks each route).
    expect(me.body.permissions).to.deep.equal(permissionsFor(['reviewer']));
    expect(me.body.permissions).to.include.members(['project.read', 'network.read', 'files.read', 'team.read']);
    for (const write of ['project.create', 'network.write', 'team.manage']) expect(me.body.permissions).to.not.include(write);
    await a.post('/api/auth/signout').expect(204);
    await a.get('/api/auth/me').expect(401);
  });

  it('regenerates the session on sign-in (new session id; cookie HttpOnly, SameSite=Lax)', async () => {
    const agent = supertest.agent(t.app);
    const first = await agent.get('/api/csrf').expect(200);
    // A signed-out visitor gets no session at all (issue 13 item 8), so there is none to fix in advance…
    expect(String(first.headers['set-cookie'])).to.not.match(/runnel\.sid=/);
    const signIn = async (email: string) => {
      const token = (await agent.get('/api/csrf').expect(200)).body.token;
      const res = await agent.post('/api/auth/signin').set('x-csrf-token', token).send({ email, password: DEMO_PASSWORD }).expect(200);
      return res;
    };
    const res = await signIn('owner@runnel.test');
    const sidBefore = String(res.headers['set-cookie']).match(/runnel\.sid=([^;]+)/)?.[1];
    expect(sidBefore).to.be.a('string');
    expect(String(res.headers['set-cookie']))
      .to.match(/HttpOnly/i)
      .and.match(/SameSite=Lax/i);
    // …and signing in over an existing session replaces its id.
    const again = await signIn('designer@runnel.test');
    const sidAfter = String(again.headers['set-cookie']).match(/runnel\.sid=([^;]+)/)?.[1];
    expect(sidAfter).to.be.a('string').and.not.equal(sidBefore);
  });

  it('wrong password → 401 with a message, no session', async () => {
    const a = await t.anonymous();
    const res = await a.post('/api/auth/signin', { email: 'designer@runnel.test', password: 'not-the-password' });
    expect(res.status).to.equal(401);
    expect(res.body.error).to.deep.equal({ code: 'unauthenticated', message: 'E-mail or password is wrong' });
    await a.get('/api/auth/me').expect(401);
  });

  it('rate-limits failed sign-ins per address and e-mail → 429 with a clear message', async () => {
    const a = await t.anonymous();
    for (let i = 0; i < 3; i++) await a.post('/api/auth/signin', { email: 'estimator@runnel.test', password: 'guess-' + i }).expect(401);
    const res = await a.post('/api/auth/signin', { email: 'estimator@runnel.test', password: DEMO_PASSWORD });
    expect(res.status).to.equal(429);
    expect(res.body.error.code).to.equal('rate-limited');
    expect(res.body.error.message).to.match(/Too many sign-in attempts.*try again in 1 minutes?/);
    // Another e-mail from the same address is not blocked.
    await a.post('/api/auth/signin', { email: 'designer@runnel.test', password: DEMO_PASSWORD }).expect(200);
  });

  it('CSRF: a POST without the token → 403 code csrf, also for sign-in', async () => {
    const res = await supertest(t.app).post('/api/auth/signin').send({ email: 'admin@runnel.test', password: DEMO_PASSWORD });
    expect(res.status).to.equal(403);
    expect(res.body.error.code).to.equal('csrf');
    const a = await t.signInAs('designer');
    const bad = await a.agent.post('/api/projects').set('x-csrf-token', 'forged.token').send({ name: 'X' });
    expect(bad.status).to.equal(403);
    expect(bad.body.error.code).to.equal('csrf');
  });

  it('CSRF: PUT, PATCH and DELETE without the token are refused too, and change nothing', async () => {
    const a = await t.signInAs('designer');
    const project = `/api/projects/${t.seeded!.demoProjectId}`;
    for (const res of [
      await a.agent.patch(project).send({ name: 'Renamed' }),
      await a.agent.put(`${project}/network`).send({ version: 1, document: {} }),
      await a.agent.delete(project),
    ]) {
      expect(res.status).to.equal(403);
      expect(res.body.error.code).to.equal('csrf');
    }
    const still = await a.get(project).expect(200);
    expect(still.body.name).to.equal('Hillside smallholding');
  });

  it('CSRF: a token from another session is refused', async () => {
    const a = await t.signInAs('designer');
    const b = await t.signInAs('admin');
    const res = await a.agent.post('/api/projects').set('x-csrf-token', b.token).send({ name: 'X' });
    expect(res.status).to.equal(403);
  });

  it('validation → 400 listing the field paths', async () => {
    const a = await t.anonymous();
    const res = await a.post('/api/auth/signup', { email: 'not-an-email', name: '', teamName: 'T' });
    expect(res.status).to.equal(400);
    expect(res.body.error.code).to.equal('validation');
    // the password is chosen where the mailed link leads
    const confirm = await a.post('/api/auth/signup/confirm', { token: 'x', password: 'short' });
    expect(confirm.status).to.equal(400);
    const paths = [...res.body.error.fields, ...confirm.body.error.fields].map((f: { path: string }) => f.path);
    expect(paths).to.include.members(['email', 'name', 'password']);
    expect(confirm.body.error.fields.find((f: { path: string }) => f.path === 'password').message).to.match(/at least 10/);
  });

  it('malformed JSON → 400 validation, not a stack trace', async () => {
    const a = await t.signInAs('designer');
    const res = await a.agent.post('/api/projects').set('x-csrf-token', a.token).set('content-type', 'application/json').send('{"name": ');
    expect(res.status).to.equal(400);
    expect(JSON.stringify(res.body)).to.not.match(/at \w+ \(|node_modules|\.ts:\d+/);
  });

  it('unknown /api route → 404 JSON', async () => {
    const res = await supertest(t.app).get('/api/no/such/route');
    expect(res.status).to.equal(404);
    expect(res.type).to.equal('application/json');
    expect(res.body.error.code).to.equal('not-found');
  });

  it('a missing asset outside /api is 404 JSON too; an unsupported charset is 415', async () => {
    const res = await supertest(t.app).get('/no-such-asset.js');
    expect(res.status).to.equal(404);
    expect(res.body.error.message).to.equal('Not found: GET /no-such-asset.js');
    const a = await t.anonymous();
    const charset = await a.agent.post('/api/auth/signin').set('x-csrf-token', a.token).set('content-type', 'application/json; charset=klingon').send('{}');
    expect(charset.status).to.equal(415);
    expect(charset.body.error.code).to.equal('unsupported-type');
  });

  it('an unexpected error → 500 with a generic message and no stack trace', async () => {
    // An app whose database has gone away: every query throws something no route expects.
    const database = await openDatabase({ kind: 'pglite' });
    const broken = await startTestApp({ database });
    try {
      const a = await broken.signInAs('designer');
      await database.close();
      const res = await a.get('/api/projects');
      expect(res.status).to.equal(500);
      expect(res.body).to.deep.equal({ error: { code: 'internal', message: 'Something went wrong on the server; it has been logged.' } });
    } finally {
      await broken.close().catch(() => undefined);
    }
  });

  it('switches current team only to a team the user belongs to (404 otherwise)', async () => {
    const a = await t.signInAs('admin');
    await a.post('/api/auth/current-team', { teamId: t.seeded!.otherTeamId }).expect(404);
    const ok = await a.post('/api/auth/current-team', { teamId: t.seeded!.demoTeamId }).expect(200);
    expect(ok.body.currentTeamId).to.equal(t.seeded!.demoTeamId);
  });

  it('sends security headers with a CSP that allows the app (self scripts, the engine’s WebAssembly, blob workers, data/blob images)', async () => {
    const res = await supertest(t.app).get('/api/csrf');
    const csp = String(res.headers['content-security-policy']);
    // WebAssembly compiles only under 'wasm-unsafe-eval'; text eval ('unsafe-eval') stays refused
    expect(csp).to.include("script-src 'self' 'wasm-unsafe-eval';").and.include("worker-src 'self' blob:").and.include("img-src 'self' data: blob:");
    expect(csp).not.to.include("'unsafe-eval'");
    expect(res.headers['x-powered-by']).to.equal(undefined);
  });
});
