import { DEFAULT_COVER_M } from '../checks';
import { GRAVITY_MS2 } from '../constants';
import { darcyWeisbachHeadloss } from '../darcy-weisbach';
import { HW_OMEGA_SI, hazenWilliamsHeadloss } from '../hazen-williams';
import type { NetworkDocument, NetworkNode, PipeLink } from '../network-document';
import type { SizingCandidate } from './price-catalogue';

/**
 * What sizing must meet, per node and per pipe choice (SI units):
 * - an outlet needs its min_pressure_m; a pressure-dependent outlet its required_pressure_m (full
 *   demand); an emitter the pressure p = (q/k)^(1/x) at which it passes its design flow; the
 *   `minPressure_m` option raises every outlet and every tee with a demand to at least that;
 * - every other tee needs pressure ≥ 0 (the engine's negative-pressure check);
 * - along a profiled pipe the HGL must stay above the pipe (ground − cover), as in ../checks.
 *
 * @example requiredPressure({ id: 'O', kind: 'outlet', elevation_m: 0, demand_m3s: 1e-4, min_pressure_m: 7 }) // 7
 */

/** Required pressure at a tee or outlet, m of water (0 for fixed heads). */
export function requiredPressure(node: NetworkNode, minPressure_m?: number): number {
  if (node.kind === 'source' || node.kind === 'tank') return 0;
  let p = 0;
  const demand = node.demand_m3s > 0;
  if (node.kind === 'outlet') {
    p = Math.max(p, node.min_pressure_m ?? 0);
    const dm = node.demand_model;
    if (dm?.type === 'pressure-dependent') p = Math.max(p, dm.required_pressure_m);
    if (dm?.type === 'emitter' && dm.k > 0 && dm.exponent > 0 && demand) p = Math.max(p, Math.pow(node.demand_m3s / dm.k, 1 / dm.exponent));
  }
  if (minPressure_m !== undefined && (node.kind === 'outlet' || demand)) p = Math.max(p, minPressure_m);
  return p;
}

/** Design demand of a node, m³/s (0 for fixed heads). */
export function designDemand(node: NetworkNode): number {
  return node.kind === 'tee' || node.kind === 'outlet' ? Math.max(node.demand_m3s, 0) : 0;
}

export interface HydraulicSettings {
  headloss: NetworkDocument['headloss'];
  /** Hazen-Williams SI coefficient ω (default 10.67). */
  omega: number;
}

/** Roughness a pipe gets with a candidate (the candidate's, else the pipe's own). */
export function candidateRoughness(pipe: PipeLink, cand: SizingCandidate): number {
  return cand.roughness ?? pipe.roughness;
}

/**
 * Headloss of a pipe with a candidate at a flow (m): friction by the document's law plus the
 * pipe's minor loss K·v²/2g at the candidate diameter.
 */
export function pipeHeadloss(pipe: PipeLink, cand: SizingCandidate, flow_m3s: number, s: HydraulicSettings): number {
  const d = cand.diameter_m;
  const q = Math.abs(flow_m3s);
  const friction =
    s.headloss === 'darcy-weisbach'
      ? darcyWeisbachHeadloss(q, pipe.length_m, d, candidateRoughness(pipe, cand))
      : hazenWilliamsHeadloss(q, pipe.length_m, d, candidateRoughness(pipe, cand), s.omega ?? HW_OMEGA_SI);
  const area = (Math.PI * d * d) / 4;
  const v = q / area;
  return friction + ((pipe.minor_loss ?? 0) * v * v) / (2 * GRAVITY_MS2);
}

/**
 * Lowest head needed at the downstream end of a profiled pipe so the HGL (linear between the end
 * heads) stays at or above ground − cover everywhere: max over profile points of
 * (ground − cover − hL·(1 − s/L)), s measured from the upstream end. −∞ without a profile.
 * @param upstreamIsFrom true when water flows from `from` to `to`
 */
export function profileHeadFloor(pipe: PipeLink, headloss_m: number, upstreamIsFrom: boolean): number {
  if (!pipe.profile || pipe.profile.length === 0) return -Infinity;
  const cover = pipe.cover_m ?? DEFAULT_COVER_M;
  const last = pipe.profile[pipe.profile.length - 1][0];
  const span = last > 0 ? last : pipe.length_m;
  let floor = -Infinity;
  for (const [dist, ground] of pipe.profile) {
    const x = Math.min(Math.max(dist / span, 0), 1);
    const fromUp = upstreamIsFrom ? x : 1 - x;
    floor = Math.max(floor, ground - cover - headloss_m * (1 - fromUp));
  }
  return floor;
}
