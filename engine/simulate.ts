import { GradientSolver, STATUS_CLOSED as STATUS_CLOSED_ } from './gradient-solver';
import * as kinds from './network-model';
import { Controls, SWITCH_SNAP_M as SWITCH_SNAP_M_ } from './simulate-controls';
import * as tankModes from './simulate-step';
import { parseDocument } from './validate';
import type { Warning } from './warnings';

export { FLOAT_VALVE_DEADBAND_M, LOW_CUTOFF_RELEASE_M } from './simulate-controls';

// module-local copies of imported bindings read per step (see ./gradient-solver)
const { compileNetwork, NODE_JUNCTION, NODE_TANK, patternFactor } = kinds;
const { TANK_EMPTY, TANK_FULL, TANK_NORMAL, TankStepper } = tankModes;
const STATUS_CLOSED = STATUS_CLOSED_;
const SWITCH_SNAP_M = SWITCH_SNAP_M_;

/**
 * Extended-period simulation. Tank levels follow A·dh/dt = Σ flows in + inflow, integrated with
 * error control (./simulate-step: backward Euler whole and halved, extrapolated, each stage a
 * network solve with the tanks as unknowns, so tank banks joined by short headers stay stable):
 * sub-steps inside a report step shrink until each adds less than tolerance_m of level error and
 * grow again when it is quiet. Steps end at report times and hour boundaries (patterns, pump
 * schedules), and events are located exactly (to 0.1 µm of level): a tank filling to its max or
 * draining to its min, an empty tank refilled by 1 cm, a pump's stop/start and cut-off levels, a
 * float valve's shut/reopen levels. So levels, volumes and switching times do not depend on the
 * report step. Behaviour:
 * - demands follow their hourly patterns and are pressure-driven (an outlet cut off from water
 *   delivers nothing; the shortfall is counted as unmet);
 * - pumps and float valves switch by the rules of ./simulate-controls;
 * - a full tank overflows (level held at max, the surplus counted); an empty tank (level at
 *   min_level_m) supplies nothing until it has refilled by EMPTY_TANK_HYSTERESIS_M.
 * Reported pressures and flows are those at the end of the last half step (within tolerance_m of
 * the reported levels).
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
  /** Largest level error a step may add, m (default 1e-4: levels to well under 1 mm at any report step). */
  tolerance_m?: number;
  /**
   * Called with the fraction of the duration simulated (0 < fraction ≤ 1), at most about a hundred
   * times per run and always with 1 at the end: a worker forwards it to a progress bar.
   */
  onProgress?: (fraction: number) => void;
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
/** Default largest level error added per step, m. */
export const STEP_TOLERANCE_M = 1e-4;

function emptyResult(warnings: Warning[]): TimeSeriesResult {
  return { times_s: [], tanks: {}, nodes: {}, links: {}, pumps: {}, summary: { outlets: {}, pumps: {}, tanks: {} }, warnings };
}

/** The earliest level a tank crosses in the last step: tank, target level and linear time fraction. */
interface Crossing { tank: number; target: number; fraction: number }

/** Run an extended-period simulation (see module doc). Never throws on bad input. */
export function simulate(doc: unknown, options: SimulateOptions): TimeSeriesResult {
  const parsed = parseDocument(doc);
  const invalid = parsed.ok ? [] : parsed.warnings;
  if (!(options.duration_s >= 0) || !(options.step_s > 0)) {
    invalid.push({ code: 'invalid', element: null, message: `options.step_s: must be a positive number and duration_s ≥ 0 (got ${options.step_s}, ${options.duration_s})` });
  }
  if (!parsed.ok || invalid.length > 0) return emptyResult(invalid);
  const network = parsed.doc;
  if (!network.nodes.some((node) => node.kind === 'source' || node.kind === 'tank')) {
    return emptyResult([{ code: 'no-fixed-head', element: null, message: 'network: needs at least one source or tank to fix the head' }]);
  }
  const tol = options.tolerance_m ?? STEP_TOLERANCE_M;
  const model = compileNetwork(network, { omega: options.omega });
  const solver = new GradientSolver(model);
  const state = solver.createState();
  state.pressureDriven = true;
  const n = model.nodeCount;
  const m = model.linkCount;

  const tanks: number[] = [];
  for (let i = 0; i < n; i++) if (model.nodeKind[i] === NODE_TANK) tanks.push(i);
  const level = new Float64Array(n);
  const minLevel = new Float64Array(n);
  const maxLevel = new Float64Array(n);
  for (const i of tanks) {
    const t = network.nodes[i];
    if (t.kind !== 'tank') continue;
    level[i] = t.level_m; minLevel[i] = t.min_level_m; maxLevel[i] = t.max_level_m; state.tankInflow[i] = t.inflow_m3s ?? 0;
  }
  const controls = new Controls(model, level, maxLevel);
  const demandNodes: number[] = [];
  for (let i = 0; i < n; i++) if (model.nodeKind[i] === NODE_JUNCTION && (model.demandBase[i] > 0 || model.demandType[i] !== 0)) demandNodes.push(i);
  const stepper = new TankStepper(model, solver, state, tanks, demandNodes, controls.pumpLinks);
  const mode = stepper.mode;
  const empty = new Uint8Array(n);
  for (const i of tanks) {
    mode[i] = level[i] >= maxLevel[i] ? TANK_FULL : level[i] <= minLevel[i] ? TANK_EMPTY : TANK_NORMAL;
    empty[i] = mode[i] === TANK_EMPTY ? 1 : 0;
  }

  // outputs
  const times: number[] = [];
  const levelSeries = tanks.map(() => [] as number[]);
  const pressureSeries = Array.from({ length: n }, () => [] as number[]);
  const flowSeries = Array.from({ length: m }, () => [] as number[]);
  const onSeries = controls.pumpLinks.map(() => [] as boolean[]);
  const delivered = new Float64Array(n);
  const unmet = new Float64Array(n);
  const pumped = new Float64Array(m);
  const overflow = new Float64Array(n);
  const lowest = Float64Array.from(level);
  const lowestAt = new Float64Array(n);
  const everEmpty = new Float64Array(n).fill(-1);
  let failedSolves = 0;

  const applyState = (t: number): void => {
    for (let i = 0; i < n; i++) if (model.nodeKind[i] === NODE_JUNCTION) state.demandFactor[i] = patternFactor(model, model.nodePattern[i], t);
    for (const i of tanks) empty[i] = mode[i] === TANK_EMPTY ? 1 : 0;
    controls.apply(state, Math.floor(t / 3600 + 1e-9) % 24, empty);
    stepper.setDirections();
  };
  const record = (t: number): void => {
    times.push(t);
    tanks.forEach((i, j) => levelSeries[j].push(level[i]));
    for (let i = 0; i < n; i++) pressureSeries[i].push(model.nodeKind[i] === NODE_TANK ? level[i] : solver.head[i] - model.elevation[i]);
    for (let k = 0; k < m; k++) flowSeries[k].push(solver.flow[k]);
    controls.pumpLinks.forEach((k, j) => onSeries[j].push(solver.status[k] !== STATUS_CLOSED && solver.flow[k] > 0));
  };
  // the levels the last step crosses, earliest first by linear interpolation
  const switching: number[] = [];
  const crossing = (): Crossing | null => {
    let best: Crossing | null = null;
    for (const i of tanks) {
      const before = stepper.level0[i];
      const after = stepper.level[i];
      switching.length = 0;
      if (mode[i] === TANK_NORMAL) { switching.push(maxLevel[i], minLevel[i]); controls.switchLevels(i, switching); }
      else if (mode[i] === TANK_EMPTY) { switching.push(minLevel[i] + EMPTY_TANK_HYSTERESIS_M); controls.switchLevels(i, switching); }
      else continue;
      for (const target of switching) {
        const crosses = (before < target - SWITCH_SNAP_M && after > target + SWITCH_SNAP_M) || (before > target + SWITCH_SNAP_M && after < target - SWITCH_SNAP_M);
        if (!crosses) continue;
        const fraction = (target - before) / (after - before);
        if (!best || fraction < best.fraction) best = { tank: i, target, fraction };
      }
    }
    return best;
  };
  /** Shorten the step to where `c` is reached (Illinois regula falsi on the step length). */
  const locate = (c: Crossing, dt: number): number => {
    let lo = 0;
    let glo = stepper.level0[c.tank] - c.target;
    let hi = dt;
    let ghi = stepper.level[c.tank] - c.target;
    let side = 0;
    let d = dt * c.fraction;
    let stepped = -1;
    for (let it = 0; it < 40; it++) {
      stepper.step(d);
      stepped = d;
      const g = stepper.level[c.tank] - c.target;
      if (Math.abs(g) <= SWITCH_SNAP_M / 2 || hi - lo < 1e-9 * Math.max(1, dt)) break;
      if (Math.sign(g) === Math.sign(ghi)) { hi = d; ghi = g; if (side === -1) glo /= 2; side = -1; } else { lo = d; glo = g; if (side === 1) ghi /= 2; side = 1; }
      d = (lo * ghi - hi * glo) / (ghi - glo);
    }
    if (stepped !== d) stepper.step(d);
    return d;
  };

  const duration = options.duration_s;
  applyState(0);
  if (!stepper.snapshot(level)) failedSolves++;
  record(0);
  let t = 0;
  let nextReport = options.step_s;
  let suggest = Math.min(options.step_s, 3600);
  const onProgress = options.onProgress;
  let progressed = 0;
  while (t < duration - 1e-6) {
    const nextHour = (Math.floor(t / 3600 + 1e-9) + 1) * 3600;
    const boundary = Math.min(nextReport, duration, nextHour);
    let dt = Math.min(suggest, boundary - t);
    if (boundary - t - dt < 1e-6) dt = boundary - t;
    applyState(t);
    stepper.level0.set(level);
    // error control: shrink until the step adds less than tol of level error
    let err = stepper.step(dt);
    while (err > tol && dt > 1e-3) {
      dt *= Math.max(0.2, 0.9 * Math.sqrt(tol / err));
      err = stepper.step(dt);
    }
    const full = boundary - t;
    suggest = err > 0 ? Math.min(dt * Math.min(4, 0.9 * Math.sqrt(tol / err)), 3600) : Math.max(dt * 4, full);
    // event location: end the step where the first tank crosses a level that switches something
    for (let round = 0; round < 8; round++) {
      const c = crossing();
      if (!c) break;
      dt = locate(c, dt);
      const reached = stepper.level[c.tank];
      if (Math.abs(reached - c.target) < 1e-5) stepper.level[c.tank] = c.target;
    }
    failedSolves += stepper.failed;
    // accept: levels and volumes
    for (const i of tanks) {
      const v = stepper.tankVolume[i];
      if (mode[i] === TANK_FULL) {
        if (v >= 0) overflow[i] += v; else { level[i] = maxLevel[i] + v / model.tankArea[i]; mode[i] = TANK_NORMAL; }
      } else level[i] = stepper.level[i];
    }
    for (const i of demandNodes) { delivered[i] += stepper.delivered[i]; unmet[i] += Math.max(stepper.unmet[i], 0); }
    for (const k of controls.pumpLinks) pumped[k] += stepper.pumped[k];
    t += dt;
    // tank modes and switches at t
    for (const i of tanks) {
      const before = stepper.level0[i];
      if (mode[i] === TANK_NORMAL && level[i] >= maxLevel[i] - SWITCH_SNAP_M && level[i] > before) { level[i] = maxLevel[i]; mode[i] = TANK_FULL; }
      if (mode[i] === TANK_NORMAL && level[i] <= minLevel[i] + SWITCH_SNAP_M && level[i] < before) {
        level[i] = minLevel[i]; mode[i] = TANK_EMPTY;
        if (everEmpty[i] < 0) everEmpty[i] = t;
      }
      if (mode[i] === TANK_EMPTY && level[i] >= minLevel[i] + EMPTY_TANK_HYSTERESIS_M - SWITCH_SNAP_M) mode[i] = TANK_NORMAL;
      if (level[i] < lowest[i] - 1e-12) { lowest[i] = level[i]; lowestAt[i] = t; }
    }
    controls.update(level);
    if (t >= nextReport - 1e-6 || t >= duration - 1e-6) {
      record(t);
      nextReport += options.step_s;
    }
    if (onProgress && t >= (progressed + 0.01) * duration && t < duration - 1e-6) { progressed = t / duration; onProgress(progressed); }
  }
  onProgress?.(1);

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
  controls.pumpLinks.forEach((k, j) => {
    result.pumps[model.linkIds[k]] = { on: onSeries[j] };
    result.summary.pumps[model.linkIds[k]] = { pumped_m3: pumped[k] };
  });
  for (const i of demandNodes) {
    const id = model.nodeIds[i];
    result.summary.outlets[id] = { delivered_m3: delivered[i], unmet_m3: unmet[i] };
    const total = delivered[i] + unmet[i];
    if (unmet[i] > 0.01 * total && unmet[i] > 1e-6) result.warnings.push({ code: 'unmet-demand', element: id, message: `${id}: ${round(unmet[i] * 1000)} L of ${round(total * 1000)} L requested was not delivered` });
  }
  if (failedSolves > 0) result.warnings.push({ code: 'not-converged', element: null, message: `network: ${failedSolves} network solves in the time steps did not converge` });
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
