/** The immutable version history: every save kept with who, when and what changed; view, compare, restore. */
import { expect } from 'chai';
import { eq } from 'drizzle-orm';
import { networkVersions } from '../../drizzle/schema';
import type { NetworkDocument, OutletNode, PipeLink } from '../../engine';
import { insertProject, SMALL_NETWORK } from './fixtures';
import { startTestApp, type TestApp } from './test-app';
import { hwLoss } from '../engine/hand-formulas';

describe('API: network versions', () => {
  let t: TestApp;
  before(async () => {
    t = await startTestApp();
  });
  after(async () => {
    await t.close();
  });

  const url = (id: string, rest = '') => `/api/projects/${id}${rest}`;
  const narrower = (): NetworkDocument => ({
    ...SMALL_NETWORK,
    nodes: [...SMALL_NETWORK.nodes, { id: 'O2', kind: 'outlet', elevation_m: 20, demand_m3s: 0.0001, min_pressure_m: 5 } as OutletNode],
    links: [
      { ...(SMALL_NETWORK.links[0] as PipeLink), diameter_m: 0.02 },
      { id: 'P2', kind: 'pipe', from: 'T1', to: 'O2', length_m: 50, diameter_m: 0.02, roughness: 150 },
    ],
  });

  it('every save keeps an immutable version with who, when and a one-line summary of what changed', async () => {
    const started = Date.now();
    const id = await insertProject(t.db, t.seeded!.demoTeamId);
    const a = await t.signInAs('designer');
    await a.put(url(id, '/network'), { version: 0, document: SMALL_NETWORK }).expect(200);
    await a.put(url(id, '/network'), { version: 1, document: narrower() }).expect(200);
    const list = await (await t.signInAs('owner')).get(url(id, '/versions')).expect(200);
    expect(list.body.versions.map((v: { version: number }) => v.version)).to.deep.equal([2, 1]);
    const [v2, v1] = list.body.versions;
    expect(v1.summary).to.equal('first version (2 points joined by 1 pipe, pump or valve)');
    expect(v2.summary).to.equal('changed P1 (diameter_m); added O2, P2');
    expect(v2.createdBy).to.equal('Dana Designer');
    expect(v2.status).to.equal('draft');
    // stamped by the server while this test ran (ISO 8601 read back by Date.parse)
    expect(Date.parse(v2.createdAt)).to.be.within(started - 1000, Date.now() + 1000);
    expect(v2).to.not.have.property('document');
  });

  it('a version reads back exactly as saved, with its results, even after later saves', async () => {
    const id = await insertProject(t.db, t.seeded!.demoTeamId);
    const a = await t.signInAs('designer');
    await a.put(url(id, '/network'), { version: 0, document: SMALL_NETWORK }).expect(200);
    const firstResults = (await a.get(url(id, '/network')).expect(200)).body.results;
    await a.put(url(id, '/network'), { version: 1, document: narrower() }).expect(200);
    const v1 = await (await t.signInAs('reviewer')).get(url(id, '/versions/1')).expect(200);
    expect(v1.body.document).to.deep.equal(SMALL_NETWORK);
    expect(v1.body.results).to.deep.equal(firstResults);
  });

  it('compares two versions: elements added, removed and changed field by field, each outlet before and after', async () => {
    const id = await insertProject(t.db, t.seeded!.demoTeamId);
    const a = await t.signInAs('designer');
    await a.put(url(id, '/network'), { version: 0, document: SMALL_NETWORK }).expect(200);
    await a.put(url(id, '/network'), { version: 1, document: narrower() }).expect(200);
    const cmp = (await a.get(url(id, '/versions/1/compare/2')).expect(200)).body;
    expect(cmp.diff.added.map((e: { id: string }) => e.id)).to.deep.equal(['O2', 'P2']);
    expect(cmp.diff.removed).to.deep.equal([]);
    expect(cmp.diff.changed).to.deep.equal([{ id: 'P1', kind: 'pipe', fields: [{ field: 'diameter_m', before: 0.0266, after: 0.02 }] }]);
    const o1 = cmp.outlets.find((o: { id: string }) => o.id === 'O1');
    const o2 = cmp.outlets.find((o: { id: string }) => o.id === 'O2');
    // A narrower pipe loses more head, so O1's pressure falls; its flow is the fixed demand both times. By hand:
    // 41 + 1.2 − 18 = 24.2 m of fall less the Hazen-Williams loss of 0.3 L/s in 120 m, C 150 (spec/engine/hand-formulas.ts, C)
    expect(o1.before.pressure_m).to.be.closeTo(24.2 - hwLoss(0.0003, 120, 0.0266, 150), 1e-6);
    expect(o1.after.pressure_m).to.be.closeTo(24.2 - hwLoss(0.0003, 120, 0.02, 150), 1e-6);
    expect(o1.after.pressure_m).to.be.lessThan(o1.before.pressure_m);
    expect(o1.pressureChange_m).to.be.closeTo(o1.after.pressure_m - o1.before.pressure_m, 1e-12);
    expect(o1.flowChange_m3s).to.be.closeTo(0, 1e-9);
    expect(o2.before).to.equal(null);
    expect(o2.after.flow_m3s).to.be.closeTo(0.0001, 1e-9);
    const back = (await a.get(url(id, '/versions/2/compare/1')).expect(200)).body;
    expect(back.diff.removed.map((e: { id: string }) => e.id)).to.deep.equal(['O2', 'P2']);
  });

  it('restore makes a new version holding the old document (designer); the history keeps every step', async () => {
    const id = await insertProject(t.db, t.seeded!.demoTeamId);
    const a = await t.signInAs('designer');
    await a.put(url(id, '/network'), { version: 0, document: SMALL_NETWORK }).expect(200);
    await a.put(url(id, '/network'), { version: 1, document: narrower() }).expect(200);
    const restored = await a.post(url(id, '/versions/1/restore'), { version: 2 }).expect(201);
    expect(restored.body.version).to.equal(3);
    // a summary like PUT network's, not the full results
    expect(restored.body).to.have.all.keys('version', 'updatedAt', 'solved');
    const current = await a.get(url(id, '/network')).expect(200);
    expect(current.body.version).to.equal(3);
    expect(current.body.document).to.deep.equal(SMALL_NETWORK);
    const list = (await a.get(url(id, '/versions')).expect(200)).body.versions;
    expect(list[0]).to.include({ version: 3, restoredFrom: 1, summary: 'restored version 1: changed P1 (diameter_m); removed O2, P2' });
    const rows = await t.db.select().from(networkVersions).where(eq(networkVersions.projectId, id));
    expect(rows).to.have.length(3);
  });

  it('restore with a stale current version → 409 and nothing written; reviewers cannot restore (403)', async () => {
    const id = await insertProject(t.db, t.seeded!.demoTeamId);
    const a = await t.signInAs('designer');
    await a.put(url(id, '/network'), { version: 0, document: SMALL_NETWORK }).expect(200);
    await a.put(url(id, '/network'), { version: 1, document: narrower() }).expect(200);
    const stale = await a.post(url(id, '/versions/1/restore'), { version: 1 }).expect(409);
    expect(stale.body.error.code).to.equal('conflict');
    await (await t.signInAs('reviewer')).post(url(id, '/versions/1/restore'), { version: 2 }).expect(403);
    const rows = await t.db.select().from(networkVersions).where(eq(networkVersions.projectId, id));
    expect(rows).to.have.length(2);
  });

  it("bad version numbers → 400 naming the field; unknown versions → 404; another team's project → 404", async () => {
    const a = await t.signInAs('designer');
    const p = t.seeded!.demoProjectId;
    const bad = await a.get(url(p, '/versions/abc')).expect(400);
    expect(bad.body.error.fields[0].path).to.equal('version');
    const missing = await a.get(url(p, '/versions/999')).expect(404);
    expect(missing.body.error.message).to.match(/Version 999/);
    const badOther = await a.get(url(p, '/versions/1/compare/0')).expect(400);
    expect(badOther.body.error.fields[0].path).to.equal('other');
    const noBody = await a.post(url(p, '/versions/1/restore'), {}).expect(400);
    expect(noBody.body.error.fields[0].path).to.equal('version');
    await (await t.signInAs('other')).get(url(p, '/versions')).expect(404);
  });

  it('version numbers of 2^31 or more (the int4 column) → 400 naming the field, in the path, the query and every body', async () => {
    const a = await t.signInAs('designer');
    const r = await t.signInAs('reviewer');
    const p = t.seeded!.demoProjectId;
    for (const path of ['/versions/2147483648', '/versions/99999999999', '/versions/2147483648/compare/1', '/comments?version=2147483648']) {
      const res = await a.get(url(p, path)).expect(400);
      expect(res.body.error.fields[0].path, path).to.equal('version');
    }
    expect((await a.get(url(p, '/versions/1/compare/2147483648')).expect(400)).body.error.fields[0].path).to.equal('other');
    expect((await a.post(url(p, '/versions/2147483648/submit'), {}).expect(400)).body.error.fields[0].path).to.equal('version');
    expect((await a.post(url(p, '/versions/1/restore'), { version: 2 ** 31 }).expect(400)).body.error.fields[0].path).to.equal('version');
    expect((await r.post(url(p, '/comments'), { version: 2 ** 31, element: 'P1', body: 'x' }).expect(400)).body.error.fields[0].path).to.equal('version');
    // The largest stored value is a well-formed number: not found, not a database error.
    expect((await a.get(url(p, '/versions/2147483647')).expect(404)).body.error.message).to.match(/Version 2147483647/);
  });
});
