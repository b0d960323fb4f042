/** Pure helpers of the Layout editor: colour scale, survey maths, GeoJSON export, kinds. */
import { expect } from 'chai';
import { createEditor } from '../../client/src/app/screens/layout/create-editor';
import { niceStep, projectOnPolyline } from '../../client/src/app/screens/layout/editor/geometry';
import { nearestSurveyPoint, profileAlong, toLocalPoints } from '../../client/src/app/screens/layout/editor/survey';
import { LINK_KINDS, NODE_KINDS, nextId, patchForPath, readPath } from '../../client/src/app/screens/layout/kinds';

describe('Layout editor: geometry and survey', () => {
  it('nice steps are 1, 2 or 5 times a power of ten', () => {
    expect([niceStep(73), niceStep(0.31), niceStep(1), niceStep(999)]).to.deep.equal([50, 0.2, 1, 500]);
  });

  it('projects onto a polyline with its chainage', () => {
    const r = projectOnPolyline({ x: 12, y: 3 }, [
      { x: 0, y: 0 },
      { x: 10, y: 0 },
      { x: 10, y: 10 },
    ]);
    expect(r.distance).to.be.closeTo(2, 1e-12);
    expect(r.chainage).to.be.closeTo(13, 1e-12);
  });

  it('local projection of lat/lon: 0.001° of latitude is about 111.2 m (mean Earth radius 6 371 008.8 m, IUGG)', () => {
    const pts = toLocalPoints([
      { lat: 45, lon: 10, elevation_m: 100 },
      { lat: 45.001, lon: 10, elevation_m: 101 },
      { lat: 45, lon: 10.001, elevation_m: 99 },
    ]);
    expect(pts[1].y_m).to.be.closeTo(111.195, 0.001);
    // East-west: the same angle shrinks by cos(45°).
    expect(pts[2].x_m).to.be.closeTo(111.195 * Math.SQRT1_2, 0.001);
  });

  it('nearest survey point and a ground profile along a pipe (3-4-5 slope gives the sloped length)', () => {
    const ed = createEditor();
    ed.placeNode('tank', { x: 0, y: 0 });
    ed.placeNode('outlet', { x: 80, y: 0 });
    ed.store.patchElement('T1', { elevation_m: 30 });
    ed.store.patchElement('O1', { elevation_m: 0 });
    ed.addLink('pipe', 'T1', 'O1');
    const survey = [
      { x_m: 40, y_m: 3, elevation_m: 15 },
      { x_m: 40, y_m: 50, elevation_m: 99 },
    ];
    expect(nearestSurveyPoint(survey, { x: 39, y: 0 })?.point.elevation_m).to.equal(15);
    const prof = profileAlong(ed.store.doc, 'P1', survey, 10);
    expect(prof?.profile).to.deep.equal([
      [0, 30],
      [40, 15],
      [80, 0],
    ]);
    expect(prof?.used).to.equal(1);
    // Each half: 40 m run, 15 m drop → √(40² + 15²) = 42.72 m.
    expect(prof?.groundLength_m).to.be.closeTo(2 * Math.hypot(40, 15), 0.01);
  });
});

describe('Layout editor: export and kinds', () => {
  it('every kind creates a record of its kind, draws a symbol and has a name field with a test id', () => {
    for (const def of Object.values(NODE_KINDS)) {
      const n = def.create('X1', 1, 2);
      expect(n.kind).to.equal(def.kind);
      expect(def.symbol(n).length).to.be.greaterThan(0);
      expect(def.fields.some((f) => f.testid === 'prop-name')).to.equal(true);
    }
    for (const def of Object.values(LINK_KINDS)) {
      expect(def.create('Y1', 'A', 'B', []).kind).to.equal(def.kind);
      expect(def.fields.every((f) => f.testid.startsWith('prop-'))).to.equal(true);
    }
  });

  it('ids, dotted paths and nested patches', () => {
    expect(nextId('P', ['P1', 'P7', 'Pu3'])).to.equal('P8');
    expect(nextId('Pu', ['P1', 'P7', 'Pu3'])).to.equal('Pu4');
    const o = { demand_model: { type: 'emitter', k: 1, exponent: 0.5 } };
    expect(readPath(o, 'demand_model.k')).to.equal(1);
    expect(patchForPath(o, 'demand_model.k', 2)).to.deep.equal({ demand_model: { type: 'emitter', k: 2, exponent: 0.5 } });
    expect(o.demand_model.k).to.equal(1);
  });
});

describe('Layout editor: pump daylight preset', () => {
  it('has 24 hourly factors in 0..1, zero through the night, summing to 8.7 full-flow hours', async () => {
    const { DAYLIGHT_SCHEDULE } = await import('../../client/src/app/screens/layout/kinds/pump-kind');
    expect(DAYLIGHT_SCHEDULE).to.have.length(24);
    expect(DAYLIGHT_SCHEDULE.every((f) => f >= 0 && f <= 1)).to.equal(true);
    expect([0, 1, 2, 3, 4, 5, 20, 21, 22, 23].map((h) => DAYLIGHT_SCHEDULE[h])).to.deep.equal(Array(10).fill(0));
    expect(DAYLIGHT_SCHEDULE.reduce((a, b) => a + b, 0)).to.be.closeTo(8.7, 1e-9);
  });
});
