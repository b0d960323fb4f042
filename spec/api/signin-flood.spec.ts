/**
 * Sign-in cannot be used to exhaust the CPU (issue 13 item 3): every password check counts against
 * a per-IP budget (random e-mails no longer get a fresh allowance each), the checks run on a bounded
 * pool of worker threads, and a check beyond the pool's queue is refused at once (429) instead of
 * piling up. The effect on other requests' latency is measured in bench/ (not timed here).
 */
import { randomUUID } from 'node:crypto';
import { expect } from 'chai';
import { PasswordPool } from '../../server/auth/passwords';
import { sealSignup } from '../../server/auth/signup-token';
import { DEMO_PASSWORD } from '../../server/seed';
import { startTestApp, testConfig, type TestApp } from './test-app';

describe('API: the sign-in CPU budget', function () {
  this.timeout(120_000);

  describe('per IP', () => {
    let t: TestApp;
    before(async () => {
      // One proxy hop in front (X-Forwarded-For names the client), five checks per IP.
      t = await startTestApp({ config: { ...testConfig('/nonexistent'), trustProxy: 1 }, passwordBudget: { max: 5, windowMs: 60_000 } });
    });
    after(async () => {
      await t.close();
    });

    it('random e-mails from one IP: five checks, then 429 for every further attempt; other IPs unaffected', async () => {
      const a = await t.anonymous();
      const statuses: number[] = [];
      for (let i = 0; i < 9; i++) {
        const res = await a.agent
          .post('/api/auth/signin')
          .set('x-csrf-token', a.token)
          .set('x-forwarded-for', '203.0.113.7')
          .send({ email: `nobody-${randomUUID()}@example.test`, password: 'wrong-password' });
        statuses.push(res.status);
        if (res.status === 429) expect(res.body.error).to.include({ code: 'rate-limited' });
      }
      expect(statuses).to.deep.equal([401, 401, 401, 401, 401, 429, 429, 429, 429]);
      // The right password from the flooded IP is refused too (the budget is spent), but not from another IP.
      const blocked = await a.agent
        .post('/api/auth/signin')
        .set('x-csrf-token', a.token)
        .set('x-forwarded-for', '203.0.113.7')
        .send({ email: 'designer@runnel.test', password: DEMO_PASSWORD });
      expect(blocked.status).to.equal(429);
      const other = await a.agent
        .post('/api/auth/signin')
        .set('x-csrf-token', a.token)
        .set('x-forwarded-for', '198.51.100.4')
        .send({ email: 'designer@runnel.test', password: DEMO_PASSWORD });
      expect(other.status).to.equal(200);
    });

    it('finishing a sign-up (where its password is hashed) spends the same budget', async () => {
      const a = await t.anonymous();
      const statuses: number[] = [];
      for (let i = 0; i < 7; i++) {
        const token = sealSignup(testConfig('/x').sessionSecret, { email: `s-${randomUUID()}@example.test`, name: 'S', teamName: 'T' });
        const res = await a.agent
          .post('/api/auth/signup/confirm')
          .set('x-csrf-token', a.token)
          .set('x-forwarded-for', '192.0.2.55')
          .send({ token, password: 'long-enough-pw' });
        statuses.push(res.status);
        await a.refreshCsrf();
      }
      expect(statuses.filter((s) => s === 429)).to.have.length(2);
    });
  });

  describe('globally', () => {
    let t: TestApp;
    let pool: PasswordPool;
    before(async () => {
      pool = new PasswordPool({ size: 1, maxQueued: 2 });
      t = await startTestApp({ config: { ...testConfig('/nonexistent'), trustProxy: 1 }, passwordPool: pool, bcryptCost: 10 });
    });
    after(async () => {
      await t.close();
      await pool.close();
    });

    it('checks run on the worker pool; beyond its queue a check is refused at once with 429, never 500', async () => {
      const a = await t.anonymous();
      const flood = Array.from({ length: 12 }, (_, i) =>
        a.agent
          .post('/api/auth/signin')
          .set('x-csrf-token', a.token)
          .set('x-forwarded-for', `198.18.0.${i + 1}`)
          .send({ email: `flood-${i}@example.test`, password: 'wrong-password' }),
      );
      const results = await Promise.all(flood);
      const statuses = results.map((r) => r.status);
      expect(
        statuses.every((s) => s === 401 || s === 429),
        statuses.join(),
      ).to.equal(true);
      expect(statuses.filter((s) => s === 429).length).to.be.at.least(1);
      const busy = results.find((r) => r.status === 429)!;
      expect(busy.body.error.message).to.match(/busy checking other sign-ins/);
      expect(pool.stats.refused).to.be.at.least(1);
      expect(pool.stats.done).to.be.at.least(3);
    });

    it('the pool answers hash and compare like bcrypt, off the main thread', async () => {
      const hash = await pool.hash('correct horse', 4);
      expect(hash).to.match(/^\$2[aby]\$04\$/);
      expect(await pool.compare('correct horse', hash)).to.equal(true);
      expect(await pool.compare('wrong horse', hash)).to.equal(false);
    });
  });
});
