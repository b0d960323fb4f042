import { swameeJainFactor } from './swamee-jain';

/**
 * Colebrook-White (1939) turbulent friction factor, solved by Newton iteration on
 * x = 1/√f = −2·log10(ε/(3.7D) + 2.51·x/Re), started from the Swamee-Jain (1976) estimate.
 * Source: Colebrook, C.F. (1939), J. Inst. Civil Engineers 11:133–156. Converges to 1e-12
 * relative in 3–6 iterations for Re ≥ 2000.
 *
 * @param reynolds Reynolds number (dimensionless, > 0)
 * @param relativeRoughness ε/D (dimensionless, ≥ 0)
 * @returns Darcy friction factor f (dimensionless)
 * @example
 * colebrookFactor(1e5, 1e-4) // 0.018514 (REFERENCES.md table, C)
 */
export function colebrookFactor(reynolds: number, relativeRoughness: number): number {
  const a = relativeRoughness / 3.7;
  const b = 2.51 / reynolds;
  let x = 1 / Math.sqrt(swameeJainFactor(Math.max(reynolds, 2000), Math.max(relativeRoughness, 1e-12)));
  for (let i = 0; i < 50; i++) {
    // Newton step on F(x) = x + 2 log10(a + b x)
    const s = a + b * x;
    const fx = x + 2 * Math.log10(s);
    const dfx = 1 + (2 * b) / (Math.LN10 * s);
    const next = x - fx / dfx;
    if (Math.abs(next - x) <= 1e-14 * Math.abs(x)) {
      x = next;
      break;
    }
    x = next;
  }
  return 1 / (x * x);
}

/**
 * Logarithmic slope d ln f / d ln Re of the Colebrook factor (for Newton gradients), from
 * implicit differentiation of the Colebrook equation: −4b / (ln10·(a + b·x) + 2b), b = 2.51/Re.
 * @example colebrookSlope(1e5, 1e-4) // ≈ −0.17
 */
export function colebrookSlope(reynolds: number, relativeRoughness: number, factor: number): number {
  const a = relativeRoughness / 3.7;
  const b = 2.51 / reynolds;
  const x = 1 / Math.sqrt(factor);
  return (-4 * b) / (Math.LN10 * (a + b * x) + 2 * b);
}
