/**
 * Textbook formulas written out again, apart from the engine, so a spec can work an expected value
 * by hand instead of asking the program for it. Each names its source as in ../../../shared/REFERENCES.md.
 */

/** Standard gravity, m/s² (exact by definition, CGPM 1901, NIST SP 811). */
export const G = 9.80665;
/** Kinematic viscosity of water at 20 °C, m²/s (Engineering ToolBox water-properties table, V). */
export const NU_20C = 1.004e-6;
/** US gallon, m³ (exact by definition, NIST SP 811). */
export const GAL = 3.785411784e-3;
/** Metres of water per psi: 6894.757 Pa / (1000 kg/m³ · 9.80665 m/s²) (NIST SP 811 factors, C). */
export const M_PER_PSI = 6894.757293168 / (1000 * G);

/** Hazen-Williams loss, m: 10.67·L·Q^1.852/(C^1.852·D^4.8704) (REFERENCES.md, SI form, ω = 10.67). */
export const hwLoss = (q: number, length: number, d: number, c: number, omega = 10.67): number =>
  (Math.sign(q) * omega * length * Math.abs(q) ** 1.852) / (c ** 1.852 * d ** 4.8704);

/** Pipe area, m². */
export const area = (d: number): number => (Math.PI * d * d) / 4;

/** Minor loss K·v²/2g, m (Weisbach, any fluid-mechanics text). */
export const minorLoss = (k: number, q: number, d: number): number => (k * (q / area(d)) ** 2) / (2 * G);

/** Colebrook-White (1939) friction factor by plain fixed-point iteration on 1/√f (50 rounds; Re > 4000). */
export function colebrook(re: number, relRough: number): number {
  let x = 8; // 1/√f
  for (let i = 0; i < 50; i++) x = -2 * Math.log10(relRough / 3.7 + (2.51 * x) / re);
  return 1 / (x * x);
}

/** Darcy-Weisbach loss f·(L/D)·v²/2g with Colebrook's f, m (roughness ε in m, water at 20 °C). */
export function dwLoss(q: number, length: number, d: number, eps_m: number): number {
  const v = q / area(d);
  const f = colebrook((v * d) / NU_20C, eps_m / d);
  return ((f * length) / d) * ((v * v) / (2 * G));
}

/** Root of an increasing function on [lo, hi] by bisection (200 halvings: to machine precision). */
export function bisect(fn: (x: number) => number, lo: number, hi: number): number {
  for (let i = 0; i < 200; i++) {
    const mid = (lo + hi) / 2;
    if (fn(mid) > 0) hi = mid;
    else lo = mid;
  }
  return (lo + hi) / 2;
}
