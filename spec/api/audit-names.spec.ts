import { expect } from 'chai';
import { describeDetail } from '../../server/routes/team-audit';
import { DEMO_PROJECT } from '../../server/seed';
import { startTestApp, type TestApp } from './test-app';

describe('API: the audit log speaks in names, not ids', () => {
  let t: TestApp;
  before(async () => {
    t = await startTestApp();
  });
  after(async () => {
    await t.close();
  });

  it('seeded rows say who (Runnel), a network save names its project, and no UUID is shown', async () => {
    const admin = await t.signInAs('admin');
    const rows = (await admin.get('/api/team/audit').expect(200)).body as { who: string; action: string; target: string; detail: string }[];
    const seed = rows.find((r) => r.action === 'seed')!;
    expect(seed.who).to.equal('Runnel (demo set-up)');
    const save = rows.find((r) => r.action === 'network.save')!;
    expect(save.target).to.equal(DEMO_PROJECT);
    expect(save.who).to.equal('Dana Designer');
    const walk = rows.find((r) => r.action === 'walk.sync')!;
    expect(walk.detail).to.match(new RegExp(`project: ${DEMO_PROJECT}`));
    const uuid = /[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/i;
    for (const r of rows) expect(`${r.who} ${r.target} ${r.detail}`, r.action).to.not.match(uuid);
  });

  it('a deleted project is said to be deleted', () => {
    expect(describeDetail({ projectId: '3f1e0c52-8d0b-4c59-9d1e-2a7b5c0e9f11', kind: 'backdrop' })).to.equal('project: (deleted); kind: backdrop');
    expect(describeDetail({ projectId: 'x', projectName: 'North block', walkId: '3f1e0c52-8d0b-4c59-9d1e-2a7b5c0e9f11', added: 3 })).to.equal(
      'project: North block; added: 3',
    );
  });
});
