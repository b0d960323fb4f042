import { randomUUID } from 'node:crypto';
import { expect } from 'chai';
import { parseSurveyGpx } from '../../server/survey/parse-gpx';
import { JPEG_BYTES, PNG_BYTES } from './fixtures';
import { startOnDemoProject, type ApiAgent, type TestApp } from './test-app';

function point(label: string, i: number, extra: Record<string, unknown> = {}) {
  return {
    id: randomUUID(),
    recordedAt: new Date(Date.UTC(2026, 11, 3, 10, i)).toISOString(),
    lat: 44.5 + i * 1e-4,
    lon: -122.1,
    accuracy_m: 4,
    label,
    kind: 'tee',
    elevation_m: 300 - i,
    elevation_source: 'fix',
    note: '',
    ...extra,
  };
}
function fix(i: number, elevation: number | null = 300 - i / 2) {
  return {
    id: randomUUID(),
    recordedAt: new Date(Date.UTC(2026, 11, 3, 10, i, 30)).toISOString(),
    lat: 44.5 + i * 1e-4,
    lon: -122.1,
    accuracy_m: 5,
    elevation_m: elevation,
  };
}

describe('API: walks recorded on a phone', () => {
  let t: TestApp;
  let designer: ApiAgent;
  let base: string;
  before(async () => ({ t, designer, base } = await startOnDemoProject()));
  after(async () => {
    await t.close();
  });

  const surveyOf = async (fileId: string) => {
    const res = await designer
      .get(`${base}/files/${fileId}`)
      .buffer(true)
      .parse((r, cb) => {
        let text = '';
        r.on('data', (c: Buffer) => (text += c.toString('utf8')));
        r.on('end', () => cb(null, text));
      })
      .expect(200);
    expect(res.headers['content-type']).to.match(/gpx/);
    return parseSurveyGpx(res.body as string);
  };

  it('a sync writes a GPX survey file the survey parser reads; a retried sync adds nothing twice', async () => {
    const walkId = randomUUID();
    const body = { name: 'North line', points: [point('Spring', 0, { kind: 'spring-box' }), point('T1', 1)], track: [fix(0), fix(1, null), fix(2)] };
    const first = await designer.put(`${base}/walks/${walkId}`, body).expect(200);
    expect(first.body).to.include({ walkId, fileId: walkId, added: 5, points: 2, track: 3, filename: 'walk-North line.gpx' });
    const again = await designer.put(`${base}/walks/${walkId}`, body).expect(200);
    expect(again.body).to.include({ added: 0, points: 2, track: 3 });
    const survey = await surveyOf(walkId);
    // Two waypoints and the two track fixes that carry an elevation (the parser needs <ele>).
    expect(survey.points.map((p) => p.label ?? null)).to.deep.equal(['Spring', 'T1', null, null]);
    expect(survey.points[0]).to.include({ lat: 44.5, lon: -122.1, elevation_m: 300 });
    const list = await designer.get(`${base}/files`).expect(200);
    expect(list.body.filter((f: { id: string }) => f.id === walkId)).to.have.length(1);
    const walk = await designer.get(`${base}/walks/${walkId}`).expect(200);
    expect(walk.body.points.map((p: { label: string }) => p.label)).to.deep.equal(['Spring', 'T1']);
    expect(walk.body.track).to.have.length(3);
    expect(walk.body.track[1].elevation_m).to.equal(null);
  });

  it('two phones recording the same project keep every point, and a later sync adds only the new ones', async () => {
    const phoneA = randomUUID();
    const phoneB = randomUUID();
    const a1 = point('A1', 0);
    await designer.put(`${base}/walks/${phoneA}`, { name: 'Phone A', points: [a1], track: [] }).expect(200);
    await designer.put(`${base}/walks/${phoneB}`, { name: 'Phone B', points: [point('B1', 0), point('B2', 1)], track: [] }).expect(200);
    const later = await designer.put(`${base}/walks/${phoneA}`, { name: 'Phone A', points: [a1, point('A2', 2)], track: [] }).expect(200);
    expect(later.body).to.include({ added: 1, points: 2 });
    expect((await surveyOf(phoneA)).points.map((p) => p.label)).to.deep.equal(['A1', 'A2']);
    expect((await surveyOf(phoneB)).points.map((p) => p.label)).to.deep.equal(['B1', 'B2']);
  });

  it("a photo is stored once under the phone's id, and a point may only name an uploaded photo", async () => {
    const walkId = randomUUID();
    const photoId = randomUUID();
    const withPhoto = point('Trough 3', 0, { kind: 'trough', photo_id: photoId });
    const early = await designer.put(`${base}/walks/${walkId}`, { name: 'Photos', points: [withPhoto], track: [] }).expect(400);
    expect(early.body.error.message).to.equal('The photo of Trough 3 has not been uploaded yet');
    const upload = () =>
      designer.agent
        .put(`${base}/walks/${walkId}/photos/${photoId}`)
        .set('x-csrf-token', designer.token)
        .attach('file', JPEG_BYTES, { filename: 'trough.jpg', contentType: 'image/jpeg' });
    expect((await upload().expect(201)).body).to.deep.equal({ id: photoId, created: true });
    expect((await upload().expect(200)).body).to.deep.equal({ id: photoId, created: false });
    await designer.put(`${base}/walks/${walkId}`, { name: 'Photos', points: [withPhoto], track: [] }).expect(200);
    const list = await designer.get(`${base}/files`).expect(200);
    expect(list.body.filter((f: { id: string }) => f.id === photoId).map((f: { kind: string }) => f.kind)).to.deep.equal(['photo']);
  });

  it('refuses a photo that is not an image (415) or larger than 2 MB (413)', async () => {
    const put = (bytes: Buffer) =>
      designer.agent
        .put(`${base}/walks/${randomUUID()}/photos/${randomUUID()}`)
        .set('x-csrf-token', designer.token)
        .attach('file', bytes, { filename: 'x.jpg', contentType: 'image/jpeg' });
    expect((await put(Buffer.from('not an image')).expect(415)).body.error.message).to.match(/JPEG or PNG/);
    expect((await put(Buffer.concat([PNG_BYTES, Buffer.alloc(2 * 1024 * 1024)])).expect(413)).body.error.message).to.match(/larger than 2 MB/);
  });

  it('names the bad field of a bad point and writes nothing', async () => {
    const walkId = randomUUID();
    const res = await designer
      .put(`${base}/walks/${walkId}`, {
        name: 'Bad',
        points: [point('ok', 0), { ...point('far', 1), lat: 123 }, { ...point('', 2) }],
        track: [],
      })
      .expect(400);
    expect(res.body.error.fields).to.deep.include({ path: 'points.1.lat', message: 'must be within ±90°' });
    expect(res.body.error.fields).to.deep.include({ path: 'points.2.label', message: 'is required' });
    await designer.get(`${base}/walks/${walkId}`).expect(404);
    await designer.get(`${base}/files/${walkId}`).expect(404);
  });

  it('another team cannot read or write the walk', async () => {
    const walkId = randomUUID();
    await designer.put(`${base}/walks/${walkId}`, { name: 'Mine', points: [point('P', 0)], track: [] }).expect(200);
    const other = await t.signInAs('other');
    await other.get(`${base}/walks/${walkId}`).expect(404);
    await other.put(`${base}/walks/${walkId}`, { name: 'Theirs', points: [], track: [] }).expect(404);
  });
});
