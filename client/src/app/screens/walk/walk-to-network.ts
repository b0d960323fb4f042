/**
 * "Build into the design": recorded points become elements and the track becomes one pipe with its
 * ground profile, in one new document (one save, one version). Pure; tested in
 * client/src/app/screens/walk/walk-to-network.spec.ts.
 *
 * Points of kind spring box, tank pad, tee and trough become a source, tank, tee and trough outlet at
 * their place and elevation; bends, high and low points and crossings stay survey points (they shape
 * the profile). Every point and every track fix with an elevation joins the document's survey, so
 * the Layout's survey tools use them. The track, simplified to bends 2 m off the straight line,
 * runs from the element nearest its start to the element nearest its end (within 30 m; a tee is
 * added where there is none); its profile comes from survey points within 10 m of the line.
 * Building again adds nothing twice: an element with the point's name within 2 m counts as built.
 */
import type { NetworkDocument, NetworkNode, NodeKind, PipeLink } from '../../../../../engine/network-document';
import { formatQuantity, type UnitSystem } from '../../../../../engine/units';
import { geoReferenceOf, type GeoReference, referenceAt, toLocal } from '../../../../../engine/geo-reference';
import { LINK_KINDS, NODE_KINDS, nextId } from '../layout/kinds';
import { profileAlong, type SurveyPoint } from '../layout/editor/survey';
import type { PointKind, WalkRecording } from './walk-types';
import { countOf } from '../../shared/count';

const ELEMENT_OF: Partial<Record<PointKind, NodeKind>> = { 'spring-box': 'source', 'tank-pad': 'tank', tee: 'tee', trough: 'outlet' };
const SAME_PLACE_M = 2;
const END_SNAP_M = 30;
const BEND_TOLERANCE_M = 2;
const PROFILE_CORRIDOR_M = 10;

export interface BuildSummary {
  elements: string[];
  pipe: { id: string; groundLength_m: number; profilePoints: number } | null;
  surveyPoints: number;
  referenceSet: boolean;
  notes: string[];
}

type XY = { x: number; y: number };

/** Douglas–Peucker: keeps the points farther than `tol` from the simplified line. */
function simplify(pts: XY[], tol: number): XY[] {
  if (pts.length <= 2) return pts;
  const [a, b] = [pts[0], pts[pts.length - 1]];
  const len = Math.hypot(b.x - a.x, b.y - a.y);
  let worst = -1;
  let worstD = 0;
  for (let i = 1; i < pts.length - 1; i++) {
    const p = pts[i];
    const d = len < 1e-9 ? Math.hypot(p.x - a.x, p.y - a.y) : Math.abs((b.x - a.x) * (a.y - p.y) - (a.x - p.x) * (b.y - a.y)) / len;
    if (d > worstD) {
      worstD = d;
      worst = i;
    }
  }
  if (worstD <= tol) return [a, b];
  return [...simplify(pts.slice(0, worst + 1), tol).slice(0, -1), ...simplify(pts.slice(worst), tol)];
}

function nearestNode(nodes: readonly NetworkNode[], p: XY): { node: NetworkNode; d: number } | null {
  let best: { node: NetworkNode; d: number } | null = null;
  for (const n of nodes) {
    const d = Math.hypot((n.x_m ?? 0) - p.x, (n.y_m ?? 0) - p.y);
    if (!best || d < best.d) best = { node: n, d };
  }
  return best;
}

const round2 = (v: number) => Math.round(v * 100) / 100;
const TIE_M = 15;

/**
 * Track elevations on the same datum as the typed ones. A phone's altitude is a height above the
 * WGS 84 ellipsoid, off from the site's datum (sea level, or a level's benchmark) by tens of metres,
 * while the offset stays nearly constant over a walk. Where typed points lie within 15 m of a fix
 * with an altitude, the median difference is applied to every fix; otherwise the altitudes are used as they are.
 */
function trackElevations(walk: WalkRecording, local: (p: { lat: number; lon: number }) => XY, units: UnitSystem, notes: string[]): (number | null)[] {
  const fixes = walk.track.map((t) => ({ at: local(t), z: t.elevation_m }));
  const diffs: number[] = [];
  for (const p of walk.points) {
    if (p.elevation_source !== 'typed') continue;
    const at = local(p);
    let best: { d: number; z: number } | null = null;
    for (const f of fixes) {
      if (f.z === null) continue;
      const d = Math.hypot(f.at.x - at.x, f.at.y - at.y);
      if (d <= TIE_M && (!best || d < best.d)) best = { d, z: f.z };
    }
    if (best) diffs.push(p.elevation_m - best.z);
  }
  diffs.sort((a, b) => a - b);
  const offset = diffs.length === 0 ? 0 : diffs.length % 2 ? diffs[(diffs.length - 1) / 2] : (diffs[diffs.length / 2 - 1] + diffs[diffs.length / 2]) / 2;
  if (Math.abs(offset) >= 0.05) {
    notes.push(
      `Track elevations from the phone shifted by ${offset > 0 ? '+' : '−'}${formatQuantity('elevation', Math.abs(offset), units)} to agree with the ${countOf(diffs.length, 'typed elevation')} along it.`,
    );
  }
  return fixes.map((f) => (f.z === null ? null : round2(f.z + offset)));
}

export function buildFromWalk(doc: NetworkDocument, walk: WalkRecording, walkName: string, units: UnitSystem): { doc: NetworkDocument; summary: BuildSummary } {
  const first = walk.points[0] ?? walk.track[0];
  if (!first) throw new Error('The walk has no points and no track yet.');
  const existingRef = geoReferenceOf(doc.layout);
  const ref: GeoReference = existingRef ?? referenceAt(first.lat, first.lon, 'walk');
  const summary: BuildSummary = { elements: [], pipe: null, surveyPoints: 0, referenceSet: !existingRef, notes: [] };
  if (!existingRef) summary.notes.push("The project had no geographic reference: the walk's first fix is now the plan's origin.");
  const local = (p: { lat: number; lon: number }) => {
    const l = toLocal(ref, p.lat, p.lon);
    return { x: round2(l.x_m), y: round2(l.y_m) };
  };

  const nodes = [...doc.nodes];
  const ids = () => [...nodes.map((n) => n.id), ...doc.links.map((l) => l.id)];
  for (const p of walk.points) {
    const kind = ELEMENT_OF[p.kind];
    if (!kind) continue;
    const at = local(p);
    if (nodes.some((n) => n.name === p.label && Math.hypot((n.x_m ?? 0) - at.x, (n.y_m ?? 0) - at.y) <= SAME_PLACE_M)) continue;
    const def = NODE_KINDS[kind];
    const made = def.create(nextId(def.prefix, ids()), at.x, at.y, units) as NetworkNode & Record<string, unknown>;
    const node: NetworkNode & Record<string, unknown> = { ...made, name: p.label, elevation_m: round2(p.elevation_m), ...(p.note ? { notes: p.note } : {}) };
    if (node.kind === 'source') node['head_m'] = round2(p.elevation_m + (made as { head_m: number }).head_m - made.elevation_m);
    if (node.kind === 'outlet') node['outlet_type'] = 'trough';
    nodes.push(node as NetworkNode);
    summary.elements.push(p.label);
  }

  const trackZ = trackElevations(walk, local, units, summary.notes);
  const survey: SurveyPoint[] = [
    ...walk.points.map((p) => ({ label: p.label, x_m: local(p).x, y_m: local(p).y, elevation_m: round2(p.elevation_m) })),
    ...walk.track.flatMap((t, i) => (trackZ[i] === null ? [] : [{ x_m: local(t).x, y_m: local(t).y, elevation_m: trackZ[i]! }])),
  ];
  const oldSurvey = (doc.layout?.['survey'] as { points?: SurveyPoint[]; filename?: string } | undefined) ?? {};
  const kept = (oldSurvey.points ?? []).filter((o) => !survey.some((s) => s.label === o.label && s.x_m === o.x_m && s.y_m === o.y_m));
  summary.surveyPoints = survey.length;

  let next: NetworkDocument = {
    ...doc,
    nodes,
    layout: {
      ...doc.layout,
      geo: ref,
      survey: { filename: oldSurvey.filename ? `${oldSurvey.filename} + ${walkName}` : walkName, format: 'gpx', points: [...kept, ...survey] },
    },
  };

  const line = walk.track.map(local);
  if (line.length < 2) {
    summary.notes.push('The track has fewer than two fixes: no pipe was drawn.');
    return { doc: next, summary };
  }
  const end = (p: XY, elevationNear: number | null): NetworkNode => {
    const near = nearestNode(next.nodes, p);
    if (near && near.d <= END_SNAP_M) return near.node;
    const def = NODE_KINDS.tee;
    const ground =
      elevationNear ??
      survey.reduce<{ z: number; d: number } | null>((best, s) => {
        const d = Math.hypot(s.x_m - p.x, s.y_m - p.y);
        return !best || d < best.d ? { z: s.elevation_m, d } : best;
      }, null)?.z ??
      0;
    const tee = {
      ...def.create(nextId(def.prefix, [...next.nodes.map((n) => n.id), ...next.links.map((l) => l.id)]), p.x, p.y, units),
      elevation_m: ground,
    } as NetworkNode;
    next = { ...next, nodes: [...next.nodes, tee] };
    summary.elements.push(tee.id);
    return tee;
  };
  const from = end(line[0], trackZ[0]);
  const to = end(line[line.length - 1], trackZ[trackZ.length - 1]);
  if (from.id === to.id) {
    summary.notes.push('The track starts and ends at the same element: no pipe was drawn.');
    return { doc: next, summary };
  }
  if (next.links.some((l) => l.kind === 'pipe' && l.name === walkName && l.from === from.id && l.to === to.id)) {
    summary.notes.push(`The pipe "${walkName}" was already built from this walk.`);
    return { doc: next, summary };
  }
  const bends = simplify(line, BEND_TOLERANCE_M)
    .slice(1, -1)
    .map((p): [number, number] => [p.x, p.y]);
  const def = LINK_KINDS.pipe;
  const pipe = {
    ...def.create(nextId(def.prefix, [...next.nodes.map((n) => n.id), ...next.links.map((l) => l.id)]), from.id, to.id, bends, units),
    name: walkName,
  } as PipeLink;
  next = { ...next, links: [...next.links, pipe] };
  const prof = profileAlong(next, pipe.id, survey, PROFILE_CORRIDOR_M);
  if (prof) {
    const surveyed: PipeLink = { ...pipe, profile: prof.profile, length_m: prof.groundLength_m, length_source: 'survey' };
    next = { ...next, links: next.links.map((l) => (l.id === pipe.id ? surveyed : l)) };
    summary.pipe = { id: pipe.id, groundLength_m: prof.groundLength_m, profilePoints: prof.profile.length };
  }
  return { doc: next, summary };
}
