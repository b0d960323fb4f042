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
interface Crossing {
  tank: number;
  target: number;
  fraction: number;
}

/** Run an extended-period simulation (see module doc). Never throws on bad input. */
export function simulate(doc: unknown, options: SimulateOptions): TimeSeriesResult {
  const parsed = parseDocument(doc);
  const invalid = parsed.ok ? [] : parsed.warnings;
  if (!(options.duration_s >= 0) || !(options.step_s > 0)) {
    invalid.push({
      code: 'invalid',
      element: null,
      message: `options.step_s: must be a positive number and duration_s ≥ 0 (got ${options.step_s}, ${options.duration_s})`,
    });
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
    level[i] = t.level_m;
    minLevel[i] = t.min_level_m;
    maxLevel[i] = t.max_level_m;
    state.tankInflow[i] = t.inflow_m3s ?? 0;
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
  // series sized once for every report (growing 30,000 arrays by push was a fifth of a week's run)
  const duration = options.duration_s;
  const reportCount = 1 + Math.max(0, Math.ceil((duration - 1e-6) / options.step_s));
  // (filled with NaN, a double, so the arrays are double arrays from the start and are not converted on the first write)
  const series = <T>(fill: T): T[] => new Array<T>(reportCount).fill(fill);
  const times = series(0);
  const levelSeries = tanks.map(() => series(Number.NaN));
  const pressureSeries = Array.from({ length: n }, () => series(Number.NaN));
  const flowSeries = Array.from({ length: m }, () => series(Number.NaN));
  const onSeries = controls.pumpLinks.map(() => series(false));
  const pumpLinks = controls.pumpLinks;
  let reports = 0;
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
    const r = reports++;
    times[r] = t;
    for (let j = 0; j < tanks.length; j++) levelSeries[j][r] = level[tanks[j]];
    for (let i = 0; i < n; i++) pressureSeries[i][r] = model.nodeKind[i] === NODE_TANK ? level[i] : solver.head[i] - model.elevation[i];
    for (let k = 0; k < m; k++) flowSeries[k][r] = solver.flow[k];
    for (let j = 0; j < pumpLinks.length; j++) onSeries[j][r] = solver.status[pumpLinks[j]] !== STATUS_CLOSED && solver.flow[pumpLinks[j]] > 0;
  };
  /**
   * A report at time tr inside the step just taken (t0, t0 + dt]: levels piecewise linear through
   * the start, the corrected midpoint and the end (each second order, so the interpolation adds at
   * most about an eighth of the step's error estimate); heads and flows on the line through the
   * midpoint's and the end's solves, which both ran under the step's own switches (a pump that
   * started at t0 is on at both). Tanks that were full or empty at t0 move linearly.
   */
  const { midLevel, midHead, midFlow } = stepper;
  const startMode = new Uint8Array(n);
  const levelAt = (i: number, s: number): number => {
    if (s === 1) return level[i];
    const l0 = stepper.level0[i];
    if (startMode[i] !== TANK_NORMAL) return l0 + s * (level[i] - l0);
    return s <= 0.5 ? l0 + 2 * s * (midLevel[i] - l0) : midLevel[i] + (2 * s - 1) * (level[i] - midLevel[i]);
  };
  /**
   * The step's error estimate; with a report strictly inside it, at least the interpolation's:
   * piecewise linear through the midpoint misses a curve by about an eighth of its second
   * difference L0 − 2·Lmid + L1 (exact for a parabola), and a fast transient after a switch (two
   * tanks equalising in minutes) shows up there even when both ends are right.
   */
  const stepError = (t0: number, dt: number): number => {
    let err = stepper.step(dt);
    const firstReport = reportTime(reportIndex);
    if (!(firstReport < t0 + dt - 1e-6)) return err;
    for (const i of tanks) {
      if (mode[i] !== TANK_NORMAL) continue;
      const e = Math.abs(stepper.level0[i] - 2 * midLevel[i] + stepper.level[i]) / 8;
      if (e > err) err = e;
    }
    return err;
  };
  const report = (tr: number, s: number): void => {
    if (s === 1) {
      record(tr);
      return;
    }
    const r = reports++;
    const { head, flow, status } = solver;
    times[r] = tr;
    for (let j = 0; j < tanks.length; j++) levelSeries[j][r] = levelAt(tanks[j], s);
    const w = 2 * s - 1; // −1 at the start, 0 at the midpoint, 1 at the end
    for (let i = 0; i < n; i++)
      pressureSeries[i][r] = model.nodeKind[i] === NODE_TANK ? levelAt(i, s) : midHead[i] + w * (head[i] - midHead[i]) - model.elevation[i];
    for (let k = 0; k < m; k++) flowSeries[k][r] = midFlow[k] + w * (flow[k] - midFlow[k]);
    for (let j = 0; j < pumpLinks.length; j++) {
      const k = pumpLinks[j];
      onSeries[j][r] = status[k] !== STATUS_CLOSED && midFlow[k] + w * (flow[k] - midFlow[k]) > 0;
    }
  };
  // the levels the last step crosses, earliest first by linear interpolation
  const switching: number[] = [];
  const crossing = (): Crossing | null => {
    let best: Crossing | null = null;
    for (const i of tanks) {
      const before = stepper.level0[i];
      const after = stepper.level[i];
      switching.length = 0;
      if (mode[i] === TANK_NORMAL) {
        switching.push(maxLevel[i], minLevel[i]);
        controls.switchLevels(i, switching);
      } else if (mode[i] === TANK_EMPTY) {
        switching.push(minLevel[i] + EMPTY_TANK_HYSTERESIS_M);
        controls.switchLevels(i, switching);
      } else continue;
      for (const target of switching) {
        const crosses =
          (before < target - SWITCH_SNAP_M && after > target + SWITCH_SNAP_M) || (before > target + SWITCH_SNAP_M && after < target - SWITCH_SNAP_M);
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
      if (Math.sign(g) === Math.sign(ghi)) {
        hi = d;
        ghi = g;
        if (side === -1) glo /= 2;
        side = -1;
      } else {
        lo = d;
        glo = g;
        if (side === 1) ghi /= 2;
        side = 1;
      }
      d = (lo * ghi - hi * glo) / (ghi - glo);
    }
    if (stepped !== d) stepper.step(d);
    return d;
  };

  applyState(0);
  if (!stepper.snapshot(level)) failedSolves++;
  record(0);
  let t = 0;
  // reports at whole multiples of step_s and at the end; steps are not cut at them (see report)
  let reportIndex = 1;
  const reportTime = (k: number): number => Math.min(k * options.step_s, duration);
  let suggest = Math.min(options.step_s, 3600);
  const onProgress = options.onProgress;
  let progressed = 0;
  while (t < duration - 1e-6) {
    const nextHour = (Math.floor(t / 3600 + 1e-9) + 1) * 3600;
    const boundary = Math.min(duration, nextHour);
    let dt = Math.min(suggest, boundary - t);
    if (boundary - t - dt < 1e-6) dt = boundary - t;
    applyState(t);
    stepper.level0.set(level);
    startMode.set(mode);
    const t0 = t;
    // error control: shrink until the step adds less than tol of level error, and where a report
    // falls inside the step, until the levels there are interpolated to tol as well
    let err = stepError(t, dt);
    while (err > tol && dt > 1e-3) {
      dt *= Math.max(0.2, 0.9 * Math.sqrt(tol / err));
      err = stepError(t, dt);
    }
    const full = boundary - t;
    suggest = err > 0 ? Math.min(dt * Math.min(4, 0.9 * Math.sqrt(tol / err)), 3600) : Math.max(dt * 4, full);
    // event location: end the step where the first tank crosses a level that switches something
    let switched = boundary - t - dt < 1e-6; // an hour boundary: patterns and schedules change
    for (let round = 0; round < 8; round++) {
      const c = crossing();
      if (!c) break;
      switched = true;
      dt = locate(c, dt);
      const reached = stepper.level[c.tank];
      if (Math.abs(reached - c.target) < 1e-5) stepper.level[c.tank] = c.target;
    }
    failedSolves += stepper.failed;
    // after a switch the next step starts no longer than a report step (and grows from there): a
    // fast transient right after it (tanks re-balancing) is then resolved, as between reports
    if (switched) suggest = Math.min(suggest, options.step_s);
    // accept: levels and volumes
    for (const i of tanks) {
      const v = stepper.tankVolume[i];
      if (mode[i] === TANK_FULL) {
        if (v >= 0) overflow[i] += v;
        else {
          level[i] = maxLevel[i] + v / model.tankArea[i];
          mode[i] = TANK_NORMAL;
        }
      } else level[i] = stepper.level[i];
    }
    for (const i of demandNodes) {
      delivered[i] += stepper.delivered[i];
      unmet[i] += Math.max(stepper.unmet[i], 0);
    }
    for (const k of controls.pumpLinks) pumped[k] += stepper.pumped[k];
    t += dt;
    // tank modes and switches at t
    for (const i of tanks) {
      const before = stepper.level0[i];
      if (mode[i] === TANK_NORMAL && level[i] >= maxLevel[i] - SWITCH_SNAP_M && level[i] > before) {
        level[i] = maxLevel[i];
        mode[i] = TANK_FULL;
      }
      if (mode[i] === TANK_NORMAL && level[i] <= minLevel[i] + SWITCH_SNAP_M && level[i] < before) {
        level[i] = minLevel[i];
        mode[i] = TANK_EMPTY;
        if (everEmpty[i] < 0) everEmpty[i] = t;
      }
      if (mode[i] === TANK_EMPTY && level[i] >= minLevel[i] + EMPTY_TANK_HYSTERESIS_M - SWITCH_SNAP_M) mode[i] = TANK_NORMAL;
      if (level[i] < lowest[i] - 1e-12) {
        lowest[i] = level[i];
        lowestAt[i] = t;
      }
    }
    while (reportIndex > 0 && reportTime(reportIndex) <= t + 1e-6) {
      const tr = reportTime(reportIndex);
      report(tr, t - tr <= 1e-6 ? 1 : (tr - t0) / (t - t0));
      reportIndex = tr >= duration - 1e-6 ? -1 : reportIndex + 1;
    }
    controls.update(level);
    if (onProgress && t >= (progressed + 0.01) * duration && t < duration - 1e-6) {
      progressed = t / duration;
      onProgress(progressed);
    }
  }
  onProgress?.(1);

  // (reportCount is exact; the trim only guards a rounding case it did not foresee)
  for (const list of [times, ...levelSeries, ...pressureSeries, ...flowSeries, ...onSeries]) if (list.length !== reports) list.length = reports;
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
    if (unmet[i] > 0.01 * total && unmet[i] > 1e-6)
      result.warnings.push({
        code: 'unmet-demand',
        element: id,
        message: `${id}: ${round(unmet[i] * 1000)} L of ${round(total * 1000)} L requested was not delivered`,
      });
  }
  if (failedSolves > 0)
    result.warnings.push({ code: 'not-converged', element: null, message: `network: ${failedSolves} network solves in the time steps did not converge` });
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
