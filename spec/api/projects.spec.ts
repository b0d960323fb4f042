import { expect } from 'chai';
import { startTestApp, type TestApp } from './test-app';

describe('API: projects', () => {
  let t: TestApp;
  before(async () => {
    t = await startTestApp();
  });
  after(async () => {
    await t.close();
  });

  it('lists the seeded demo project for every member of the demo team', async () => {
    const a = await t.signInAs('owner');
    const res = await a.get('/api/projects').expect(200);
    expect(res.body.map((p: { name: string }) => p.name)).to.include('Hillside smallholding');
    const demo = res.body.find((p: { name: string }) => p.name === 'Hillside smallholding');
    expect(demo).to.include({ units: 'si', archived: false, teamId: t.seeded!.demoTeamId });
    expect(new Date(demo.createdAt).toISOString()).to.equal(demo.createdAt);
  });

  it('creates, reads, updates, archives and deletes, writing an audit entry for each change', async () => {
    const a = await t.signInAs('designer');
    const created = await a.post('/api/projects', { name: 'North orchard line', siteName: 'North block', units: 'si' }).expect(201);
    const id = created.body.id;
    expect(created.body).to.include({ name: 'North orchard line', siteName: 'North block', notes: '', units: 'si', archived: false });
    await a.get(`/api/projects/${id}`).expect(200);
    const patched = await a.patch(`/api/projects/${id}`, { notes: 'Trench after harvest', archived: true }).expect(200);
    expect(patched.body).to.include({ notes: 'Trench after harvest', archived: true });
    const list = await a.get('/api/projects').expect(200);
    expect(list.body.map((p: { id: string }) => p.id)).to.not.include(id);
    const all = await a.get('/api/projects?archived=true').expect(200);
    expect(all.body.map((p: { id: string }) => p.id)).to.include(id);
    await a.delete(`/api/projects/${id}`).expect(204);
    await a.get(`/api/projects/${id}`).expect(404);

    const admin = await t.signInAs('admin');
    const audit = await admin.get('/api/team/audit').expect(200);
    // The log names projects rather than ids (audit-names.spec): this project's rows carry its name.
    const actions = audit.body
      .filter((e: { target: string }) => e.target === 'North orchard line')
      .map((e: { action: string; userEmail: string }) => `${e.action} by ${e.userEmail}`);
    expect(actions).to.deep.equal([
      'project.delete by designer@runnel.test',
      'project.update by designer@runnel.test',
      'project.create by designer@runnel.test',
    ]);
  });

  it("another team's project is 404 for read, update, delete, network and files", async () => {
    const a = await t.signInAs('admin');
    const other = `/api/projects/${t.seeded!.otherProjectId}`;
    for (const res of [
      await a.get(other),
      await a.patch(other, { name: 'Mine now' }),
      await a.delete(other),
      await a.get(`${other}/network`),
      await a.get(`${other}/files`),
    ]) {
      expect(res.status).to.equal(404);
      expect(res.body.error.code).to.equal('not-found');
    }
    const otherUser = await t.signInAs('other');
    const still = await otherUser.get(other).expect(200);
    expect(still.body.name).to.equal('Lower paddock troughs');
    const theirList = await otherUser.get('/api/projects').expect(200);
    expect(theirList.body.map((p: { name: string }) => p.name)).to.not.include('Hillside smallholding');
  });

  it('a malformed project id is 404, not a database error', async () => {
    const a = await t.signInAs('admin');
    await a.get('/api/projects/not-a-uuid').expect(404);
  });

  it('reviewer and owner get 403 creating or deleting a project, and nothing changes', async () => {
    for (const role of ['reviewer', 'owner'] as const) {
      const a = await t.signInAs(role);
      const create = await a.post('/api/projects', { name: `By ${role}` });
      expect(create.status).to.equal(403);
      expect(create.body.error.message).to.include('project.create');
      await a.delete(`/api/projects/${t.seeded!.demoProjectId}`).expect(403);
      await a.get(`/api/projects/${t.seeded!.demoProjectId}`).expect(200);
      const list = await a.get('/api/projects').expect(200);
      expect(list.body.map((p: { name: string }) => p.name)).to.not.include(`By ${role}`);
    }
  });

  it('validation names the field: empty name, bad units, unknown archived type', async () => {
    const a = await t.signInAs('designer');
    const res = await a.post('/api/projects', { name: '  ', units: 'imperial' }).expect(400);
    const paths = res.body.error.fields.map((f: { path: string }) => f.path);
    expect(paths).to.have.members(['name', 'units']);
    const patch = await a.patch(`/api/projects/${t.seeded!.demoProjectId}`, { archived: 'yes' }).expect(400);
    expect(patch.body.error.fields[0].path).to.equal('archived');
  });
});
