/**
 * Surge head of a sudden stop (Joukowsky, textbook; REFERENCES.md, M): ΔH = a·ΔV/g, valid when the
 * flow stops faster than the wave's round trip 2L/a. For a slower closure over t seconds Michaud's
 * ΔH ≈ 2·L·V/(g·t) gives less; the review checks the sudden stop, the worst case.
 *
 * @example
 * joukowskyHead(2690 * 0.3048, 6.48 * 0.3048) / 0.3048 // ≈ 541.8 ft (UFC 3-230-13A quotes ≈ 545 ft)
 */
import { GRAVITY_MS2 } from '../constants';

/** Surge head, m of water, for wave speed `a` (m/s) and velocity change `dv` (m/s). */
export function joukowskyHead(a_ms: number, dv_ms: number, g = GRAVITY_MS2): number {
  return (a_ms * Math.abs(dv_ms)) / g;
}

/** Michaud's estimate for a closure over `closure_s` seconds of a line `length_m` long, m of water. */
export function michaudHead(length_m: number, v_ms: number, closure_s: number, g = GRAVITY_MS2): number {
  return (2 * length_m * Math.abs(v_ms)) / (g * closure_s);
}

/** The wave's round trip 2L/a, s: closures faster than this see the full Joukowsky surge. */
export function criticalClosureTime(length_m: number, a_ms: number): number {
  return (2 * length_m) / a_ms;
}
