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

/** Words for the states that have no honest number. */
export const PRESSURE_STATE_TEXT: Record<Exclude<PressureState, 'ok' | 'negative'>, string> = {
  'below-vacuum': 'below vacuum (column separates)',
  'no-supply': 'no supply',
};

/**
 * A pressure result as shown on a screen: the number with its unit, or the words for a state that
 * has none ("no supply", "below vacuum (column separates)").
 * @example pressureText(-15, true, (p) => `${p} m`) // 'below vacuum (column separates)'
 */
export function pressureText(pressure_m: number, supplied: boolean, format: (p_m: number) => string): string {
  const state = pressureState(pressure_m, supplied);
  return state === 'below-vacuum' || state === 'no-supply' ? PRESSURE_STATE_TEXT[state] : format(pressure_m);
}

/** Ids the steady result reports as cut off from every source and tank. */
export function unsuppliedIds(result: { warnings: { code: string; element: string | null }[] } | null | undefined): Set<string> {
  return new Set((result?.warnings ?? []).filter((w) => w.code === 'disconnected' && w.element).map((w) => w.element as string));
}
