import { GradientSolver, STATUS_CLOSED } from './gradient-solver';
import type { NetworkDocument } from './network-document';
import { compileNetwork, LINK_FLOAT, LINK_PUMP_CURVE, LINK_PUMP_FLOW, NODE_JUNCTION, NODE_TANK, patternFactor } from './network-model';
import { normaliseDocument } from './steady';
import { validateDocument } from './validate';
import type { Warning } from './warnings';

/**
 * Extended-period simulation: each time step is one implicit (backward Euler) solve in which the
 * tanks are unknowns with storage A/Δt (./gradient-solver), so tanks joined by short headers stay
 * stable at any step. Steps end at report times and hour boundaries (patterns, pump schedules) and
 * are cut where a tank reaches its max, min or a control level, so controls act on time; volumes
 * are the end-of-step flows times the step (exact for flows constant within a step). Behaviour:
 * - demands follow their hourly patterns and are pressure-driven (an outlet cut off from water
 *   delivers nothing; the shortfall is counted as unmet);
 * - pumps follow their 24-hour schedule (a solar pump's daylight factors scale its flow), stop when
 *   the control tank reaches stop_level_m, restart at start_level_m, and stop while the tank they
 *   draw from is at its low-water cut-off (restart 0.1 m above it) or empty;
 * - a full tank overflows (level held at max, the surplus counted); an empty tank (level at
 *   min_level_m) supplies nothing until it has refilled by 1 cm;
 * - float valves shut when the tank they feed is full and reopen 2 cm below.
 *
 * @param doc network document (validated here)
 * @param options duration_s and step_s (report interval), both seconds
 * @example
 * const day = simulate(hillSmallholding, { duration_s: 86400, step_s: 600 });
 * day.tanks['T1'].level_m // one level per report time
 */

export interface SimulateOptions {
  /** Length of the simulation, s. */
  duration_s: number;
  /** Report interval, s. */
  step_s: number;
  /** Hazen-Williams ω (default 10.67). */
  omega?: number;
}

export interface SimulationSummary {
  /** Per outlet (and tee with demand): delivered and unmet volume, m³. */
  outlets: Record<string, { delivered_m3: number; unmet_m3: number }>;
  /** Per pump: pumped volume, m³. */
  pumps: Record<string, { pumped_m3: number }>;
  /** Per tank: overflowed volume, m³; lowest level, m, and when it first occurred, s. */
  tanks: Record<string, { overflow_m3: number; lowest_level_m: number; lowest_time_s: number }>;
}

export interface TimeSeriesResult {
  times_s: number[];
  tanks: Record<string, { level_m: number[] }>;
  nodes: Record<string, { pressure_m: number[] }>;
  links: Record<string, { flow_m3s: number[] }>;
  pumps: Record<string, { on: boolean[] }>;
  summary: SimulationSummary;
  warnings: Warning[];
}

/** Refill an empty tank must gain before it supplies again, m. */
export const EMPTY_TANK_HYSTERESIS_M = 0.01;
/** Float valves reopen this far below the tank's max level, m. */
export const FLOAT_VALVE_DEADBAND_M = 0.02;
/** Low-water cut-offs release this far above their level, m. */
export const LOW_CUTOFF_RELEASE_M = 0.1;
/** Levels this close to an event level count as having reached it, m (steps are cut at events). */
const SNAP_M = 1e-7;
const LEVEL_EPS = 1e-9;

const TANK_NORMAL = 0;
const TANK_FULL = 1;
const TANK_EMPTY = 2;

function emptyResult(warnings: Warning[]): TimeSeriesResult {
  return { times_s: [], tanks: {}, nodes: {}, links: {}, pumps: {}, summary: { outlets: {}, pumps: {}, tanks: {} }, warnings };
}

/** Run an extended-period simulation (see module doc). Never throws on bad input. */
export function simulate(doc: unknown, options: SimulateOptions): TimeSeriesResult {
  const invalid = validateDocument(doc);
  if (!(options.duration_s >= 0) || !(options.step_s > 0)) {
    invalid.push({ code: 'invalid', element: null, message: `options.step_s: must be a positive number and duration_s ≥ 0 (got ${options.step_s}, ${options.duration_s})` });
  }
  if (invalid.length > 0) return emptyResult(invalid);
  const network: NetworkDocument = normaliseDocument(doc as NetworkDocument);
  if (!network.nodes.some((node) => node.kind === 'source' || node.kind === 'tank')) {
    return emptyResult([{ code: 'no-fixed-head', element: null, message: 'network: needs at least one source or tank to fix the head' }]);
  }
  const model = compileNetwork(network, { omega: options.omega });
  const solver = new GradientSolver(model);
  const state = solver.createState();
  state.pressureDriven = true;
  const n = model.nodeCount;
  const m = model.linkCount;
  const nodes = network.nodes;
  const links = network.links;

  const tanks: number[] = [];
  for (let i = 0; i < n; i++) if (model.nodeKind[i] === NODE_TANK) tanks.push(i);
  const level = new Float64Array(n);
  const minLevel = new Float64Array(n);
  const maxLevel = new Float64Array(n);
  const inflow = new Float64Array(n);
  const tankState = new Uint8Array(n);
  for (const i of tanks) {
    const t = nodes[i];
    if (t.kind !== 'tank') continue;
    level[i] = t.level_m; minLevel[i] = t.min_level_m; maxLevel[i] = t.max_level_m; inflow[i] = t.inflow_m3s ?? 0;
    tankState[i] = level[i] >= maxLevel[i] - LEVEL_EPS ? TANK_FULL : level[i] <= minLevel[i] + LEVEL_EPS ? TANK_EMPTY : TANK_NORMAL;
  }
  const idx = (id: string | undefined): number => (id === undefined ? -1 : model.nodeIndex.get(id) ?? -1);
  const pumpLinks: number[] = [];
  const controlTank = new Int32Array(m).fill(-1);
  const stopLevel = new Float64Array(m);
  const startLevel = new Float64Array(m);
  const cutoffTank = new Int32Array(m).fill(-1);
  const cutoffLevel = new Float64Array(m);
  const controlOn = new Uint8Array(m).fill(1);
  const cutoffOk = new Uint8Array(m).fill(1);
  const floatTank = new Int32Array(m).fill(-1);
  const floatOpen = new Uint8Array(m).fill(1);
  const schedules: (number[] | undefined)[] = new Array(m);
  links.forEach((link, k) => {
    if (link.kind === 'pump') {
      pumpLinks.push(k);
      schedules[k] = link.schedule;
      if (link.control) {
        controlTank[k] = idx(link.control.tank); stopLevel[k] = link.control.stop_level_m; startLevel[k] = link.control.start_level_m;
        controlOn[k] = level[controlTank[k]] < stopLevel[k] - LEVEL_EPS ? 1 : 0;
      }
      if (link.low_cutoff) {
        cutoffTank[k] = idx(link.low_cutoff.tank); cutoffLevel[k] = link.low_cutoff.level_m;
        cutoffOk[k] = level[cutoffTank[k]] > cutoffLevel[k] + LEVEL_EPS ? 1 : 0;
      }
    } else if (link.kind === 'valve' && model.linkKind[k] === LINK_FLOAT) {
      floatTank[k] = idx(link.tank);
      floatOpen[k] = level[floatTank[k]] < maxLevel[floatTank[k]] - LEVEL_EPS ? 1 : 0;
    }
  });
  const demandNodes: number[] = [];
  for (let i = 0; i < n; i++) if (model.nodeKind[i] === NODE_JUNCTION && (model.demandBase[i] > 0 || model.demandType[i] !== 0)) demandNodes.push(i);

  // outputs
  const times: number[] = [];
  const levelSeries = tanks.map(() => [] as number[]);
  const pressureSeries = Array.from({ length: n }, () => [] as number[]);
  const flowSeries = Array.from({ length: m }, () => [] as number[]);
  const onSeries = pumpLinks.map(() => [] as boolean[]);
  const delivered = new Float64Array(n);
  const unmet = new Float64Array(n);
  const pumped = new Float64Array(m);
  const overflow = new Float64Array(n);
  const lowest = Float64Array.from(level);
  const lowestAt = new Float64Array(n);
  const everEmpty = new Float64Array(n).fill(-1);
  let failedSolves = 0;
  const netIn = new Float64Array(n);

  const applyState = (t: number, dt: number): void => {
    for (const i of tanks) {
      const pinned = dt <= 0 || tankState[i] !== TANK_NORMAL;
      state.tankStorage[i] = pinned ? 0 : model.tankArea[i] / dt;
      state.tankInflow[i] = inflow[i];
      state.fixedHead[i] = model.elevation[i] + level[i];
    }
    for (let i = 0; i < n; i++) if (model.nodeKind[i] === NODE_JUNCTION) state.demandFactor[i] = patternFactor(model, model.nodePattern[i], t);
    const hour = Math.floor(t / 3600 + 1e-9) % 24;
    for (let k = 0; k < m; k++) {
      const f = model.from[k];
      const to = model.to[k];
      let closed = model.closedInDocument[k];
      let dir = 0;
      // empty tanks only receive
      if (tankState[f] === TANK_EMPTY && model.nodeKind[f] === NODE_TANK) dir = -1;
      if (tankState[to] === TANK_EMPTY && model.nodeKind[to] === NODE_TANK) dir = dir === -1 ? 0 : 1;
      const kind = model.linkKind[k];
      if (kind === LINK_PUMP_FLOW || kind === LINK_PUMP_CURVE) {
        const sched = schedules[k];
        const factor = sched ? sched[hour] : 1;
        const drawsFromEmpty = model.nodeKind[f] === NODE_TANK && tankState[f] === TANK_EMPTY;
        state.pumpFactor[k] = controlOn[k] && cutoffOk[k] && !drawsFromEmpty ? factor : 0;
        dir = 0;
      } else if (kind === LINK_FLOAT && !floatOpen[k]) closed = 1;
      state.linkClosed[k] = closed;
      state.linkDirection[k] = dir;
    }
  };

  const record = (t: number): void => {
    times.push(t);
    tanks.forEach((i, j) => levelSeries[j].push(level[i]));
    for (let i = 0; i < n; i++) pressureSeries[i].push(solver.head[i] - model.elevation[i]);
    for (let k = 0; k < m; k++) flowSeries[k].push(solver.flow[k]);
    pumpLinks.forEach((k, j) => onSeries[j].push(solver.status[k] !== STATUS_CLOSED && solver.flow[k] > 0));
  };

  const duration = options.duration_s;
  const oldLevel = new Float64Array(n);
  // the state at t = 0: tanks at their levels
  applyState(0, 0);
  if (!solver.solve(state, { accuracy: 1e-8 }).converged) failedSolves++;
  record(0);
  let t = 0;
  let nextReport = options.step_s;
  while (t < duration - 1e-6) {
    const nextHour = (Math.floor(t / 3600 + 1e-9) + 1) * 3600;
    let dt = Math.min(nextReport, duration, nextHour) - t;
    oldLevel.set(level);
    // implicit step; cut it at the first tank event (max, min, control levels) and redo
    for (let attempt = 0; attempt < 4; attempt++) {
      applyState(t, dt);
      if (!solver.solve(state, { warmStart: true, accuracy: 1e-8 }).converged) failedSolves++;
      netIn.fill(0);
      for (let k = 0; k < m; k++) { netIn[model.to[k]] += solver.flow[k]; netIn[model.from[k]] -= solver.flow[k]; }
      let fraction = 1;
      for (const i of tanks) {
        if (tankState[i] !== TANK_NORMAL) continue;
        const after = solver.head[i] - model.elevation[i];
        const before = oldLevel[i];
        const cross = (target: number): void => {
          if ((before < target - LEVEL_EPS && after > target + LEVEL_EPS) || (before > target + LEVEL_EPS && after < target - LEVEL_EPS)) {
            fraction = Math.min(fraction, (target - before) / (after - before));
          }
        };
        cross(maxLevel[i]);
        cross(minLevel[i]);
        for (const k of pumpLinks) {
          if (controlTank[k] === i) { cross(stopLevel[k]); cross(startLevel[k]); }
          if (cutoffTank[k] === i) { cross(cutoffLevel[k]); cross(cutoffLevel[k] + LOW_CUTOFF_RELEASE_M); }
        }
        for (let k = 0; k < m; k++) if (floatTank[k] === i) cross(maxLevel[i] - FLOAT_VALVE_DEADBAND_M);
      }
      if (fraction >= 1 - 1e-9 || attempt === 3 || dt * fraction < 1e-3) break;
      dt *= fraction;
    }
    // accept the step: levels, volumes
    for (const i of tanks) {
      const q = netIn[i] + inflow[i];
      if (tankState[i] === TANK_NORMAL) level[i] = solver.head[i] - model.elevation[i];
      else if (tankState[i] === TANK_FULL) { if (q > 0) overflow[i] += q * dt; else level[i] += (q * dt) / model.tankArea[i]; }
      else if (q > 0) level[i] += (q * dt) / model.tankArea[i];
    }
    for (const i of demandNodes) {
      delivered[i] += solver.demand[i] * dt;
      const req = solver.requested[i];
      if (req > 0) unmet[i] += Math.max(req - solver.demand[i], 0) * dt;
    }
    for (const k of pumpLinks) pumped[k] += Math.max(solver.flow[k], 0) * dt;
    t += dt;
    // state transitions at t (levels within a millimetre of a target snap to it)
    for (const i of tanks) {
      if (level[i] >= maxLevel[i] - SNAP_M && tankState[i] === TANK_NORMAL && level[i] > oldLevel[i]) { level[i] = maxLevel[i]; tankState[i] = TANK_FULL; }
      else if (tankState[i] === TANK_FULL && level[i] < maxLevel[i] - LEVEL_EPS) tankState[i] = TANK_NORMAL;
      if (level[i] <= minLevel[i] + SNAP_M && tankState[i] === TANK_NORMAL && level[i] < oldLevel[i]) {
        level[i] = minLevel[i]; tankState[i] = TANK_EMPTY;
        if (everEmpty[i] < 0) everEmpty[i] = t;
      }
      if (tankState[i] === TANK_EMPTY && level[i] >= minLevel[i] + EMPTY_TANK_HYSTERESIS_M - LEVEL_EPS) tankState[i] = TANK_NORMAL;
      if (level[i] < lowest[i] - 1e-12) { lowest[i] = level[i]; lowestAt[i] = t; }
    }
    for (const k of pumpLinks) {
      const c = controlTank[k];
      if (c >= 0) {
        if (controlOn[k] && level[c] >= stopLevel[k] - SNAP_M) controlOn[k] = 0;
        else if (!controlOn[k] && level[c] <= startLevel[k] + SNAP_M) controlOn[k] = 1;
      }
      const w = cutoffTank[k];
      if (w >= 0) {
        if (cutoffOk[k] && level[w] <= cutoffLevel[k] + SNAP_M) cutoffOk[k] = 0;
        else if (!cutoffOk[k] && level[w] >= cutoffLevel[k] + LOW_CUTOFF_RELEASE_M - SNAP_M) cutoffOk[k] = 1;
      }
    }
    for (let k = 0; k < m; k++) {
      const f = floatTank[k];
      if (f < 0) continue;
      if (floatOpen[k] && level[f] >= maxLevel[f] - SNAP_M) floatOpen[k] = 0;
      else if (!floatOpen[k] && level[f] <= maxLevel[f] - FLOAT_VALVE_DEADBAND_M + SNAP_M) floatOpen[k] = 1;
    }
    if (t >= nextReport - 1e-6 || t >= duration - 1e-6) {
      record(t);
      nextReport += options.step_s;
    }
  }

  const result = emptyResult([]);
  result.times_s = times;
  tanks.forEach((i, j) => {
    const id = model.nodeIds[i];
    result.tanks[id] = { level_m: levelSeries[j] };
    result.summary.tanks[id] = { overflow_m3: overflow[i], lowest_level_m: lowest[i], lowest_time_s: lowestAt[i] };
    if (everEmpty[i] >= 0) result.warnings.push({ code: 'tank-empty', element: id, message: `${id}: ran empty at ${formatTime(everEmpty[i])}` });
    if (overflow[i] > 1e-9) result.warnings.push({ code: 'tank-overflow', element: id, message: `${id}: overflowed ${round(overflow[i] * 1000)} L` });
  });
  for (let i = 0; i < n; i++) result.nodes[model.nodeIds[i]] = { pressure_m: pressureSeries[i] };
  for (let k = 0; k < m; k++) result.links[model.linkIds[k]] = { flow_m3s: flowSeries[k] };
  pumpLinks.forEach((k, j) => {
    result.pumps[model.linkIds[k]] = { on: onSeries[j] };
    result.summary.pumps[model.linkIds[k]] = { pumped_m3: pumped[k] };
  });
  for (const i of demandNodes) {
    const id = model.nodeIds[i];
    result.summary.outlets[id] = { delivered_m3: delivered[i], unmet_m3: unmet[i] };
    const total = delivered[i] + unmet[i];
    if (unmet[i] > 0.01 * total && unmet[i] > 1e-6) result.warnings.push({ code: 'unmet-demand', element: id, message: `${id}: ${round(unmet[i] * 1000)} L of ${round(total * 1000)} L requested was not delivered` });
  }
  if (failedSolves > 0) result.warnings.push({ code: 'not-converged', element: null, message: `network: ${failedSolves} time steps did not converge` });
  return result;
}

function round(v: number): number {
  return Math.round(v);
}

function formatTime(t: number): string {
  const d = Math.floor(t / 86400);
  const h = Math.floor((t % 86400) / 3600);
  const min = Math.floor((t % 3600) / 60);
  return `${d > 0 ? `day ${d + 1} ` : ''}${String(h).padStart(2, '0')}:${String(min).padStart(2, '0')}`;
}
