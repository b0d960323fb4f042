import { expect } from 'chai';
import { METRES_PER_FOOT, parseSurveyCsv, SurveyError } from '../../../server/survey';

function failure(text: string): SurveyError {
  try {
    parseSurveyCsv(text);
  } catch (err) {
    if (err instanceof SurveyError) return err;
    throw err;
  }
  throw new Error('expected a SurveyError');
}

describe('survey CSV parser (pure)', () => {
  it('reads label/x/y/elevation in metres by default', () => {
    const r = parseSurveyCsv('label,x,y,elevation\nSpring,0,0,12.5\nTank,40,310,41\n');
    expect(r).to.deep.equal({
      format: 'csv',
      points: [
        { label: 'Spring', x_m: 0, y_m: 0, elevation_m: 12.5 },
        { label: 'Tank', x_m: 40, y_m: 310, elevation_m: 41 },
      ],
    });
  });

  it('accepts the column aliases (name, easting, northing, elev, z, ele) in any case', () => {
    for (const header of ['Name,Easting,Northing,Elev', 'point,east,north,Z', 'ID,X,Y,ele']) {
      const r = parseSurveyCsv(`${header}\nP1,1,2,3\n`);
      expect(r.points[0]).to.deep.equal({ label: 'P1', x_m: 1, y_m: 2, elevation_m: 3 });
    }
  });

  it('converts a _ft header suffix with the international foot, 0.3048 m exactly (NIST SP 811)', () => {
    expect(METRES_PER_FOOT).to.equal(0.3048);
    const r = parseSurveyCsv('label,x_ft,y_ft,elevation_ft\nA,10,20,100\n');
    expect(r.points[0].x_m).to.be.closeTo(3.048, 1e-12);
    expect(r.points[0].y_m).to.be.closeTo(6.096, 1e-12);
    expect(r.points[0].elevation_m).to.be.closeTo(30.48, 1e-12);
  });

  it('uses a units column per row; a _m suffix wins over it', () => {
    const r = parseSurveyCsv('label,x,y,elevation_m,units\nA,10,0,5,ft\nB,10,0,5,m\nC,10,0,5,\n');
    expect(r.points.map((p) => p.x_m)).to.deep.equal([10 * 0.3048, 10, 10]);
    expect(r.points.map((p) => p.elevation_m)).to.deep.equal([5, 5, 5]);
  });

  it('reads lat/lon/elevation (GPS exports) and keeps degrees as degrees', () => {
    const r = parseSurveyCsv('latitude,longitude,altitude\n45.5,-120.25,310\n');
    expect(r.points[0]).to.deep.equal({ lat: 45.5, lon: -120.25, elevation_m: 310 });
  });

  it('skips blank lines but keeps line numbers true to the file', () => {
    const err = failure('label,x,y,z\n\nA,0,0,1\n\nB,0,0,\n');
    expect(err.where).to.deep.equal({ line: 5 });
    expect(err.message).to.equal('line 5: elevation is missing');
  });

  it('names the first bad line: a non-number, a missing position, an unknown unit, a bad latitude', () => {
    expect(failure('label,x,y,z\nA,0,0,1\nB,east,0,1\n').message).to.equal('line 3: x "east" is not a number');
    expect(failure('label,x,y,z\nA,,0,1\n').message).to.equal('line 2: position is missing (need x and y)');
    expect(failure('label,x,y,z,units\nA,0,0,1,yards\n').message).to.equal('line 2: units "yards" is not ft or m');
    expect(failure('lat,lon,ele\n95,0,1\n').message).to.equal('line 2: lat 95 is outside ±90°');
  });

  it('rejects a header without elevation or without a position, on line 1', () => {
    expect(failure('label,x,y\nA,0,0\n').where).to.deep.equal({ line: 1 });
    expect(failure('label,elevation\nA,3\n').message).to.match(/^line 1: need x and y/);
  });

  it('rejects an empty file and a header with no points', () => {
    expect(failure('').message).to.match(/^line 1: the file is empty/);
    expect(failure('x,y,z\n').message).to.equal('line 2: no points after the header');
  });

  it('handles a UTF-8 byte-order mark and CRLF line ends (spreadsheet exports)', () => {
    const r = parseSurveyCsv('\uFEFFlabel,x,y,z\r\nA,1,2,3\r\n');
    expect(r.points).to.deep.equal([{ label: 'A', x_m: 1, y_m: 2, elevation_m: 3 }]);
  });
});
