import type { GradientSolver, SolverState } from './gradient-solver';
import * as kinds from './network-model';
import type { NetworkModel } from './network-model';

// module-local copy of an imported constant read per link and step (see ./gradient-solver)
const { NODE_TANK } = kinds;

/**
 * One time step of the tank levels with an error estimate (used by ./simulate). The levels obey
 * A·dh/dt = Σ flows in + inflow, where the flows come from a network solve at the current heads.
 * Each step is taken twice with the implicit (backward) Euler method, once whole and once as two
 * halves; the two answers differ by about the whole step's error, which is the error estimate, and
 * 2·(halves) − whole cancels that first-order error (Richardson extrapolation: second order, and
 * stable for stiff tank banks joined by short headers; Hairer & Wanner, Solving Ordinary
 * Differential Equations II, 1996, IV.9). Volumes (delivered, unmet, pumped, into each tank) are
 * combined the same way, so they stay consistent with the levels. Tanks that are full or empty are
 * held at their level (their net flow is counted instead).
 */

export const TANK_NORMAL = 0;
export const TANK_FULL = 1;
export const TANK_EMPTY = 2;

export class TankStepper {
  /** Mode of each tank (TANK_*), level at the start of the step, m. */
  readonly mode: Uint8Array;
  readonly level0: Float64Array;
  /** Results of the last step: levels, and volumes over it (m³). */
  readonly level: Float64Array;
  readonly tankVolume: Float64Array;
  readonly delivered: Float64Array;
  readonly unmet: Float64Array;
  readonly pumped: Float64Array;
  /** Steps whose network solve did not converge (counted in the last step). */
  failed = 0;
  /**
   * The last step's midpoint: levels (the first half's, corrected by the same error estimate, so
   * second order like the end), and the heads and flows of the first half's solve, for reports
   * that fall inside a step (./simulate interpolates them).
   */
  readonly midLevel: Float64Array;
  readonly midHead: Float64Array;
  readonly midFlow: Float64Array;
  private readonly half: Float64Array;
  private readonly whole: Float64Array;
  private readonly netIn: Float64Array;

  constructor(
    private readonly model: NetworkModel,
    private readonly solver: GradientSolver,
    private readonly state: SolverState,
    readonly tanks: number[],
    private readonly demandNodes: number[],
    private readonly pumps: number[],
  ) {
    const n = model.nodeCount;
    this.mode = new Uint8Array(n);
    this.level0 = new Float64Array(n);
    this.level = new Float64Array(n);
    this.tankVolume = new Float64Array(n);
    this.delivered = new Float64Array(n);
    this.unmet = new Float64Array(n);
    this.pumped = new Float64Array(model.linkCount);
    this.half = new Float64Array(n);
    this.whole = new Float64Array(n);
    this.netIn = new Float64Array(n);
    this.midLevel = new Float64Array(n);
    this.midHead = new Float64Array(n);
    this.midFlow = new Float64Array(model.linkCount);
  }

  /** Allowed directions of links next to empty tanks (they only receive). */
  setDirections(): void {
    const { model, state, mode } = this;
    for (let k = 0; k < model.linkCount; k++) {
      const f = model.from[k];
      const t = model.to[k];
      let dir = 0;
      if (model.nodeKind[f] === NODE_TANK && mode[f] === TANK_EMPTY) dir = -1;
      if (model.nodeKind[t] === NODE_TANK && mode[t] === TANK_EMPTY) dir = dir === -1 ? 0 : 1;
      state.linkDirection[k] = dir;
    }
  }

  /** A steady solve with every tank held at `level` (no storage), for t = 0. */
  snapshot(level: Float64Array): boolean {
    for (const i of this.tanks) {
      this.state.tankStorage[i] = 0;
      this.state.fixedHead[i] = this.model.elevation[i] + level[i];
    }
    return this.solver.solve(this.state, { warmStart: true }).converged;
  }

  /** One backward-Euler stage of length dt from `from`, adding weight × its volumes; new levels into `to`. */
  private stage(from: Float64Array, dt: number, weight: number, to: Float64Array): void {
    const { model, state, solver, mode, netIn } = this;
    for (const i of this.tanks) {
      state.tankStorage[i] = mode[i] === TANK_NORMAL ? model.tankArea[i] / dt : 0;
      state.fixedHead[i] = model.elevation[i] + from[i];
    }
    if (!solver.solve(state, { warmStart: true }).converged) this.failed++;
    netIn.fill(0);
    for (let k = 0; k < model.linkCount; k++) {
      netIn[model.to[k]] += solver.flow[k];
      netIn[model.from[k]] -= solver.flow[k];
    }
    const w = weight * dt;
    for (const i of this.tanks) {
      const q = netIn[i] + state.tankInflow[i];
      this.tankVolume[i] += w * q;
      to[i] = mode[i] === TANK_NORMAL ? solver.head[i] - model.elevation[i] : from[i] + (dt * q) / model.tankArea[i];
    }
    for (const i of this.demandNodes) {
      this.delivered[i] += w * solver.demand[i];
      const req = solver.requested[i];
      if (req > 0) this.unmet[i] += w * Math.max(req - solver.demand[i], 0);
    }
    for (const k of this.pumps) this.pumped[k] += w * Math.max(solver.flow[k], 0);
  }

  /**
   * Step from level0 over dt (patterns, pump factors and closures already in the state). Leaves
   * the extrapolated levels and volumes in this step's results and the solver at the end of the
   * second half step; returns the error estimate, m (largest level difference of the two answers).
   */
  step(dt: number): number {
    const { tanks, level0, level, half, whole } = this;
    this.tankVolume.fill(0);
    this.delivered.fill(0);
    this.unmet.fill(0);
    this.pumped.fill(0);
    this.failed = 0;
    this.stage(level0, dt, -1, whole);
    this.stage(level0, dt / 2, 2, half);
    this.midHead.set(this.solver.head);
    this.midFlow.set(this.solver.flow);
    this.stage(half, dt / 2, 2, level);
    let err = 0;
    for (const i of tanks) {
      const e = Math.abs(level[i] - whole[i]);
      if (e > err) err = e;
      // backward Euler's error is about (h²/2)·y'' per step: the halves carry half the whole
      // step's, the first half a quarter of it, so each is corrected by the measured difference
      this.midLevel[i] = half[i] + (level[i] - whole[i]) / 2;
      level[i] = 2 * level[i] - whole[i];
    }
    return err;
  }
}
