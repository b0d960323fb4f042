// Over 400 lines: one Newton loop and the arrays it iterates; its other jobs live in gradient-solver-*.ts.
import { HW_FLOW_EXPONENT as HW_FLOW_EXPONENT_, hazenWilliamsSecant as hazenWilliamsSecant_ } from './hazen-williams';
import { chordStep, factorStillServes } from './gradient-solver-chord';
import * as laws from './gradient-solver-laws';
import { firstViolation as firstViolation_, type Tolerances } from './gradient-solver-residuals';
import * as statuses from './gradient-solver-status';
import { EMPTY_PAIRS, structureFor } from './gradient-solver-structure';
import * as kinds from './network-model';
import type { NetworkModel } from './network-model';
import { SparseLdl } from './sparse-ldl';
import { SupernodalCholesky } from './supernodal-cholesky';

export { clearStructureCache, SUPERNODAL_MIN_ORDER } from './gradient-solver-structure';
export { DEFAULT_REQUIRED_PRESSURE_M, DEMAND_BARRIER_SLOPE } from './gradient-solver-laws';
export { STATUS_ACTIVE, STATUS_CHECK_CLOSED, STATUS_CLOSED, STATUS_ISOLATED, STATUS_NAMES, STATUS_OPEN, STATUS_SHUT } from './gradient-solver-status';

// Module-local copies of the imported constants and functions read in the inner loops: where
// modules are run through a CommonJS transform (tsx on the server, the CLI and the benchmarks)
// every read of an imported binding is a getter call, which cost about 6 % of a large solve.
const HW_FLOW_EXPONENT = HW_FLOW_EXPONENT_;
const hazenWilliamsSecant = hazenWilliamsSecant_;
const firstViolation = firstViolation_;
const { linkLaw, outletFlow, virtualLaw, zeroFlowSlope, zeroFlowSpan, zeroPressure } = laws;
const { connect, isShut, prvFlowsByContinuity, prvHead, STATUS_ACTIVE, STATUS_CHECK_CLOSED, STATUS_CLOSED, STATUS_OPEN, STATUS_SHUT, updateStatuses } =
  statuses;
const { DEMAND_EMITTER, DEMAND_FIXED, LINK_CHECK, LINK_FLOAT, LINK_PIPE, LINK_PRV, LINK_PUMP_CURVE, LINK_PUMP_FLOW, LINK_SHUTOFF, NODE_JUNCTION, NODE_TANK } =
  kinds;

/**
 * Global gradient algorithm for steady flow in looped and branched networks: Newton's method on
 * the link headloss equations and node continuity equations, with the flows eliminated so that
 * each iteration solves one symmetric positive-definite system A·H = F for the unknown heads
 * (Todini, E. & Pilati, S. (1988), "A gradient algorithm for the analysis of pipe networks", in
 * Computer Applications in Water Supply, vol. 1, Research Studies Press, 1–20). The jobs around
 * the loop live beside it: the layout's matrix structure (./gradient-solver-structure), the link
 * and outlet laws with the zero-flow regularisation (./gradient-solver-laws), connectivity and
 * valve statuses (./gradient-solver-status) and the stopping rule (./gradient-solver-residuals).
 *
 * - Fixed heads: sources, and tanks (head = floor elevation + level) unless a tank is given a
 *   storage coefficient A/Δt, which makes it an unknown of an implicit time-step stage.
 * - Pressure-dependent outlets and emitters are virtual links to a virtual reservoir with the
 *   inverse law as their headloss, with barrier slopes keeping delivery within [0, full demand].
 * - A Newton step that makes the laws worse (measured as Σ|h(Q) − ΔH|·|Q| over links and
 *   outlets, in watts per unit weight) is halved until it does not: the barriers of outlets
 *   otherwise let a step freeze an outlet at full demand far below its required pressure.
 * - On large networks an iteration whose matrix is within 1 % of the last factorised one (scaled
 *   by the diagonal) takes a chord step with that factorisation instead of a new one
 *   (./gradient-solver-chord): the last iteration or two of a cold solve, many of a warm one.
 * - Converged only when every equation holds (see the stopping rule); otherwise converged:false
 *   with the first equation that does not hold as the reason.
 *
 * @example
 * const solver = new GradientSolver(compileNetwork(doc));
 * const outcome = solver.solve(solver.createState()); // then read solver.head, solver.flow, solver.demand
 */

/** Smallest headloss gradient dh/dQ used, m per m³/s (keeps 1/g finite for links at zero flow with no regularisation). */
export const GRADIENT_FLOOR = 1e-2;
/** Diagonal weight that pins the downstream node of an active pressure-reducing valve and fixed tanks. */
const PIN_WEIGHT = 1e10;
/** Default largest law residual |h(Q) − ΔH| accepted as converged, m. */
export const ENERGY_TOLERANCE_M = 1e-6;
/** Default largest node imbalance accepted, m³/s. */
export const BALANCE_TOLERANCE_M3S = 1e-10;
/** Default largest next flow correction accepted, relative to the link's flow. */
export const RELATIVE_FLOW_TOLERANCE = 1e-7;
/**
 * Share of a link's previous headloss gradient that its next gradient may not fall below: after
 * the first solve many links of a looped network come out near zero flow, where the next Newton
 * step would overshoot several-fold. It only acts when a flow collapses by more than about 4× in
 * one step and leaves the solution unchanged (y = h/g uses the true h).
 */
export const GRADIENT_MEMORY = 0.3;
/**
 * The full check of every equation (./gradient-solver-residuals, a pass over every element) is
 * skipped after an update whose largest flow step Δ makes passing its flow test hopeless: near a
 * solution Newton's next correction of a link is about 0.4·Δ²/|Q| (Hazen-Williams), so the check
 * runs only when CHECK_MARGIN·Δ²/|Q| is within the flow tolerance for every link (a margin 40
 * times below that estimate). Skipping never reports a solution; it saves a pass per iteration
 * in the approach.
 */
const CHECK_MARGIN = 0.01;

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
   * Per tank: 0 = head held at fixedHead; c > 0 = storage (m²/s) of an implicit stage
   * c·(H − fixedHead) = net inflow + tankInflow, so the solved head is the stage's head.
   */
  tankStorage: Float64Array;
  /** Steady inflow from outside the network into each tank during a storage step, m³/s. */
  tankInflow: Float64Array;
}

export interface SolveOptions {
  /** Iteration cap (default 100). */
  maxIterations?: number;
  /** Start from the last solution (default false: fresh start). */
  warmStart?: boolean;
  /** With warmStart: first test whether the start already solves the state (no factorisation then). */
  checkStart?: boolean;
  /** Largest law residual accepted, m (default 1e-6). */
  headTolerance_m?: number;
  /** Largest node imbalance accepted, m³/s (default 1e-10). */
  flowTolerance_m3s?: number;
  /** Largest next flow correction accepted, relative (default 1e-7). */
  relativeFlowTolerance?: number;
  /** Accepted for compatibility; the stopping rule above replaces it. */
  accuracy?: number;
}

export interface SolveOutcome {
  converged: boolean;
  iterations: number;
  singular: boolean;
  /** Why it did not converge: the first equation that does not hold (null when converged). */
  reason: string | null;
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
  /** Flow of each node's virtual demand link and its full demand (0: not pressure-driven). */
  readonly virtualFlow: Float64Array;
  readonly virtualFull: Float64Array;
  /** Zero-flow span δ and chord slope h(δ)/δ per link (./gradient-solver-laws). */
  readonly delta: Float64Array;
  readonly chord: Float64Array;
  readonly changes: Int32Array;
  readonly queue: Int32Array;
  readonly adjPtr: Int32Array;
  readonly adjLink: Int32Array;
  private readonly unknown: Int32Array;
  private readonly unknownNode: Int32Array;
  private readonly ldl: SparseLdl;
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
  private readonly virtualY: Float64Array;
  private readonly virtualP: Float64Array;
  private readonly pinned: Float64Array;
  private readonly netOut: Float64Array;
  private readonly scratch = new Float64Array(2);
  private readonly gradientPrev: Float64Array;
  /** 1 where the last Newton step shrank the flow at about the ratio of a power law heading to zero. */
  private readonly collapsing: Uint8Array;
  /** The last accepted Newton state, for halving a step that makes the laws worse. */
  private readonly flowPrev: Float64Array;
  private readonly headPrev: Float64Array;
  private readonly virtualPrev: Float64Array;
  private initialised = false;
  /** Σ|Q| of the last assembly or flow update (a second return value of those methods). */
  private stepScale = 0;
  /** The matrix of the last factorisation (large networks; null before the first or after a failed one). */
  private factoredValues: Float64Array | null = null;
  /** b − A·H of a chord step. */
  private readonly chordResidual: Float64Array;
  /** r·|Q|^0.852 per Hazen-Williams pipe (hazenWilliamsSlopes), at the flow magnitude in secantFlow. */
  readonly secant: Float64Array;
  /** |Q| each `secant` was taken at (the check and the assembly use it only while the flow is unchanged). */
  readonly secantFlow: Float64Array;
  /** Largest CHECK_MARGIN·Δ²/|Q| of the last update over the flow tolerance (links and outlets; ≤ 1: worth checking). */
  private stepExcess = 0;
  private tolerances: Tolerances = { head_m: ENERGY_TOLERANCE_M, flow_m3s: BALANCE_TOLERANCE_M3S, relativeFlow: RELATIVE_FLOW_TOLERANCE };
  private readonly prvs: Int32Array;
  private readonly prvDone: Uint8Array;
  /** Links with status logic of their own (check, PRV, curve pump) and all links. */
  private readonly logicLinks: Int32Array;
  private readonly allLinks: Int32Array;

  constructor(model: NetworkModel) {
    this.model = model;
    const n = model.nodeCount;
    const m = model.linkCount;
    this.unknown = new Int32Array(n).fill(-1);
    let nu = 0;
    for (let i = 0; i < n; i++) if (model.nodeKind[i] !== kinds.NODE_SOURCE) this.unknown[i] = nu++;
    this.unknownNode = new Int32Array(nu);
    for (let i = 0; i < n; i++) if (this.unknown[i] >= 0) this.unknownNode[this.unknown[i]] = i;
    const structure = structureFor(model, this.unknown, nu);
    this.ldl = new SparseLdl(nu, EMPTY_PAIRS, structure.ldl);
    this.chol = structure.chol ? new SupernodalCholesky(this.ldl, structure.chol) : null;
    ({ posFF: this.posFF, posTT: this.posTT, posFT: this.posFT, posTF: this.posTF, posDiag: this.posDiag } = structure);
    const logic: number[] = [];
    const prvs: number[] = [];
    for (let k = 0; k < m; k++) {
      const kind = model.linkKind[k];
      if (kind === LINK_CHECK || kind === LINK_PRV || kind === LINK_PUMP_CURVE) logic.push(k);
      if (kind === LINK_PRV) prvs.push(k);
    }
    this.logicLinks = Int32Array.from(logic);
    this.prvs = Int32Array.from(prvs);
    this.prvDone = new Uint8Array(prvs.length);
    this.allLinks = Int32Array.from({ length: m }, (_, k) => k);
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
    this.collapsing = new Uint8Array(m);
    this.secant = new Float64Array(m);
    this.secantFlow = new Float64Array(m).fill(Number.NaN);
    this.chordResidual = new Float64Array(nu);
    this.flowPrev = new Float64Array(m);
    this.headPrev = new Float64Array(n);
    this.virtualPrev = new Float64Array(n);
    this.queue = new Int32Array(n);
    this.delta = new Float64Array(m);
    this.chord = new Float64Array(m);
    for (let k = 0; k < m; k++) {
      this.delta[k] = zeroFlowSpan(model, k);
      this.chord[k] = zeroFlowSlope(model, k, this.delta[k], this.scratch);
    }
    // node → incident links (CSR)
    this.adjPtr = new Int32Array(n + 1);
    for (let k = 0; k < m; k++) {
      this.adjPtr[model.from[k] + 1]++;
      this.adjPtr[model.to[k] + 1]++;
    }
    for (let i = 0; i < n; i++) this.adjPtr[i + 1] += this.adjPtr[i];
    this.adjLink = new Int32Array(this.adjPtr[n]);
    const fill = this.adjPtr.slice(0, n);
    for (let k = 0; k < m; k++) {
      this.adjLink[fill[model.from[k]]++] = k;
      this.adjLink[fill[model.to[k]]++] = k;
    }
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
    model.doc.nodes.forEach((node, i) => {
      if (node.kind === 'tank') state.fixedHead[i] = node.elevation_m + node.level_m;
    });
    return state;
  }

  /**
   * Start the next solve from given heads, flows and (optionally) statuses: a previous answer of
   * this layout or of an edited copy. Entries that are not finite (statuses: not a STATUS_* code)
   * are left at the cold start; the iteration re-derives every status anyway. Call solve with
   * warmStart: true afterwards.
   */
  setStart(head: ArrayLike<number>, flow: ArrayLike<number>, state: SolverState, status?: ArrayLike<number>): void {
    const model = this.model;
    this.initialise(state);
    for (let i = 0; i < model.nodeCount; i++) if (Number.isFinite(head[i]) && model.nodeKind[i] === NODE_JUNCTION) this.head[i] = head[i];
    for (let k = 0; k < model.linkCount; k++) {
      if (Number.isFinite(flow[k]) && model.linkKind[k] !== LINK_PUMP_FLOW) this.flow[k] = flow[k];
      const st = status ? status[k] : -1;
      if (st === STATUS_OPEN || st === STATUS_ACTIVE || st === STATUS_CHECK_CLOSED || st === STATUS_SHUT) this.status[k] = st;
    }
  }

  private initialise(state: SolverState): void {
    const model = this.model;
    // a cold start owes nothing to earlier solves: same state, same answer to the bit
    this.factoredValues = null;
    this.secantFlow.fill(Number.NaN);
    let hmax = -Infinity;
    for (let i = 0; i < model.nodeCount; i++) if (model.nodeKind[i] !== NODE_JUNCTION) hmax = Math.max(hmax, state.fixedHead[i]);
    for (let i = 0; i < model.nodeCount; i++) {
      this.head[i] = model.nodeKind[i] === NODE_JUNCTION ? (Number.isFinite(hmax) ? hmax : model.elevation[i]) : state.fixedHead[i];
      this.virtualFlow[i] =
        model.demandType[i] === DEMAND_EMITTER
          ? model.emitterK[i] * state.demandFactor[i] * Math.pow(Math.max((Number.isFinite(hmax) ? hmax : 0) - model.elevation[i], 0), model.emitterExponent[i])
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

  /** Statuses imposed by the state (closures, pumps off, lifted direction blocks) and demands. */
  private prepare(state: SolverState): void {
    const { model, status, flow } = this;
    for (let k = 0; k < model.linkCount; k++) {
      const kind = model.linkKind[k];
      const off = state.linkClosed[k] === 1 || ((kind === LINK_PUMP_FLOW || kind === LINK_PUMP_CURVE) && !(state.pumpFactor[k] > 0));
      if (off) {
        status[k] = STATUS_CLOSED;
        flow[k] = 0;
      } else if (status[k] === STATUS_CLOSED) {
        status[k] = kind === LINK_PRV ? STATUS_ACTIVE : STATUS_OPEN;
        flow[k] =
          kind === LINK_PUMP_FLOW
            ? model.pumpFlow[k]
            : kind === LINK_PUMP_CURVE
              ? model.curveQ[model.curveStart[k] + 1] * state.pumpFactor[k]
              : 0.1 * model.area[k];
      }
      // a PRV feeding a fixed head cannot regulate: it behaves as an open valve
      if (kind === LINK_PRV && status[k] === STATUS_ACTIVE && model.nodeKind[model.to[k]] !== NODE_JUNCTION) status[k] = STATUS_OPEN;
      if (status[k] === STATUS_CHECK_CLOSED && state.linkDirection[k] === 0 && (kind === LINK_PIPE || kind === LINK_SHUTOFF || kind === LINK_FLOAT)) {
        status[k] = STATUS_OPEN;
        flow[k] = 0;
      }
    }
    for (let i = 0; i < model.nodeCount; i++) {
      if (model.nodeKind[i] !== NODE_JUNCTION) {
        this.head[i] = state.fixedHead[i];
        this.requested[i] = 0;
        this.virtualFull[i] = 0;
        continue;
      }
      const base = model.demandBase[i] * state.demandFactor[i];
      const emitter = model.demandType[i] === DEMAND_EMITTER;
      this.requested[i] = emitter ? Number.NaN : base;
      const isVirtual = model.demandType[i] !== DEMAND_FIXED || (state.pressureDriven && base > 0);
      // a full demand within the balance tolerance (under 9 mL a day) is delivered as fixed: its law would be all barrier
      const live = emitter ? model.emitterK[i] * state.demandFactor[i] > 0 : base > BALANCE_TOLERANCE_M3S;
      this.virtualFull[i] = isVirtual && live ? (emitter ? Infinity : base) : 0;
      // start each outlet at what its own law delivers at the current pressure: a warm start may
      // carry a flow from another demand factor, and the law's steep start would overshoot from 0
      if (this.virtualFull[i] > 0)
        this.virtualFlow[i] = outletFlow(model, i, this.head[i] - model.elevation[i], this.virtualFull[i], state.demandFactor[i], state.pressureDriven);
    }
  }

  /**
   * Solve the steady state (or implicit stage) for `state`. Results are left in head, flow, demand, status.
   * @param state fixed heads, factors and closures
   * @param options tolerances, maxIterations (default 100), warmStart
   */
  solve(state: SolverState, options: SolveOptions = {}): SolveOutcome {
    const model = this.model;
    const maxIterations = options.maxIterations ?? 100;
    const tol: Tolerances = {
      head_m: options.headTolerance_m ?? ENERGY_TOLERANCE_M,
      flow_m3s: options.flowTolerance_m3s ?? BALANCE_TOLERANCE_M3S,
      relativeFlow: options.relativeFlowTolerance ?? RELATIVE_FLOW_TOLERANCE,
    };
    this.tolerances = tol;
    const n = model.nodeCount;
    const m = model.linkCount;
    const { head, flow, status, ldl, rhs, x, virtualFlow, virtualFull, pinned, netOut, changes, active, gradientPrev, flowPrev, headPrev, virtualPrev } = this;
    const values = ldl.values;
    const { linkKind } = model;
    const linkFrom = model.from;
    const linkTo = model.to;
    const hazenWilliams = model.headloss !== 'darcy-weisbach';
    if (!options.warmStart || !this.initialised) this.initialise(state);
    changes.fill(0);
    gradientPrev.fill(0);
    this.collapsing.fill(0);
    this.prepare(state);
    connect(this);
    let hasBlocks = false;
    for (let k = 0; k < m; k++)
      if (state.linkDirection[k] !== 0) {
        hasBlocks = true;
        break;
      }
    const statusLinks = hasBlocks ? this.allLinks : this.logicLinks;

    let iterations = 0;
    let verified = false;
    let singular = false;
    let reason: string | null = null;
    let meritPrev = Infinity;
    let halvings = 0;
    let sinceReset = 0;
    let checkedAt = -1;
    // a warm start that already solves this state needs no factorisation at all
    if (options.warmStart && options.checkStart) {
      for (let i = 0; i < n; i++)
        this.demand[i] = model.nodeKind[i] !== NODE_JUNCTION || !active[i] ? 0 : virtualFull[i] > 0 ? virtualFlow[i] : this.requested[i] || 0;
      for (let k = 0; k < m; k++) if (isShut(status[k]) || !active[linkFrom[k]] || !active[linkTo[k]]) flow[k] = 0;
      if (hazenWilliams) this.hazenWilliamsSlopes();
      verified = firstViolation(this, state, tol, netOut, this.scratch) === null;
    }
    while (!verified && iterations < maxIterations) {
      iterations++;
      values.fill(0);
      rhs.fill(0);
      pinned.fill(Number.NaN);
      // the loops are methods of their own: small functions are optimised (and, in a fresh
      // process, compiled on stack replacement) far sooner than one long one
      let merit = this.assembleLinks(state, hazenWilliams);
      const qScale = this.stepScale;
      merit = this.assembleNodes(state, merit);
      // a step that made the laws worse by far: go back half way (continuity holds on the segment)
      if (merit > meritPrev * (1 + 1e-6) && merit > tol.head_m * qScale && halvings < 8 && sinceReset >= 2) {
        halvings++;
        for (let k = 0; k < m; k++) flow[k] = 0.5 * (flow[k] + flowPrev[k]);
        for (let i = 0; i < n; i++) {
          head[i] = 0.5 * (head[i] + headPrev[i]);
          virtualFlow[i] = 0.5 * (virtualFlow[i] + virtualPrev[i]);
        }
        iterations--;
        continue;
      }
      halvings = 0;
      sinceReset++;
      meritPrev = merit;
      flowPrev.set(flow);
      headPrev.set(head);
      virtualPrev.set(virtualFlow);
      if (this.chol && this.factoredValues && factorStillServes(this.factoredValues, ldl, this.posDiag))
        chordStep(ldl, this.chol, rhs, this.chordResidual, x, head, this.unknownNode);
      else {
        const factorisation = this.chol ?? ldl;
        if (factorisation.factor() !== ldl.n) {
          singular = true;
          this.factoredValues = null;
          reason = 'singular system (a part of the network has no head to hold it)';
          break;
        }
        if (this.chol) (this.factoredValues ??= new Float64Array(values.length)).set(values);
        factorisation.solve(rhs, x);
        for (let u = 0; u < this.unknownNode.length; u++) head[this.unknownNode[u]] = x[u];
      }

      // flow update
      let sumDQ = this.updateFlows();
      let sumQ = this.stepScale;
      if (this.prvs.length > 0) {
        netOut.fill(0);
        for (let k = 0; k < m; k++) {
          if (linkKind[k] === LINK_PRV && status[k] === STATUS_ACTIVE) continue;
          netOut[linkFrom[k]] += flow[k];
          netOut[linkTo[k]] -= flow[k];
        }
        const prv = prvFlowsByContinuity(this, this.prvs, netOut, this.prvDone);
        sumDQ += prv.change;
        sumQ += prv.total;
      }
      const relative = sumDQ / Math.max(sumQ, 1e-4);
      if ((relative < 1e-2 || iterations >= 10) && statusLinks.length > 0 && updateStatuses(this, statusLinks, state.linkDirection, state.pumpFactor)) {
        connect(this);
        meritPrev = Infinity;
        sinceReset = 0; // the flows before the change do not balance under the new statuses
        continue;
      }
      if ((relative < 1e-3 && this.stepExcess <= 1) || iterations - checkedAt >= 8 || iterations === maxIterations) {
        checkedAt = iterations;
        if (hazenWilliams) this.hazenWilliamsSlopes();
        reason = firstViolation(this, state, tol, netOut, this.scratch);
        if (reason === null) {
          verified = true;
          break;
        }
      }
    }
    if (!singular && reason === null && iterations >= maxIterations) reason = 'iteration cap reached';
    // delivered demand (the virtual flows hold their law's range to the barrier's 1e-14 m³/s per m)
    for (let i = 0; i < n; i++) {
      if (model.nodeKind[i] !== NODE_JUNCTION) continue;
      if (!active[i]) {
        head[i] = model.elevation[i];
        this.demand[i] = 0;
        continue;
      }
      if (virtualFull[i] > 0) this.demand[i] = Math.min(Math.max(virtualFlow[i], 0), virtualFull[i]);
    }
    if (!singular && !verified && reason === null) {
      if (hazenWilliams) this.hazenWilliamsSlopes();
      reason = firstViolation(this, state, tol, netOut, this.scratch);
    }
    return { converged: reason === null, iterations, singular, reason };
  }

  /**
   * One Newton step's link terms: each open link's conductance p = 1/h'(Q) and y = h(Q)/h'(Q) into
   * the matrix and right-hand side. Returns the merit Σ|h(Q) − ΔH|·|Q| of the links and leaves
   * Σ|Q| in stepScale.
   */
  private assembleLinks(state: SolverState, hazenWilliams: boolean): number {
    const { model, head, flow, status, unknown, rhs, pinned, delta, chord, gradientPrev, collapsing, posFF, posTT, posFT, posTF, p, y, secant } = this;
    const active = this.active;
    if (hazenWilliams) this.hazenWilliamsSlopes();
    const values = this.ldl.values;
    const { minor, linkKind } = model;
    const linkFrom = model.from;
    const linkTo = model.to;
    const m = model.linkCount;
    let merit = 0;
    let qScale = 0;
    for (let k = 0; k < m; k++) {
      const f = linkFrom[k];
      const t = linkTo[k];
      const st = status[k];
      if (isShut(st) || !active[f] || !active[t]) {
        flow[k] = 0;
        p[k] = 0;
        y[k] = 0;
        continue;
      }
      const uf = unknown[f];
      const ut = unknown[t];
      const kind = linkKind[k];
      if (kind === LINK_PUMP_FLOW) {
        const q = model.pumpFlow[k] * state.pumpFactor[k];
        flow[k] = q;
        p[k] = 0;
        y[k] = 0;
        if (uf >= 0) rhs[uf] -= q;
        if (ut >= 0) rhs[ut] += q;
        continue;
      }
      if (kind === LINK_PRV && st === STATUS_ACTIVE) {
        p[k] = 0;
        y[k] = 0;
        if (uf >= 0) rhs[uf] -= flow[k];
        const hset = prvHead(model, k);
        if (!(pinned[t] >= hset)) pinned[t] = hset; // parallel valves: the higher setting governs
        continue;
      }
      const q = flow[k];
      const a = q < 0 ? -q : q;
      let hk: number;
      let g: number;
      if (a < delta[k]) {
        hk = chord[k] * q;
        g = chord[k];
      } else if (kind === LINK_PIPE && hazenWilliams) {
        // nearly every link of a large network: the law of ./hazen-williams, its power taken in
        // the tight loop of hazenWilliamsSlopes
        const s = secant[k];
        const mk = minor[k];
        hk = (s + mk * a) * q;
        g = HW_FLOW_EXPONENT * s + 2 * mk * a;
      } else {
        linkLaw(model, k, q, state.pumpFactor[k], this.scratch);
        hk = this.scratch[0];
        g = this.scratch[1];
      }
      // a flow shrinking at Newton's ratio 1 − 1/n towards zero: take the chord through the origin,
      // which lands on a zero flow in one step instead of halving it each iteration
      if (collapsing[k] === 1 && a >= delta[k] && kind !== LINK_PUMP_CURVE) g = hk / q;
      const resid = hk - (head[f] - head[t]);
      merit += (resid < 0 ? -resid : resid) * a;
      qScale += a;
      if (kind !== LINK_PUMP_CURVE) {
        const memory = GRADIENT_MEMORY * gradientPrev[k];
        gradientPrev[k] = g;
        if (memory > g) g = memory;
      }
      if (g < GRADIENT_FLOOR) g = GRADIENT_FLOOR;
      const pk = 1 / g;
      const yk = hk * pk;
      p[k] = pk;
      y[k] = yk;
      const qy = q - yk;
      if (uf >= 0) {
        values[posFF[k]] += pk;
        rhs[uf] -= qy;
      } else if (ut >= 0) rhs[ut] += pk * head[f];
      if (ut >= 0) {
        values[posTT[k]] += pk;
        rhs[ut] += qy;
      } else if (uf >= 0) rhs[uf] += pk * head[t];
      if (uf >= 0 && ut >= 0) {
        values[posFT[k]] -= pk;
        values[posTF[k]] -= pk;
      }
    }
    this.stepScale = qScale;
    return merit;
  }

  /**
   * r·|Q|^0.852 of every pipe into `secant`, in a loop of its own: inside the assembly loop the
   * power's two library calls run one after another (their latency, about 45 ns a pipe on the
   * 10,000-tee grid), here the processor overlaps them from pipe to pipe (about 20 ns). Pipes
   * whose flow has not changed since keep theirs: the check after an update and the next
   * iteration's assembly share one pass.
   */
  private hazenWilliamsSlopes(): void {
    const { flow, secant, secantFlow } = this;
    const { resistance, linkKind } = this.model;
    for (let k = 0; k < secant.length; k++) {
      if (linkKind[k] !== LINK_PIPE) continue;
      const q = flow[k];
      const a = q < 0 ? -q : q;
      const was = secantFlow[k];
      if (was === a) continue;
      const t = a / was - 1;
      // a small change scales the last power by (1 + t)^0.852, its binomial series to t⁴
      // (remainder below 1e-17 for |t| < 1e-3): two library calls fewer for most pipes late on
      if (t < 1e-3 && t > -1e-3) secant[k] *= 1 + t * (0.852 + t * (-0.063048 + t * (0.024126368 - t * 0.01295586)));
      else secant[k] = hazenWilliamsSecant(resistance[k], a);
      secantFlow[k] = a;
    }
  }

  /** One Newton step's node terms (tanks, cut-off nodes, outlets' virtual links, demands, PRV pins); returns `merit` plus the outlets' terms. */
  private assembleNodes(state: SolverState, meritOfLinks: number): number {
    const { model, head, rhs, pinned, active, virtualFull, virtualFlow } = this;
    const values = this.ldl.values;
    let merit = meritOfLinks;
    for (let u = 0; u < this.unknownNode.length; u++) {
      const i = this.unknownNode[u];
      const pd = this.posDiag[u];
      if (model.nodeKind[i] === NODE_TANK) {
        const c = state.tankStorage[i];
        const w = c > 0 ? c : PIN_WEIGHT;
        values[pd] += w;
        rhs[u] += w * state.fixedHead[i] + (c > 0 ? state.tankInflow[i] : 0);
        continue;
      }
      if (!active[i]) {
        values[pd] = 1;
        rhs[u] = model.elevation[i];
        continue;
      }
      if (virtualFull[i] > 0) {
        virtualLaw(model, i, virtualFlow[i], virtualFull[i], state.demandFactor[i], state.pressureDriven, this.scratch);
        const base = model.elevation[i] + zeroPressure(model, i);
        const resid = this.scratch[0] - (head[i] - base);
        merit += (resid < 0 ? -resid : resid) * Math.abs(virtualFlow[i]);
        const g = this.scratch[1] > GRADIENT_FLOOR ? this.scratch[1] : GRADIENT_FLOOR;
        const pv = 1 / g;
        const yv = this.scratch[0] * pv;
        values[pd] += pv;
        rhs[u] += -(virtualFlow[i] - yv) + pv * base;
        this.virtualY[i] = yv;
        this.virtualP[i] = pv;
      } else {
        rhs[u] -= this.requested[i] > 0 || this.requested[i] < 0 ? this.requested[i] : 0;
      }
      if (!Number.isNaN(pinned[i])) {
        values[pd] += PIN_WEIGHT;
        rhs[u] += PIN_WEIGHT * pinned[i];
      }
    }
    return merit;
  }

  /** Flows from the new heads (Q − y + p·ΔH per link, the same for outlets); returns Σ|ΔQ| and leaves Σ|Q| in stepScale. */
  private updateFlows(): number {
    const { model, head, flow, active, virtualFull, virtualFlow, collapsing, delta, p, y } = this;
    const n = model.nodeCount;
    const m = model.linkCount;
    const linkFrom = model.from;
    const linkTo = model.to;
    let sumQ = 0;
    let sumDQ = 0;
    const { relativeFlow, flow_m3s } = this.tolerances;
    let excess = 0;
    for (let i = 0; i < n; i++) {
      if (model.nodeKind[i] !== NODE_JUNCTION || !active[i]) {
        virtualFlow[i] = 0;
        this.demand[i] = 0;
        continue;
      }
      if (virtualFull[i] > 0) {
        const qv = virtualFlow[i] - this.virtualY[i] + this.virtualP[i] * (head[i] - model.elevation[i] - zeroPressure(model, i));
        const dq = Math.abs(qv - virtualFlow[i]);
        sumDQ += dq;
        sumQ += Math.abs(qv);
        const e = (CHECK_MARGIN * dq * dq) / Math.abs(qv) / (relativeFlow * Math.abs(qv) + flow_m3s);
        if (e > excess) excess = e;
        virtualFlow[i] = qv;
        this.demand[i] = qv;
      } else this.demand[i] = this.requested[i] || 0;
    }
    for (let k = 0; k < m; k++) {
      if (p[k] === 0) continue;
      const q = flow[k] - y[k] + p[k] * (head[linkFrom[k]] - head[linkTo[k]]);
      const ratio = q / flow[k];
      collapsing[k] = ratio > 0.42 && ratio < 0.5 ? 1 : 0;
      const dq = Math.abs(q - flow[k]);
      const a = Math.abs(q);
      sumDQ += dq;
      sumQ += a;
      // not inside the zero-flow span, where the law is linear and Newton's step exact
      if (a >= delta[k]) {
        const e = (CHECK_MARGIN * dq * dq) / a / (relativeFlow * a + flow_m3s);
        if (e > excess) excess = e;
      }
      flow[k] = q;
    }
    this.stepScale = sumQ;
    this.stepExcess = excess;
    return sumDQ;
  }
}
