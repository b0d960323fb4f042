/**
 * Two app instances on one PostgreSQL database, as behind a load balancer (issue 13, scale-out):
 * they start together (migrations and seed serialised by an advisory lock), a session made on one
 * works on the other, concurrent saves across them have exactly one winner, and the outbox, audit
 * log and sign-in limits are shared. Runs when RUNNEL_TEST_PG_URL (scripts/with-postgres.sh) or
 * DATABASE_URL points at a reachable server; skipped otherwise.
 */
import { expect } from 'chai';
import pg from 'pg';
import supertest from 'supertest';
import type { RunnelApp } from '../../server/app';
import { createApp } from '../../server/app';
import { openDatabase, type Database } from '../../server/db';
import { DEMO_PASSWORD } from '../../server/seed';
import { SMALL_NETWORK } from './fixtures';
import { freshPostgresDatabase, TEST_BCRYPT_COST, testConfig } from './test-app';

/** A browser-like client: one cookie jar and CSRF token, sending each request to either instance. */
class Client {
  private cookies = new Map<string, string>();
  token = '';

  private keep(res: supertest.Response): supertest.Response {
    for (const line of ([] as string[]).concat(res.headers['set-cookie'] ?? [])) {
      const [pair] = line.split(';');
      const at = pair.indexOf('=');
      this.cookies.set(pair.slice(0, at), pair.slice(at + 1));
    }
    return res;
  }

  private cookieHeader(): string {
    return [...this.cookies].map(([k, v]) => `${k}=${v}`).join('; ');
  }

  async csrf(app: RunnelApp): Promise<void> {
    const res = this.keep(await supertest(app.app).get('/api/csrf').set('Cookie', this.cookieHeader()).expect(200));
    this.token = res.body.token;
  }

  async get(app: RunnelApp, path: string) {
    return this.keep(await supertest(app.app).get(path).set('Cookie', this.cookieHeader()));
  }

  async send(app: RunnelApp, method: 'post' | 'put', path: string, body: object) {
    return this.keep(await supertest(app.app)[method](path).set('Cookie', this.cookieHeader()).set('x-csrf-token', this.token).send(body));
  }
}

async function reachable(url: string): Promise<boolean> {
  const client = new pg.Client({ connectionString: url, connectionTimeoutMillis: 2000 });
  try {
    await client.connect();
    return true;
  } catch {
    return false;
  } finally {
    await client.end().catch(() => undefined);
  }
}

describe('Two instances on one PostgreSQL', function () {
  this.timeout(120_000);
  const server = process.env['RUNNEL_TEST_PG_URL'] ?? process.env['DATABASE_URL'];
  let fresh: { url: string; drop(): Promise<void> } | undefined;
  let databases: Database[] = [];
  let a: RunnelApp;
  let b: RunnelApp;

  before(async function () {
    if (!server || !(await reachable(server))) return this.skip();
    fresh = await freshPostgresDatabase(server);
    // Started together: the advisory lock serialises migrations and the demo seed.
    databases = await Promise.all([openDatabase({ kind: 'postgres', url: fresh.url }), openDatabase({ kind: 'postgres', url: fresh.url })]);
    [a, b] = await Promise.all(
      databases.map((database) =>
        createApp({
          config: testConfig('/nonexistent'),
          database,
          bcryptCost: TEST_BCRYPT_COST,
          log: false,
          signinLimit: { max: 3, windowMs: 60_000 },
          passwordBudget: { max: 1_000_000, windowMs: 60_000 },
        }),
      ),
    );
  });
  after(async () => {
    await a?.close();
    await b?.close();
    for (const d of databases) await d.close();
    await fresh?.drop();
  });

  it('both seeded the same demo once', () => {
    expect(a.seeded!.demoProjectId).to.equal(b.seeded!.demoProjectId);
    expect([a.seeded!.seeded, b.seeded!.seeded].filter(Boolean)).to.have.length(1);
  });

  it('a session made on one instance is used on the other, for reads and CSRF-protected writes', async () => {
    const c = new Client();
    await c.csrf(a);
    const signin = await c.send(a, 'post', '/api/auth/signin', { email: 'designer@runnel.test', password: DEMO_PASSWORD });
    expect(signin.status).to.equal(200);
    await c.csrf(a);
    const me = await c.get(b, '/api/auth/me');
    expect(me.status).to.equal(200);
    expect(me.body.user.email).to.equal('designer@runnel.test');
    const created = await c.send(b, 'post', '/api/projects', { name: 'Made through B' });
    expect(created.status, JSON.stringify(created.body)).to.equal(201);
    const list = await c.get(a, '/api/projects');
    expect(list.body.map((p: { name: string }) => p.name)).to.include('Made through B');
  });

  it('concurrent saves across the instances: exactly one wins, the others get 409 with the winner', async () => {
    const c = new Client();
    await c.csrf(b);
    await c.send(b, 'post', '/api/auth/signin', { email: 'designer@runnel.test', password: DEMO_PASSWORD });
    await c.csrf(b);
    const project = await c.send(a, 'post', '/api/projects', { name: 'Raced across instances' });
    const path = `/api/projects/${project.body.id}/network`;
    expect((await c.send(a, 'put', path, { version: 0, document: SMALL_NETWORK })).status).to.equal(200);
    const racers = await Promise.all(
      [1, 2, 3, 4, 5, 6].map((n) => c.send(n % 2 ? a : b, 'put', path, { version: 1, document: { ...SMALL_NETWORK, title: `racer ${n}` } })),
    );
    const statuses = racers.map((r) => r.status);
    expect([...statuses].sort()).to.deep.equal([200, 409, 409, 409, 409, 409]);
    const winner = racers[statuses.indexOf(200)];
    const loser = racers.find((r) => r.status === 409)!;
    expect(loser.body.current.version).to.equal(2);
    const saved = await c.get(b, path);
    expect(saved.body.version).to.equal(2);
    expect(saved.body.document.title).to.equal(`racer ${racers.indexOf(winner) + 1}`);
    expect(loser.body.current.document.title).to.equal(saved.body.document.title);
  });

  it('the outbox and the audit log are shared: an invitation sent through one is read through the other', async () => {
    const admin = new Client();
    await admin.csrf(a);
    await admin.send(a, 'post', '/api/auth/signin', { email: 'admin@runnel.test', password: DEMO_PASSWORD });
    await admin.csrf(a);
    const invited = await admin.send(a, 'post', '/api/team/invitations', { email: 'shared-outbox@example.test', roles: ['owner'] });
    expect(invited.status).to.equal(201);
    const outbox = await admin.get(b, '/api/team/outbox');
    expect(outbox.body.map((m: { to: string }) => m.to).join(' ')).to.contain('shared-outbox@example.test');
    const audit = await admin.get(b, '/api/team/audit');
    expect(audit.body.some((e: { action: string; target: string }) => e.action === 'invitation.create' && e.target === 'shared-outbox@example.test')).to.equal(
      true,
    );
  });

  it('failed sign-ins count together across the instances (one shared limit)', async () => {
    const c = new Client();
    await c.csrf(a);
    const statuses: number[] = [];
    for (const app of [a, b, a, b]) {
      statuses.push((await c.send(app, 'post', '/api/auth/signin', { email: 'owner@runnel.test', password: 'not-the-password' })).status);
    }
    expect(statuses).to.deep.equal([401, 401, 401, 429]);
  });
});
