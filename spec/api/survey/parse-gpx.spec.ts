import { expect } from 'chai';
import { detectSurveyFormat, parseSurveyGpx, SurveyError } from '../../../server/survey';

const gpx = (body: string) => `<?xml version="1.0" encoding="UTF-8"?>
<gpx version="1.1" creator="test" xmlns="http://www.topografix.com/GPX/1/1">${body}</gpx>`;

function failure(text: string): SurveyError {
  try {
    parseSurveyGpx(text);
  } catch (err) {
    if (err instanceof SurveyError) return err;
    throw err;
  }
  throw new Error('expected a SurveyError');
}

describe('survey GPX parser (pure)', () => {
  it('reads waypoints, route points and track points in document order (GPX 1.1: ele in metres)', () => {
    const r = parseSurveyGpx(
      gpx(`
      <wpt lat="45.10" lon="-120.20"><ele>312.5</ele><name>Spring box</name></wpt>
      <rte><rtept lat="45.11" lon="-120.21"><ele>305</ele></rtept></rte>
      <trk><trkseg><trkpt lat="45.12" lon="-120.22"><ele>298.25</ele></trkpt></trkseg></trk>`),
    );
    expect(r).to.deep.equal({
      format: 'gpx',
      points: [
        { label: 'Spring box', lat: 45.1, lon: -120.2, elevation_m: 312.5 },
        { lat: 45.11, lon: -120.21, elevation_m: 305 },
        { lat: 45.12, lon: -120.22, elevation_m: 298.25 },
      ],
    });
  });

  it('works without a namespace', () => {
    const r = parseSurveyGpx('<gpx><wpt lat="1" lon="2"><ele>3</ele></wpt></gpx>');
    expect(r.points).to.deep.equal([{ lat: 1, lon: 2, elevation_m: 3 }]);
  });

  it('names the bad point (1-based): missing ele, missing lat, a non-number lon', () => {
    const ok = '<trkpt lat="1" lon="2"><ele>3</ele></trkpt>';
    expect(failure(gpx(`<trk><trkseg>${ok}${ok}<trkpt lat="1" lon="2"/></trkseg></trk>`)).where).to.deep.equal({ point: 3 });
    expect(failure(gpx(`${'<wpt lat="1" lon="2"><ele>3</ele></wpt>'}<wpt lon="2"><ele>3</ele></wpt>`)).message).to.equal('point 2: lat is missing');
    expect(failure(gpx('<wpt lat="1" lon="west"><ele>3</ele></wpt>')).message).to.equal('point 1: lon "west" is not a number');
    expect(failure(gpx('<wpt lat="1" lon="2"><ele>high</ele></wpt>')).message).to.equal('point 1: elevation (<ele>) "high" is not a number');
  });

  it('rejects text that is not GPX and a GPX without points', () => {
    expect(failure('<kml></kml>').message).to.match(/^point 0: not a GPX file/);
    expect(failure('<gpx><wpt lat="1"').message).to.match(/^point 0: not a GPX file/);
    expect(failure(gpx('<metadata/>')).message).to.equal('point 1: the GPX file has no wpt, rtept or trkpt points');
  });

  it('tells GPX (XML), CSV (text) and binary apart', () => {
    expect(detectSurveyFormat(Buffer.from(gpx('')))).to.equal('gpx');
    expect(detectSurveyFormat(Buffer.from('x,y,z\n1,2,3\n'))).to.equal('csv');
    expect(detectSurveyFormat(Buffer.from([0x89, 0x50, 0x4e, 0x47, 0, 0]))).to.equal(null);
  });
});
