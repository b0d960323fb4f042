/**
 * The water budget document: Runnel's own JSON for a project's water uses, stored beside the
 * network. SI inside (m³/day for daily needs, m/day for application depths, hours for windows).
 * Months are 1–12. A use names the outlets that serve it; the budget sets those outlets' design
 * flows in the network unless the outlet is listed in `manual_outlets` ("not from budget").
 *
 * @example
 * const budget: BudgetDocument = {
 *   schema: 'runnel.budget/1', peak_factor: 2.5, hot_months: [6, 7, 8],
 *   peak_sun_hours: [2.1, 2.9, 3.9, 4.8, 5.6, 6.1, 6.3, 5.6, 4.6, 3.4, 2.2, 1.8],
 *   uses: [{ id: 'herd', name: 'Beef herd', kind: 'livestock', animal: 'beef-cow-dry', count: 30,
 *     months: [1,2,3,4,5,6,7,8,9,10,11,12], outlets: ['TR1'], window_h: 4 }],
 * };
 */

import type { FixtureKey } from './fixtures';

export const BUDGET_SCHEMA = 'runnel.budget/1';

/**
 * A drip block laid in rows (garden, tunnel): its flow is rows × row length × the flow per length
 * (emitter flow ÷ emitter spacing, or drip tape's flow per length), run for run_h a day.
 */
export interface DripRows {
  rows: number;
  row_length_m: number;
  /** Emitters: spacing along the row, m, and each emitter's flow, m³/s. */
  emitter_spacing_m?: number;
  emitter_flow_m3s?: number;
  /** Or drip tape: its flow per metre of row, m³/s per m. */
  tape_flow_m3s_per_m?: number;
  /** Hours the block runs a day, and in the budget's hot months. */
  run_h: number;
  hot_run_h?: number;
}

export type UseKind = 'livestock' | 'garden' | 'tunnel' | 'orchard' | 'household' | 'other';

export interface BudgetUse {
  id: string;
  name: string;
  kind: UseKind;
  /** Months (1–12) in which the use draws water. */
  months: number[];
  /** Outlet ids (network node ids) that serve this use; its daily need is shared equally among them. */
  outlets: string[];
  /**
   * Hours in which the linked outlets deliver the day's need: a trough's refill window or a drip
   * block's run time (default per kind, see ./outlet-flows).
   */
  window_h?: number;
  /** Key into the defaults table (./defaults) for the per-unit rate; default per kind. */
  rate_key?: string;
  /** Per-unit daily need typed by the designer (m³/day per head, per tree, per person), overrides the table. */
  rate_m3_day?: number;
  /** Hot-weather per-unit daily need (livestock, orchard), used in the budget's hot months. */
  hot_rate_m3_day?: number;
  /** Head of stock (livestock), trees (orchard) or people (household). */
  count?: number;
  /** Growing area, m² (garden, tunnel). */
  area_m2?: number;
  /** Daily application depth, m/day (garden, tunnel); equal to a per-area rate in m³/m²·day. */
  depth_m_day?: number;
  /** Hot-weather application depth, m/day. */
  hot_depth_m_day?: number;
  /** Fixed daily volume, m³/day (other). */
  daily_m3?: number;
  /**
   * Household: fixtures by kind (./fixtures). The daily need stays people × the per-person figure;
   * the linked outlet's design flow becomes the house's probable peak by fixture units.
   */
  fixtures?: Partial<Record<FixtureKey, number>>;
  /** Garden or tunnel laid as drip rows: daily need and outlet flow from the rows (replaces area × depth). */
  drip?: DripRows;
  notes?: string;
}

/** A project's override of one defaults-table row (per-unit daily need, normal and hot). */
export interface RateOverride {
  rate: number;
  hot_rate?: number;
  /** Where the team's figure comes from (shown beside it). */
  source?: string;
}

export interface BudgetDocument {
  schema: typeof BUDGET_SCHEMA;
  uses: BudgetUse[];
  /** Peak-hour flow ÷ average flow over the day (designer's choice; 2–4 is common practice). */
  peak_factor: number;
  /** Months counted as hot weather (hot rates apply); default [6, 7, 8]. */
  hot_months?: number[];
  /** Site peak-sun hours per month (kWh/m²·day), 12 values, January first. */
  peak_sun_hours: number[];
  /** Project overrides of the defaults table, by row key. */
  rates?: Record<string, RateOverride>;
  /** Outlets whose design flow is typed by hand (kept as typed, marked "not from budget"). */
  manual_outlets?: string[];
  /** Fill pump (link id); default the first pump in the network. */
  fill_pump?: string;
  /** Tanks counted as storage; default every tank in the network. */
  tanks?: string[];
  /** Days of storage asked of the source; default by the source (./storage-fill). */
  storage_days?: number;
  /** Evaporation and waste allowance added to outlet design flows (default 0.10, see ./outlet-flows). */
  waste_allowance?: number;
}

export const ALL_MONTHS = [1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12];
export const MONTH_NAMES = ['Jan', 'Feb', 'Mar', 'Apr', 'May', 'Jun', 'Jul', 'Aug', 'Sep', 'Oct', 'Nov', 'Dec'];
export const DEFAULT_HOT_MONTHS = [6, 7, 8];

/**
 * Peak-sun hours for a new budget: typical mid-latitude northern values (from memory, M); the
 * screen asks the designer to replace them with the site's own (a solar resource map or the
 * pump maker's tables).
 */
export const TYPICAL_PEAK_SUN_HOURS = [2.5, 3.3, 4.3, 5.2, 5.8, 6.2, 6.3, 5.7, 4.8, 3.7, 2.6, 2.2];

/** The budget of a project that has none yet. */
export function emptyBudget(): BudgetDocument {
  return { schema: BUDGET_SCHEMA, uses: [], peak_factor: 3, hot_months: [...DEFAULT_HOT_MONTHS], peak_sun_hours: [...TYPICAL_PEAK_SUN_HOURS] };
}
