import { expect } from 'chai';
import type { NetworkDocument, PipeLink } from '../../../../../engine/network-document';
import { validateDocument } from '../../../../../engine/validate';
import { referenceAt, toLonLat } from '../../../../../engine/geo-reference';
import { createEditor } from '../layout/create-editor';
import { buildFromWalk } from './walk-to-network';
import type { WalkRecording } from './walk-types';

const EMPTY: NetworkDocument = { schema: 'runnel.network/1', headloss: 'hazen-williams', nodes: [], links: [] };
const REF = referenceAt(44.5, -122.1, 'demo');

/** A walk laid out in plan metres around REF: spring at (0,0) 320 m, down a bend to a trough at (200, 100). */
function walk(): WalkRecording {
  const at = (x: number, y: number) => {
    const [lon, lat] = toLonLat(REF, x, y);
    return { lat, lon };
  };
  const t = (i: number) => new Date(Date.UTC(2026, 11, 3, 10, 0, i)).toISOString();
  const point = (id: string, label: string, kind: WalkRecording['points'][number]['kind'], x: number, y: number, z: number) => ({
    id,
    recordedAt: t(0),
    ...at(x, y),
    accuracy_m: 3,
    label,
    kind,
    elevation_m: z,
    elevation_source: 'typed' as const,
    note: '',
    photo_id: null,
    poor_fix: false,
  });
  return {
    points: [
      point('p1', 'Spring', 'spring-box', 0, 0, 320),
      point('p2', 'Bend A', 'bend', 100, 0.5, 310),
      point('p3', 'Low gully', 'low-point', 150, 50, 296),
      point('p4', 'Trough 3', 'trough', 200, 100, 300),
    ],
    track: [
      [1, 1],
      [50, 0],
      [100, 0],
      [150, 50],
      [199, 99],
    ].map(([x, y], i) => ({ id: `t${i}`, recordedAt: t(i + 1), ...at(x, y), accuracy_m: 4, elevation_m: null })),
  };
}

describe('Walk: build the recorded points and track into the design', () => {
  it('makes a source and a trough at their places, and one pipe along the track with a ground profile', () => {
    const { doc, summary } = buildFromWalk({ ...EMPTY, layout: { geo: REF } }, walk(), 'North line', 'si');
    expect(summary.referenceSet).to.equal(false);
    expect(summary.elements).to.deep.equal(['Spring', 'Trough 3']);
    const spring = doc.nodes.find((n) => n.name === 'Spring')!;
    const trough = doc.nodes.find((n) => n.name === 'Trough 3')!;
    expect(spring).to.include({ kind: 'source', elevation_m: 320, x_m: 0, y_m: 0 });
    // its water surface stands above the ground as for a source placed from the palette (the same kind's defaults)
    const palette = createEditor();
    const placedId = palette.placeNode('source', { x: 0, y: 0 });
    const placed = palette.store.doc.nodes.find((n) => n.id === placedId) as { head_m: number; elevation_m: number };
    expect((spring as { head_m: number }).head_m - 320).to.be.closeTo(placed.head_m - placed.elevation_m, 1e-9);
    expect((spring as { head_m: number }).head_m).to.be.above(320);
    expect(trough).to.include({ kind: 'outlet', outlet_type: 'trough', elevation_m: 300 });
    expect(trough.x_m).to.be.closeTo(200, 0.01);
    const pipe = doc.links[0] as PipeLink & { length_source?: string };
    expect(pipe).to.include({ kind: 'pipe', name: 'North line', from: spring.id, to: trough.id, length_source: 'survey' });
    // The track bends at (100, 0): the simplified line keeps it, within 2 m.
    expect(pipe.vertices!.some(([x, y]) => Math.abs(x - 100) < 2 && Math.abs(y) < 2)).to.equal(true);
    // Profile: ends at the elements' elevations, the bend and the low gully in between.
    expect(pipe.profile![0]).to.deep.equal([0, 320]);
    expect(pipe.profile!.map(([, z]) => z)).to.deep.equal([320, 310, 296, 300]);
    const plan = 100 + Math.hypot(50, 50) * 2;
    expect(pipe.profile![pipe.profile!.length - 1][0]).to.be.closeTo(plan, 1);
    // the pipe lies on the slope: its length is the sloped length along the profile, Σ √(Δchainage² + Δz²)
    // (Pythagoras, C): √(100² + 10²) + √(70.7² + 14²) + √(70.7² + 4²) ≈ 100.5 + 72.1 + 70.8 = 243.4 m
    const sloped = pipe.profile!.slice(1).reduce((sum, [c, z], i) => sum + Math.hypot(c - pipe.profile![i][0], z - pipe.profile![i][1]), 0);
    expect(pipe.length_m).to.be.closeTo(sloped, 0.01);
    expect(pipe.length_m).to.be.closeTo(243.4, 1);
    expect(summary.surveyPoints).to.equal(4);
    expect(validateDocument(doc)).to.deep.equal([]);
  });

  it('sets the plan origin at the first fix when the project has no reference, and building again adds nothing', () => {
    const once = buildFromWalk(EMPTY, walk(), 'North line', 'us');
    expect(once.summary.referenceSet).to.equal(true);
    expect(once.doc.layout!['geo']).to.include({ source: 'walk' });
    const twice = buildFromWalk(once.doc, walk(), 'North line', 'us');
    expect(twice.summary.elements).to.deep.equal([]);
    expect(twice.summary.pipe).to.equal(null);
    expect(twice.doc.nodes).to.have.length(once.doc.nodes.length);
    expect(twice.doc.links).to.have.length(1);
  });

  it("shifts the phone's track altitudes onto the typed elevations' datum (median offset)", () => {
    const w = walk();
    // The phone reads 30 m high everywhere; the typed spring (320 m) and trough (300 m) sit on fixes 0 and 4.
    const ground = [320, 315, 310, 296, 300];
    w.track = w.track.map((t, i) => ({ ...t, elevation_m: ground[i] + 30 }));
    const { doc, summary } = buildFromWalk({ ...EMPTY, layout: { geo: REF } }, w, 'North line', 'si');
    expect(summary.notes).to.include('Track elevations from the phone shifted by −30.00 m to agree with the 4 typed elevations along it.');
    const survey = (doc.layout!['survey'] as { points: { label?: string; elevation_m: number }[] }).points.filter((p) => !p.label);
    expect(survey.map((p) => p.elevation_m)).to.deep.equal(ground);
  });

  it('adds tees where the track ends far from any element', () => {
    const w = walk();
    w.points = w.points.filter((p) => p.kind !== 'trough');
    const { doc, summary } = buildFromWalk({ ...EMPTY, layout: { geo: REF } }, w, 'Spur', 'si');
    expect(summary.elements).to.deep.equal(['Spring', 'J1']);
    expect(doc.nodes.find((n) => n.id === 'J1')).to.include({ kind: 'tee' });
  });
});
