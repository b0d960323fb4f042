import { HW_DIAMETER_EXPONENT, HW_FLOW_EXPONENT, HW_OMEGA_SI } from './hazen-williams';
import { minorLossCoefficient } from './minor-loss';
import type { NetworkDocument, NetworkLink, NetworkNode } from './network-document';

/**
 * The compiled, typed-array form of a validated network document that the solvers work on.
 * Compiling once (ids → indices, resistances, curve tables, matrix pattern) lets a simulation run
 * thousands of steady solves without re-reading the document. Units: SI throughout.
 *
 * @example
 * const model = compileNetwork(doc); // doc already passed validateDocument()
 */

export const NODE_JUNCTION = 0;
export const NODE_SOURCE = 1;
export const NODE_TANK = 2;

export const LINK_PIPE = 0;
export const LINK_PUMP_FLOW = 1;
export const LINK_PUMP_CURVE = 2;
export const LINK_SHUTOFF = 3;
export const LINK_CHECK = 4;
export const LINK_PRV = 5;
export const LINK_FLOAT = 6;

/** Demand laws of a node: none/fixed, pressure-dependent (Wagner et al. 1988), emitter q = k·p^x. */
export const DEMAND_FIXED = 0;
export const DEMAND_PRESSURE = 1;
export const DEMAND_EMITTER = 2;

/** Default minor-loss coefficient of an open valve without one (gate valve, common practice). */
export const DEFAULT_VALVE_MINOR_LOSS = 0.2;

export interface CompileOptions {
  /** Hazen-Williams SI coefficient ω (default 10.67). */
  omega?: number;
}

export interface NetworkModel {
  doc: NetworkDocument;
  headloss: 'hazen-williams' | 'darcy-weisbach';
  nodeCount: number;
  linkCount: number;
  nodeIds: string[];
  linkIds: string[];
  nodeIndex: Map<string, number>;
  linkIndex: Map<string, number>;
  nodeKind: Uint8Array;
  elevation: Float64Array;
  /** Source head, or tank floor elevation (head = elevation + level). */
  baseHead: Float64Array;
  tankArea: Float64Array;
  demandBase: Float64Array;
  demandType: Uint8Array;
  /** Pressure-dependent: required (full-demand) and zero-demand pressures, m. */
  pressureRequired: Float64Array;
  pressureZero: Float64Array;
  emitterK: Float64Array;
  emitterExponent: Float64Array;
  /** Pattern index per node (-1 none) into patterns. */
  nodePattern: Int32Array;
  patterns: Float64Array[];
  minPressure: Float64Array;
  linkKind: Uint8Array;
  from: Int32Array;
  to: Int32Array;
  length: Float64Array;
  diameter: Float64Array;
  area: Float64Array;
  /** Hazen-Williams resistance (m per (m³/s)^1.852) or relative roughness ε/D under Darcy-Weisbach. */
  resistance: Float64Array;
  roughnessRelative: Float64Array;
  /** Minor-loss coefficient m (m per (m³/s)²). */
  minor: Float64Array;
  /** Constant pump flow, m³/s. */
  pumpFlow: Float64Array;
  /** Curve points per pump: offsets into curveQ/curveH. */
  curveStart: Int32Array;
  curveEnd: Int32Array;
  curveQ: Float64Array;
  curveH: Float64Array;
  /** PRV setting (m of pressure at `to`). */
  prvSetting: Float64Array;
  /** Initially closed by the document (closed pipe, shut valve). */
  closedInDocument: Uint8Array;
}

function kindOfLink(link: NetworkLink): number {
  if (link.kind === 'pipe') return LINK_PIPE;
  if (link.kind === 'pump') return link.curve && link.curve.length > 0 ? LINK_PUMP_CURVE : LINK_PUMP_FLOW;
  switch (link.valve_type) {
    case 'check':
      return LINK_CHECK;
    case 'prv':
      return LINK_PRV;
    case 'float':
      return LINK_FLOAT;
    default:
      return LINK_SHUTOFF;
  }
}

/** Expand a pump curve to at least three points (one-point curves: 4/3·h0 shut-off, 2·Q0 run-out). */
function curvePoints(curve: [number, number][]): [number, number][] {
  const pts = [...curve].sort((a, b) => a[0] - b[0]);
  if (pts.length === 1) {
    const [q0, h0] = pts[0];
    return [
      [0, (4 / 3) * h0],
      [q0, h0],
      [2 * q0, 0],
    ];
  }
  return pts;
}

/**
 * Compile a validated document. Trusts types (call validateDocument first).
 * @param doc validated network document
 * @param options ω for Hazen-Williams (default 10.67)
 */
export function compileNetwork(doc: NetworkDocument, options: CompileOptions = {}): NetworkModel {
  const omega = options.omega ?? HW_OMEGA_SI;
  const n = doc.nodes.length;
  const m = doc.links.length;
  const nodeIndex = new Map<string, number>();
  doc.nodes.forEach((node, i) => nodeIndex.set(node.id, i));
  const linkIndex = new Map<string, number>();
  doc.links.forEach((link, k) => linkIndex.set(link.id, k));
  const patternIds = Object.keys(doc.patterns ?? {});
  const patterns = patternIds.map((id) => Float64Array.from((doc.patterns ?? {})[id]));
  const patternIndex = new Map(patternIds.map((id, i) => [id, i] as const));

  const model: NetworkModel = {
    doc,
    headloss: doc.headloss,
    nodeCount: n,
    linkCount: m,
    nodeIds: doc.nodes.map((x) => x.id),
    linkIds: doc.links.map((x) => x.id),
    nodeIndex,
    linkIndex,
    nodeKind: new Uint8Array(n),
    elevation: new Float64Array(n),
    baseHead: new Float64Array(n),
    tankArea: new Float64Array(n),
    demandBase: new Float64Array(n),
    demandType: new Uint8Array(n),
    pressureRequired: new Float64Array(n),
    pressureZero: new Float64Array(n),
    emitterK: new Float64Array(n),
    emitterExponent: new Float64Array(n),
    nodePattern: new Int32Array(n).fill(-1),
    patterns,
    minPressure: new Float64Array(n).fill(Number.NaN),
    linkKind: new Uint8Array(m),
    from: new Int32Array(m),
    to: new Int32Array(m),
    length: new Float64Array(m),
    diameter: new Float64Array(m),
    area: new Float64Array(m),
    resistance: new Float64Array(m),
    roughnessRelative: new Float64Array(m),
    minor: new Float64Array(m),
    pumpFlow: new Float64Array(m),
    curveStart: new Int32Array(m),
    curveEnd: new Int32Array(m),
    curveQ: new Float64Array(0),
    curveH: new Float64Array(0),
    prvSetting: new Float64Array(m),
    closedInDocument: new Uint8Array(m),
  };

  doc.nodes.forEach((node: NetworkNode, i) => {
    model.elevation[i] = node.elevation_m;
    if (node.kind === 'source') {
      model.nodeKind[i] = NODE_SOURCE;
      model.baseHead[i] = node.head_m;
      return;
    }
    if (node.kind === 'tank') {
      model.nodeKind[i] = NODE_TANK;
      model.baseHead[i] = node.elevation_m;
      model.tankArea[i] = (Math.PI * node.diameter_m * node.diameter_m) / 4;
      return;
    }
    model.nodeKind[i] = NODE_JUNCTION;
    model.demandBase[i] = node.demand_m3s;
    if (node.pattern !== undefined) model.nodePattern[i] = patternIndex.get(node.pattern) ?? -1;
    if (node.kind === 'outlet') {
      if (node.min_pressure_m !== undefined) model.minPressure[i] = node.min_pressure_m;
      const dm = node.demand_model;
      if (dm?.type === 'pressure-dependent') {
        model.demandType[i] = DEMAND_PRESSURE;
        model.pressureRequired[i] = dm.required_pressure_m;
        model.pressureZero[i] = dm.zero_pressure_m ?? 0;
      } else if (dm?.type === 'emitter') {
        model.demandType[i] = DEMAND_EMITTER;
        model.emitterK[i] = dm.k;
        model.emitterExponent[i] = dm.exponent;
      }
    }
  });

  const cq: number[] = [];
  const ch: number[] = [];
  const cPowers = new Map<number, number>();
  const dPowers = new Map<number, number>();
  doc.links.forEach((link, k) => {
    const kind = kindOfLink(link);
    model.linkKind[k] = kind;
    model.from[k] = nodeIndex.get(link.from) ?? -1;
    model.to[k] = nodeIndex.get(link.to) ?? -1;
    if (link.kind === 'pipe') {
      const d = link.diameter_m;
      model.length[k] = link.length_m;
      model.diameter[k] = d;
      model.area[k] = (Math.PI * d * d) / 4;
      if (doc.headloss === 'darcy-weisbach') model.roughnessRelative[k] = link.roughness / 1000 / d;
      else {
        // hazenWilliamsResistance (./hazen-williams) with the powers of each distinct C and
        // diameter taken once: a network uses a handful of each, and Math.pow is the costly part
        model.resistance[k] = (omega * link.length_m) / (power(cPowers, link.roughness, HW_FLOW_EXPONENT) * power(dPowers, d, HW_DIAMETER_EXPONENT));
      }
      model.minor[k] = minorLossCoefficient(link.minor_loss ?? 0, d);
      if (link.closed) model.closedInDocument[k] = 1;
    } else if (link.kind === 'valve') {
      const d = link.diameter_m;
      model.diameter[k] = d;
      model.area[k] = (Math.PI * d * d) / 4;
      model.minor[k] = minorLossCoefficient(link.minor_loss ?? DEFAULT_VALVE_MINOR_LOSS, d);
      if (link.valve_type === 'prv') model.prvSetting[k] = link.setting_m ?? 0;
      if (link.valve_type === 'shutoff' && link.open === false) model.closedInDocument[k] = 1;
    } else {
      model.pumpFlow[k] = link.flow_m3s ?? 0;
      model.curveStart[k] = cq.length;
      if (link.curve && link.curve.length > 0) {
        for (const [q, h] of curvePoints(link.curve)) {
          cq.push(q);
          ch.push(h);
        }
      }
      model.curveEnd[k] = cq.length;
    }
  });
  model.curveQ = Float64Array.from(cq);
  model.curveH = Float64Array.from(ch);
  return model;
}

/** x^e, remembered in `cache` by x. */
function power(cache: Map<number, number>, x: number, e: number): number {
  let v = cache.get(x);
  if (v === undefined) {
    v = Math.pow(x, e);
    cache.set(x, v);
  }
  return v;
}

/**
 * Hourly factor of pattern p at time t (s); 1 when p < 0. Hours wrap every 24.
 * @example patternFactor(model, model.nodePattern[i], 7.5 * 3600) // the 07:00–08:00 factor
 */
export function patternFactor(model: NetworkModel, p: number, time_s: number): number {
  if (p < 0) return 1;
  const pat = model.patterns[p];
  const hour = Math.floor(time_s / 3600 + 1e-9) % pat.length;
  return pat[hour < 0 ? hour + pat.length : hour];
}
