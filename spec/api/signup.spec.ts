/**
 * Sign-up does not tell who has an account, and is limited (issue 13 item 9): a registered and a
 * new address get the same answer (status, body, the same headers), each gets one mail; the
 * confirmation link cannot be forged, expires, and works once (also for two clicks at once), and
 * replaces a sign-in that was open; requests are limited per IP and per e-mail. Without SMTP the
 * link is logged in development only; in production sign-up is closed instead.
 */
import { expect } from 'chai';
import { count, eq } from 'drizzle-orm';
import { sessions, users } from '../../drizzle/schema';
import type { Response } from 'supertest';
import { openSignup, sealSignup, SIGNUP_TOKEN_TTL_MS } from '../../server/auth/signup-token';
import { confirmTokenIn, mailsTo, mailTo } from './mail-helpers';
import { startTestApp, testConfig, type TestApp } from './test-app';

const SECRET = testConfig('/x').sessionSecret;
const form = (email: string) => ({ email, name: 'Curious Person', teamName: 'Any Team' });
/** The password chosen on the page the mailed link opens. */
const PASSWORD = 'long-enough-pw';
/** What a client can see of an answer, minus what differs on every response. */
const visible = (res: Response) => {
  const headers = { ...res.headers };
  for (const h of ['date', 'etag', 'set-cookie', 'ratelimit', 'ratelimit-policy', 'content-length']) delete headers[h];
  return { status: res.status, body: res.body, headers, cookies: String(res.headers['set-cookie'] ?? '').replace(/=[^;]*/g, '=') };
};

describe('API: sign-up without revealing who is registered', () => {
  let t: TestApp;
  before(async () => {
    t = await startTestApp();
  });
  after(async () => {
    await t.close();
  });

  it('a registered and a new address get the same answer, and one mail each', async () => {
    const registered = await (await t.anonymous()).post('/api/auth/signup', form('designer@runnel.test'));
    const fresh = await (await t.anonymous()).post('/api/auth/signup', form('brand.new@example.test'));
    expect(visible(registered)).to.deep.equal(visible(fresh));
    expect(registered.status).to.equal(202);
    const owner = await mailTo(t, 'designer@runnel.test');
    expect(owner.text).to.not.include('/sign-up/confirm');
    expect((await mailTo(t, 'brand.new@example.test')).text).to.include('http://runnel.test/sign-up/confirm#');
    expect(await mailsTo(t, 'designer@runnel.test')).to.have.length(1);
  });

  it('the confirmation link works once; a forged, cut or expired one is a 400 naming token', async () => {
    await (await t.anonymous()).post('/api/auth/signup', form('once.only@example.test')).expect(202);
    const token = confirmTokenIn(await mailTo(t, 'once.only@example.test'));
    expect(token).to.not.include('once.only'); // sealed, not just signed
    const a = await t.anonymous();
    await a.post('/api/auth/signup/confirm', { token, password: PASSWORD }).expect(201);
    const again = await (await t.anonymous()).post('/api/auth/signup/confirm', { token, password: PASSWORD });
    expect(again.status).to.equal(409);
    for (const bad of [
      token.slice(0, -4),
      // one character changed (to one it is not: the token is random, and 1 run in 64 it held an 'A' there)
      token.slice(0, 20) + (token[20] === 'A' ? 'B' : 'A') + token.slice(21),
      sealSignup('another-secret-0123456789', { email: 'x@example.test', name: 'X', teamName: 'T' }),
    ]) {
      const res = await (await t.anonymous()).post('/api/auth/signup/confirm', { token: bad, password: PASSWORD });
      expect(res.status, bad).to.equal(400);
      expect(res.body.error.fields[0].path).to.equal('token');
    }
    const old = sealSignup(SECRET, { email: 'late@example.test', name: 'L', teamName: 'T' }, Date.now() - SIGNUP_TOKEN_TTL_MS - 1000);
    expect(openSignup(SECRET, old)).to.equal('expired');
    const late = await (await t.anonymous()).post('/api/auth/signup/confirm', { token: old, password: PASSWORD });
    expect(late.status).to.equal(400);
    expect(late.body.error.message).to.match(/expired/);
  });

  it('the link carries no password: the account gets the one chosen when the link is opened (a stranger who asks for your address cannot know it)', async () => {
    // the request has no password field at all (one sent is ignored, not sealed into the link)
    await (await t.anonymous()).post('/api/auth/signup', { ...form('not.theirs@example.test'), password: 'strangers-password' }).expect(202);
    const token = confirmTokenIn(await mailTo(t, 'not.theirs@example.test'));
    const pending = openSignup(SECRET, token);
    expect(pending).to.be.an('object');
    expect(JSON.stringify(pending)).to.not.match(/password|\$2[aby]\$/i);
    // too short a password is a 400 naming it, and creates nothing
    const short = await (await t.anonymous()).post('/api/auth/signup/confirm', { token, password: 'short' });
    expect(short.status).to.equal(400);
    expect(short.body.error.fields[0].path).to.equal('password');
    expect((await t.db.select({ n: count() }).from(users).where(eq(users.email, 'not.theirs@example.test')))[0].n).to.equal(0);
    await (await t.anonymous()).post('/api/auth/signup/confirm', { token, password: 'owners-own-password' }).expect(201);
    await (await t.signIn('not.theirs@example.test', 'owners-own-password')).get('/api/auth/me').expect(200);
    const stranger = await (await t.anonymous()).post('/api/auth/signin', { email: 'not.theirs@example.test', password: 'strangers-password' });
    expect(stranger.status).to.equal(401);
  });

  it('two clicks on one link at once: one account, the other click a 409 (not a 500)', async () => {
    await (await t.anonymous()).post('/api/auth/signup', form('double.click@example.test')).expect(202);
    const token = confirmTokenIn(await mailTo(t, 'double.click@example.test'));
    const [a, b] = [await t.anonymous(), await t.anonymous()];
    const statuses = (
      await Promise.all([a.post('/api/auth/signup/confirm', { token, password: PASSWORD }), b.post('/api/auth/signup/confirm', { token, password: PASSWORD })])
    ).map((r) => r.status);
    expect(statuses.sort()).to.deep.equal([201, 409]);
    expect((await t.db.select({ n: count() }).from(users).where(eq(users.email, 'double.click@example.test')))[0].n).to.equal(1);
  });

  it('someone signed in who confirms is signed in as the new account; the old session is gone', async () => {
    await (await t.anonymous()).post('/api/auth/signup', form('second.account@example.test')).expect(202);
    const token = confirmTokenIn(await mailTo(t, 'second.account@example.test'));
    const a = await t.signInAs('estimator');
    const oldSid = a.sid;
    const done = await a.post('/api/auth/signup/confirm', { token, password: PASSWORD });
    expect(done.status, JSON.stringify(done.body)).to.equal(201);
    expect(done.body.user.email).to.equal('second.account@example.test');
    expect(await t.db.select().from(sessions).where(eq(sessions.sid, oldSid))).to.have.length(0);
    await a.refreshCsrf();
    expect((await a.get('/api/auth/me').expect(200)).body.user.email).to.equal('second.account@example.test');
  });

  it('without SMTP in development the link is also logged, so whoever runs the server can finish a sign-up', async () => {
    const lines: string[] = [];
    const dev = await startTestApp({ log: (line) => lines.push(line) });
    try {
      await (await dev.anonymous()).post('/api/auth/signup', form('dev.person@example.test')).expect(202);
      const token = confirmTokenIn(await mailTo(dev, 'dev.person@example.test'));
      const logged = lines.map((l) => JSON.parse(l) as { msg: string; devMail?: { to: string } }).filter((l) => l.devMail);
      expect(logged).to.have.length(1);
      expect(logged[0].devMail!.to).to.equal('dev.person@example.test');
      expect(logged[0].msg).to.include(`http://runnel.test/sign-up/confirm#${token}`);
      // A team's mail (an invitation) is for its admins' Outbox, not the log.
      await (await dev.signInAs('admin')).post('/api/team/invitations', { email: 'invitee@example.test', roles: ['owner'] }).expect(201);
      await mailTo(dev, 'invitee@example.test');
      expect(lines.filter((l) => l.includes('devMail'))).to.have.length(1);
    } finally {
      await dev.close();
    }
  });

  it('without SMTP in production sign-up is closed (503, the same for every address) and no link is logged or mailed', async () => {
    const lines: string[] = [];
    const prod = await startTestApp({ config: { ...testConfig('/nonexistent-test-data'), production: true }, log: (line) => lines.push(line) });
    try {
      for (const email of ['owner@runnel.test', 'nobody.yet@example.test']) {
        const res = await (await prod.anonymous()).post('/api/auth/signup', form(email));
        expect(res.status).to.equal(503);
        expect(res.body.error.code).to.equal('unavailable');
      }
      expect(lines.some((l) => l.includes('No SMTP_HOST in production'))).to.equal(true);
      expect(lines.join('\n')).to.not.include('/sign-up/confirm');
      expect(await mailsTo(prod, 'nobody.yet@example.test')).to.have.length(0);
    } finally {
      await prod.close();
    }
  });

  it('is limited per e-mail and per IP (429), for registered and new addresses alike', async () => {
    const limited = await startTestApp({ signupLimit: { perIp: 5, perEmail: 2, windowMs: 60_000 } });
    try {
      const a = await limited.anonymous();
      const statuses: number[] = [];
      for (let i = 0; i < 3; i++) statuses.push((await a.post('/api/auth/signup', form('owner@runnel.test'))).status);
      for (let i = 0; i < 3; i++) statuses.push((await a.post('/api/auth/signup', form(`n${i}@example.test`))).status);
      expect(statuses).to.deep.equal([202, 202, 429, 202, 202, 429]);
      expect(await mailsTo(limited, 'owner@runnel.test')).to.have.length.at.most(2);
    } finally {
      await limited.close();
    }
  });
});
