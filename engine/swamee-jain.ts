/**
 * Swamee-Jain explicit approximation of the Colebrook-White friction factor.
 * Source: Swamee, P.K. & Jain, A.K. (1976), "Explicit equations for pipe-flow problems",
 * J. Hydraulics Division ASCE 102(HY5):657–664. f = 0.25 / [log10(ε/(3.7D) + 5.74/Re^0.9)]².
 * Valid for 5e3 ≤ Re ≤ 1e8 and 1e-6 ≤ ε/D ≤ 1e-2; within about 2.1 % of Colebrook there
 * (computed, REFERENCES.md; the paper claims 1 %).
 *
 * @example
 * swameeJainFactor(1e5, 1e-4) // ≈ 0.0185
 */
export function swameeJainFactor(reynolds: number, relativeRoughness: number): number {
  const l = Math.log10(relativeRoughness / 3.7 + 5.74 / Math.pow(reynolds, 0.9));
  return 0.25 / (l * l);
}
