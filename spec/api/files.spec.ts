import { expect } from 'chai';
import { JPEG_BYTES, PNG_BYTES, SURVEY_CSV } from './fixtures';
import { binaryBody, startOnDemoProject, type ApiAgent, type TestApp } from './test-app';

const MB = 1024 * 1024;

describe('API: files and survey parsing', () => {
  let t: TestApp;
  let designer: ApiAgent;
  let files: string;
  before(async () => ({ t, designer, files } = await startOnDemoProject()));
  after(async () => {
    await t.close();
  });

  it('uploads a PNG backdrop, lists it and serves its bytes with its type', async () => {
    const res = await designer.upload(files, { bytes: PNG_BYTES, filename: 'site plan.png', contentType: 'image/png' }, { kind: 'backdrop' }).expect(201);
    expect(res.body).to.include({ kind: 'backdrop', filename: 'site plan.png', mime: 'image/png', size: PNG_BYTES.length });
    expect(res.body.createdBy).to.equal('Dana Designer');
    const list = await (await t.signInAs('owner')).get(files).expect(200);
    expect(list.body.map((f: { id: string }) => f.id)).to.include(res.body.id);
    const bytes = await designer.get(`${files}/${res.body.id}`).buffer(true).parse(binaryBody).expect(200);
    expect(bytes.headers['content-type']).to.equal('image/png');
    expect(Buffer.compare(bytes.body, PNG_BYTES)).to.equal(0);
    await designer.delete(`${files}/${res.body.id}`).expect(204);
    await designer.get(`${files}/${res.body.id}`).expect(404);
  });

  it('keeps a non-ASCII file name and serves it in Content-Disposition (RFC 6266 filename*)', async () => {
    const res = await designer.upload(files, { bytes: PNG_BYTES, filename: '水路 plan.png' }, { kind: 'backdrop' }).expect(201);
    expect(res.body.filename).to.equal('水路 plan.png');
    const got = await designer.get(`${files}/${res.body.id}`).expect(200);
    // RFC 8187 percent-encoding of the UTF-8 bytes: 水 = E6 B0 B4, 路 = E8 B7 AF.
    expect(got.headers['content-disposition']).to.equal(`inline; filename="__ plan.png"; filename*=UTF-8''%E6%B0%B4%E8%B7%AF%20plan.png`);
    await designer.delete(`${files}/${res.body.id}`).expect(204);
  });

  it('accepts a JPEG by its magic bytes whatever the file is called', async () => {
    const res = await designer.upload(files, { bytes: JPEG_BYTES, filename: 'drone.dat' }, { kind: 'backdrop' }).expect(201);
    expect(res.body.mime).to.equal('image/jpeg');
  });

  it('a backdrop that is not PNG or JPEG → 415, even when named .png and sent as image/png', async () => {
    const res = await designer.upload(files, { bytes: Buffer.from('GIF89a....'), filename: 'fake.png', contentType: 'image/png' }, { kind: 'backdrop' });
    expect(res.status).to.equal(415);
    expect(res.body.error).to.include({ code: 'unsupported-type' });
    expect(res.body.error.message).to.match(/PNG or JPEG/);
  });

  it('a binary survey file → 415; a CSV survey is stored as text/csv', async () => {
    const bin = await designer.upload(files, { bytes: Buffer.from([0, 1, 2, 3, 0xff]), filename: 'pegs.csv' }, { kind: 'survey' });
    expect(bin.status).to.equal(415);
    const ok = await designer.upload(files, { bytes: Buffer.from(SURVEY_CSV), filename: 'pegs.csv' }, { kind: 'survey' }).expect(201);
    expect(ok.body.mime).to.equal('text/csv');
  });

  it('oversized files → 413 with the limit in the message (backdrop 8 MB, survey 2 MB)', async () => {
    const bigImage = Buffer.concat([PNG_BYTES, Buffer.alloc(8 * MB)]);
    const res = await designer.upload(files, { bytes: bigImage, filename: 'huge.png' }, { kind: 'backdrop' });
    expect(res.status).to.equal(413);
    expect(res.body.error).to.deep.equal({ code: 'too-large', message: 'The file is larger than 8 MB' });
    const bigCsv = Buffer.from('label,x,y,z\n' + 'a,1,2,3\n'.repeat(Math.ceil((2 * MB) / 8) + 10));
    const survey = await designer.upload(files, { bytes: bigCsv, filename: 'big.csv' }, { kind: 'survey' });
    expect(survey.status).to.equal(413);
    expect(survey.body.error.message).to.match(/2 MB/);
  });

  it('missing kind or file → 400 naming the field', async () => {
    const noKind = await designer.upload(files, { bytes: PNG_BYTES, filename: 'a.png' }).expect(400);
    expect(noKind.body.error.fields[0].path).to.equal('kind');
    const noFile = await designer.agent.post(files).set('x-csrf-token', designer.token).field('kind', 'backdrop').expect(400);
    expect(noFile.body.error.fields.map((f: { path: string }) => f.path)).to.include('file');
    // JSON where a file is expected is the wrong content type.
    const json = await designer.post(files, { kind: 'backdrop' }).expect(415);
    expect(json.body.error.code).to.equal('unsupported-type');
  });

  it('an estimator may list files but not upload (403)', async () => {
    const e = await t.signInAs('estimator');
    await e.get(files).expect(200);
    await e.upload(files, { bytes: PNG_BYTES, filename: 'a.png' }, { kind: 'backdrop' }).expect(403);
  });

  it('renames a file (keeping its extension when none is typed), says so in the audit log and in the download name', async () => {
    const up = await designer.upload(files, { bytes: PNG_BYTES, filename: 'IMG_2231.png' }, { kind: 'backdrop' }).expect(201);
    const renamed = await designer.patch(`${files}/${up.body.id}`, { filename: '  Ridge aerial  ' }).expect(200);
    expect(renamed.body).to.include({ id: up.body.id, filename: 'Ridge aerial.png', createdBy: 'Dana Designer' });
    const typedExt = await designer.patch(`${files}/${up.body.id}`, { filename: 'ridge/aerial.jpg' }).expect(200);
    expect(typedExt.body.filename).to.equal('ridge_aerial.jpg');
    const got = await designer.get(`${files}/${up.body.id}`).expect(200);
    expect(got.headers['content-disposition']).to.match(/filename="ridge_aerial\.jpg"/);
    const log = await (await t.signInAs('admin')).get('/api/team/audit').expect(200);
    const entries = log.body as { action: string; target: string }[];
    expect(entries.some((e) => e.action === 'file.rename' && e.target === 'Ridge aerial.png')).to.equal(true);
    await designer.patch(`${files}/${up.body.id}`, { filename: '   ' }).expect(400);
    await designer.patch(`${files}/${up.body.id}`, { filename: 'x', kind: 'survey' }).expect(400);
    await (await t.signInAs('estimator')).patch(`${files}/${up.body.id}`, { filename: 'nope' }).expect(403);
    await designer.delete(`${files}/${up.body.id}`).expect(204);
    await designer.patch(`${files}/${up.body.id}`, { filename: 'gone' }).expect(404);
  });

  it("answers a stored survey's points for the preview; an image has none (415)", async () => {
    const up = await designer.upload(files, { bytes: Buffer.from(SURVEY_CSV), filename: 'pegs.csv' }, { kind: 'survey' }).expect(201);
    const pts = await (await t.signInAs('owner')).get(`${files}/${up.body.id}/points`).expect(200);
    expect(pts.body.format).to.equal('csv');
    expect(pts.body.points.map((p: { label: string }) => p.label)).to.deep.equal(['Spring', 'Tank site']);
    expect(pts.body.points[1]).to.include({ x_m: 40, y_m: 310, elevation_m: 41 });
    const img = await designer.upload(files, { bytes: PNG_BYTES, filename: 'a.png' }, { kind: 'backdrop' }).expect(201);
    await designer.get(`${files}/${img.body.id}/points`).expect(415);
  });

  describe('POST survey/parse', () => {
    const parse = (a: ApiAgent, text: string, filename: string) =>
      a.upload(`/api/projects/${t.seeded!.demoProjectId}/survey/parse`, { bytes: Buffer.from(text), filename });

    it('parses a CSV into points in metres', async () => {
      const res = await parse(designer, 'name,easting_ft,northing_ft,elev_ft\nSpring box,0,0,100\n', 'pegs.csv').expect(200);
      expect(res.body.format).to.equal('csv');
      expect(res.body.points[0].label).to.equal('Spring box');
      expect(res.body.points[0].elevation_m).to.be.closeTo(30.48, 1e-9); // 100 ft = 30.48 m exactly (NIST SP 811)
    });

    it('a bad CSV line → 400 naming the line', async () => {
      const res = await parse(designer, 'label,x,y,elevation\nA,0,0,10\nB,5,5,ten\n', 'pegs.csv').expect(400);
      expect(res.body.error).to.deep.equal({ code: 'validation', message: 'line 3: elevation "ten" is not a number', line: 3 });
    });

    it('a GPX point without elevation → 400 naming the point', async () => {
      const gpx =
        '<?xml version="1.0"?><gpx version="1.1" xmlns="http://www.topografix.com/GPX/1/1"><trk><trkseg>' +
        '<trkpt lat="45.1" lon="-120.2"><ele>300</ele></trkpt><trkpt lat="45.2" lon="-120.3"></trkpt></trkseg></trk></gpx>';
      const res = await parse(designer, gpx, 'walk.gpx').expect(400);
      expect(res.body.error).to.deep.equal({ code: 'validation', message: 'point 2: elevation (<ele>) is missing', point: 2 });
    });

    it('is open to every member (an owner parses too)', async () => {
      const owner = await t.signInAs('owner');
      await parse(owner, SURVEY_CSV, 'pegs.csv').expect(200);
    });
  });
});
