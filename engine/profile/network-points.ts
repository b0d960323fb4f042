import type { NetworkDocument } from '../network-document';
import { solve, type SteadyResult } from '../steady';
import { profileRoute, type RouteProfile } from './profile-line';
import { supplyRoutes, type Route } from './routes';

/**
 * Every high and low point of a network's lines, found the one way the Profile screen finds them
 * (./findings turning points along ./profile-line routes, fittings marked there): along the route
 * from the nearest supply to each outlet (./routes supplyRoutes), then each pipe no such route
 * covers (a rising main, a dead-end spur) on its own. The review's profile checks and the
 * takeoff's air-release valves and drains both read this list.
 *
 * @example
 * networkTurningPoints(hillSmallholding).filter((p) => p.kind === 'high-point' && !p.fitted)
 */

export interface NetworkTurningPoint {
  kind: 'high-point' | 'low-point';
  /** The pipe the point lies on (for a point at a tee, the route's pipe arriving there). */
  link: string;
  /** The tee (or other element) the point sits on, when it is at one. */
  node?: string;
  /** Distance from the link's `from` end, m (0 or its length at a node). */
  along_m: number;
  /** Elevation of the pipe there, m (ground less cover; an element's own elevation). */
  elevation_m: number;
  /** An air-release valve (drain) in the document serves the point. */
  fitted: boolean;
}

/** The points of one route's profile, placed on their links and nodes. */
function pointsOf(profile: RouteProfile, route: Route, doc: NetworkDocument): NetworkTurningPoint[] {
  const out: NetworkTurningPoint[] = [];
  for (const f of profile.findings) {
    if (f.kind !== 'high-point' && f.kind !== 'low-point') continue;
    const j = route.links.indexOf(f.link);
    const seg = profile.segments.find((s) => s.link === f.link);
    if (j < 0 || !seg) continue;
    const link = doc.links.find((l) => l.id === f.link);
    const forward = link?.from === route.nodes[j];
    const atStart = Math.abs(f.at_m - seg.from_m) < 1e-9;
    const atEnd = Math.abs(f.at_m - seg.to_m) < 1e-9;
    const node = atStart ? route.nodes[j] : atEnd ? route.nodes[j + 1] : undefined;
    const fromRouteSide = f.at_m - seg.from_m;
    const length = seg.to_m - seg.from_m;
    const along = forward ? fromRouteSide : length - fromRouteSide;
    out.push({
      kind: f.kind,
      link: f.link,
      ...(node ? { node } : {}),
      along_m: Math.round(along * 1000) / 1000,
      elevation_m: f.elevation_m,
      fitted: f.fitted === true,
    });
  }
  return out;
}

/** High and low points of every line of a (valid) document; `steady` saves a solve when the caller has one. */
export function networkTurningPoints(doc: NetworkDocument, steady: SteadyResult = solve(doc)): NetworkTurningPoint[] {
  const seen = new Map<string, NetworkTurningPoint>();
  const keep = (p: NetworkTurningPoint): void => {
    const key = p.node ? `${p.kind}:node:${p.node}` : `${p.kind}:${p.link}@${p.along_m}`;
    const had = seen.get(key);
    if (!had) seen.set(key, p);
    else if (p.fitted && !had.fitted) seen.set(key, { ...had, fitted: true });
  };
  const covered = new Set<string>();
  for (const route of supplyRoutes(doc)) {
    route.links.forEach((id) => covered.add(id));
    for (const p of pointsOf(profileRoute(doc, route, { steady }), route, doc)) keep(p);
  }
  for (const l of doc.links) {
    if (l.kind !== 'pipe' || covered.has(l.id) || !l.profile || l.profile.length < 3) continue;
    const route: Route = { nodes: [l.from, l.to], links: [l.id], length_m: l.length_m };
    for (const p of pointsOf(profileRoute(doc, route, { steady }), route, doc)) keep(p);
  }
  return [...seen.values()];
}
