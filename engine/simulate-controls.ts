import type { SolverState } from './gradient-solver';
import * as kinds from './network-model';
import type { NetworkModel } from './network-model';

// module-local copies of imported constants read per element and step (see ./gradient-solver)
const { LINK_FLOAT, LINK_PUMP_CURVE, LINK_PUMP_FLOW, NODE_TANK } = kinds;

/**
 * The rules that switch pumps and float valves on tank levels, in one place for the steady solve
 * (./steady: design condition at the document's levels) and the simulation (./simulate: switched
 * as levels cross them):
 * - a pump with a control stops when its tank reaches stop_level_m and restarts at start_level_m;
 * - a pump with a low-water cut-off stops at or below the cut-off level of the tank it draws from
 *   and restarts LOW_CUTOFF_RELEASE_M above it; a pump drawing from an empty tank stops;
 * - a float valve shuts when the tank it feeds reaches max_level_m and reopens FLOAT_VALVE_DEADBAND_M below;
 * - a pump's 24-hour schedule scales a constant-flow pump's flow or a curve pump's speed
 *   (simulation only: a steady solve runs pumps at full availability).
 *
 * @example
 * const controls = new Controls(model, levels); // switched from the levels, as a steady solve sees them
 * controls.apply(state, null);                  // closures and pump factors into a solver state
 */

/** Float valves reopen this far below the tank's max level, m. */
export const FLOAT_VALVE_DEADBAND_M = 0.02;
/** Low-water cut-offs release this far above their level, m. */
export const LOW_CUTOFF_RELEASE_M = 0.1;
/** Levels this close to a switching level count as having reached it, m. */
export const SWITCH_SNAP_M = 1e-7;

export class Controls {
  readonly pumpLinks: number[] = [];
  readonly controlTank: Int32Array;
  readonly stopLevel: Float64Array;
  readonly startLevel: Float64Array;
  readonly cutoffTank: Int32Array;
  readonly cutoffLevel: Float64Array;
  readonly floatTank: Int32Array;
  readonly schedules: (number[] | undefined)[];
  readonly controlOn: Uint8Array;
  readonly cutoffOk: Uint8Array;
  readonly floatOpen: Uint8Array;

  /**
   * Switches as they stand at `level` (per node; tanks' levels above their floors, m).
   * @param maxLevel per node, the tanks' max levels, m
   */
  constructor(
    private readonly model: NetworkModel,
    level: ArrayLike<number>,
    private readonly maxLevel: ArrayLike<number>,
  ) {
    const m = model.linkCount;
    this.controlTank = new Int32Array(m).fill(-1);
    this.stopLevel = new Float64Array(m);
    this.startLevel = new Float64Array(m);
    this.cutoffTank = new Int32Array(m).fill(-1);
    this.cutoffLevel = new Float64Array(m);
    this.floatTank = new Int32Array(m).fill(-1);
    this.schedules = new Array(m);
    this.controlOn = new Uint8Array(m).fill(1);
    this.cutoffOk = new Uint8Array(m).fill(1);
    this.floatOpen = new Uint8Array(m).fill(1);
    const idx = (id: string | undefined): number => (id === undefined ? -1 : (model.nodeIndex.get(id) ?? -1));
    model.doc.links.forEach((link, k) => {
      if (link.kind === 'pump') {
        this.pumpLinks.push(k);
        this.schedules[k] = link.schedule;
        if (link.control && idx(link.control.tank) >= 0) {
          const c = idx(link.control.tank);
          this.controlTank[k] = c;
          this.stopLevel[k] = link.control.stop_level_m;
          this.startLevel[k] = link.control.start_level_m;
          this.controlOn[k] = level[c] < this.stopLevel[k] ? 1 : 0;
        }
        if (link.low_cutoff && idx(link.low_cutoff.tank) >= 0) {
          const w = idx(link.low_cutoff.tank);
          this.cutoffTank[k] = w;
          this.cutoffLevel[k] = link.low_cutoff.level_m;
          this.cutoffOk[k] = level[w] > this.cutoffLevel[k] ? 1 : 0;
        }
      } else if (link.kind === 'valve' && model.linkKind[k] === LINK_FLOAT && idx(link.tank) >= 0 && model.nodeKind[idx(link.tank)] === NODE_TANK) {
        const f = idx(link.tank);
        this.floatTank[k] = f;
        this.floatOpen[k] = level[f] < maxLevel[f] ? 1 : 0;
      }
    });
  }

  /**
   * Closures and pump factors into `state`.
   * @param hour hour of day for schedules, or null for full availability (steady design condition)
   * @param empty per node, 1 for tanks that are empty (pumps drawing from them stop)
   */
  apply(state: SolverState, hour: number | null, empty?: Uint8Array): void {
    const model = this.model;
    for (let k = 0; k < model.linkCount; k++) {
      const kind = model.linkKind[k];
      let closed = model.closedInDocument[k];
      if (kind === LINK_PUMP_FLOW || kind === LINK_PUMP_CURVE) {
        const sched = this.schedules[k];
        const factor = hour !== null && sched ? sched[hour] : 1;
        const drawsFromEmpty = empty !== undefined && empty[model.from[k]] === 1;
        state.pumpFactor[k] = this.controlOn[k] && this.cutoffOk[k] && !drawsFromEmpty ? factor : 0;
        if (hour === null && !(state.pumpFactor[k] > 0)) closed = 1;
      } else if (kind === LINK_FLOAT && !this.floatOpen[k]) closed = 1;
      state.linkClosed[k] = closed;
    }
  }

  /** Switch on levels reached (within SWITCH_SNAP_M); true if anything switched. */
  update(level: ArrayLike<number>): boolean {
    let changed = false;
    const flip = (arr: Uint8Array, k: number, v: number): void => {
      if (arr[k] !== v) {
        arr[k] = v;
        changed = true;
      }
    };
    for (const k of this.pumpLinks) {
      const c = this.controlTank[k];
      if (c >= 0) {
        if (this.controlOn[k] && level[c] >= this.stopLevel[k] - SWITCH_SNAP_M) flip(this.controlOn, k, 0);
        else if (!this.controlOn[k] && level[c] <= this.startLevel[k] + SWITCH_SNAP_M) flip(this.controlOn, k, 1);
      }
      const w = this.cutoffTank[k];
      if (w >= 0) {
        if (this.cutoffOk[k] && level[w] <= this.cutoffLevel[k] + SWITCH_SNAP_M) flip(this.cutoffOk, k, 0);
        else if (!this.cutoffOk[k] && level[w] >= this.cutoffLevel[k] + LOW_CUTOFF_RELEASE_M - SWITCH_SNAP_M) flip(this.cutoffOk, k, 1);
      }
    }
    for (let k = 0; k < this.floatTank.length; k++) {
      const f = this.floatTank[k];
      if (f < 0) continue;
      if (this.floatOpen[k] && level[f] >= this.maxLevel[f] - SWITCH_SNAP_M) flip(this.floatOpen, k, 0);
      else if (!this.floatOpen[k] && level[f] <= this.maxLevel[f] - FLOAT_VALVE_DEADBAND_M + SWITCH_SNAP_M) flip(this.floatOpen, k, 1);
    }
    return changed;
  }

  /** Levels of tank i at which the next switch would act (stop or restart, cut-off or release, shut or reopen). */
  switchLevels(i: number, out: number[]): void {
    for (const k of this.pumpLinks) {
      if (this.controlTank[k] === i) out.push(this.controlOn[k] ? this.stopLevel[k] : this.startLevel[k]);
      if (this.cutoffTank[k] === i) out.push(this.cutoffOk[k] ? this.cutoffLevel[k] : this.cutoffLevel[k] + LOW_CUTOFF_RELEASE_M);
    }
    for (let k = 0; k < this.floatTank.length; k++) {
      if (this.floatTank[k] === i) out.push(this.floatOpen[k] ? this.maxLevel[i] : this.maxLevel[i] - FLOAT_VALVE_DEADBAND_M);
    }
  }
}
