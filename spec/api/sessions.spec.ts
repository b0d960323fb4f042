/**
 * Sessions are stored only when they carry something (issue 13 item 8): a signed-out visitor's
 * CSRF token is a signed double-submit that needs no session row; a signed-in request does not
 * rewrite its session row; the token stays bound to the session once signed in. The cookie's
 * expiry rolls with use (re-sent at most once a minute), so an active user is not signed out.
 */
import { expect } from 'chai';
import { count, eq } from 'drizzle-orm';
import supertest from 'supertest';
import { sessions } from '../../drizzle/schema';
import { SESSION_MAX_AGE_MS } from '../../server/app';
import { DEMO_PASSWORD } from '../../server/seed';
import { demoEmail, startTestApp, type TestApp } from './test-app';

describe('API: sessions stored only when they carry something', () => {
  let t: TestApp;
  const rows = async () => (await t.db.select({ n: count() }).from(sessions))[0].n;
  before(async () => {
    t = await startTestApp();
  });
  after(async () => {
    await t.close();
  });

  it('200 signed-out requests for a CSRF token store no session row, and a token still signs in', async () => {
    const before = await rows();
    for (let i = 0; i < 200; i++) {
      const res = await supertest(t.app).get('/api/csrf').expect(200);
      expect(res.body.token).to.be.a('string');
      expect(String(res.headers['set-cookie'])).to.not.include('runnel.sid');
    }
    expect(await rows()).to.equal(before);
    const a = await t.anonymous();
    expect(await rows()).to.equal(before);
    await a.post('/api/auth/signin', { email: demoEmail('designer'), password: DEMO_PASSWORD }).expect(200);
    expect(await rows()).to.equal(before + 1);
  });

  it('a signed-out token is refused without its cookie, and once signed in (bound to the session then)', async () => {
    const a = await t.anonymous();
    // The header alone (no cookie: another browser) is not enough.
    const bare = await supertest(t.app)
      .post('/api/auth/signin')
      .set('x-csrf-token', a.token)
      .send({ email: demoEmail('designer'), password: DEMO_PASSWORD });
    expect(bare.status).to.equal(403);
    const signedOutToken = a.token;
    await a.signIn(demoEmail('designer'), DEMO_PASSWORD);
    const stale = await a.agent.post('/api/projects').set('x-csrf-token', signedOutToken).send({ name: 'x' });
    expect(stale.status).to.equal(403);
    expect(stale.body.error.code).to.equal('csrf');
    await a.post('/api/projects', { name: 'Session spec project' }).expect(201);
  });

  it('signed-in requests do not rewrite the session row each time', async () => {
    const a = await t.signInAs('reviewer');
    const sid = a.sid;
    const expiry = async () => (await t.db.query.sessions.findFirst({ where: (s, { eq }) => eq(s.sid, sid) }))!.expires.getTime();
    const first = await expiry();
    for (let i = 0; i < 5; i++) await a.get('/api/auth/me').expect(200);
    expect(await expiry()).to.equal(first);
  });

  it('the cookie expiry rolls with use: a session used on its 13th day gets a fresh 14 days, re-sent at most once a minute', async () => {
    const a = await t.signInAs('owner');
    const sid = a.sid;
    const row = async () => (await t.db.query.sessions.findFirst({ where: (s, { eq }) => eq(s.sid, sid) }))!;
    const cookieExpiry = (res: supertest.Response) => {
      const cookie = ([] as string[]).concat(res.headers['set-cookie'] ?? []).find((c) => c.startsWith('runnel.sid='));
      return cookie ? Date.parse(/Expires=([^;]+)/.exec(cookie)![1]) : null;
    };
    // As if signed in 13 days ago: the cookie (and the row) expire in one day.
    const oneDayLeft = new Date(Date.now() + 24 * 3600_000);
    const stored = await row();
    const data = stored.data as { cookie: Record<string, unknown> };
    await t.db
      .update(sessions)
      .set({ data: { ...data, cookie: { ...data.cookie, expires: oneDayLeft.toISOString() } }, expires: oneDayLeft })
      .where(eq(sessions.sid, sid));

    const used = await a.get('/api/auth/me').expect(200);
    const renewed = cookieExpiry(used);
    expect(renewed, 'the cookie is sent again').to.not.equal(null);
    expect(renewed! - Date.now()).to.be.within(SESSION_MAX_AGE_MS - 60_000, SESSION_MAX_AGE_MS + 1000);
    expect((await row()).expires.getTime()).to.be.closeTo(renewed!, 1000);
    // Used again within the minute: no new cookie, no write.
    const again = await a.get('/api/projects').expect(200);
    expect(cookieExpiry(again)).to.equal(null);
    expect((await row()).expires.getTime()).to.be.closeTo(renewed!, 1000);
    // The same cookie still signs in (same session id; only its expiry moved).
    expect(a.sid).to.equal(sid);
  });

  it('a session a minute or more since its cookie was sent is renewed; a fresh one is not', async () => {
    const a = await t.signInAs('designer');
    const sid = a.sid;
    const fresh = await a.get('/api/auth/me').expect(200);
    expect(String(fresh.headers['set-cookie'] ?? '')).to.not.include('runnel.sid=');
    const stored = (await t.db.query.sessions.findFirst({ where: (s, { eq }) => eq(s.sid, sid) }))!;
    const data = stored.data as { cookie: { expires: string } };
    const minuteAgo = new Date(Date.parse(data.cookie.expires) - 61_000);
    await t.db
      .update(sessions)
      .set({ data: { ...data, cookie: { ...data.cookie, expires: minuteAgo.toISOString() } } })
      .where(eq(sessions.sid, sid));
    const later = await a.get('/api/auth/me').expect(200);
    expect(String(later.headers['set-cookie'] ?? '')).to.include('runnel.sid=');
  });

  it('signing out leaves no stored session behind for the visitor', async () => {
    const a = await t.signInAs('estimator');
    const signedIn = await rows();
    await a.post('/api/auth/signout').expect(204);
    await a.refreshCsrf();
    await a.get('/api/auth/me').expect(401);
    expect(await rows()).to.equal(signedIn - 1);
  });
});
