/**
 * The same migrations and a sign-in round trip against a real PostgreSQL server. Runs when
 * RUNNEL_TEST_PG_URL (set by scripts/with-postgres.sh, which `npm test` uses for its PostgreSQL pass) or DATABASE_URL is set and
 * reachable; otherwise it is skipped. It writes the demo data into a fresh database on that server.
 */
import { expect } from 'chai';
import pg from 'pg';
import { openDatabase, type Database } from '../../server/db';
import { SMALL_NETWORK } from './fixtures';
import { startTestApp, type TestApp } from './test-app';

async function reachable(url: string): Promise<boolean> {
  const client = new pg.Client({ connectionString: url, connectionTimeoutMillis: 2000 });
  try {
    await client.connect();
    await client.query('select 1');
    return true;
  } catch {
    return false;
  } finally {
    await client.end().catch(() => undefined);
  }
}

describe('API on PostgreSQL (DATABASE_URL)', function () {
  const url = process.env['RUNNEL_TEST_PG_URL'] ?? process.env['DATABASE_URL'];
  let database: Database | undefined;
  let t: TestApp | undefined;

  before(async function () {
    if (!url || !(await reachable(url))) return this.skip();
    database = await openDatabase({ kind: 'postgres', url });
    t = await startTestApp({ database });
  });
  after(async () => {
    await t?.close();
    await database?.close();
  });

  it('applies the migrations, seeds, signs in and saves a network', async () => {
    const a = await t!.signInAs('designer');
    const list = await a.get('/api/projects').expect(200);
    expect(list.body.map((p: { name: string }) => p.name)).to.include('Hillside smallholding');
    const net = await a.get(`/api/projects/${t!.seeded!.demoProjectId}/network`).expect(200);
    expect(net.body.version).to.be.at.least(1);
    const project = await a.post('/api/projects', { name: 'On PostgreSQL' }).expect(201);
    await a.put(`/api/projects/${project.body.id}/network`, { version: 0, document: SMALL_NETWORK }).expect(200);
    await a.put(`/api/projects/${project.body.id}/network`, { version: 0, document: SMALL_NETWORK }).expect(409);
    // Real concurrency on a connection pool: of five saves from version 1, exactly one wins.
    const racers = await Promise.all(
      [1, 2, 3, 4, 5].map((n) => a.put(`/api/projects/${project.body.id}/network`, { version: 1, document: { ...SMALL_NETWORK, title: `racer ${n}` } })),
    );
    expect(racers.map((r) => r.status).sort()).to.deep.equal([200, 409, 409, 409, 409]);
    const saved = await a.get(`/api/projects/${project.body.id}/network`).expect(200);
    expect(saved.body.version).to.equal(2);
    expect(saved.body.document.title).to.match(/^racer [1-5]$/);
    await a.delete(`/api/projects/${project.body.id}`).expect(204);
  });
});
