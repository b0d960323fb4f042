import { expect } from 'chai';
import supertest from 'supertest';
import { SMALL_NETWORK } from './fixtures';
import { makeTempDir, removeTempDir, startTestApp } from './test-app';

describe('API: data survives a restart on the same PGlite data dir', () => {
  let dir: string;
  before(() => {
    dir = makeTempDir();
  });
  after(() => {
    removeTempDir(dir);
  });

  it('keeps projects, networks, sessions and users; seeding again changes nothing', async function () {
    this.timeout(120_000); // two PGlite databases created and opened on disk: slow on a busy machine
    const first = await startTestApp({ dataDir: dir });
    expect(first.seeded!.seeded).to.equal(true);
    const designer = await first.signInAs('designer');
    const project = await designer.post('/api/projects', { name: 'Kept across restarts', units: 'si' }).expect(201);
    await designer.put(`/api/projects/${project.body.id}/network`, { version: 0, document: SMALL_NETWORK }).expect(200);
    // Another team's project with the demo project's name must not be taken for the seeded one.
    await (await first.signInAs('other')).post('/api/projects', { name: 'Hillside smallholding', units: 'si' }).expect(201);
    await first.close();

    const second = await startTestApp({ dataDir: dir });
    try {
      expect(second.seeded!.seeded).to.equal(false);
      expect(second.seeded!.demoProjectId).to.equal(first.seeded!.demoProjectId);
      expect(second.seeded!.otherProjectId).to.equal(first.seeded!.otherProjectId);
      // The same browser session still works after the restart: sessions live in the database.
      const sameSession = await supertest(second.app).get('/api/auth/me').set('Cookie', designer.sessionCookie).expect(200);
      expect(sameSession.body.user.email).to.equal('designer@runnel.test');
      const again = await second.signInAs('designer');
      const list = await again.get('/api/projects').expect(200);
      expect(list.body.map((p: { name: string }) => p.name)).to.include('Kept across restarts');
      expect(list.body.filter((p: { name: string }) => p.name === 'Hillside smallholding')).to.have.length(1);
      const network = await again.get(`/api/projects/${project.body.id}/network`).expect(200);
      expect(network.body.version).to.equal(1);
      expect(network.body.document).to.deep.equal(SMALL_NETWORK);
    } finally {
      await second.close();
    }
  });
});
