import { colebrookFactor, colebrookSlope } from './colebrook';
import { GRAVITY_MS2, WATER_KINEMATIC_VISCOSITY_M2S } from './constants';

/**
 * Darcy-Weisbach headloss hL = f · (L/D) · v²/(2g) with the friction factor from
 * - laminar flow, Re < 2000: f = 64/Re (Hagen-Poiseuille);
 * - turbulent flow, Re > 4000: Colebrook-White (1939), Newton-iterated from Swamee-Jain (1976);
 * - 2000–4000: a C¹ smoothstep blend of the two (no published law holds there; trade practice is
 *   to avoid designing in this band).
 * Roughness ε is in millimetres in the document (e.g. PVC 0.0015 mm, PE 0.007 mm).
 * Source: Darcy (1857), Weisbach (1845); see REFERENCES.md for check values.
 *
 * @example
 * darcyFactor(1e5, 1e-4) // 0.018514
 * darcyWeisbachHeadloss(0.001, 100, 0.0266, 0.0015) // m of water
 */

/** Upper Reynolds number of laminar flow. */
export const LAMINAR_REYNOLDS = 2000;
/** Lower Reynolds number of fully turbulent flow. */
export const TURBULENT_REYNOLDS = 4000;

/**
 * Darcy friction factor and its log-slope d ln f / d ln Re.
 * @param reynolds Reynolds number (≥ 0)
 * @param relativeRoughness ε/D (≥ 0)
 * @param out two-element array receiving [f, dlnf/dlnRe] (avoids allocation in the solver)
 * @example const o = new Float64Array(2); darcyFactorAndSlope(3000, 1e-4, o);
 */
export function darcyFactorAndSlope(reynolds: number, relativeRoughness: number, out: Float64Array): void {
  if (reynolds < LAMINAR_REYNOLDS) {
    out[0] = 64 / Math.max(reynolds, 1e-12);
    out[1] = -1;
    return;
  }
  if (reynolds > TURBULENT_REYNOLDS) {
    const f = colebrookFactor(reynolds, relativeRoughness);
    out[0] = f;
    out[1] = colebrookSlope(reynolds, relativeRoughness, f);
    return;
  }
  // smoothstep blend between laminar and turbulent laws
  const s = (reynolds - LAMINAR_REYNOLDS) / (TURBULENT_REYNOLDS - LAMINAR_REYNOLDS);
  const w = s * s * (3 - 2 * s);
  const dw = (6 * s * (1 - s)) / (TURBULENT_REYNOLDS - LAMINAR_REYNOLDS); // dw/dRe
  const fl = 64 / reynolds;
  const ft = colebrookFactor(reynolds, relativeRoughness);
  const dft = (colebrookSlope(reynolds, relativeRoughness, ft) * ft) / reynolds; // dft/dRe
  const f = (1 - w) * fl + w * ft;
  const df = -dw * fl + (1 - w) * (-fl / reynolds) + dw * ft + w * dft;
  out[0] = f;
  out[1] = (df * reynolds) / f;
}

const scratch = new Float64Array(2);

/** Darcy friction factor f (dimensionless). @example darcyFactor(1e4, 1e-3) // 0.032382 */
export function darcyFactor(reynolds: number, relativeRoughness: number): number {
  darcyFactorAndSlope(reynolds, relativeRoughness, scratch);
  return scratch[0];
}

/**
 * Headloss (m) of a flow (m³/s, signed) through a pipe under Darcy-Weisbach.
 * @param flow_m3s flow, m³/s
 * @param length_m length, m
 * @param diameter_m inside diameter, m
 * @param roughness_mm absolute roughness ε, mm
 * @param viscosity_m2s kinematic viscosity, default 1.004e-6 (water, 20 °C)
 * @example darcyWeisbachHeadloss(0.001, 100, 0.0266, 0.0015)
 */
export function darcyWeisbachHeadloss(
  flow_m3s: number,
  length_m: number,
  diameter_m: number,
  roughness_mm: number,
  viscosity_m2s: number = WATER_KINEMATIC_VISCOSITY_M2S,
): number {
  const area = (Math.PI * diameter_m * diameter_m) / 4;
  const v = Math.abs(flow_m3s) / area;
  const re = (v * diameter_m) / viscosity_m2s;
  if (re < LAMINAR_REYNOLDS) {
    // 64/Re · L/D · v²/2g = 32 ν L v / (g D²): linear in v, finite at zero flow
    return (Math.sign(flow_m3s) * (32 * viscosity_m2s * length_m * v)) / (GRAVITY_MS2 * diameter_m * diameter_m);
  }
  const f = darcyFactor(re, roughness_mm / 1000 / diameter_m);
  return (Math.sign(flow_m3s) * f * (length_m / diameter_m) * (v * v)) / (2 * GRAVITY_MS2);
}
