import { expect } from 'chai';
import { eq } from 'drizzle-orm';
import { networks } from '../../drizzle/schema';
import { solve } from '../../engine';
import { applyBudget, planBudget } from '../../engine/budget';
import { hillSmallholding } from '../../engine/examples/hill-smallholding';
import { hillSmallholdingBudget } from '../../engine/examples/hill-smallholding-budget';
import { insertProject, SMALL_NETWORK } from './fixtures';
import { startTestApp, type TestApp } from './test-app';

describe('API: network document (optimistic version, validation, server solve)', () => {
  let t: TestApp;
  before(async () => {
    t = await startTestApp();
  });
  after(async () => {
    await t.close();
  });

  const url = (id: string) => `/api/projects/${id}/network`;

  it('a project with nothing saved gives version 0 and an empty document', async () => {
    const id = await insertProject(t.db, t.seeded!.demoTeamId);
    const a = await t.signInAs('reviewer');
    const res = await a.get(url(id)).expect(200);
    expect(res.body).to.deep.equal({
      version: 0,
      document: { schema: 'runnel.network/1', headloss: 'hazen-williams', nodes: [], links: [] },
      results: null,
      updatedAt: null,
      updatedBy: null,
    });
  });

  it("the seeded demo project holds the example network with the demo budget's outlet flows, saved through the same path (version 1, results stored)", async () => {
    const a = await t.signInAs('owner');
    const res = await a.get(url(t.seeded!.demoProjectId)).expect(200);
    expect(res.body.version).to.equal(1);
    const demo = applyBudget(hillSmallholding, planBudget(hillSmallholdingBudget, hillSmallholding));
    expect(res.body.document).to.deep.equal(JSON.parse(JSON.stringify(demo)));
    // The stored results are the engine's own solve of that document (run in the server's worker pool).
    expect(res.body.results).to.deep.equal(JSON.parse(JSON.stringify(solve(demo))));
    expect(res.body.updatedBy).to.equal('Dana Designer');
  });

  it('saves and loads with a version: each save increments it and stores the solve results', async () => {
    const id = await insertProject(t.db, t.seeded!.demoTeamId);
    const a = await t.signInAs('designer');
    const first = await a.put(url(id), { version: 0, document: SMALL_NETWORK }).expect(200);
    // The answer is a summary, not the results (those can be megabytes; GET has them).
    const expected = solve(SMALL_NETWORK);
    expect(first.body).to.deep.equal({
      version: 1,
      updatedAt: first.body.updatedAt,
      solved: { converged: true, iterations: expected.iterations, warnings: expected.warnings.length },
    });
    const edited = { ...SMALL_NETWORK, title: 'Second cut' };
    const second = await a.put(url(id), { version: 1, document: edited }).expect(200);
    expect(second.body.version).to.equal(2);
    const loaded = await a.get(url(id)).expect(200);
    expect(loaded.body.version).to.equal(2);
    expect(loaded.body.document).to.deep.equal(edited);
    expect(loaded.body.results).to.deep.equal(JSON.parse(JSON.stringify(solve(edited))));
    expect(loaded.body.updatedBy).to.equal('Dana Designer');
  });

  it('a stale save → 409 with the current document; the newer save is not lost', async () => {
    const id = await insertProject(t.db, t.seeded!.demoTeamId);
    const a = await t.signInAs('designer');
    const b = await t.signInAs('designer');
    await a.put(url(id), { version: 0, document: SMALL_NETWORK }).expect(200);
    const fromA = { ...SMALL_NETWORK, title: 'A moved the tank' };
    const fromB = { ...SMALL_NETWORK, title: 'B resized the pipe' };
    await a.put(url(id), { version: 1, document: fromA }).expect(200);
    const stale = await b.put(url(id), { version: 1, document: fromB });
    expect(stale.status).to.equal(409);
    expect(stale.body.error.code).to.equal('conflict');
    expect(stale.body.error.message).to.match(/since you loaded version 1 \(now version 2\)/);
    expect(stale.body.current.version).to.equal(2);
    expect(stale.body.current.document).to.deep.equal(fromA);
    const stored = await a.get(url(id)).expect(200);
    expect(stored.body.version).to.equal(2);
    expect(stored.body.document).to.deep.equal(fromA);
    // Saving "version 0" over an existing network is also stale.
    await b.put(url(id), { version: 0, document: fromB }).expect(409);
  });

  it('two saves racing from the same version: exactly one wins, the other gets 409', async () => {
    const id = await insertProject(t.db, t.seeded!.demoTeamId);
    const a = await t.signInAs('designer');
    const b = await t.signInAs('designer');
    await a.put(url(id), { version: 0, document: SMALL_NETWORK }).expect(200);
    const [ra, rb] = await Promise.all([
      a.put(url(id), { version: 1, document: { ...SMALL_NETWORK, title: 'from A' } }),
      b.put(url(id), { version: 1, document: { ...SMALL_NETWORK, title: 'from B' } }),
    ]);
    expect([ra.status, rb.status].sort()).to.deep.equal([200, 409]);
    const winner = ra.status === 200 ? 'from A' : 'from B';
    const stored = await a.get(url(id)).expect(200);
    expect(stored.body).to.deep.include({ version: 2 });
    expect(stored.body.document.title).to.equal(winner);
  });

  it('a reviewer may read but PUT is 403 and nothing changes', async () => {
    const r = await t.signInAs('reviewer');
    const before = await r.get(url(t.seeded!.demoProjectId)).expect(200);
    const res = await r.put(url(t.seeded!.demoProjectId), { version: before.body.version, document: SMALL_NETWORK });
    expect(res.status).to.equal(403);
    expect(res.body.error.code).to.equal('forbidden');
    const after = await r.get(url(t.seeded!.demoProjectId)).expect(200);
    expect(after.body.version).to.equal(before.body.version);
  });

  it('a malformed document → 400 naming the element and the field; nothing stored', async () => {
    const id = await insertProject(t.db, t.seeded!.demoTeamId);
    const a = await t.signInAs('designer');
    const broken = {
      ...SMALL_NETWORK,
      nodes: [SMALL_NETWORK.nodes[0], { id: 'O1', kind: 'outlet', elevation_m: 'high', demand_m3s: 0.0003 }],
    };
    const res = await a.put(url(id), { version: 0, document: broken }).expect(400);
    expect(res.body.error.code).to.equal('validation');
    expect(res.body.error.fields).to.deep.include({
      path: 'document.nodes.1.elevation_m',
      element: 'O1',
      message: 'O1.elevation_m: must be a number (got "high")',
    });
    expect(res.body.error.message).to.include('O1.elevation_m');
    const kinds = await a.put(url(id), { version: 0, document: { ...SMALL_NETWORK, links: [{ id: 'X9', kind: 'hose', from: 'T1', to: 'O1' }] } }).expect(400);
    expect(kinds.body.error.fields[0]).to.include({ element: 'X9', path: 'document.links.0.kind' });
    const top = await a.put(url(id), { version: 0, document: { schema: 'runnel.network/1', nodes: [] } }).expect(400);
    expect(top.body.error.fields.map((f: { path: string }) => f.path)).to.include.members(['document.headloss', 'document.links']);
    const future = await a.put(url(id), { version: 0, document: { ...SMALL_NETWORK, schema: 'runnel.network/99' } }).expect(400);
    expect(future.body.error.fields[0]).to.include({ path: 'document.schema' });
    expect(future.body.error.fields[0].message).to.match(/newer than this program/);
    const loaded = await a.get(url(id)).expect(200);
    expect(loaded.body.version).to.equal(0);
  });

  it('field-level problems the engine finds (a zero pipe diameter, a dangling link) → 400 naming element and field', async () => {
    const id = await insertProject(t.db, t.seeded!.demoTeamId);
    const a = await t.signInAs('designer');
    const zero = await a.put(url(id), { version: 0, document: { ...SMALL_NETWORK, links: [{ ...SMALL_NETWORK.links[0], diameter_m: 0 }] } }).expect(400);
    expect(zero.body.error.fields).to.deep.equal([
      { path: 'document.links.0.diameter_m', element: 'P1', message: 'P1.diameter_m: must be a positive number (got 0)' },
    ]);
    const dangling = await a.put(url(id), { version: 0, document: { ...SMALL_NETWORK, links: [{ ...SMALL_NETWORK.links[0], to: 'O9' }] } }).expect(400);
    expect(dangling.body.error.fields).to.deep.equal([{ path: 'document.links.0.to', element: 'P1', message: 'P1.to: must name an existing node (got "O9")' }]);
  });

  it('physically impossible values → 400 naming the field (elevation −1e308, demand 1e308, junk bend points); nothing stored', async () => {
    const id = await insertProject(t.db, t.seeded!.demoTeamId);
    const a = await t.signInAs('designer');
    const [tank, outlet] = SMALL_NETWORK.nodes;
    const document = {
      ...SMALL_NETWORK,
      nodes: [
        { ...tank, elevation_m: -1e308 },
        { ...outlet, demand_m3s: 1e308 },
      ],
      links: [{ ...SMALL_NETWORK.links[0], vertices: [[0, 0], 'junk', [1, null]] }],
    };
    const res = await a.put(url(id), { version: 0, document }).expect(400);
    expect(res.body.error.fields.map((f: { path: string; message: string }) => `${f.path} ${f.message}`)).to.deep.equal([
      'document.nodes.0.elevation_m T1.elevation_m: must be at least -500 m (got -1e+308)',
      'document.nodes.1.demand_m3s O1.demand_m3s: must be at most 10 m³/s (got 1e+308)',
      'document.links.0.vertices.1 P1.vertices[1]: must be an [x_m, y_m] pair (got "junk")',
      'document.links.0.vertices.2.1 P1.vertices[2][1]: must be a number (got null)',
    ]);
    expect((await a.get(url(id)).expect(200)).body.version).to.equal(0);
  });

  it('a design saved under an older version of the format (no schema tag) opens as the current version, and saves', async () => {
    const id = await insertProject(t.db, t.seeded!.demoTeamId);
    const designer = await t.signInAs('designer');
    const { schema: _schema, headloss: _headloss, ...old } = SMALL_NETWORK;
    await t.db.insert(networks).values({ projectId: id, version: 3, document: old, results: null, updatedAt: new Date() });
    const loaded = await designer.get(url(id)).expect(200);
    expect(loaded.body.version).to.equal(3);
    expect(loaded.body.document).to.deep.equal({ ...old, schema: 'runnel.network/1', headloss: 'hazen-williams' });
    const saved = await designer.put(url(id), { version: 3, document: old }).expect(200);
    expect(saved.body.version).to.equal(4);
    const [row] = await t.db.select({ document: networks.document }).from(networks).where(eq(networks.projectId, id));
    expect(row.document).to.deep.equal({ ...old, schema: 'runnel.network/1', headloss: 'hazen-williams' });
  });

  it('the body must carry an integer version (400 naming it) and stay under 5 MB (413)', async () => {
    const a = await t.signInAs('designer');
    const res = await a.put(url(t.seeded!.demoProjectId), { document: SMALL_NETWORK }).expect(400);
    expect(res.body.error.fields[0].path).to.equal('version');
    const huge = { version: 1, document: { ...SMALL_NETWORK, notes: 'x'.repeat(5.5 * 1024 * 1024) } };
    const big = await a.put(url(t.seeded!.demoProjectId), huge);
    expect(big.status).to.equal(413);
    expect(big.body.error.code).to.equal('too-large');
  });
});
