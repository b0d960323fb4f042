/**
 * High and low points of the lines, from the pipes' ground profiles and the tees' elevations: where
 * air gathers (wants an air-release valve) and where water stays (wants a drain).
 * A thin finder kept here until engine/profile offers its own; the review's rows only need
 * { element, at_m, kind, elevation_m }.
 *
 * Fittings are optional document fields (ignored by the solver; engine/document-schema.ts): on a pipe
 * `air_valves_m` and `drains_m` (distances from its `from` end, m); on a tee `air_valve` / `drain`.
 */
import type { NetworkDocument } from '../network-document';
import { FITTING_REACH_M, PROFILE_PROMINENCE_M } from './rules';

export interface ProfilePoint {
  kind: 'high' | 'low';
  /** The pipe (a point inside its profile) or the tee (a point at the node). */
  element: string;
  at_m?: number;
  elevation_m: number;
  /** A fitting of the right kind serves this point. */
  fitted: boolean;
}

/** Interior vertices of a profile that rise (or fall) at least `prominence` above (below) the lowest (highest) ground on each side. */
export function profileExtremes(profile: [number, number][], prominence = PROFILE_PROMINENCE_M): { kind: 'high' | 'low'; at_m: number; elevation_m: number }[] {
  const out: { kind: 'high' | 'low'; at_m: number; elevation_m: number }[] = [];
  for (let i = 1; i < profile.length - 1; i++) {
    const z = profile[i][1];
    const prev = profile[i - 1][1];
    const next = profile[i + 1][1];
    if (z > prev && z >= next) {
      const left = Math.min(...profile.slice(0, i).map((p) => p[1]));
      const right = Math.min(...profile.slice(i + 1).map((p) => p[1]));
      if (z - left >= prominence && z - right >= prominence) out.push({ kind: 'high', at_m: profile[i][0], elevation_m: z });
    } else if (z < prev && z <= next) {
      const left = Math.max(...profile.slice(0, i).map((p) => p[1]));
      const right = Math.max(...profile.slice(i + 1).map((p) => p[1]));
      if (left - z >= prominence && right - z >= prominence) out.push({ kind: 'low', at_m: profile[i][0], elevation_m: z });
    }
  }
  return out;
}

/** Every high and low point of the document's lines, with whether a fitting serves it. */
export function profilePoints(doc: NetworkDocument): ProfilePoint[] {
  const out: ProfilePoint[] = [];
  const elevation = new Map(doc.nodes.map((n) => [n.id, n.elevation_m]));
  for (const link of doc.links) {
    if (link.kind !== 'pipe' || !link.profile || link.profile.length < 3) continue;
    for (const p of profileExtremes(link.profile)) {
      const near = (list: number[] | undefined) => (list ?? []).some((d) => Math.abs(d - p.at_m) <= FITTING_REACH_M);
      out.push({ ...p, element: link.id, fitted: p.kind === 'high' ? near(link.air_valves_m) : near(link.drains_m) });
    }
  }
  // A tee is a high (low) point when the ground next to it along every line it joins is lower (higher) by the prominence.
  for (const node of doc.nodes) {
    if (node.kind !== 'tee') continue;
    const neighbours: number[] = [];
    for (const link of doc.links) {
      if (link.from !== node.id && link.to !== node.id) continue;
      const other = link.from === node.id ? link.to : link.from;
      const profile = link.kind === 'pipe' && link.profile && link.profile.length >= 2 ? link.profile : null;
      if (profile) neighbours.push(link.from === node.id ? profile[1][1] : profile[profile.length - 2][1]);
      else neighbours.push(elevation.get(other) ?? node.elevation_m);
    }
    if (neighbours.length < 2) continue;
    if (neighbours.every((z) => node.elevation_m - z >= PROFILE_PROMINENCE_M)) {
      out.push({ kind: 'high', element: node.id, elevation_m: node.elevation_m, fitted: node.air_valve === true });
    } else if (neighbours.every((z) => z - node.elevation_m >= PROFILE_PROMINENCE_M)) {
      out.push({ kind: 'low', element: node.id, elevation_m: node.elevation_m, fitted: node.drain === true });
    }
  }
  return out;
}
