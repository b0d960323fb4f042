/**
 * What the plan says about each element after a steady solve, in the farm's terms: is each outlet
 * OK, close or short of the pressure its device needs; how near each junction sits to the rating
 * of the pipes it joins; how full each tank is; how hard each pipe works. The thresholds are the
 * review checklist's (engine/review/rules.ts), so the plan and the review never disagree:
 * - close: less than OUTLET_MARGIN_SHARE (10 %) above the requirement (review "caution");
 * - near rating: working pressure above WORKING_SHARE (72 %) of the lowest rating met there
 *   (ASABE S376, via the review's rule), over rating at 100 %;
 * - pipe work: velocity as a share of VELOCITY_LIMIT_MS (1.5 m/s, Jarrett): under 40 % light,
 *   under 80 % working, up to 100 % hard, above it over (the bands are our own, for line widths).
 *
 * @example
 * serviceStates(doc, solve(doc)).nodes['TR4'] // { state: 'ok', margin_m: 31.2, required_m: 3.5, … }
 */
import type { NetworkDocument, NetworkNode, OutletNode } from './network-document';
import { outletPressureStatus, requiredPressure } from './review/outlet-checks';
import { VELOCITY_LIMIT_MS, WORKING_SHARE } from './review/rules';
import type { SteadyResult } from './steady';

export type OutletState = 'ok' | 'close' | 'short' | 'no-supply' | 'unknown';
export type RatingState = 'fine' | 'near' | 'over';
export type PipeWork = 'idle' | 'light' | 'working' | 'hard' | 'over';

export interface NodeService {
  pressure_m: number;
  /** Outlets: what the device needs (min pressure, else a pressure-dependent model's full-flow pressure). */
  required_m?: number;
  /** pressure − required, m (outlets with a requirement). */
  margin_m?: number;
  state: OutletState;
  /** Pressure over the lowest rating of the pipes meeting here (0..), when any carries a rating. */
  ratingShare?: number;
  rating: RatingState;
  /** Tanks: water held now and when full, m³. */
  volume_m3?: number;
  capacity_m3?: number;
}

export interface LinkService {
  /** |velocity| over the velocity limit (pipes). */
  velocityShare: number;
  work: PipeWork;
}

export interface ServiceStates {
  nodes: Record<string, NodeService>;
  links: Record<string, LinkService>;
}

/** Share of the limit below which a pipe is "light", and below which it is "working". */
export const LIGHT_WORK_SHARE = 0.4;
export const WORKING_WORK_SHARE = 0.8;

/** Outlet verdict from its pressure and requirement (the review's outlet-pressure rule). */
export function outletState(pressure_m: number, required_m: number | undefined, supplied = true): OutletState {
  if (!supplied || !Number.isFinite(pressure_m)) return 'no-supply';
  if (required_m === undefined) return 'unknown';
  const verdict = outletPressureStatus(pressure_m, required_m);
  return verdict === 'fail' ? 'short' : verdict === 'caution' ? 'close' : 'ok';
}

export function ratingState(share: number | undefined): RatingState {
  if (share === undefined) return 'fine';
  return share >= 1 ? 'over' : share > WORKING_SHARE ? 'near' : 'fine';
}

export function pipeWork(velocity_ms: number, flowing: boolean): PipeWork {
  if (!flowing) return 'idle';
  const s = Math.abs(velocity_ms) / VELOCITY_LIMIT_MS;
  return s > 1 ? 'over' : s >= WORKING_WORK_SHARE ? 'hard' : s >= LIGHT_WORK_SHARE ? 'working' : 'light';
}

/** Water held by a cylindrical tank at a level, m³ (π d²/4 · level). */
export function tankVolume(diameter_m: number, level_m: number): number {
  return (Math.PI * diameter_m * diameter_m * Math.max(0, level_m)) / 4;
}

export function serviceStates(doc: NetworkDocument, res: SteadyResult): ServiceStates {
  const lowestRating = new Map<string, number>();
  for (const l of doc.links) {
    if (l.kind !== 'pipe' || l.rating_m === undefined) continue;
    for (const end of [l.from, l.to]) lowestRating.set(end, Math.min(lowestRating.get(end) ?? Infinity, l.rating_m));
  }
  // A valve joins two junctions without pipe of its own: each end meets the other's pipe too
  // (a wellhead before its check valve sees the rising main's pressure class).
  for (const l of doc.links) {
    if (l.kind !== 'valve') continue;
    const m = Math.min(lowestRating.get(l.from) ?? Infinity, lowestRating.get(l.to) ?? Infinity);
    if (Number.isFinite(m)) for (const end of [l.from, l.to]) lowestRating.set(end, m);
  }
  const nodes: Record<string, NodeService> = {};
  for (const n of doc.nodes) {
    const r = res.nodes[n.id];
    if (!r) continue;
    nodes[n.id] = nodeService(
      n,
      r.pressure_m,
      lowestRating.get(n.id),
      res.warnings.some((w) => w.code === 'disconnected' && w.element === n.id),
    );
  }
  const links: Record<string, LinkService> = {};
  for (const l of doc.links) {
    const r = res.links[l.id];
    if (!r) continue;
    const flowing = Math.abs(r.flow_m3s) > 1e-9 && r.status !== 'closed' && r.status !== 'check-closed';
    const v = l.kind === 'pipe' ? Math.abs(r.velocity_ms) : 0;
    links[l.id] = { velocityShare: v / VELOCITY_LIMIT_MS, work: l.kind === 'pipe' ? pipeWork(v, flowing) : flowing ? 'light' : 'idle' };
  }
  return { nodes, links };
}

function nodeService(n: NetworkNode, pressure_m: number, rating_m: number | undefined, disconnected: boolean): NodeService {
  if (n.kind === 'tank') {
    return {
      pressure_m,
      state: 'unknown',
      rating: 'fine',
      volume_m3: tankVolume(n.diameter_m, n.level_m),
      capacity_m3: tankVolume(n.diameter_m, n.max_level_m),
    };
  }
  if (n.kind === 'source') return { pressure_m, state: 'unknown', rating: 'fine' };
  const ratingShare = rating_m !== undefined && rating_m > 0 ? Math.max(0, pressure_m) / rating_m : undefined;
  const base = { pressure_m, ratingShare, rating: ratingState(ratingShare) };
  if (n.kind !== 'outlet') return { ...base, state: disconnected ? 'no-supply' : 'unknown' };
  const required_m = requiredPressure(n as OutletNode);
  const state = outletState(pressure_m, required_m, !disconnected);
  return { ...base, state, required_m, margin_m: required_m === undefined ? undefined : pressure_m - required_m };
}
