/**
 * What a computed pressure means physically. Water cannot sit more than one atmosphere below
 * atmospheric pressure: a steady solve that reports less is not a real state but a column that
 * separates (the line drains, air enters, flow stops). Standard atmosphere 101.325 kPa ÷ 9.80665
 * kPa per m of water = 10.33 m (C; vapour pressure, about 0.24 m at 20 °C, is ignored). A node with
 * no open path to a source or tank has no pressure at all ("no supply").
 *
 * @example
 * pressureState(-12, true) // 'below-vacuum'
 */
export const VACUUM_HEAD_M = 101.325 / 9.80665;

export type PressureState = 'ok' | 'negative' | 'below-vacuum' | 'no-supply';

export function pressureState(pressure_m: number, supplied: boolean): PressureState {
  if (!supplied || !Number.isFinite(pressure_m)) return 'no-supply';
  if (pressure_m < -VACUUM_HEAD_M) return 'below-vacuum';
  return pressure_m < 0 ? 'negative' : 'ok';
}
