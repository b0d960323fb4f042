import { DEFAULT_COVER_M, staticHeads } from '../checks';
import type { NetworkDocument, PipeLink } from '../network-document';
import { compileNetwork } from '../network-model';
import { normaliseDocument, solve, type SteadyResult } from '../steady';
import { FITTING_REACH_M, PROFILE_PROMINENCE_M } from '../review/rules';
import { FITTED_TEXT, profileFindings, WORKING_SHARE, type ProfileFinding } from './findings';
import type { Route } from './routes';

/**
 * The lines of a route's profile against distance from its start: ground, pipe (ground less the
 * pipe's cover, or the project default), the HGL at design flow (the steady solve; linear between
 * a pipe's end heads, friction being uniform along a pipe) and the static line (the highest fixed
 * head feeding the part with tanks at their full level, ./checks staticHeads; common practice for
 * pipe-class selection). Ground comes from a pipe's surveyed profile, scaled to its length, or
 * where it has none straight between its end elements' elevations (the segment says which).
 * Pipes meet their elements at the elements' elevations.
 *
 * @example
 * const p = profileRoute(hillSmallholding, findRoutes(hillSmallholding, 'T2', 'TR4')[0]);
 * p.findings.filter((f) => f.kind === 'high-point')
 */

export interface ProfilePoint {
  distance_m: number;
  ground_m: number;
  pipe_m: number;
  /** Hydraulic grade at design flow, m; NaN where the route has no supply. */
  hgl_m: number;
  /** Static head, m; NaN where nothing feeds the part. */
  static_m: number;
  /** Pipe (or valve / pump) this point lies on; the element id where it is one. */
  link: string;
  element?: string;
}

export interface ProfileElement {
  id: string;
  name?: string;
  kind: string;
  distance_m: number;
  elevation_m: number;
  /** Pressure at design flow, m of water; NaN with no supply. */
  pressure_m: number;
  static_pressure_m: number;
  supplied: boolean;
}

export interface ProfileSegment {
  link: string;
  kind: string;
  from_m: number;
  to_m: number;
  ground: 'survey' | 'straight' | 'none';
  cover_m: number;
  rating_m?: number;
}

export interface StaticMargin {
  /** Smallest margin between the working limit (share × rating) and the static pressure, m (negative: over). */
  working_margin_m: number;
  /** Smallest margin to the rating itself, m. */
  rating_margin_m: number;
  at_m: number;
  link: string;
}

export interface RouteProfile {
  route: Route;
  points: ProfilePoint[];
  elements: ProfileElement[];
  segments: ProfileSegment[];
  findings: ProfileFinding[];
  static_margin: StaticMargin | null;
  /** Where the ground comes from over the whole route. */
  ground: 'survey' | 'straight' | 'mixed';
}

export interface ProfileOptions {
  /** The steady result to draw the HGL from (solved here when absent). */
  steady?: SteadyResult;
  /** Cover for pipes without their own cover_m, m (project default; 0.45 m otherwise). */
  cover_m?: number;
  /** Share of the rating kept as the working limit (default 0.72, ASAE S376.1). */
  working_share?: number;
  /** Smallest rise or fall that makes a high or low point, m (default 0.3). */
  min_relief_m?: number;
}

export function profileRoute(input: NetworkDocument, route: Route, options: ProfileOptions = {}): RouteProfile {
  const doc = normaliseDocument(input);
  const steady = options.steady ?? solve(doc);
  const model = compileNetwork(doc);
  const statics = staticHeads(model, { closed: model.closedInDocument });
  const nodeById = new Map(doc.nodes.map((n, i) => [n.id, { node: n, i }]));
  const linkById = new Map(doc.links.map((l) => [l.id, l]));
  const disconnected = new Set(steady.warnings.filter((w) => w.code === 'disconnected').map((w) => w.element));
  const solvedOk = Object.keys(steady.nodes).length > 0;
  const head = (id: string): number => {
    const r = steady.nodes[id];
    return solvedOk && r && !disconnected.has(id) && Number.isFinite(r.head_m) ? r.head_m : Number.NaN;
  };
  const staticOf = (id: string): number => {
    const v = statics[nodeById.get(id)?.i ?? -1];
    return Number.isFinite(v) ? v : Number.NaN;
  };
  const defaultCover = options.cover_m ?? DEFAULT_COVER_M;
  const points: ProfilePoint[] = [];
  const elements: ProfileElement[] = [];
  const segments: ProfileSegment[] = [];
  let distance = 0;
  const addElement = (id: string, link: string): void => {
    const { node } = nodeById.get(id) as { node: NetworkDocument['nodes'][number]; i: number };
    const h = head(id);
    const sh = staticOf(id);
    points.push({ distance_m: distance, ground_m: node.elevation_m, pipe_m: node.elevation_m, hgl_m: h, static_m: sh, link, element: id });
    if (elements.length === 0 || elements[elements.length - 1].id !== id) {
      elements.push({
        id,
        name: node.name,
        kind: node.kind,
        distance_m: distance,
        elevation_m: node.elevation_m,
        pressure_m: h - node.elevation_m,
        static_pressure_m: sh - node.elevation_m,
        supplied: Number.isFinite(h),
      });
    }
  };
  route.links.forEach((linkId, j) => {
    const a = route.nodes[j];
    const b = route.nodes[j + 1];
    const link = linkById.get(linkId);
    if (!link) return;
    addElement(a, linkId);
    const start = distance;
    const ha = head(a);
    const hb = head(b);
    const sa = Math.max(staticOf(a), staticOf(b));
    if (link.kind === 'pipe') {
      const pipe = link as PipeLink;
      const cover = pipe.cover_m ?? defaultCover;
      const forward = pipe.from === a;
      const interior = interiorGround(pipe, forward);
      for (const [d, g] of interior) {
        const f = d / pipe.length_m;
        points.push({ distance_m: start + d, ground_m: g, pipe_m: g - cover, hgl_m: ha + (hb - ha) * f, static_m: sa, link: linkId });
      }
      distance = start + pipe.length_m;
      segments.push({
        link: linkId,
        kind: 'pipe',
        from_m: start,
        to_m: distance,
        ground: interior.length > 0 ? 'survey' : 'straight',
        cover_m: cover,
        rating_m: pipe.rating_m,
      });
    } else {
      segments.push({ link: linkId, kind: link.kind, from_m: start, to_m: start, ground: 'none', cover_m: 0 });
    }
    addElement(b, linkId);
  });
  const share = options.working_share ?? WORKING_SHARE;
  const findings = markFitted(
    doc,
    route,
    segments,
    profileFindings(points, segments, { working_share: share, min_relief_m: options.min_relief_m ?? PROFILE_PROMINENCE_M }),
  );
  const pipeSegs = segments.filter((s) => s.kind === 'pipe');
  const kinds = new Set(pipeSegs.map((s) => s.ground));
  return {
    route,
    points,
    elements,
    segments,
    findings,
    static_margin: staticMargin(points, segments, share),
    ground: kinds.size === 1 ? (kinds.has('survey') ? 'survey' : 'straight') : kinds.size === 0 ? 'straight' : 'mixed',
  };
}

/**
 * High and low points with the document's fittings: a pipe's air_valves_m / drains_m (from its
 * `from` end) within FITTING_REACH_M, or a tee's air_valve / drain at the point (engine/review/rules).
 */
function markFitted(doc: NetworkDocument, route: Route, segments: ProfileSegment[], findings: ProfileFinding[]): ProfileFinding[] {
  return findings.map((f) => {
    if (f.kind !== 'high-point' && f.kind !== 'low-point') return f;
    const high = f.kind === 'high-point';
    const seg = segments.find((s) => s.link === f.link);
    const link = doc.links.find((l) => l.id === f.link);
    let fitted = false;
    const node = doc.nodes.find(
      (n, _i) =>
        n.kind === 'tee' &&
        seg &&
        (Math.abs(f.at_m - seg.from_m) < 1e-9 || Math.abs(f.at_m - seg.to_m) < 1e-9) &&
        route.nodes[route.links.indexOf(f.link) + (Math.abs(f.at_m - seg.from_m) < 1e-9 ? 0 : 1)] === n.id,
    );
    if (node?.kind === 'tee') fitted = high ? node.air_valve === true : node.drain === true;
    if (!fitted && seg && link?.kind === 'pipe') {
      const forward = route.nodes[route.links.indexOf(link.id)] === link.from;
      const local = forward ? f.at_m - seg.from_m : seg.to_m - f.at_m;
      fitted = ((high ? link.air_valves_m : link.drains_m) ?? []).some((d) => Math.abs(d - local) <= FITTING_REACH_M);
    }
    return fitted ? { ...f, fitted, caution: FITTED_TEXT[f.kind] } : { ...f, fitted };
  });
}

/** Surveyed ground points strictly inside the pipe, as [distance from the route's side, elevation]. */
function interiorGround(pipe: PipeLink, forward: boolean): [number, number][] {
  const profile = pipe.profile;
  if (!profile || profile.length === 0) return [];
  const span = profile[profile.length - 1][0] > 0 ? profile[profile.length - 1][0] : pipe.length_m;
  const scaled = profile.map(([d, g]): [number, number] => [(d / span) * pipe.length_m, g]);
  const inside = scaled.filter(([d]) => d > 1e-9 && d < pipe.length_m - 1e-9);
  return forward ? inside : inside.map(([d, g]): [number, number] => [pipe.length_m - d, g]).reverse();
}

function staticMargin(points: ProfilePoint[], segments: ProfileSegment[], share: number): StaticMargin | null {
  let best: StaticMargin | null = null;
  for (const seg of segments) {
    if (seg.rating_m === undefined) continue;
    for (const p of points) {
      if (p.link !== seg.link || !Number.isFinite(p.static_m)) continue;
      const ps = p.static_m - p.pipe_m;
      const margin = share * seg.rating_m - ps;
      if (!best || margin < best.working_margin_m) best = { working_margin_m: margin, rating_margin_m: seg.rating_m - ps, at_m: p.distance_m, link: seg.link };
    }
  }
  return best;
}
