/** Pure helpers of the Layout editor: survey maths, kinds, the solar pump's daylight curve. */
import { expect } from 'chai';
import { createEditor } from '../../client/src/app/screens/layout/create-editor';
import { niceStep, projectOnPolyline } from '../../client/src/app/screens/layout/editor/geometry';
import { nearestSurveyPoint, profileAlong, toLocalPoints } from '../../client/src/app/screens/layout/editor/survey';
import { LINK_KINDS, NODE_KINDS, nextId, patchForPath, readPath } from '../../client/src/app/screens/layout/kinds';
import type { NetworkDocument, PumpLink } from '../../engine/network-document';

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

describe('Layout editor: pump daylight preset and sun hours', () => {
  it('the preset is a clear day: dark at night, symmetric about solar noon (12:30 here), rising through the morning, inside the day length at 45° N', async () => {
    const { DAYLIGHT_SCHEDULE } = await import('../../client/src/app/screens/layout/kinds/pump-kind');
    expect(DAYLIGHT_SCHEDULE).to.have.length(24);
    expect(DAYLIGHT_SCHEDULE.every((f) => f >= 0 && f <= 1)).to.equal(true);
    // sunlight is symmetric about solar noon (any astronomy text): hour h mirrors hour 24 − h (centres h + ½ about 12:30)
    for (let h = 1; h < 24; h++) expect(DAYLIGHT_SCHEDULE[h], `hour ${h}`).to.equal(DAYLIGHT_SCHEDULE[24 - h]);
    for (let h = 1; h <= 12; h++) expect(DAYLIGHT_SCHEDULE[h], `hour ${h}`).to.be.at.least(DAYLIGHT_SCHEDULE[h - 1]);
    // lit hours no longer than a summer day: cos ω0 = −tan φ·tan δ at φ = 45°, δ = 23.44° gives ω0 = 115.7°,
    // a day of 2·115.7/15 = 15.4 h (sunrise equation, C), and no shorter than the 12 h of an equinox
    const lit = DAYLIGHT_SCHEDULE.filter((f) => f > 0).length;
    const dayLength = (2 * ((Math.acos(-Math.tan(Math.PI / 4) * Math.tan((23.44 * Math.PI) / 180)) * 180) / Math.PI)) / 15;
    expect(dayLength).to.be.closeTo(15.4, 0.05);
    expect(lit).to.be.within(12, dayLength);
  });

  it("typing the site's sun hours reshapes the curve: a pump then fills flow × sun hours a day (REFERENCES.md: daily volume ≈ full-sun flow × peak sun hours, common practice)", async () => {
    const { simulate } = await import('../../engine/simulate');
    const field = LINK_KINDS.pump.fields.find((f) => f.key === 'sun_hours')!;
    const pump = LINK_KINDS.pump.create('Pu1', 'W', 'T', [], 'si') as PumpLink;
    // 5.5 h: inside the 5–6 peak-sun hours solar pumps are commonly sized on (trade practice, M)
    const reshaped = { ...pump, ...(field.write!(pump, 5.5) as Partial<PumpLink>) };
    expect(field.read!(reshaped) as number).to.be.closeTo(5.5, 0.012); // shares rounded to 0.001 in 24 hours
    expect(reshaped.schedule!.every((f, h) => f <= 1 && f > 0 === pump.schedule![h] > 0)).to.equal(true);
    // 13 h of sun would need every lit hour full: capped at 1, all 13 lit hours run flat out
    const long = field.write!(pump, 13) as Partial<PumpLink>;
    expect(long.schedule!.filter((f) => f === 1)).to.have.length(13);
    // a day of that pump into a large tank, no control: 0.5 L/s × 5.5 h × 3600 s = 9.9 m³ (C)
    const doc: NetworkDocument = {
      schema: 'runnel.network/1',
      headloss: 'hazen-williams',
      nodes: [
        { id: 'W', kind: 'source', elevation_m: 0, head_m: 0 },
        { id: 'T', kind: 'tank', elevation_m: 10, diameter_m: 10, level_m: 0.5, min_level_m: 0.1, max_level_m: 5 },
      ],
      links: [{ id: 'Pu1', kind: 'pump', from: 'W', to: 'T', flow_m3s: 0.0005, schedule: reshaped.schedule }],
    };
    const day = simulate(doc, { duration_s: 86400, step_s: 600 });
    expect(day.summary.pumps['Pu1'].pumped_m3).to.be.closeTo(0.0005 * (field.read!(reshaped) as number) * 3600, 1e-6);
    expect(day.summary.pumps['Pu1'].pumped_m3).to.be.closeTo(9.9, 0.0005 * 0.012 * 3600);
  });
});
