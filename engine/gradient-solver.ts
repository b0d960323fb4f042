import * as constants from './constants';
import { darcyFactorAndSlope, LAMINAR_REYNOLDS as LAMINAR_REYNOLDS_ } from './darcy-weisbach';
import { HW_FLOW_EXPONENT as HW_FLOW_EXPONENT_ } from './hazen-williams';
import * as kinds from './network-model';
import type { NetworkModel } from './network-model';
import { SparseLdl } from './sparse-ldl';
import { SupernodalCholesky } from './supernodal-cholesky';

// Module-local copies of the imported constants read in the inner loops: where modules are run
// through a CommonJS transform (tsx on the server, the CLI and the benchmarks) every read of an
// imported binding is a getter call, which cost about 6 % of a large solve.
const { WATER_KINEMATIC_VISCOSITY_M2S, GRAVITY_MS2 } = constants;
const LAMINAR_REYNOLDS = LAMINAR_REYNOLDS_;
const HW_FLOW_EXPONENT = HW_FLOW_EXPONENT_;
const HW_SLOPE_EXPONENT = HW_FLOW_EXPONENT_ - 1;
const {
  DEMAND_EMITTER, DEMAND_FIXED, DEMAND_PRESSURE, LINK_CHECK, LINK_FLOAT, LINK_PIPE, LINK_PRV, LINK_PUMP_CURVE, LINK_PUMP_FLOW, LINK_SHUTOFF,
  NODE_JUNCTION, NODE_SOURCE, NODE_TANK,
} = kinds;

/**
 * Global gradient algorithm for steady flow in looped and branched networks: Newton's method on
 * the link headloss equations and node continuity equations, with the flows eliminated so that
 * each iteration solves one symmetric positive-definite system A·H = F for the unknown heads
 * (Todini, E. & Pilati, S. (1988), "A gradient algorithm for the analysis of pipe networks", in
 * Computer Applications in Water Supply, vol. 1, Research Studies Press, 1–20).
 *
 * - Fixed heads: sources, and tanks (head = floor elevation + level) unless a tank is given a
 *   storage coefficient A/Δt, which makes it an unknown of a backward-Euler time step (stable for
 *   tanks joined by short headers, whose levels equalise in seconds).
 * - Zero and tiny flows: the headloss gradient g = dh/dQ is floored at GRADIENT_FLOOR so p = 1/g
 *   stays finite; the iteration still converges to h(Q) = ΔH because y = h/g uses the true h.
 *   A link whose flow collapses towards zero in one step keeps part of its previous gradient
 *   (GRADIENT_MEMORY), which stops the next step from overshooting.
 * - Pressure-dependent outlets and emitters are virtual links to a virtual reservoir with the
 *   inverse law as their headloss (the formulation of EPANET 2.2's pressure-driven analysis,
 *   Rossman et al. 2020, documented in the public US EPA manual) with barrier slopes keeping the
 *   delivered flow within [0, full demand].
 * - Check valves, no-reverse pumps and tank-empty blocks open and close by status checks between
 *   iterations; pressure-reducing valves switch between active, open and closed.
 * - Parts of the network with no open path to a fixed head are set aside (head = ground,
 *   no flow) instead of making the matrix singular.
 * The sparse factorisation's symbolic phase is computed once per layout and shared by solvers of
 * the same layout (./sparse-ldl; large networks factorise with ./supernodal-cholesky).
 *
 * @example
 * const solver = new GradientSolver(compileNetwork(doc));
 * const state = solver.createState();
 * const outcome = solver.solve(state);       // then read solver.head, solver.flow, solver.demand
 */

/** Link status codes reported by the solver. */
export const STATUS_OPEN = 0;
export const STATUS_CLOSED = 1;
export const STATUS_CHECK_CLOSED = 2;
export const STATUS_ACTIVE = 3;
export const STATUS_NAMES = ['open', 'closed', 'check-closed', 'active'] as const;

/** Smallest headloss gradient dh/dQ used, m per m³/s (keeps 1/g finite at zero flow). */
export const GRADIENT_FLOOR = 1e-2;
/** Barrier slope for virtual demand links outside [0, full demand], m per m³/s. */
export const DEMAND_BARRIER_SLOPE = 1e14;
/** Regularisation of the pressure-driven law near zero flow (fraction of full demand). */
const VIRTUAL_FLOW_FLOOR = 1e-3;
/** Metres of residual per m³/s of flow error on a virtual demand link (1e-10 m³/s ↔ 1e-4 m). */
const VIRTUAL_RESIDUAL_SCALE = 1e6;
/** Diagonal weight that pins the downstream node of an active pressure-reducing valve. */
const PIN_WEIGHT = 1e10;
/** Head tolerance of status checks, m. */
const STATUS_HEAD_TOL = 1e-6;
/** Flow tolerance of status checks, m³/s. */
const STATUS_FLOW_TOL = 1e-10;
/** Flow scale below which the relative-change test becomes absolute, m³/s. */
const FLOW_SCALE_FLOOR = 1e-4;
/** Default largest energy-equation residual |h(Q) − ΔH| accepted as converged, m (0.1 mm: far
 * below survey accuracy; tests that check identities ask for less). */
export const ENERGY_TOLERANCE_M = 1e-4;
/** Networks with at least this many unknown heads use the supernodal factorisation. */
export const SUPERNODAL_MIN_ORDER = 1000;
/** Required pressure used for outlets and tees in pressure-driven (simulation) mode without a minimum, m. */
export const DEFAULT_REQUIRED_PRESSURE_M = 0.5;
/**
 * Share of a link's previous headloss gradient that its next gradient may not fall below. After
 * the first solve many links of a looped network come out near zero flow, where the power law's
 * gradient vanishes and the next Newton step overshoots several-fold (then takes iterations to
 * come back). Keeping 0.3 of the previous gradient only acts when a flow collapses by more than
 * about 4× in one step: converging links (quadratically, or at the ratio 1 − 1/1.852 of Newton
 * approaching zero flow) never trigger it, and the solution is unchanged because y = h/g uses the
 * true h. Measured: looped grids of 1,000–40,000 tees converge in one Newton iteration fewer.
 */
export const GRADIENT_MEMORY = 0.3;

/**
 * The topology-only part of a solver: the matrix pattern with its fill-reducing ordering and
 * symbolic factorisation, and where each link writes into the matrix. It depends only on the
 * link endpoints and on which nodes are sources, so it is shared by solvers of networks with the
 * same layout (the browser re-solves after every edit of a size, demand or level): the ordering,
 * the costliest part of building a solver for a large network, is then done once per layout.
 * Everything in it is read-only after construction.
 */
interface SolverStructure {
  nodeCount: number;
  source: Uint8Array;
  from: Int32Array;
  to: Int32Array;
  ldl: SparseLdl;
  chol: SupernodalCholesky | null;
  posFF: Int32Array;
  posTT: Int32Array;
  posFT: Int32Array;
  posTF: Int32Array;
  posDiag: Int32Array;
}

/** Layouts kept, most recently used first. */
const STRUCTURE_CACHE_SIZE = 4;
const structureCache: SolverStructure[] = [];
const EMPTY_PAIRS = { i: new Int32Array(0), j: new Int32Array(0) };

/**
 * Forget the cached layouts (benchmarks use it to time a first solve; memory is otherwise bounded
 * by STRUCTURE_CACHE_SIZE layouts).
 * @example clearStructureCache(); solve(doc) // orders the matrix again
 */
export function clearStructureCache(): void {
  structureCache.length = 0;
}

function sameArray(a: ArrayLike<number>, b: ArrayLike<number>): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

/** The cached structure of this layout, or a new one (which then enters the cache). */
function structureFor(model: NetworkModel, unknown: Int32Array, nu: number): SolverStructure {
  const n = model.nodeCount;
  const m = model.linkCount;
  const source = new Uint8Array(n);
  for (let i = 0; i < n; i++) if (unknown[i] < 0) source[i] = 1;
  for (let c = 0; c < structureCache.length; c++) {
    const entry = structureCache[c];
    if (entry.nodeCount === n && sameArray(entry.from, model.from) && sameArray(entry.to, model.to) && sameArray(entry.source, source)) {
      if (c > 0) { structureCache.splice(c, 1); structureCache.unshift(entry); }
      return entry;
    }
  }
  let pairs = 0;
  for (let k = 0; k < m; k++) {
    const a = unknown[model.from[k]];
    const b = unknown[model.to[k]];
    if (a >= 0 && b >= 0 && a !== b) pairs++;
  }
  const pi = new Int32Array(pairs);
  const pj = new Int32Array(pairs);
  for (let k = 0, e = 0; k < m; k++) {
    const a = unknown[model.from[k]];
    const b = unknown[model.to[k]];
    if (a >= 0 && b >= 0 && a !== b) { pi[e] = a; pj[e] = b; e++; }
  }
  const ldl = new SparseLdl(nu, { i: pi, j: pj });
  const chol = nu >= SUPERNODAL_MIN_ORDER ? new SupernodalCholesky(ldl) : null;
  const posFF = new Int32Array(m).fill(-1);
  const posTT = new Int32Array(m).fill(-1);
  const posFT = new Int32Array(m).fill(-1);
  const posTF = new Int32Array(m).fill(-1);
  for (let k = 0; k < m; k++) {
    const a = unknown[model.from[k]];
    const b = unknown[model.to[k]];
    if (a >= 0) posFF[k] = ldl.position(a, a);
    if (b >= 0) posTT[k] = ldl.position(b, b);
    if (a >= 0 && b >= 0 && a !== b) { posFT[k] = ldl.position(a, b); posTF[k] = ldl.position(b, a); }
  }
  const posDiag = new Int32Array(nu);
  for (let u = 0; u < nu; u++) posDiag[u] = ldl.position(u, u);
  const entry: SolverStructure = { nodeCount: n, source, from: model.from.slice(), to: model.to.slice(), ldl, chol, posFF, posTT, posFT, posTF, posDiag };
  structureCache.unshift(entry);
  if (structureCache.length > STRUCTURE_CACHE_SIZE) structureCache.length = STRUCTURE_CACHE_SIZE;
  return entry;
}

export interface SolverState {
  /** Head of sources and tanks, m (others ignored). */
  fixedHead: Float64Array;
  /** Demand multiplier per node (hourly pattern), default 1. */
  demandFactor: Float64Array;
  /** Link closed by a control or by the document (1 = closed). */
  linkClosed: Uint8Array;
  /** Allowed flow direction per link: 0 either, +1 only from→to, −1 only to→from (empty tanks). */
  linkDirection: Int8Array;
  /** Pump availability (0..1): constant-flow pumps scale their flow, curve pumps their speed. */
  pumpFactor: Float64Array;
  /** Treat fixed demands as pressure-driven (full at min pressure, zero at 0 m): used by simulate. */
  pressureDriven: boolean;
  /**
   * Per tank: 0 = head held at fixedHead; c > 0 = storage A/Δt (m²/s) for an implicit (backward
   * Euler) time step from the head fixedHead, so the solved head is the head at the end of the step.
   */
  tankStorage: Float64Array;
  /** Steady inflow from outside the network into each tank during a storage step, m³/s. */
  tankInflow: Float64Array;
}

export interface SolveOptions {
  /** Convergence: sum |ΔQ| / sum |Q| below this (default 1e-9). */
  accuracy?: number;
  /** Iteration cap (default 100). */
  maxIterations?: number;
  /** Start from the last solution (default false: fresh start). */
  warmStart?: boolean;
  /** Converged when every link's energy equation holds to this, m (default ENERGY_TOLERANCE_M = 1e-4). */
  headTolerance_m?: number;
}

export interface SolveOutcome {
  converged: boolean;
  iterations: number;
  singular: boolean;
}

export class GradientSolver {
  readonly model: NetworkModel;
  /** Head per node, m. */
  readonly head: Float64Array;
  /** Flow per link, m³/s (positive from → to). */
  readonly flow: Float64Array;
  /** Delivered demand per node, m³/s. */
  readonly demand: Float64Array;
  /** Requested demand per node at the current factors, m³/s. */
  readonly requested: Float64Array;
  /** Status per link (STATUS_*). */
  readonly status: Uint8Array;
  /** 1 when the node has an open path to a fixed head. */
  readonly active: Uint8Array;
  private readonly unknown: Int32Array;
  private readonly unknownNode: Int32Array;
  private readonly ldl: SparseLdl;
  /** Supernodal factorisation used instead of the simplicial one for large networks. */
  private readonly chol: SupernodalCholesky | null;
  private readonly posFF: Int32Array;
  private readonly posTT: Int32Array;
  private readonly posFT: Int32Array;
  private readonly posTF: Int32Array;
  private readonly posDiag: Int32Array;
  private readonly rhs: Float64Array;
  private readonly x: Float64Array;
  private readonly p: Float64Array;
  private readonly y: Float64Array;
  private readonly virtualFlow: Float64Array;
  private readonly virtualFull: Float64Array;
  /** Newton terms y = h/g and p = 1/g of the virtual demand links in the current iteration. */
  private readonly virtualY: Float64Array;
  private readonly virtualP: Float64Array;
  private readonly pinned: Float64Array;
  private readonly netOut: Float64Array;
  private readonly changes: Int32Array;
  private readonly queue: Int32Array;
  private readonly adjPtr: Int32Array;
  private readonly adjLink: Int32Array;
  private readonly scratch = new Float64Array(2);
  /** Headloss gradient of each link in the previous iteration (see GRADIENT_MEMORY). */
  private readonly gradientPrev: Float64Array;
  private initialised = false;
  private readonly hasPrv: boolean;
  /** Links with status logic of their own (check, PRV, curve pump) and all links. */
  private readonly logicLinks: Int32Array;
  private readonly allLinks: Int32Array;
  private statusLinks: Int32Array;

  constructor(model: NetworkModel) {
    this.model = model;
    const n = model.nodeCount;
    const m = model.linkCount;
    this.unknown = new Int32Array(n).fill(-1);
    let nu = 0;
    for (let i = 0; i < n; i++) if (model.nodeKind[i] !== NODE_SOURCE) this.unknown[i] = nu++;
    this.unknownNode = new Int32Array(nu);
    for (let i = 0; i < n; i++) if (this.unknown[i] >= 0) this.unknownNode[this.unknown[i]] = i;
    const structure = structureFor(model, this.unknown, nu);
    this.ldl = new SparseLdl(nu, EMPTY_PAIRS, structure.ldl);
    this.chol = structure.chol ? new SupernodalCholesky(this.ldl, structure.chol) : null;
    const logic: number[] = [];
    for (let k = 0; k < m; k++) {
      const kind = model.linkKind[k];
      if (kind === LINK_CHECK || kind === LINK_PRV || kind === LINK_PUMP_CURVE) logic.push(k);
    }
    this.logicLinks = Int32Array.from(logic);
    this.allLinks = new Int32Array(m);
    for (let k = 0; k < m; k++) this.allLinks[k] = k;
    this.statusLinks = this.logicLinks;
    this.hasPrv = logic.some((k) => model.linkKind[k] === LINK_PRV);
    this.posFF = structure.posFF;
    this.posTT = structure.posTT;
    this.posFT = structure.posFT;
    this.posTF = structure.posTF;
    this.posDiag = structure.posDiag;
    this.rhs = new Float64Array(nu);
    this.x = new Float64Array(nu);
    this.head = new Float64Array(n);
    this.flow = new Float64Array(m);
    this.demand = new Float64Array(n);
    this.requested = new Float64Array(n);
    this.status = new Uint8Array(m);
    this.active = new Uint8Array(n);
    this.p = new Float64Array(m);
    this.y = new Float64Array(m);
    this.virtualFlow = new Float64Array(n);
    this.virtualFull = new Float64Array(n);
    this.virtualY = new Float64Array(n);
    this.virtualP = new Float64Array(n);
    this.pinned = new Float64Array(n).fill(Number.NaN);
    this.netOut = new Float64Array(n);
    this.changes = new Int32Array(m);
    this.gradientPrev = new Float64Array(m);
    this.queue = new Int32Array(n);
    // node → incident links (CSR)
    this.adjPtr = new Int32Array(n + 1);
    for (let k = 0; k < m; k++) { this.adjPtr[model.from[k] + 1]++; this.adjPtr[model.to[k] + 1]++; }
    for (let i = 0; i < n; i++) this.adjPtr[i + 1] += this.adjPtr[i];
    this.adjLink = new Int32Array(this.adjPtr[n]);
    const fill = this.adjPtr.slice(0, n);
    for (let k = 0; k < m; k++) { this.adjLink[fill[model.from[k]]++] = k; this.adjLink[fill[model.to[k]]++] = k; }
  }

  /** A state with the document's tank levels and source heads, factors 1, nothing closed. */
  createState(): SolverState {
    const { model } = this;
    const state: SolverState = {
      fixedHead: Float64Array.from(model.baseHead),
      demandFactor: new Float64Array(model.nodeCount).fill(1),
      linkClosed: Uint8Array.from(model.closedInDocument),
      linkDirection: new Int8Array(model.linkCount),
      pumpFactor: new Float64Array(model.linkCount).fill(1),
      pressureDriven: false,
      tankStorage: new Float64Array(model.nodeCount),
      tankInflow: new Float64Array(model.nodeCount),
    };
    model.doc.nodes.forEach((node, i) => { if (node.kind === 'tank') state.fixedHead[i] = node.elevation_m + node.level_m; });
    return state;
  }

  /** Headloss h and gradient g of link k at flow q (pipes and valves). Writes scratch[0..1]. */
  private linkLaw(k: number, q: number, speed: number): void {
    const model = this.model;
    const kind = model.linkKind[k];
    const a = Math.abs(q);
    const out = this.scratch;
    if (kind === LINK_PUMP_CURVE) {
      // head gain s²·h0(Q/s), piecewise linear, extrapolated from the end segments
      const s = speed > 0 ? speed : 1e-6;
      const x = q / s;
      const c0 = model.curveStart[k];
      const c1 = model.curveEnd[k];
      let seg = c0;
      while (seg < c1 - 2 && x > model.curveQ[seg + 1]) seg++;
      const q0 = model.curveQ[seg];
      const q1 = model.curveQ[seg + 1];
      const h0 = model.curveH[seg];
      const h1 = model.curveH[seg + 1];
      const slope = (h1 - h0) / (q1 - q0);
      const head = s * s * (h0 + slope * (x - q0));
      out[0] = -head;
      out[1] = -s * slope;
      return;
    }
    let h = model.minor[k] * a * q;
    let g = 2 * model.minor[k] * a;
    if (kind === LINK_PIPE) {
      if (model.headloss === 'darcy-weisbach') {
        const d = model.diameter[k];
        const area = model.area[k];
        const re = (a / area) * d / WATER_KINEMATIC_VISCOSITY_M2S;
        if (re < LAMINAR_REYNOLDS) {
          const c = (32 * WATER_KINEMATIC_VISCOSITY_M2S * model.length[k]) / (GRAVITY_MS2 * d * d * area);
          h += c * q;
          g += c;
        } else {
          darcyFactorAndSlope(re, model.roughnessRelative[k], this.scratch);
          const f = this.scratch[0];
          const slope = this.scratch[1];
          const hf = (f * model.length[k]) / (2 * GRAVITY_MS2 * d * area * area) * a * q;
          h += hf;
          g += (hf / q) * (2 + slope);
        }
      } else {
        const r = model.resistance[k] * Math.pow(a, HW_FLOW_EXPONENT - 1);
        h += r * q;
        g += HW_FLOW_EXPONENT * r;
      }
    }
    out[0] = h;
    out[1] = g;
  }

  /** Virtual demand link of node i at virtual flow q: inverse pressure law as headloss. */
  private virtualLaw(i: number, q: number, full: number, state: SolverState): void {
    const model = this.model;
    const out = this.scratch;
    const type = model.demandType[i];
    if (type === DEMAND_EMITTER) {
      const k = model.emitterK[i] * state.demandFactor[i];
      const invX = 1 / model.emitterExponent[i];
      const qf = Math.max(k * 1e-3, 1e-12);
      if (q < 0) { out[0] = DEMAND_BARRIER_SLOPE * q; out[1] = DEMAND_BARRIER_SLOPE; return; }
      const qq = Math.max(q, qf);
      const h = Math.pow(qq / k, invX);
      const g = (invX * h) / qq;
      out[0] = q < qf ? (h / qf) * q : h; // linear below the floor
      out[1] = q < qf ? h / qf : g;
      return;
    }
    const span = this.requiredPressure(i, state) - this.zeroPressure(i, state);
    // h = span·(q/full)² for 0 ≤ q ≤ full (inverse of q = full·√s), barriers outside
    if (q < 0) { out[0] = DEMAND_BARRIER_SLOPE * q; out[1] = DEMAND_BARRIER_SLOPE; return; }
    if (q > full) { out[0] = span + DEMAND_BARRIER_SLOPE * (q - full); out[1] = DEMAND_BARRIER_SLOPE; return; }
    const s = q / full;
    out[0] = span * s * s;
    out[1] = (2 * span * Math.max(s, VIRTUAL_FLOW_FLOOR)) / full;
  }

  private requiredPressure(i: number, state: SolverState): number {
    const model = this.model;
    if (model.demandType[i] === DEMAND_PRESSURE) return model.pressureRequired[i];
    const mp = model.minPressure[i];
    return state.pressureDriven && mp > DEFAULT_REQUIRED_PRESSURE_M ? mp : DEFAULT_REQUIRED_PRESSURE_M;
  }

  private zeroPressure(i: number, _state: SolverState): number {
    return this.model.demandType[i] === DEMAND_PRESSURE ? this.model.pressureZero[i] : 0;
  }

  /** Mark nodes with an open path to a fixed head (sources, tanks, active PRV outlets). */
  private connect(): void {
    const model = this.model;
    const { active, queue, status, adjPtr, adjLink } = this;
    active.fill(0);
    let tail = 0;
    for (let i = 0; i < model.nodeCount; i++) if (model.nodeKind[i] !== NODE_JUNCTION) { active[i] = 1; queue[tail++] = i; }
    let head = 0;
    while (head < tail) {
      const v = queue[head++];
      for (let a = adjPtr[v]; a < adjPtr[v + 1]; a++) {
        const k = adjLink[a];
        const st = status[k];
        if (st === STATUS_CLOSED || st === STATUS_CHECK_CLOSED || model.linkKind[k] === LINK_PUMP_FLOW) continue;
        const u = model.from[k] === v ? model.to[k] : model.from[k];
        if (!active[u]) { active[u] = 1; queue[tail++] = u; }
      }
    }
  }

  private initialise(state: SolverState): void {
    const model = this.model;
    let hmax = -Infinity;
    for (let i = 0; i < model.nodeCount; i++) if (model.nodeKind[i] !== NODE_JUNCTION) hmax = Math.max(hmax, state.fixedHead[i]);
    for (let i = 0; i < model.nodeCount; i++) {
      this.head[i] = model.nodeKind[i] === NODE_JUNCTION ? (Number.isFinite(hmax) ? hmax : model.elevation[i]) : state.fixedHead[i];
      // virtual demand links start at the flow they would take at the highest fixed head
      const lift = Math.max((Number.isFinite(hmax) ? hmax : 0) - model.elevation[i], 0);
      this.virtualFlow[i] = model.demandType[i] === DEMAND_EMITTER
        ? model.emitterK[i] * state.demandFactor[i] * Math.pow(lift, model.emitterExponent[i])
        : model.demandBase[i] * state.demandFactor[i];
    }
    for (let k = 0; k < model.linkCount; k++) {
      const kind = model.linkKind[k];
      this.status[k] = kind === LINK_PRV ? STATUS_ACTIVE : STATUS_OPEN;
      if (kind === LINK_PUMP_FLOW) this.flow[k] = model.pumpFlow[k];
      else if (kind === LINK_PUMP_CURVE) this.flow[k] = model.curveQ[model.curveStart[k] + 1];
      else this.flow[k] = 0.05 * model.area[k]; // 0.05 m/s forward
    }
    this.initialised = true;
  }

  /**
   * Solve the steady state for `state`. Results are left in head, flow, demand, status.
   * @param state fixed heads, factors and closures
   * @param options accuracy (default 1e-9), maxIterations (default 100), warmStart
   */
  solve(state: SolverState, options: SolveOptions = {}): SolveOutcome {
    const model = this.model;
    const accuracy = options.accuracy ?? 1e-9;
    const maxIterations = options.maxIterations ?? 100;
    const headTolerance = options.headTolerance_m ?? ENERGY_TOLERANCE_M;
    const n = model.nodeCount;
    const m = model.linkCount;
    const { head, flow, status, p, y, unknown, ldl, rhs, x, virtualFlow, virtualFull, pinned, netOut, changes, active, gradientPrev } = this;
    const values = ldl.values;
    const { posFF, posTT, posFT, posTF } = this;
    const { resistance, minor, linkKind } = model;
    const linkFrom = model.from;
    const linkTo = model.to;
    const hazenWilliams = model.headloss !== 'darcy-weisbach';
    if (!options.warmStart || !this.initialised) this.initialise(state);
    changes.fill(0);
    gradientPrev.fill(0);
    // structural statuses from the state
    for (let k = 0; k < m; k++) {
      const kind = model.linkKind[k];
      const off = state.linkClosed[k] === 1 || ((kind === LINK_PUMP_FLOW || kind === LINK_PUMP_CURVE) && !(state.pumpFactor[k] > 0));
      if (off) { status[k] = STATUS_CLOSED; flow[k] = 0; } else if (status[k] === STATUS_CLOSED) {
        status[k] = kind === LINK_PRV ? STATUS_ACTIVE : STATUS_OPEN;
        flow[k] = kind === LINK_PUMP_FLOW ? model.pumpFlow[k] : kind === LINK_PUMP_CURVE ? model.curveQ[model.curveStart[k] + 1] * state.pumpFactor[k] : 0.1 * model.area[k];
      }
      // a PRV feeding a fixed head cannot regulate: it behaves as an open valve
      if (kind === LINK_PRV && status[k] === STATUS_ACTIVE && model.nodeKind[model.to[k]] !== NODE_JUNCTION) status[k] = STATUS_OPEN;
      // a plain link closed by a direction block that has been lifted opens again
      if (status[k] === STATUS_CHECK_CLOSED && state.linkDirection[k] === 0 && (kind === LINK_PIPE || kind === LINK_SHUTOFF || kind === LINK_FLOAT)) {
        status[k] = STATUS_OPEN;
        flow[k] = 0;
      }
    }
    for (let i = 0; i < n; i++) {
      if (model.nodeKind[i] !== NODE_JUNCTION) { head[i] = state.fixedHead[i]; this.requested[i] = 0; virtualFull[i] = 0; continue; }
      const base = model.demandBase[i] * state.demandFactor[i];
      this.requested[i] = model.demandType[i] === DEMAND_EMITTER ? Number.NaN : base;
      const isVirtual = model.demandType[i] !== DEMAND_FIXED || (state.pressureDriven && base > 0);
      virtualFull[i] = isVirtual ? (model.demandType[i] === DEMAND_EMITTER ? Infinity : base) : 0;
      if (isVirtual && !(model.demandType[i] === DEMAND_EMITTER ? model.emitterK[i] * state.demandFactor[i] > 0 : base > 0)) virtualFull[i] = 0;
    }
    this.connect();
    // links whose status can change: valves with logic, curve pumps, and links of empty tanks
    let hasBlocks = false;
    for (let k = 0; k < m; k++) if (state.linkDirection[k] !== 0) { hasBlocks = true; break; }
    if (hasBlocks) this.statusLinks = this.allLinks; else this.statusLinks = this.logicLinks;

    let iterations = 0;
    let converged = false;
    let singular = false;
    let settled = false; // the previous update changed flows by < 1 % and no status
    let worst = 0;
    while (iterations < maxIterations) {
      iterations++;
      values.fill(0);
      rhs.fill(0);
      worst = 0;
      pinned.fill(Number.NaN);
      for (let k = 0; k < m; k++) {
        const f = linkFrom[k];
        const t = linkTo[k];
        const st = status[k];
        if (st === STATUS_CLOSED || st === STATUS_CHECK_CLOSED || !active[f] || !active[t]) { flow[k] = 0; p[k] = 0; y[k] = 0; continue; }
        const uf = unknown[f];
        const ut = unknown[t];
        const kind = linkKind[k];
        if (kind === LINK_PUMP_FLOW) {
          const q = model.pumpFlow[k] * state.pumpFactor[k];
          flow[k] = q; p[k] = 0; y[k] = 0;
          if (uf >= 0) rhs[uf] -= q;
          if (ut >= 0) rhs[ut] += q;
          continue;
        }
        if (kind === LINK_PRV && st === STATUS_ACTIVE) {
          p[k] = 0; y[k] = 0;
          if (uf >= 0) rhs[uf] -= flow[k];
          pinned[t] = model.elevation[t] + model.prvSetting[k];
          continue;
        }
        let hk: number;
        let g: number;
        if (kind === LINK_PIPE && hazenWilliams) {
          // the Hazen-Williams pipe law of linkLaw, inline (nearly every link of a large network)
          const q = flow[k];
          const a = Math.abs(q);
          const mk = minor[k];
          // |q|^0.852 as exp(0.852·ln|q|): half the time of Math.pow in V8 (about 30 against 65 ns,
          // 140,000 calls in a 10,000-tee solve), within a few units in the last place
          const r = resistance[k] * Math.exp(HW_SLOPE_EXPONENT * Math.log(a));
          hk = mk * a * q + r * q;
          g = 2 * mk * a + HW_FLOW_EXPONENT * r;
        } else {
          this.linkLaw(k, flow[k], state.pumpFactor[k]);
          hk = this.scratch[0];
          g = this.scratch[1];
        }
        if (st === STATUS_OPEN) {
          const r = Math.abs(hk - (head[f] - head[t]));
          if (r > worst) worst = r;
        }
        if (kind !== LINK_PUMP_CURVE) {
          const memory = GRADIENT_MEMORY * gradientPrev[k];
          gradientPrev[k] = g;
          if (memory > g) g = memory;
        }
        if (g < GRADIENT_FLOOR) g = GRADIENT_FLOOR;
        const pk = 1 / g;
        const yk = hk * pk;
        p[k] = pk; y[k] = yk;
        const qy = flow[k] - yk;
        if (uf >= 0) { values[posFF[k]] += pk; rhs[uf] -= qy; } else if (ut >= 0) rhs[ut] += pk * head[f];
        if (ut >= 0) { values[posTT[k]] += pk; rhs[ut] += qy; } else if (uf >= 0) rhs[uf] += pk * head[t];
        if (uf >= 0 && ut >= 0) { values[posFT[k]] -= pk; values[posTF[k]] -= pk; }
      }
      for (let u = 0; u < unknown.length && u < this.unknownNode.length; u++) {
        const i = this.unknownNode[u];
        const pd = this.posDiag[u];
        if (model.nodeKind[i] === NODE_TANK) {
          const c = state.tankStorage[i];
          const w = c > 0 ? c : PIN_WEIGHT;
          values[pd] += w;
          rhs[u] += w * state.fixedHead[i] + (c > 0 ? state.tankInflow[i] : 0);
          continue;
        }
        if (!active[i]) { values[pd] = 1; rhs[u] = model.elevation[i]; continue; }
        if (virtualFull[i] > 0) {
          this.virtualLaw(i, virtualFlow[i], virtualFull[i], state);
          // flow residual of the virtual link, scaled to metres (the barriers are too steep for a head test)
          const rv = (Math.abs(this.scratch[0] - (head[i] - model.elevation[i] - this.zeroPressure(i, state))) / this.scratch[1]) * VIRTUAL_RESIDUAL_SCALE;
          if (rv > worst) worst = rv;
          const g = this.scratch[1] > GRADIENT_FLOOR ? this.scratch[1] : GRADIENT_FLOOR;
          const pv = 1 / g;
          const yv = this.scratch[0] * pv;
          values[pd] += pv;
          rhs[u] += -(virtualFlow[i] - yv) + pv * (model.elevation[i] + this.zeroPressure(i, state));
          this.virtualY[i] = yv;
          this.virtualP[i] = pv;
        } else {
          rhs[u] -= this.requested[i] > 0 || this.requested[i] < 0 ? this.requested[i] : 0;
        }
        if (!Number.isNaN(pinned[i])) { values[pd] += PIN_WEIGHT; rhs[u] += PIN_WEIGHT * pinned[i]; }
      }
      // the assembly just evaluated every energy equation at the current flows and heads: when the
      // last update was small and they all hold, the current state is the solution
      if (settled && worst < headTolerance) { converged = true; iterations--; break; }
      const factorisation = this.chol ?? ldl;
      if (factorisation.factor() !== ldl.n) { singular = true; break; }
      factorisation.solve(rhs, x);
      for (let u = 0; u < this.unknownNode.length; u++) head[this.unknownNode[u]] = x[u];

      // flow update
      let sumQ = 0;
      let sumDQ = 0;
      for (let i = 0; i < n; i++) {
        if (model.nodeKind[i] !== NODE_JUNCTION || !active[i]) { virtualFlow[i] = 0; continue; }
        if (virtualFull[i] > 0) {
          const qv = virtualFlow[i] - this.virtualY[i] + this.virtualP[i] * (head[i] - model.elevation[i] - this.zeroPressure(i, state));
          sumDQ += Math.abs(qv - virtualFlow[i]);
          sumQ += Math.abs(qv);
          virtualFlow[i] = qv;
        }
      }
      for (let k = 0; k < m; k++) {
        if (p[k] === 0) continue;
        const q = flow[k] - y[k] + p[k] * (head[linkFrom[k]] - head[linkTo[k]]);
        sumDQ += Math.abs(q - flow[k]);
        sumQ += Math.abs(q);
        flow[k] = q;
      }
      // delivered demands and flows through active PRVs from continuity at their outlets
      if (this.hasPrv) netOut.fill(0);
      for (let i = 0; i < n; i++) {
        if (model.nodeKind[i] !== NODE_JUNCTION || !active[i]) { this.demand[i] = 0; continue; }
        const d = virtualFull[i] > 0 ? virtualFlow[i] : this.requested[i] || 0;
        this.demand[i] = d;
      }
      if (this.hasPrv) {
        for (let k = 0; k < m; k++) {
          if (model.linkKind[k] === LINK_PRV && status[k] === STATUS_ACTIVE && active[model.from[k]] && active[model.to[k]]) continue;
          netOut[model.from[k]] += flow[k];
          netOut[model.to[k]] -= flow[k];
        }
        for (let k = 0; k < m; k++) {
          if (!(model.linkKind[k] === LINK_PRV && status[k] === STATUS_ACTIVE && active[model.from[k]] && active[model.to[k]])) continue;
          const t = model.to[k];
          const q = netOut[t] + this.demand[t];
          sumDQ += Math.abs(q - flow[k]);
          sumQ += Math.abs(q);
          flow[k] = q;
          netOut[t] -= q;
        }
      }
      const relative = sumDQ / Math.max(sumQ, FLOW_SCALE_FLOOR);
      let changed = false;
      if ((relative < 1e-2 || iterations >= 10) && (this.statusLinks.length > 0 || hasBlocks)) changed = this.checkStatuses(state);
      if (changed) { this.connect(); continue; }
      // converged when flows stop changing, or when they only creep (a power law approaching zero
      // flow converges linearly under Newton) while every link's energy equation already holds
      if (relative < accuracy) { converged = true; break; }
      settled = relative < 1e-2;
    }
    // final delivered demand (clamped to the physical range of each law)
    for (let i = 0; i < n; i++) {
      if (model.nodeKind[i] !== NODE_JUNCTION) continue;
      if (!active[i]) { head[i] = model.elevation[i]; this.demand[i] = 0; continue; }
      if (virtualFull[i] > 0) this.demand[i] = Math.min(Math.max(virtualFlow[i], 0), virtualFull[i]);
    }
    return { converged: converged && !singular, iterations, singular };
  }

  /** Status changes of check valves, no-reverse pumps, empty-tank blocks and PRVs; true if any. */
  private checkStatuses(state: SolverState): boolean {
    const model = this.model;
    const { status, flow, head, active, changes } = this;
    let changed = false;
    const list = this.statusLinks;
    for (let a = 0; a < list.length; a++) {
      const k = list[a];
      const st = status[k];
      if (st === STATUS_CLOSED || changes[k] > 8) continue;
      const kind = model.linkKind[k];
      const f = model.from[k];
      const t = model.to[k];
      let next = st;
      if (kind === LINK_PRV) {
        const hset = model.elevation[t] + model.prvSetting[k];
        if (!active[f]) continue;
        const hf = head[f];
        const ht = active[t] ? head[t] : model.elevation[t];
        if (st === STATUS_ACTIVE) {
          if (flow[k] < -STATUS_FLOW_TOL) next = STATUS_CHECK_CLOSED;
          else if (hf < hset - STATUS_HEAD_TOL) next = STATUS_OPEN;
        } else if (st === STATUS_OPEN) {
          if (flow[k] < -STATUS_FLOW_TOL) next = STATUS_CHECK_CLOSED;
          else if (ht > hset + STATUS_HEAD_TOL && model.nodeKind[t] === NODE_JUNCTION) next = STATUS_ACTIVE;
        } else if (hf > hset + STATUS_HEAD_TOL && ht < hset - STATUS_HEAD_TOL && model.nodeKind[t] === NODE_JUNCTION) next = STATUS_ACTIVE;
        else if (hf > ht + STATUS_HEAD_TOL) next = STATUS_OPEN;
      } else {
        let allowed = state.linkDirection[k];
        if (kind === LINK_CHECK || kind === LINK_PUMP_CURVE || kind === LINK_PUMP_FLOW) allowed = allowed < 0 ? 2 : 1;
        if (allowed === 0 || kind === LINK_PUMP_FLOW) continue;
        if (allowed === 2) { next = STATUS_CHECK_CLOSED; } else if (st === STATUS_OPEN) {
          if (allowed * flow[k] < -STATUS_FLOW_TOL) next = STATUS_CHECK_CLOSED;
        } else {
          // reopen when the head difference pushes flow the allowed way; a part without a fixed
          // head can receive water but not give it
          const up = allowed > 0 ? f : t;
          const down = allowed > 0 ? t : f;
          if (active[up]) {
            let drive = head[up] - (active[down] ? head[down] : model.elevation[down]);
            if (kind === LINK_PUMP_CURVE) {
              const s = state.pumpFactor[k];
              drive += s * s * model.curveH[model.curveStart[k]];
            }
            if (drive > STATUS_HEAD_TOL) next = STATUS_OPEN;
          }
        }
      }
      if (next !== st) {
        status[k] = next;
        changes[k]++;
        changed = true;
        if (next === STATUS_CHECK_CLOSED) flow[k] = 0;
        else if (st === STATUS_CHECK_CLOSED) flow[k] = (model.linkKind[k] === LINK_PRV || state.linkDirection[k] >= 0 ? 1 : -1) * 1e-3 * Math.max(model.area[k], 1e-4);
      }
    }
    return changed;
  }
}
