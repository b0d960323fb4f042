import type { NetworkDocument, NetworkNode, SurveyPoint } from '../../../../../../engine/network-document';
import type { ParsedSurveyPoint } from '../../../../../../engine/survey-point';
import { linkPoints } from './document-store';
import { distance, Point, polylineLength, projectOnPolyline } from './geometry';

/** A point as returned by POST /api/projects/:id/survey/parse (one type, shared with the server). */
export type { ParsedSurveyPoint };

/** A survey point in local site metres (stored in doc.layout.survey.points; typed by the document schema). */
export type { SurveyPoint };

/** Mean Earth radius, m (IUGG mean radius R1 = 6 371 008.8 m). */
const EARTH_RADIUS_M = 6371008.8;

/**
 * Bring parsed points into local site metres. Points with x_m/y_m are kept; points with lat/lon
 * are projected with a local equirectangular projection about `origin` (default: the first
 * lat/lon point) — accurate to well under 0.1 % across a farm-sized site.
 */
export function toLocalPoints(points: ParsedSurveyPoint[], origin?: { lat: number; lon: number }): SurveyPoint[] {
  const first = origin ?? points.find((p) => p.lat !== undefined && p.lon !== undefined);
  const o = first && first.lat !== undefined && first.lon !== undefined ? { lat: first.lat, lon: first.lon } : null;
  const out: SurveyPoint[] = [];
  for (const p of points) {
    if (p.x_m !== undefined && p.y_m !== undefined) out.push({ label: p.label, x_m: p.x_m, y_m: p.y_m, elevation_m: p.elevation_m });
    else if (o && p.lat !== undefined && p.lon !== undefined) {
      const rad = Math.PI / 180;
      const x = (p.lon - o.lon) * rad * EARTH_RADIUS_M * Math.cos(o.lat * rad);
      const y = (p.lat - o.lat) * rad * EARTH_RADIUS_M;
      out.push({ label: p.label, x_m: x, y_m: y, elevation_m: p.elevation_m });
    }
  }
  return out;
}

/** The survey point nearest to p, with its plan distance, or null when there are none. */
export function nearestSurveyPoint(points: readonly SurveyPoint[], p: Point): { point: SurveyPoint; distance_m: number } | null {
  let best: { point: SurveyPoint; distance_m: number } | null = null;
  for (const s of points) {
    const d = distance(p, { x: s.x_m, y: s.y_m });
    if (!best || d < best.distance_m) best = { point: s, distance_m: d };
  }
  return best;
}

/** The survey points kept in a document (doc.layout.survey.points), or none. */
export function surveyPointsOf(doc: NetworkDocument): SurveyPoint[] {
  return doc.layout?.survey?.points ?? [];
}

/** Where a node's elevation came from (editor-only `elevation_source`; absent means typed). */
export type ElevationSource = NonNullable<NetworkNode['elevation_source']>;

/** A node's elevation provenance as stored. */
export function elevationSource(n: Pick<NetworkNode, 'elevation_source'>): ElevationSource | 'typed' {
  return n.elevation_source ?? 'typed';
}

/** Nodes whose elevation nobody has given yet (the plan asks for them and shows no pressures). */
export function unsetElevations(doc: NetworkDocument): string[] {
  return doc.nodes.filter((n) => elevationSource(n) === 'unset').map((n) => n.id);
}

/**
 * Best guess of the ground elevation at a point for a new element, and where it came from: the
 * nearest survey point, else the nearest existing node's elevation (unset when that one is unset
 * too), else nothing to go on (unset).
 */
export function groundGuess(doc: NetworkDocument, p: Point): { z: number | null; source: ElevationSource; from?: string } {
  const near = nearestSurveyPoint(surveyPointsOf(doc), p);
  if (near) return { z: near.point.elevation_m, source: 'survey', from: near.point.label };
  let best: { n: NetworkDocument['nodes'][number]; d: number } | null = null;
  for (const n of doc.nodes) {
    const d = distance(p, { x: n.x_m ?? 0, y: n.y_m ?? 0 });
    if (!best || d < best.d) best = { n, d };
  }
  if (!best || elevationSource(best.n) === 'unset') return { z: null, source: 'unset' };
  return { z: best.n.elevation_m, source: 'nearest', from: best.n.name || best.n.id };
}

/** Best guess of the ground elevation at a point (see `groundGuess`), or null. */
export function groundElevationAt(doc: NetworkDocument, p: Point): number | null {
  return groundGuess(doc, p).z;
}

/** One element whose elevation the survey would change, for the preview before applying. */
export interface SurveyChange {
  id: string;
  name: string;
  from_m: number;
  to_m: number;
  point: string;
  distance_m: number;
}

/**
 * What "apply survey elevations to all" would do: each node within `reach_m` of a survey point
 * takes the nearest point's elevation (a source's water surface moves with it). Nodes already at
 * that elevation are left out of the preview.
 */
export function surveyElevationChanges(doc: NetworkDocument, reach_m = 25): SurveyChange[] {
  const points = surveyPointsOf(doc);
  const out: SurveyChange[] = [];
  for (const n of doc.nodes) {
    const near = nearestSurveyPoint(points, { x: n.x_m ?? 0, y: n.y_m ?? 0 });
    if (!near || near.distance_m > reach_m) continue;
    const unset = elevationSource(n) === 'unset';
    if (!unset && Math.abs(near.point.elevation_m - n.elevation_m) < 0.005) continue;
    out.push({
      id: n.id,
      name: n.name || n.id,
      from_m: unset ? NaN : n.elevation_m,
      to_m: near.point.elevation_m,
      point: near.point.label ?? '',
      distance_m: near.distance_m,
    });
  }
  return out;
}

/** The document with the previewed survey elevations applied (marked as from the survey). */
export function withSurveyElevations(doc: NetworkDocument, changes: readonly SurveyChange[]): NetworkDocument {
  const by = new Map(changes.map((c) => [c.id, c]));
  return {
    ...doc,
    nodes: doc.nodes.map((n) => {
      const c = by.get(n.id);
      if (!c) return n;
      const mark = { elevation_m: c.to_m, elevation_source: 'survey' as const, elevation_from: c.point || undefined };
      return n.kind === 'source' ? { ...n, ...mark, head_m: n.head_m + (c.to_m - n.elevation_m) } : { ...n, ...mark };
    }),
  };
}

/** The survey point within `px` screen pixels of a point (given metres per pixel), or null: elements snap onto it. */
export function surveySnap(doc: NetworkDocument, p: Point, metresPerPx: number, px = 10): SurveyPoint | null {
  const near = nearestSurveyPoint(surveyPointsOf(doc), p);
  return near && near.distance_m <= px * metresPerPx ? near.point : null;
}

/**
 * Ground profile of a link from survey points within `corridor_m` of its line: pairs
 * [chainage from the `from` end (m), ground elevation (m)] sorted by chainage, starting at 0 and
 * ending at the plan length with the end nodes' elevations. The length along the ground is the
 * sum of the sloped segments (Pythagoras on each pair).
 */
export function profileAlong(
  doc: NetworkDocument,
  linkId: string,
  points: readonly SurveyPoint[],
  corridor_m = 10,
): { profile: [number, number][]; planLength_m: number; groundLength_m: number; used: number } | null {
  const link = doc.links.find((l) => l.id === linkId);
  if (!link) return null;
  const line = linkPoints(link, doc);
  const planLength = polylineLength(line);
  const a = doc.nodes.find((n) => n.id === link.from);
  const b = doc.nodes.find((n) => n.id === link.to);
  if (!a || !b || planLength <= 0) return null;
  const inner: [number, number][] = [];
  for (const s of points) {
    const proj = projectOnPolyline({ x: s.x_m, y: s.y_m }, line);
    if (proj.distance <= corridor_m && proj.chainage > 0.01 && proj.chainage < planLength - 0.01) inner.push([proj.chainage, s.elevation_m]);
  }
  inner.sort((p, q) => p[0] - q[0]);
  const round = (v: number) => Math.round(v * 100) / 100;
  const profile: [number, number][] = [[0, a.elevation_m], ...inner, [planLength, b.elevation_m]].map(([c, z]) => [round(c), round(z)]);
  let ground = 0;
  for (let i = 1; i < profile.length; i++) ground += Math.hypot(profile[i][0] - profile[i - 1][0], profile[i][1] - profile[i - 1][1]);
  return { profile, planLength_m: planLength, groundLength_m: round(ground), used: inner.length };
}
