/**
 * Physical constants shared by the engine's laws (SI).
 * Source: standard gravity is exact by definition (CGPM 1901, NIST SP 811); the kinematic
 * viscosity of water at 20 °C is 1.004e-6 m²/s (Engineering ToolBox, water properties table).
 *
 * @example
 * const headOfVelocity = (v * v) / (2 * GRAVITY_MS2); // m
 */

/** Standard gravity, m/s² (exact). */
export const GRAVITY_MS2 = 9.80665;

/** Kinematic viscosity of water at 20 °C, m²/s (default for Reynolds numbers). */
export const WATER_KINEMATIC_VISCOSITY_M2S = 1.004e-6;
