/**
 * server/project-scope.ts: every route registered under /projects/:id (today's and the ones still to
 * come) gets the caller's team's project loaded before its handler, so another team's project, an
 * unknown id and a malformed id are 404 on all of them, whatever the handler does.
 */
import { randomUUID } from 'node:crypto';
import { expect } from 'chai';
import { PROJECT_PATH } from '../../server/project-scope';
import { startTestApp, type TestApp } from './test-app';

describe("API: the project of /projects/:id routes is loaded for the caller's team", () => {
  let t: TestApp;
  before(async () => {
    t = await startTestApp();
  });
  after(async () => {
    await t.close();
  });

  it("every /projects/:id route answers 404 for another team's, an unknown and a malformed project id", async () => {
    // The admin of the second team, on every route their roles reach (a missing permission is 403 first).
    const a = await t.signInAs('other');
    const held: string[] = (await a.get('/api/auth/me').expect(200)).body.permissions;
    const scoped = t.routes.filter((r) => PROJECT_PATH.test(r.path) && held.includes(r.access));
    expect(scoped.length).to.be.at.least(8);
    const wrong: string[] = [];
    for (const id of [t.seeded!.demoProjectId, randomUUID(), 'not-a-uuid']) {
      for (const r of scoped) {
        const path = '/api' + r.path.replace(':id', id).replace(/:(\w+)/g, () => randomUUID());
        const res = await (r.method === 'get' ? a.get(path) : r.method === 'delete' ? a.delete(path) : a[r.method](path, {}));
        if (res.status !== 404 || res.body.error?.message !== 'No such project') wrong.push(`${r.method} ${path} → ${res.status} ${JSON.stringify(res.body)}`);
      }
    }
    expect(wrong, wrong.join('\n')).to.deep.equal([]);
  });

  it('the demo team still reaches its own project through the same routes', async () => {
    const a = await t.signInAs('designer');
    const res = await a.get(`/api/projects/${t.seeded!.demoProjectId}/network`).expect(200);
    // the seed saves the demo network once (spec/api/network.spec.ts: version 1)
    expect(res.body.version).to.equal(1);
    expect(res.body.document.nodes.map((n: { id: string }) => n.id)).to.include.members(['T1', 'T2', 'HOUSE', 'TR4']);
  });
});
