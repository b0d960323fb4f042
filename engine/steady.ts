import { steadyChecks, type CheckOptions } from './checks';
import {
  GradientSolver,
  STATUS_ACTIVE as STATUS_ACTIVE_,
  STATUS_CHECK_CLOSED as STATUS_CHECK_CLOSED_,
  STATUS_OPEN as STATUS_OPEN_,
  STATUS_SHUT as STATUS_SHUT_,
  STATUS_CLOSED as STATUS_CLOSED_,
  STATUS_ISOLATED as STATUS_ISOLATED_,
  STATUS_NAMES as STATUS_NAMES_,
  type SolverState,
} from './gradient-solver';
import type { NetworkDocument } from './network-document';
import {
  compileNetwork,
  LINK_PRV,
  LINK_PUMP_CURVE as LINK_PUMP_CURVE_,
  LINK_PUMP_FLOW as LINK_PUMP_FLOW_,
  NODE_JUNCTION as NODE_JUNCTION_,
  type NetworkModel,
} from './network-model';
import { migrateDocument } from './migrations';
import { Controls } from './simulate-controls';
import { parseDocument } from './validate';
import type { Warning } from './warnings';

// local copies of imported constants read per element (see gradient-solver.ts)
const LINK_PUMP_CURVE = LINK_PUMP_CURVE_;
const LINK_PUMP_FLOW = LINK_PUMP_FLOW_;
const NODE_JUNCTION = NODE_JUNCTION_;
const STATUS_CLOSED = STATUS_CLOSED_;
const STATUS_NAMES = STATUS_NAMES_;
const STATUS_ISOLATED = STATUS_ISOLATED_;

/**
 * Steady-state solve of a network document: validate, compile, run the global gradient method
 * (./gradient-solver), then the design checks (./checks).
 * Design condition: tanks at their document levels; pumps run at full availability unless their
 * control tank is at or above its stop level, or their low-water cut-off tank at or below its cut-off;
 * float valves are shut when the tank they feed is at max_level_m. Units: SI.
 *
 * @example
 * const result = solve(hillSmallholding);
 * result.nodes['TR4'].pressure_m // m of water
 */

export interface SteadyOptions extends CheckOptions {
  /** Hazen-Williams SI coefficient ω (default 10.67). */
  omega?: number;
  /** Convergence: relative flow change (default 1e-9). */
  accuracy?: number;
  /** Convergence: every link's energy equation holds to this, m (default 1e-4). */
  headTolerance_m?: number;
  /** Iteration cap (default 100). */
  maxIterations?: number;
  /** Fixed demands fall off below the outlet's minimum pressure (default false: demand-driven). */
  pressureDriven?: boolean;
  /**
   * Warm start: a previous answer (of this document or an edited copy, matched by element id).
   * The solve starts from its heads, flows and statuses, so a small edit re-solves in one or two
   * Newton iterations; the answer is the same as from a cold start (to the tolerances).
   */
  start?: Pick<SteadyResult, 'nodes' | 'links'>;
}

export interface NodeResult {
  head_m: number;
  pressure_m: number;
  demand_m3s: number;
}
export interface LinkResult {
  flow_m3s: number;
  velocity_ms: number;
  headloss_m: number;
  status: string;
}

export interface SteadyResult {
  converged: boolean;
  /** When not converged: the first equation that does not hold, naming its element. */
  reason?: string;
  iterations: number;
  /** Per node: head (m), pressure = head − elevation (m of water), delivered demand (m³/s;
   * for sources and tanks the net flow into them from the network, negative when supplying). */
  nodes: Record<string, NodeResult>;
  /** Per link: flow (m³/s, + from → to), velocity (m/s; 0 for pumps), headloss = head(from) − head(to)
   * (m; negative across a pump), status open | closed | check-closed | active | isolated (an end
   * has no open path to a source or tank). */
  links: Record<string, LinkResult>;
  warnings: Warning[];
}

/**
 * A validated document of any version as the current version (./migrations: a document without
 * schema/headloss is version 0, Hazen-Williams).
 * @example normaliseDocument(JSON.parse(text)).headloss // 'hazen-williams' when absent
 */
export function normaliseDocument(doc: NetworkDocument): NetworkDocument {
  const migrated = migrateDocument(doc);
  return migrated.ok ? (migrated.doc as NetworkDocument) : doc;
}

/**
 * The design-condition state of a compiled model (see module doc).
 * @example solver.solve(steadyState(solver, { pressureDriven: true }))
 */
export function steadyState(solver: GradientSolver, options: SteadyOptions = {}): SolverState {
  const model = solver.model;
  const state = solver.createState();
  state.pressureDriven = options.pressureDriven ?? false;
  const level = new Float64Array(model.nodeCount);
  const max = new Float64Array(model.nodeCount);
  model.doc.nodes.forEach((node, i) => {
    if (node.kind === 'tank') {
      level[i] = node.level_m;
      max[i] = node.max_level_m;
    }
  });
  new Controls(model, level, max).apply(state, null);
  return state;
}

/**
 * Result records (keyed by element id) from the solver's arrays.
 * @example const { nodes, links } = collectResult(model, solver);
 */
export function collectResult(model: NetworkModel, solver: GradientSolver): Pick<SteadyResult, 'nodes' | 'links'> {
  const nodes: Record<string, NodeResult> = {};
  const links: Record<string, LinkResult> = {};
  const netIn = new Float64Array(model.nodeCount);
  for (let k = 0; k < model.linkCount; k++) {
    netIn[model.to[k]] += solver.flow[k];
    netIn[model.from[k]] -= solver.flow[k];
  }
  for (let i = 0; i < model.nodeCount; i++) {
    const h = solver.head[i];
    nodes[model.nodeIds[i]] = {
      head_m: h,
      pressure_m: h - model.elevation[i],
      demand_m3s: model.nodeKind[i] === NODE_JUNCTION ? solver.demand[i] : netIn[i],
    };
  }
  for (let k = 0; k < model.linkCount; k++) {
    const kind = model.linkKind[k];
    const q = solver.flow[k];
    const isPump = kind === LINK_PUMP_FLOW || kind === LINK_PUMP_CURVE;
    links[model.linkIds[k]] = {
      flow_m3s: q,
      velocity_ms: isPump || model.area[k] === 0 ? 0 : q / model.area[k],
      headloss_m: solver.head[model.from[k]] - solver.head[model.to[k]],
      status:
        STATUS_NAMES[solver.status[k] !== STATUS_CLOSED && (!solver.active[model.from[k]] || !solver.active[model.to[k]]) ? STATUS_ISOLATED : solver.status[k]],
    };
  }
  return { nodes, links };
}

const STATUS_CODES: Record<string, number> = { open: STATUS_OPEN_, active: STATUS_ACTIVE_, 'check-closed': STATUS_CHECK_CLOSED_ };

/** Load a previous answer's heads, flows and statuses (by id) as the solver's starting point. */
function startFrom(model: NetworkModel, solver: GradientSolver, state: SolverState, start: Pick<SteadyResult, 'nodes' | 'links'>): void {
  const head = new Float64Array(model.nodeCount).fill(Number.NaN);
  const flow = new Float64Array(model.linkCount).fill(Number.NaN);
  const status = new Int8Array(model.linkCount).fill(-1);
  for (let i = 0; i < model.nodeCount; i++) {
    const r = start.nodes?.[model.nodeIds[i]];
    if (r) head[i] = r.head_m;
  }
  for (let k = 0; k < model.linkCount; k++) {
    const r = start.links?.[model.linkIds[k]];
    if (!r) continue;
    flow[k] = r.flow_m3s;
    const code = STATUS_CODES[r.status];
    if (code !== undefined) status[k] = code;
    else if (r.status === 'closed' && model.linkKind[k] === LINK_PRV) status[k] = STATUS_SHUT_;
  }
  solver.setStart(head, flow, state, status);
}

/**
 * Solve the steady state of an untrusted document. Never throws: invalid input gives
 * converged:false with `invalid` warnings; no source or tank gives `no-fixed-head`.
 * @param doc a network document (validated here)
 * @param options ω, accuracy, velocity limit (1.5 m/s), pressureDriven (false)
 */
export function solve(doc: unknown, options: SteadyOptions = {}): SteadyResult {
  const parsed = parseDocument(doc);
  if (!parsed.ok)
    return { converged: false, reason: 'the document is invalid (see the warnings)', iterations: 0, nodes: {}, links: {}, warnings: parsed.warnings };
  const network = parsed.doc;
  if (!network.nodes.some((node) => node.kind === 'source' || node.kind === 'tank')) {
    return {
      converged: false,
      reason: 'no source or tank',
      iterations: 0,
      nodes: {},
      links: {},
      warnings: [{ code: 'no-fixed-head', element: null, message: 'network: needs at least one source or tank to fix the head' }],
    };
  }
  try {
    const model = compileNetwork(network, { omega: options.omega });
    const solver = new GradientSolver(model);
    const state = steadyState(solver, options);
    if (options.start) startFrom(model, solver, state, options.start);
    const outcome = solver.solve(state, {
      maxIterations: options.maxIterations,
      headTolerance_m: options.headTolerance_m,
      warmStart: options.start !== undefined,
      checkStart: true,
    });
    const { nodes, links } = collectResult(model, solver);
    const warnings: Warning[] = [];
    if (!outcome.converged) {
      warnings.push({
        code: 'not-converged',
        element: null,
        message: `network: the solution did not converge in ${outcome.iterations} iterations: ${outcome.reason}`,
      });
    }
    const level = new Float64Array(model.nodeCount);
    const closed = new Uint8Array(model.linkCount);
    for (let k = 0; k < model.linkCount; k++) closed[k] = solver.status[k] === STATUS_CLOSED ? 1 : 0;
    warnings.push(
      ...steadyChecks(
        model,
        { head: solver.head, flow: solver.flow, demand: solver.demand, requested: solver.requested, active: solver.active, level, closed },
        options,
      ),
    );
    const result: SteadyResult = { converged: outcome.converged, iterations: outcome.iterations, nodes, links, warnings };
    if (!outcome.converged) result.reason = outcome.reason ?? 'not converged';
    return result;
  } catch (error) {
    return {
      converged: false,
      reason: 'the solver failed',
      iterations: 0,
      nodes: {},
      links: {},
      warnings: [{ code: 'not-converged', element: null, message: `network: the solver failed (${error instanceof Error ? error.message : String(error)})` }],
    };
  }
}
