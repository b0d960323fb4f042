import { GRAVITY_MS2 } from './constants';

/**
 * Minor (local) loss of fittings, valves and entrances: hm = K · v²/(2g), written in flow
 * form hm = m · |Q| · Q with m = K / (2g·A²). Source: Weisbach's local-loss form, as tabulated in
 * Crane Technical Paper 410 (K values are common practice: open gate valve ≈ 0.2, tee branch ≈ 1.5,
 * sharp entrance 0.5, exit 1.0).
 *
 * @param k sum of loss coefficients K (dimensionless, ≥ 0)
 * @param diameter_m inside diameter, m
 * @returns m in m per (m³/s)²
 * @example minorLossCoefficient(1, 0.0357) * 0.001 ** 2 // m of head at 1 L/s
 */
export function minorLossCoefficient(k: number, diameter_m: number): number {
  const area = (Math.PI * diameter_m * diameter_m) / 4;
  return k / (2 * GRAVITY_MS2 * area * area);
}
