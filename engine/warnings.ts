/**
 * Warnings the engine returns beside its results. `element` names the node or link id (null for
 * the whole document); `message` is a plain sentence for the screen, starting with the element
 * and field for `invalid` (e.g. "P3.diameter_m: must be a positive number (got 0)").
 *
 * @example
 * const w: Warning = { code: 'velocity-high', element: 'P4', message: 'P4: velocity 1.9 m/s is above 1.5 m/s' };
 */
export type WarningCode =
  | 'invalid'
  | 'disconnected'
  | 'no-fixed-head'
  | 'not-converged'
  | 'negative-pressure'
  | 'velocity-high'
  | 'over-rating'
  | 'below-minimum'
  | 'tank-empty'
  | 'tank-overflow'
  | 'unmet-demand';

export interface Warning {
  code: WarningCode;
  element: string | null;
  message: string;
}
