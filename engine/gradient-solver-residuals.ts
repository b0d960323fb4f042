import { HW_FLOW_EXPONENT as HW_FLOW_EXPONENT_ } from './hazen-williams';
import * as laws from './gradient-solver-laws';
import * as statuses from './gradient-solver-status';
import type { StatusArrays } from './gradient-solver-status';
import * as kinds from './network-model';

/**
 * The stopping rule of the gradient solver (./gradient-solver): a state is a solution only when
 * every one of its equations holds at once — continuity at every node (and the storage balance of
 * tanks inside a time step), every link's own law (headloss, pump curve, fixed pump flow, the
 * setting of an active PRV), every outlet's pressure law, every valve's status (a check valve
 * that should reopen, a PRV that should switch) — and the flows are settled (the next Newton
 * correction of each link, |h(Q) − ΔH|/h'(Q), is below a relative tolerance). Heads alone are not
 * enough: in low-headloss links a flow can be far off while the head error is tiny.
 */

// module-local copies of imported bindings read per element (see ./gradient-solver)
const { LINK_FLOAT, LINK_PIPE, LINK_PRV, LINK_PUMP_FLOW, LINK_SHUTOFF, NODE_JUNCTION, NODE_TANK } = kinds;
const { linkLaw, outletLawResidual } = laws;
const HW_FLOW_EXPONENT = HW_FLOW_EXPONENT_;
const { isShut, nextStatus, prvHead, STATUS_ACTIVE, STATUS_OPEN } = statuses;
/** Per-node scratch of the check, kept between calls. */
const buffers: Float64Array[] = [];

export interface Tolerances {
  /** Largest law residual, m. */
  head_m: number;
  /** Largest node imbalance, m³/s. */
  flow_m3s: number;
  /** Largest predicted flow correction relative to the flow (plus flow_m3s). */
  relativeFlow: number;
}

/** Everything a check reads, beyond the status arrays. */
export interface SolutionArrays extends StatusArrays {
  readonly virtualFlow: Float64Array;
  readonly virtualFull: Float64Array;
  readonly requested: Float64Array;
  /** Zero-flow span and chord slope per link (./gradient-solver-laws). */
  readonly delta: Float64Array;
  readonly chord: Float64Array;
  /** Hazen-Williams secant r·|Q|^0.852 per pipe, valid where secantFlow equals the pipe's |Q|. */
  readonly secant: Float64Array;
  readonly secantFlow: Float64Array;
}

/** Inputs of the state being solved (see SolverState in ./gradient-solver). */
export interface StateView {
  fixedHead: Float64Array;
  demandFactor: Float64Array;
  linkDirection: Int8Array;
  pumpFactor: Float64Array;
  pressureDriven: boolean;
  tankStorage: Float64Array;
  tankInflow: Float64Array;
}

function fmt(v: number): string {
  return Math.abs(v) >= 1e-3 && Math.abs(v) < 1e6 ? v.toFixed(4) : v.toExponential(2);
}

/**
 * The first equation the state breaks by more than its tolerance, as a message naming the element
 * (null when every equation holds).
 * @param netIn scratch, one entry per node
 */
export function firstViolation(s: SolutionArrays, state: StateView, tol: Tolerances, netIn: Float64Array, scratch: Float64Array): string | null {
  const { model, head, flow, status, active } = s;
  const n = model.nodeCount;
  const m = model.linkCount;
  netIn.fill(0);
  if (buffers.length !== 2 || buffers[0].length !== n) {
    buffers.length = 0;
    buffers.push(new Float64Array(n), new Float64Array(n));
  }
  const [scale, slack] = buffers;
  scale.fill(0);
  slack.fill(0);
  for (let k = 0; k < m; k++) {
    const f = model.from[k];
    const t = model.to[k];
    const q = flow[k];
    netIn[t] += q;
    netIn[f] -= q;
    scale[t] += Math.abs(q);
    scale[f] += Math.abs(q);
    const st = status[k];
    const id = model.linkIds[k];
    const kind = model.linkKind[k];
    if (isShut(st) || !active[f] || !active[t]) {
      if (q !== 0) return `${id}: carries ${fmt(q)} m³/s while closed or cut off`;
      if ((active[f] || active[t]) && nextStatus(s, k, state.linkDirection[k], state.pumpFactor[k]) !== st)
        return `${id}: status should change (it would reopen at these heads)`;
      continue;
    }
    if (kind === LINK_PUMP_FLOW) {
      const target = model.pumpFlow[k] * state.pumpFactor[k];
      if (Math.abs(q - target) > tol.flow_m3s) return `${id}: pumps ${fmt(q)} m³/s instead of ${fmt(target)} m³/s`;
      continue;
    }
    // plain links with no direction block have no status of their own to check
    const plain = (kind === LINK_PIPE || kind === LINK_SHUTOFF || kind === LINK_FLOAT) && state.linkDirection[k] === 0 && st === STATUS_OPEN;
    if (!plain && nextStatus(s, k, state.linkDirection[k], state.pumpFactor[k]) !== st) return `${id}: status should change at these heads and flows`;
    const dh = head[f] - head[t];
    if (kind === LINK_PRV && st === STATUS_ACTIVE) {
      const miss = Math.abs(head[t] - prvHead(model, k));
      if (miss > tol.head_m) return `${id}: holds the downstream head ${fmt(miss)} m off its setting`;
      if (q < -tol.flow_m3s) return `${id}: active with reverse flow ${fmt(q)} m³/s`;
      continue;
    }
    const d = s.delta[k];
    let h: number;
    let g: number;
    if (Math.abs(q) < d) {
      h = s.chord[k] * q;
      g = s.chord[k];
    } else if (kind === LINK_PIPE && s.secantFlow[k] === Math.abs(q) && model.headloss !== 'darcy-weisbach') {
      // the law of ./gradient-solver-laws with the power the solver has just taken
      const a = Math.abs(q);
      const sec = s.secant[k];
      h = (sec + model.minor[k] * a) * q;
      g = HW_FLOW_EXPONENT * sec + 2 * model.minor[k] * a;
    } else {
      linkLaw(model, k, q, state.pumpFactor[k], scratch);
      h = scratch[0];
      g = Math.abs(scratch[1]);
    }
    // rounding of the flow update p·ΔH grows with the heads (they reach −10⁴ m in absurd designs)
    if (g > 0) {
      const e = (4.4e-16 * (Math.abs(head[f]) + Math.abs(head[t]))) / g;
      slack[f] += e;
      slack[t] += e;
    }
    const r = Math.abs(h - dh);
    if (r > tol.head_m) return `${id}: headloss law misses by ${fmt(r)} m`;
    if (g > 0 && r / g > tol.relativeFlow * Math.abs(q) + tol.flow_m3s) return `${id}: flow not settled (next correction ${fmt(r / g)} m³/s of ${fmt(q)} m³/s)`;
  }
  for (let i = 0; i < n; i++) {
    const kind = model.nodeKind[i];
    if (kind === NODE_TANK) {
      const c = state.tankStorage[i];
      if (!(c > 0)) continue;
      const miss = Math.abs(c * (head[i] - state.fixedHead[i]) - netIn[i] - state.tankInflow[i]);
      if (miss > tol.flow_m3s + 1e-13 * c * Math.abs(head[i]) + 1e-13 * scale[i]) return `${model.nodeIds[i]}: storage balance misses by ${fmt(miss)} m³/s`;
      continue;
    }
    if (kind !== NODE_JUNCTION || !active[i]) continue;
    const full = s.virtualFull[i];
    const delivered = full > 0 ? s.virtualFlow[i] : s.requested[i] || 0;
    const miss = Math.abs(netIn[i] - delivered);
    if (miss > tol.flow_m3s + 1e-13 * scale[i] + slack[i]) return `${model.nodeIds[i]}: flow balance misses by ${fmt(miss)} m³/s`;
    if (full > 0) {
      const r = outletLawResidual(model, i, s.virtualFlow[i], full, head[i] - model.elevation[i], state.demandFactor[i], state.pressureDriven, tol.flow_m3s);
      if (r > tol.head_m) return `${model.nodeIds[i]}: delivery ${fmt(s.virtualFlow[i])} m³/s misses its pressure law by ${fmt(r)} m`;
    }
  }
  return null;
}
