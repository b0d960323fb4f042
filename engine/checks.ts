import {
  LINK_PIPE as LINK_PIPE_,
  LINK_PRV as LINK_PRV_,
  LINK_PUMP_CURVE as LINK_PUMP_CURVE_,
  LINK_PUMP_FLOW as LINK_PUMP_FLOW_,
  NODE_JUNCTION as NODE_JUNCTION_,
  NODE_TANK as NODE_TANK_,
  type NetworkModel,
} from './network-model';
import type { NetworkDocument, PipeLink } from './network-document';
import type { Warning } from './warnings';

// local copies of imported constants read per element (see gradient-solver.ts)
const LINK_PIPE = LINK_PIPE_;
const LINK_PRV = LINK_PRV_;
const LINK_PUMP_CURVE = LINK_PUMP_CURVE_;
const LINK_PUMP_FLOW = LINK_PUMP_FLOW_;
const NODE_JUNCTION = NODE_JUNCTION_;
const NODE_TANK = NODE_TANK_;

/**
 * Design checks on a solved steady state (each one a common-practice rule; see REFERENCES.md):
 * - negative-pressure: a node below zero pressure, or a pipe whose HGL (linear between its end
 *   heads) falls below the pipe (ground profile minus cover) → air-lock / siphon risk;
 * - velocity-high: |v| above the limit (default 1.5 m/s ≈ 5 ft/s, Jarrett, Water Management, V2);
 * - over-rating: static pressure (highest connected fixed head, tanks full, minus the lowest point of
 *   the pipe) above the pipe's rating_m;
 * - below-minimum: an outlet below its min_pressure_m;
 * - disconnected: a node with no open path to a source or tank;
 * - unmet-demand: an outlet delivering less than 99 % of its requested flow;
 * - tank-empty: a tank at or below its minimum level.
 *
 * @example
 * const warnings = steadyChecks(model, solution, { velocityLimit_ms: 1.5 });
 */

/** Default velocity limit, m/s (5 ft/s, common practice, Jarrett 2000, V2). */
export const DEFAULT_VELOCITY_LIMIT_MS = 1.5;
/** Default burial depth of a pipe below its ground profile, m (18 in, common practice). */
export const DEFAULT_COVER_M = 0.45;

/**
 * The document with a project's default cover (the Profile tab's setting) written onto every pipe
 * that has none of its own; a pipe's own cover wins. The same document back when there is no project cover,
 * so every check downstream reads one `cover_m ?? DEFAULT_COVER_M`.
 */
export function withProjectCover(doc: NetworkDocument, cover_m: number | null | undefined): NetworkDocument {
  if (cover_m === null || cover_m === undefined) return doc;
  return { ...doc, links: doc.links.map((l) => (l.kind === 'pipe' && l.cover_m === undefined ? { ...l, cover_m } : l)) };
}

export interface SteadySolution {
  head: Float64Array;
  flow: Float64Array;
  demand: Float64Array;
  requested: Float64Array;
  active: Uint8Array;
  /** Tank levels, m (by node index; other entries ignored). */
  level: Float64Array;
  /** Links closed in this state (controls, shut valves). */
  closed: Uint8Array;
}

export interface CheckOptions {
  /** Velocity limit, m/s (default 1.5). */
  velocityLimit_ms?: number;
}

/** Run every steady check and return the warnings (none for a healthy design). */
export function steadyChecks(model: NetworkModel, s: SteadySolution, options: CheckOptions = {}): Warning[] {
  const out: Warning[] = [];
  const limit = options.velocityLimit_ms ?? DEFAULT_VELOCITY_LIMIT_MS;
  const doc = model.doc;
  for (let i = 0; i < model.nodeCount; i++) {
    const id = model.nodeIds[i];
    if (model.nodeKind[i] === NODE_TANK) {
      const node = doc.nodes[i];
      if (node.kind === 'tank' && node.level_m <= node.min_level_m)
        out.push({
          code: 'tank-empty',
          element: id,
          message: `${id}: tank level ${fmt(node.level_m)} m is at or below its minimum ${fmt(node.min_level_m)} m`,
        });
      continue;
    }
    if (model.nodeKind[i] !== NODE_JUNCTION) continue;
    const pressure = s.active[i] ? s.head[i] - model.elevation[i] : 0;
    if (!s.active[i]) out.push({ code: 'disconnected', element: id, message: `${id}: no open path to a source or tank` });
    else if (pressure < 0) out.push({ code: 'negative-pressure', element: id, message: `${id}: pressure ${fmt(pressure)} m is below zero` });
    const min = model.minPressure[i];
    if (!Number.isNaN(min) && pressure < min)
      out.push({ code: 'below-minimum', element: id, message: `${id}: pressure ${fmt(pressure)} m is below the outlet's minimum ${fmt(min)} m` });
    const req = s.requested[i];
    if (req > 0 && s.demand[i] < 0.99 * req)
      out.push({ code: 'unmet-demand', element: id, message: `${id}: delivers ${fmtFlow(s.demand[i])} of ${fmtFlow(req)} requested` });
  }
  const staticHead = staticHeads(model, s);
  for (let k = 0; k < model.linkCount; k++) {
    if (model.linkKind[k] !== LINK_PIPE) continue;
    const link = doc.links[k] as PipeLink;
    const id = link.id;
    const f = model.from[k];
    const t = model.to[k];
    const v = Math.abs(s.flow[k]) / model.area[k];
    if (v > limit) out.push({ code: 'velocity-high', element: id, message: `${id}: velocity ${fmt(v)} m/s is above ${fmt(limit)} m/s` });
    const cover = link.cover_m ?? DEFAULT_COVER_M;
    let lowest = Math.min(model.elevation[f], model.elevation[t]);
    if (link.profile && link.profile.length > 0) {
      for (const [, ground] of link.profile) lowest = Math.min(lowest, ground - cover);
      if (s.active[f] && s.active[t] && !s.closed[k]) {
        const last = link.profile[link.profile.length - 1][0];
        const span = last > 0 ? last : link.length_m;
        let worst = 0;
        let worstAt = 0;
        for (const [dist, ground] of link.profile) {
          const hgl = s.head[f] + (s.head[t] - s.head[f]) * Math.min(Math.max(dist / span, 0), 1);
          const deficit = ground - cover - hgl;
          if (deficit > worst) {
            worst = deficit;
            worstAt = dist;
          }
        }
        if (worst > 1e-9)
          out.push({
            code: 'negative-pressure',
            element: id,
            message: `${id}: HGL is ${fmt(worst)} m below the pipe at ${fmt(worstAt)} m from ${link.from}; air-lock / siphon risk at this high point`,
          });
      }
    }
    if (link.rating_m !== undefined) {
      const hs = Math.max(staticHead[f], staticHead[t]);
      const ps = hs - lowest;
      if (Number.isFinite(hs) && ps > link.rating_m)
        out.push({ code: 'over-rating', element: id, message: `${id}: static pressure ${fmt(ps)} m is above the pipe rating ${fmt(link.rating_m)} m` });
    }
  }
  return out;
}

/**
 * Static (no-flow) head per node, m: the highest fixed head (sources; tanks at max level; the
 * setting of a PRV feeding the part) reachable over open pipes and valves. Pumps and PRVs separate
 * parts. Static pressure = static head − elevation (common practice for pipe-class selection).
 * @example staticHeads(model, { closed: new Uint8Array(model.linkCount) })[i] - model.elevation[i]
 */
export function staticHeads(model: NetworkModel, s: Pick<SteadySolution, 'closed'>): Float64Array {
  const n = model.nodeCount;
  const parent = Int32Array.from({ length: n }, (_, i) => i);
  const find = (i: number): number => {
    while (parent[i] !== i) {
      parent[i] = parent[parent[i]];
      i = parent[i];
    }
    return i;
  };
  for (let k = 0; k < model.linkCount; k++) {
    const kind = model.linkKind[k];
    if (kind === LINK_PUMP_FLOW || kind === LINK_PUMP_CURVE || kind === LINK_PRV || s.closed[k]) continue;
    const a = find(model.from[k]);
    const b = find(model.to[k]);
    if (a !== b) parent[a] = b;
  }
  const best = new Float64Array(n).fill(-Infinity);
  const offer = (i: number, h: number): void => {
    const r = find(i);
    if (h > best[r]) best[r] = h;
  };
  model.doc.nodes.forEach((node, i) => {
    if (node.kind === 'source') offer(i, node.head_m);
    else if (node.kind === 'tank') offer(i, node.elevation_m + node.max_level_m);
  });
  for (let k = 0; k < model.linkCount; k++)
    if (model.linkKind[k] === LINK_PRV && !s.closed[k]) offer(model.to[k], model.elevation[model.to[k]] + model.prvSetting[k]);
  const out = new Float64Array(n);
  for (let i = 0; i < n; i++) out[i] = best[find(i)];
  return out;
}

function fmt(v: number): string {
  return (Math.round(v * 100) / 100).toString();
}

function fmtFlow(q: number): string {
  return `${(Math.round(q * 1e6) / 1e3).toString()} L/s`;
}
