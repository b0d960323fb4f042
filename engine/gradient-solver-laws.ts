import * as constants from './constants';
import { darcyFactorAndSlope, LAMINAR_REYNOLDS as LAMINAR_REYNOLDS_ } from './darcy-weisbach';
import { HW_FLOW_EXPONENT as HW_FLOW_EXPONENT_, hazenWilliamsSecant as hazenWilliamsSecant_ } from './hazen-williams';
import * as kinds from './network-model';
import type { NetworkModel } from './network-model';

/**
 * The laws of the solver's links and virtual demand links: headloss h(Q) and its gradient dh/dQ
 * for pipes (Hazen-Williams through ./hazen-williams, Darcy-Weisbach through ./darcy-weisbach),
 * valves (minor loss) and curve pumps; the inverse pressure laws of pressure-dependent outlets and
 * emitters; and the zero-flow regularisation.
 *
 * Zero flows: a power law h = c·|Q|^(n−1)·Q has no gradient at Q = 0, so Newton approaches a zero
 * flow only linearly (each step keeps 1 − 1/n of the flow). Below a small flow δ the law is
 * replaced by its chord through the origin, h = (h(δ)/δ)·Q, where Newton is exact in one step
 * (Elhay, S. & Simpson, A.R. (2011), "Dealing with zero flows in solving the nonlinear equations
 * for water distribution systems", J. Hydraulic Eng. 137(10), 1216–1224). δ is chosen per link so
 * the chord departs from the true law by at most ZERO_FLOW_LAW_ERROR_M anywhere: the answer still
 * satisfies the true law to far below the solver's tolerance.
 */

const { WATER_KINEMATIC_VISCOSITY_M2S, GRAVITY_MS2 } = constants;
const LAMINAR_REYNOLDS = LAMINAR_REYNOLDS_;
const HW_FLOW_EXPONENT = HW_FLOW_EXPONENT_;
const hazenWilliamsSecant = hazenWilliamsSecant_;
const { DEMAND_EMITTER, DEMAND_PRESSURE, LINK_PIPE, LINK_PUMP_CURVE } = kinds;

/** Largest departure of a regularised law from the true one, m (100× below the default tolerance). */
export const ZERO_FLOW_LAW_ERROR_M = 1e-8;
/** Barrier slope for virtual demand links outside [0, full demand], m per m³/s. */
export const DEMAND_BARRIER_SLOPE = 1e14;
/** Regularisation of the pressure-driven law's gradient near zero flow (fraction of full demand). */
const VIRTUAL_FLOW_FLOOR = 1e-3;
/** Required pressure used for outlets and tees in pressure-driven (simulation) mode without a minimum, m. */
export const DEFAULT_REQUIRED_PRESSURE_M = 0.5;

/**
 * Flow below which link k follows its chord (0: no regularisation, e.g. pumps and laminar-only
 * links). The chord of c·|Q|^(n−1)·Q over [0, δ] departs from the law by at most
 * c·δⁿ·(x − xⁿ) at x = n^(−1/(n−1)): 0.223·c·δⁿ for n = 1.852 and 0.25·c·δ² for n = 2.
 */
export function zeroFlowSpan(model: NetworkModel, k: number): number {
  const kind = model.linkKind[k];
  if (kind === LINK_PUMP_CURVE || kind === kinds.LINK_PUMP_FLOW) return 0;
  let delta = Infinity;
  if (kind === LINK_PIPE && model.headloss !== 'darcy-weisbach' && model.resistance[k] > 0) {
    delta = Math.pow(ZERO_FLOW_LAW_ERROR_M / (0.2231 * model.resistance[k]), 1 / HW_FLOW_EXPONENT);
  }
  if (model.minor[k] > 0) delta = Math.min(delta, Math.sqrt(ZERO_FLOW_LAW_ERROR_M / (0.25 * model.minor[k])));
  return Number.isFinite(delta) ? delta : 0;
}

/**
 * Headloss h and gradient g of link k at flow q (true law, no regularisation), into out[0..1].
 * Curve pumps give the negative head gain s²·h0(Q/s) (piecewise linear, end segments extended).
 */
export function linkLaw(model: NetworkModel, k: number, q: number, speed: number, out: Float64Array): void {
  const kind = model.linkKind[k];
  const a = Math.abs(q);
  if (kind === LINK_PUMP_CURVE) {
    const s = speed > 0 ? speed : 1e-6;
    const x = q / s;
    const c0 = model.curveStart[k];
    const c1 = model.curveEnd[k];
    let seg = c0;
    while (seg < c1 - 2 && x > model.curveQ[seg + 1]) seg++;
    const q0 = model.curveQ[seg];
    const h0 = model.curveH[seg];
    const slope = (model.curveH[seg + 1] - h0) / (model.curveQ[seg + 1] - q0);
    out[0] = -s * s * (h0 + slope * (x - q0));
    out[1] = -s * slope;
    return;
  }
  let h = model.minor[k] * a * q;
  let g = 2 * model.minor[k] * a;
  if (kind === LINK_PIPE) {
    if (model.headloss === 'darcy-weisbach') {
      const d = model.diameter[k];
      const area = model.area[k];
      const re = ((a / area) * d) / WATER_KINEMATIC_VISCOSITY_M2S;
      if (re < LAMINAR_REYNOLDS) {
        const c = (32 * WATER_KINEMATIC_VISCOSITY_M2S * model.length[k]) / (GRAVITY_MS2 * d * d * area);
        h += c * q;
        g += c;
      } else {
        darcyFactorAndSlope(re, model.roughnessRelative[k], out);
        const hf = ((out[0] * model.length[k]) / (2 * GRAVITY_MS2 * d * area * area)) * a * q;
        h += hf;
        g += (hf / q) * (2 + out[1]);
      }
    } else {
      const s = hazenWilliamsSecant(model.resistance[k], a);
      h += s * q;
      g += HW_FLOW_EXPONENT * s;
    }
  }
  out[0] = h;
  out[1] = g;
}

/** Chord slope h(δ)/δ of link k below its zero-flow span δ (see zeroFlowSpan). */
export function zeroFlowSlope(model: NetworkModel, k: number, delta: number, out: Float64Array): number {
  if (!(delta > 0)) return 0;
  linkLaw(model, k, delta, 1, out);
  return out[0] / delta;
}

/** Full-demand pressure of a pressure-driven outlet (or tee in pressure-driven mode), m. */
export function requiredPressure(model: NetworkModel, i: number, pressureDriven: boolean): number {
  if (model.demandType[i] === DEMAND_PRESSURE) return model.pressureRequired[i];
  const mp = model.minPressure[i];
  return pressureDriven && mp > DEFAULT_REQUIRED_PRESSURE_M ? mp : DEFAULT_REQUIRED_PRESSURE_M;
}

/** Pressure at which a pressure-driven outlet delivers nothing, m. */
export function zeroPressure(model: NetworkModel, i: number): number {
  return model.demandType[i] === DEMAND_PRESSURE ? model.pressureZero[i] : 0;
}

/**
 * Virtual demand link of node i at virtual flow q: the inverse pressure law as a headloss into
 * out[0..1] (measured from the zero-flow pressure). Pressure-dependent: h = span·(q/full)² on
 * [0, full] (inverse of q = full·√((p − p0)/span), Wagner et al. 1988); emitter: h = (q/k)^(1/x)
 * (linear below 1e-3·k); steep barriers outside the physical range.
 */
export function virtualLaw(model: NetworkModel, i: number, q: number, full: number, factor: number, pressureDriven: boolean, out: Float64Array): void {
  if (q < 0) {
    out[0] = DEMAND_BARRIER_SLOPE * q;
    out[1] = DEMAND_BARRIER_SLOPE;
    return;
  }
  if (model.demandType[i] === DEMAND_EMITTER) {
    const k = model.emitterK[i] * factor;
    const invX = 1 / model.emitterExponent[i];
    const qf = Math.max(k * 1e-3, 1e-12);
    const qq = Math.max(q, qf);
    const h = Math.pow(qq / k, invX);
    out[0] = q < qf ? (h / qf) * q : h;
    out[1] = q < qf ? h / qf : (invX * h) / qq;
    return;
  }
  const span = requiredPressure(model, i, pressureDriven) - zeroPressure(model, i);
  // at full delivery the outlet is capped: a step may only leave the cap if the pressure falls below required
  if (q >= full) {
    out[0] = span + DEMAND_BARRIER_SLOPE * (q - full);
    out[1] = DEMAND_BARRIER_SLOPE;
    return;
  }
  const s = q / full;
  out[0] = span * s * s;
  out[1] = (2 * span * Math.max(s, VIRTUAL_FLOW_FLOOR)) / full;
}

/** What node i's own law delivers at pressure p (the forward law of virtualLaw), m³/s. */
export function outletFlow(model: NetworkModel, i: number, p: number, full: number, factor: number, pressureDriven: boolean): number {
  if (model.demandType[i] === DEMAND_EMITTER) return p > 0 ? model.emitterK[i] * factor * Math.pow(p, model.emitterExponent[i]) : 0;
  const p0 = zeroPressure(model, i);
  const s = (p - p0) / (requiredPressure(model, i, pressureDriven) - p0);
  return s <= 0 ? 0 : s >= 1 ? full : full * Math.sqrt(s);
}

/**
 * How far a delivered flow q misses node i's own pressure law at pressure p, in metres of
 * pressure (0 when it holds). At full delivery the pressure may be anywhere above the required
 * pressure, at none anywhere below the zero-flow pressure.
 */
export function outletLawResidual(
  model: NetworkModel,
  i: number,
  q: number,
  full: number,
  p: number,
  factor: number,
  pressureDriven: boolean,
  flowTol: number,
): number {
  if (model.demandType[i] === DEMAND_EMITTER) {
    const expected = Math.pow(Math.max(q, 0) / (model.emitterK[i] * factor), 1 / model.emitterExponent[i]);
    return q <= flowTol ? Math.max(p - expected, 0) : Math.abs(expected - p);
  }
  const p0 = zeroPressure(model, i);
  const required = requiredPressure(model, i, pressureDriven);
  if (q < -flowTol || q > full + flowTol) return Infinity;
  if (full <= flowTol) return 0;
  if (q >= full - flowTol) return Math.max(required - p, 0);
  if (q <= flowTol) return Math.max(p - p0, 0);
  return Math.abs(p0 + (required - p0) * (q / full) ** 2 - p);
}
