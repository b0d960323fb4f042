import { expect } from 'chai';
import { emptyBudget, type BudgetDocument } from '../../engine/budget';
import { hillSmallholdingBudget } from '../../engine/examples/hill-smallholding-budget';
import type { NetworkDocument, OutletNode } from '../../engine/network-document';
import { insertProject, insertSavedProject } from './fixtures';
import { startTestApp, type TestApp } from './test-app';
import { GAL } from '../engine/hand-formulas';

describe('API: water budget (versioned, validated, outlet flows carried into the network)', () => {
  let t: TestApp;
  // a PGlite database with migrations and the seed: slow to start on a busy machine
  before(async function () {
    this.timeout(90000);
    t = await startTestApp();
  });
  after(async function () {
    this.timeout(30000);
    await t?.close();
  });

  const url = (id: string) => `/api/projects/${id}/budget`;
  const outlet = (doc: NetworkDocument, id: string) => doc.nodes.find((n) => n.id === id) as OutletNode;

  it('a project with no budget gives version 0, an empty budget and a plan', async () => {
    const id = await insertProject(t.db, t.seeded!.demoTeamId);
    const res = await (await t.signInAs('owner')).get(url(id)).expect(200);
    expect(res.body.version).to.equal(0);
    expect(res.body.document).to.deep.equal(emptyBudget());
    expect(res.body.plan.months).to.have.length(12);
  });

  it('the demo project has its budget, with monthly verdicts against the saved network', async () => {
    const res = await (await t.signInAs('owner')).get(url(t.seeded!.demoProjectId)).expect(200);
    expect(res.body.version).to.equal(1);
    expect(res.body.document.uses.map((u: { id: string }) => u.id)).to.deep.equal(hillSmallholdingBudget.uses.map((u) => u.id));
    expect(res.body.plan.verdicts).to.have.length(12);
    expect(res.body.networkVersion).to.equal(1);
  });

  it("a first save holds the flows typed on the Layout until the designer chooses; raising a head count then raises the linked trough's flow", async () => {
    const projectName = 'Budget flows fixture';
    const id = await insertProject(t.db, t.seeded!.demoTeamId, projectName);
    const a = await t.signInAs('designer');
    const { hillSmallholding } = await import('../../engine/examples/hill-smallholding');
    await a.put(`/api/projects/${id}/network`, { version: 0, document: hillSmallholding }).expect(200);
    // the network's outlets carry flows typed on the Layout: nothing is overwritten without a choice
    const held = await a.put(url(id), { version: 0, document: hillSmallholdingBudget }).expect(200);
    expect(held.body.network).to.equal(null);
    const heldTr4 = held.body.held.find((d: { id: string }) => d.id === 'TR4');
    expect(heldTr4).to.include({ reason: 'not-yet-from-budget', network_m3s: outlet(hillSmallholding, 'TR4').demand_m3s, previous_m3s: null });
    expect((await a.get(url(id)).expect(200)).body.held.map((d: { id: string }) => d.id)).to.include('TR4');
    // the designer takes the budget's flow for every outlet but the house, whose typed flow they keep ("not from budget")
    const chosen = held.body.held.map((d: { id: string }) => d.id).filter((o: string) => o !== 'HOUSE');
    const keepHouse = { ...hillSmallholdingBudget, manual_outlets: ['HYD', 'HOUSE'] };
    const first = await a.put(url(id), { version: 1, document: keepHouse, apply_outlets: chosen }).expect(200);
    expect(first.body.held).to.deep.equal([]);
    expect(first.body.network.version).to.equal(2);
    // the network save's summary, not its results (GET network has those)
    expect(first.body.network).to.have.all.keys('version', 'updatedAt', 'solved');
    expect(first.body.network.solved.converged).to.equal(true);
    const net1 = (await a.get(`/api/projects/${id}/network`).expect(200)).body;
    const tr4 = first.body.plan.outlets.find((o: { id: string }) => o.id === 'TR4').design_flow_m3s;
    expect(outlet(net1.document, 'TR4').demand_m3s).to.be.closeTo(tr4, 1e-15);
    // by hand (C): 10 cow-calf pairs × 20 gal/day (NRCS Kansas, V2) × 1.1 delivered in 4 h (Ohio State ANR-12;
    // Nebraska NRCS 2008, V2), shared by TR3 and TR4
    expect(tr4).to.be.closeTo((10 * 20 * GAL * 1.1) / (4 * 3600) / 2, 1e-12);
    // the hand-typed hydrant and house flows are kept ("not from budget")
    expect(outlet(net1.document, 'HYD').demand_m3s).to.equal(outlet(hillSmallholding, 'HYD').demand_m3s);
    expect(outlet(net1.document, 'HOUSE').demand_m3s).to.equal(outlet(hillSmallholding, 'HOUSE').demand_m3s);

    const more: BudgetDocument = { ...keepHouse, uses: keepHouse.uses.map((u) => (u.id === 'herd' ? { ...u, count: 30 } : u)) };
    const second = await a.put(url(id), { version: 2, document: more }).expect(200);
    expect(second.body.network.version).to.equal(3);
    const net2 = (await a.get(`/api/projects/${id}/network`).expect(200)).body;
    expect(outlet(net2.document, 'TR4').demand_m3s).to.be.closeTo(outlet(net1.document, 'TR4').demand_m3s * 3, 1e-15);
    expect(net2.results.nodes['TR4'].pressure_m).to.be.below(net1.results.nodes['TR4'].pressure_m);
    // saving the same budget again changes no flow: no new network version
    const third = await a.put(url(id), { version: 3, document: more }).expect(200);
    expect(third.body.network).to.equal(null);
    expect(third.body.networkVersion).to.equal(3);

    // TR3 edited on the Layout: a budget change to the herd does not overwrite it, and says so
    const edited = { ...net2.document, nodes: net2.document.nodes.map((n: OutletNode) => (n.id === 'TR3' ? { ...n, demand_m3s: 0.0005 } : n)) };
    await a.put(`/api/projects/${id}/network`, { version: 3, document: edited }).expect(200);
    const fewer: BudgetDocument = { ...more, uses: more.uses.map((u) => (u.id === 'herd' ? { ...u, count: 20 } : u)) };
    const fourth = await a.put(url(id), { version: 4, document: fewer }).expect(200);
    expect(fourth.body.held).to.have.length(1);
    expect(fourth.body.held[0]).to.include({ id: 'TR3', reason: 'edited-on-layout', network_m3s: 0.0005 });
    const net3 = (await a.get(`/api/projects/${id}/network`).expect(200)).body;
    expect(outlet(net3.document, 'TR3').demand_m3s).to.equal(0.0005);
    expect(outlet(net3.document, 'TR4').demand_m3s).to.be.closeTo(outlet(net1.document, 'TR4').demand_m3s * 2, 1e-15);
    // choosing the budget's flow for TR3 replaces it, and the audit log says which
    const fifth = await a.put(url(id), { version: 5, document: fewer, apply_outlets: ['TR3'] }).expect(200);
    expect(fifth.body.held).to.deep.equal([]);
    expect(outlet((await a.get(`/api/projects/${id}/network`).expect(200)).body.document, 'TR3').demand_m3s).to.be.closeTo(
      outlet(net3.document, 'TR4').demand_m3s,
      1e-15,
    );
    const log = (await (await t.signInAs('admin')).get('/api/team/audit').expect(200)).body as { action: string; detail: string }[];
    // the log names the project as the team sees it, not by its id
    const save = log.find((r) => r.action === 'budget.save' && /TR3/.test(r.detail)) as { target: string } | undefined;
    expect(save?.target).to.equal(projectName);
  });

  it('a stale save → 409 with the current budget; the newer save is kept', async () => {
    const id = await insertSavedProject(t.db, t.seeded!.demoTeamId);
    const a = await t.signInAs('designer');
    const b = await t.signInAs('designer');
    await a.put(url(id), { version: 0, document: emptyBudget() }).expect(200);
    await a.put(url(id), { version: 1, document: { ...emptyBudget(), peak_factor: 4 } }).expect(200);
    const stale = await b.put(url(id), { version: 1, document: { ...emptyBudget(), peak_factor: 2 } });
    expect(stale.status).to.equal(409);
    expect(stale.body.error.message).to.match(/since you loaded version 1 \(now version 2\)/);
    expect(stale.body.current.document.peak_factor).to.equal(4);
  });

  it('bad input is refused naming the row and field, and nothing is saved', async () => {
    const id = await insertSavedProject(t.db, t.seeded!.demoTeamId);
    const a = await t.signInAs('designer');
    const use = { id: 'c', name: 'Cows', kind: 'livestock', months: [1], outlets: ['O1'] };
    const cases: [unknown, string][] = [
      [{ ...emptyBudget(), uses: [{ ...use, count: -3 }] }, 'uses[0] "Cows".count: must be a whole number ≥ 0 (got -3)'],
      [{ ...emptyBudget(), uses: [{ ...use, kind: 'garden', area_m2: 0 }] }, 'uses[0] "Cows".area_m2: must be a number > 0 (got 0)'],
      [{ ...emptyBudget(), uses: [{ ...use, count: 3, months: [13] }] }, 'uses[0] "Cows".months[0]: must be a whole month 1–12 (got 13)'],
      [{ ...emptyBudget(), uses: [{ ...use, kind: 'barn' }] }, 'uses[0] "Cows".kind: must be livestock, garden, tunnel, orchard, household or other'],
      [{ ...emptyBudget(), peak_sun_hours: [1] }, 'peak_sun_hours: must be 12 numbers (January first)'],
    ];
    for (const [document, message] of cases) {
      const res = await a.put(url(id), { version: 0, document }).expect(400);
      expect(res.body.error.fields.map((f: { message: string }) => f.message)).to.include(message);
    }
    expect((await a.get(url(id)).expect(200)).body.version).to.equal(0);
    expect((await a.get(`/api/projects/${id}/network`).expect(200)).body.version).to.equal(1);
  });

  it('profile settings: the default cover is saved per project by designers, validated and audited', async () => {
    const id = await insertProject(t.db, t.seeded!.demoTeamId);
    const settings = `/api/projects/${id}/profile-settings`;
    const owner = await t.signInAs('owner');
    expect((await owner.get(settings).expect(200)).body).to.include({ cover_m: null, default_cover_m: 0.45 });
    await owner.put(settings, { cover_m: 0.9 }).expect(403);
    const a = await t.signInAs('designer');
    for (const [body, message] of [
      [{ cover_m: -0.1 }, 'cover_m: must be 0 m or more'],
      [{ cover_m: 5 }, 'cover_m: must be at most 3 m (about 10 ft)'],
      [{ cover_m: '1' }, 'cover_m: must be a depth in metres, or null for the default'],
      [{}, 'cover_m: must be a depth in metres, or null for the default'],
    ] as const) {
      const res = await a.put(settings, body).expect(400);
      expect(res.body.error.fields.map((f: { path: string; message: string }) => `${f.path}: ${f.message}`)).to.include(message);
    }
    expect((await owner.get(settings).expect(200)).body.cover_m).to.equal(null);
    const saved = (await a.put(settings, { cover_m: 0.9 }).expect(200)).body;
    expect(saved).to.include({ cover_m: 0.9, updatedBy: 'Dana Designer' });
    expect((await owner.get(settings).expect(200)).body.cover_m).to.equal(0.9);
    expect((await (await t.signInAs('owner')).get(`/api/projects/${t.seeded!.otherProjectId}/profile-settings`)).status).to.equal(404);
    const log = (await (await t.signInAs('admin')).get('/api/team/audit').expect(200)).body as { action: string; detail: string }[];
    expect(log.some((r) => r.action === 'profile.settings' && /cover_m: 0\.9/.test(r.detail))).to.equal(true);
  });

  it("another team's project is 404; owners may read but not save", async () => {
    const other = await (await t.signInAs('owner')).get(url(t.seeded!.otherProjectId));
    expect(other.status).to.equal(404);
    await (await t.signInAs('owner')).put(url(t.seeded!.demoProjectId), { version: 1, document: emptyBudget() }).expect(403);
  });
});
