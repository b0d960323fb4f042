/**
 * Odd and hostile input is a clear 4xx naming the field, never a 500 (issue 13 items 6 and 10):
 * one case per class the probe found, plus wrong content types (415).
 */
import { expect } from 'chai';
import type { Response } from 'supertest';
import { SMALL_NETWORK } from './fixtures';
import { startTestApp, type ApiAgent, type TestApp } from './test-app';

function expectField(res: Response, status: number, path: string | RegExp): void {
  expect(res.status, JSON.stringify(res.body)).to.equal(status);
  const paths = (res.body.error.fields ?? []).map((f: { path: string }) => f.path);
  if (typeof path === 'string') expect(paths, JSON.stringify(res.body)).to.include(path);
  else
    expect(
      paths.some((p: string) => path.test(p)),
      JSON.stringify(res.body),
    ).to.equal(true);
}

describe('API: bad requests answer 4xx naming the field', () => {
  let t: TestApp;
  let a: ApiAgent;
  let project: string;
  const logged: string[] = [];
  before(async () => {
    t = await startTestApp({ log: (line) => logged.push(line) });
    a = await t.signInAs('designer');
    project = `/api/projects/${t.seeded!.demoProjectId}`;
  });
  after(async () => {
    await t.close();
  });
  afterEach(() => {
    // None of these may reach the 500 path (which logs "error …").
    expect(logged.filter((l) => /^error /.test(l) || /"level":50/.test(l))).to.deep.equal([]);
  });

  it('a NUL byte in a text field, a document field or a key → 400 naming it', async () => {
    expectField(await a.patch(project, { name: 'bad\u0000name' }), 400, 'name');
    expectField(await a.post('/api/projects', { name: 'x', notes: 'a\u0000' }), 400, 'notes');
    const doc = { ...SMALL_NETWORK, nodes: [{ ...SMALL_NETWORK.nodes[0], label: 'T\u0000' }, SMALL_NETWORK.nodes[1]] };
    expectField(await a.put(`${project}/network`, { version: 1, document: doc }), 400, 'document.nodes.0.label');
    expectField(await a.post('/api/team/invitations', { ['e\u0000mail']: 1 }), 400, /^e\?mail$/);
    expectField(await a.get('/api/projects?archived=%00'), 400, 'archived');
  });

  it('a malformed percent-encoded id → 400 naming the url', async () => {
    for (const bad of ['%C0%AF', '%E0%A4%A', '%ZZ']) expectField(await a.get(`/api/projects/${bad}`), 400, 'url');
    expectField(await a.get(`${project}/files/%C0%AF`), 400, 'url');
  });

  it('a version of 2^31 or more on a network save → 400 naming version', async () => {
    expectField(await a.put(`${project}/network`, { version: 2 ** 31, document: SMALL_NETWORK }), 400, 'version');
    expectField(await a.put(`${project}/network`, { version: 2 ** 53, document: SMALL_NETWORK }), 400, 'version');
  });

  it('a lone UTF-16 surrogate in a document or a name → 400 naming the field', async () => {
    const doc = { ...SMALL_NETWORK, title: 'x\ud800y' };
    expectField(await a.put(`${project}/network`, { version: 1, document: doc }), 400, 'document.title');
    expectField(await a.post('/api/projects', { name: 'tail \udc00' }), 400, 'name');
  });

  it('a 5,000-deep array in a document → 400; a 20,000-deep GPX → 400 naming point 0', async () => {
    let deep: unknown = [];
    for (let i = 0; i < 5000; i++) deep = [deep];
    // Sent as raw JSON text: the client library would recurse as deep to serialise it.
    const body = `{"version":1,"document":{"schema":"runnel.network/1","nodes":[],"links":[],"extra":${'['.repeat(5000)}${']'.repeat(5000)}}}`;
    const res = await a.agent.put(`${project}/network`).set('x-csrf-token', a.token).set('content-type', 'application/json').send(body);
    expect(res.status, JSON.stringify(res.body)).to.equal(400);
    expect(res.body.error.message).to.match(/nested more than 64 levels/);
    expect(res.body.error.fields[0].path).to.match(/^document\.extra\.0\./);
    const gpx = '<?xml version="1.0"?><gpx>' + '<g>'.repeat(20000) + '</g>'.repeat(20000) + '</gpx>';
    const parsed = await a.upload(`${project}/survey/parse`, { bytes: Buffer.from(gpx), filename: 'deep.gpx' });
    expect(parsed.status, JSON.stringify(parsed.body)).to.equal(400);
    expect(parsed.body.error).to.include({ point: 0 });
    expect(parsed.body.error.message).to.match(/more than 64 levels/);
  });

  it('multipart without a boundary or with a truncated body → 400 naming file', async () => {
    const noBoundary = await a.agent.post(`${project}/survey/parse`).set('x-csrf-token', a.token).set('content-type', 'multipart/form-data').send('abc');
    expectField(noBoundary, 400, 'file');
    const truncated = await a.agent
      .post(`${project}/files`)
      .set('x-csrf-token', a.token)
      .set('content-type', 'multipart/form-data; boundary=XX')
      .send(
        '--XX\r\nContent-Disposition: form-data; name="kind"\r\n\r\nsurvey\r\n--XX\r\nContent-Disposition: form-data; name="file"; filename="a.csv"\r\n\r\nlabel,x',
      );
    expectField(truncated, 400, 'file');
  });

  it('an e-mail that is an object or a megabyte long at sign-in → 400 naming email', async () => {
    const anon = await t.anonymous();
    expectField(await anon.post('/api/auth/signin', { email: { $gt: '' }, password: 'x' }), 400, 'email');
    expectField(await anon.post('/api/auth/signin', { email: 'a'.repeat(1024 * 1024 - 100), password: 'x' }), 400, 'email');
    expectField(await anon.post('/api/auth/signin', { email: 'x@y.test', password: ['a'] }), 400, 'password');
  });

  it('a body that is not JSON → 415, and nothing changes (no updatedAt bump, no audit row)', async () => {
    const before = await a.get(project).expect(200);
    const auditBefore = (await (await t.signInAs('admin')).get('/api/team/audit').expect(200)).body.length;
    for (const [type, body] of [
      ['text/plain', '{"notes":"x"}'],
      ['application/x-www-form-urlencoded', 'notes=x'],
    ] as const) {
      const res = await a.agent.patch(project).set('x-csrf-token', a.token).set('content-type', type).send(body);
      expect(res.status, type).to.equal(415);
      expect(res.body.error.code).to.equal('unsupported-type');
    }
    const none = await a.agent.patch(project).set('x-csrf-token', a.token);
    expect(none.status).to.equal(415);
    const noneBody = await a.agent.put(`${project}/network`).set('x-csrf-token', a.token);
    expect(noneBody.status).to.equal(415);
    const after = await a.get(project).expect(200);
    expect(after.body.updatedAt).to.equal(before.body.updatedAt);
    const auditAfter = (await (await t.signInAs('admin')).get('/api/team/audit').expect(200)).body.length;
    expect(auditAfter).to.equal(auditBefore);
  });
});
