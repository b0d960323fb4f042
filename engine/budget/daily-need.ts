import { DEFAULT_HOT_MONTHS, type BudgetDocument, type BudgetUse, type DripRows } from './budget-document';
import { DEFAULT_KEY_BY_KIND, DEFAULT_RATES, type RateUnit } from './defaults';

/**
 * Daily need of each water use per month (m³/day): units × per-unit rate, the hot-weather rate in
 * the budget's hot months, zero outside the use's season. The per-unit rate is, in order, what the
 * designer typed on the row, the project's override of the defaults row, or the defaults row; the
 * result says which and names the source.
 *
 * @example
 * useNeed(budget, { kind: 'livestock', count: 40, rate_key: 'sheep', months: [1,…,12], … }).monthly_m3_day[6] // 40 × 14 L = 0.56 m³/day in July
 */

export interface UseNeed {
  id: string;
  name: string;
  /** Per-unit rate used in normal and hot months (m³/day per unit, or m/day for depth). */
  rate: number;
  hot_rate: number;
  unit: RateUnit;
  /** How many units: head, trees, people, m² (depth rates) or 1 (fixed). */
  units: number;
  /** Where the rate comes from: "typed", "project" or "table", with the source text. */
  rate_from: 'typed' | 'project' | 'table';
  source: string;
  /** Daily need per month, January first, m³/day. */
  monthly_m3_day: number[];
  /** Largest monthly daily need, m³/day, and its month (1–12; 0 when the use never draws). */
  peak_m3_day: number;
  peak_month: number;
}

/** A drip block's flow, m³/s (rows × length × flow per length). */
export function dripFlow(drip: DripRows): number {
  const perM = drip.tape_flow_m3s_per_m ?? (drip.emitter_flow_m3s ?? 0) / (drip.emitter_spacing_m ?? 1);
  return drip.rows * drip.row_length_m * perM;
}

export const DRIP_SOURCE =
  "drip rows: rows × length × emitter flow ÷ spacing (or tape flow per length) × run hours; the emitter or tape maker's figures (common practice)";

export function useNeed(budget: BudgetDocument, use: BudgetUse): UseNeed {
  if (use.drip && (use.kind === 'garden' || use.kind === 'tunnel')) return dripNeed(budget, use, use.drip);
  const key = use.rate_key ?? DEFAULT_KEY_BY_KIND[use.kind];
  const row = DEFAULT_RATES[key];
  const project = budget.rates?.[key];
  let rate: number;
  let hot: number;
  let from: UseNeed['rate_from'];
  let source: string;
  const typed = use.kind === 'garden' || use.kind === 'tunnel' ? use.depth_m_day : use.kind === 'other' ? use.daily_m3 : use.rate_m3_day;
  const typedHot = use.kind === 'garden' || use.kind === 'tunnel' ? use.hot_depth_m_day : use.hot_rate_m3_day;
  if (typed !== undefined) {
    rate = typed;
    hot = typedHot ?? typed;
    from = 'typed';
    source = 'typed by the designer';
  } else if (project) {
    rate = project.rate;
    hot = project.hot_rate ?? project.rate;
    from = 'project';
    source = project.source ?? 'project figure';
  } else {
    rate = row.rate;
    hot = row.hot_rate;
    from = 'table';
    source = row.source;
  }
  const units = unitsOf(use);
  const hotMonths = new Set(budget.hot_months ?? DEFAULT_HOT_MONTHS);
  const season = new Set(use.months);
  const monthly = Array.from({ length: 12 }, (_, j) => (season.has(j + 1) ? units * (hotMonths.has(j + 1) ? hot : rate) : 0));
  let peak = 0;
  let peakMonth = 0;
  monthly.forEach((v, j) => {
    if (v > peak) {
      peak = v;
      peakMonth = j + 1;
    }
  });
  return {
    id: use.id,
    name: use.name,
    rate,
    hot_rate: hot,
    unit: use.kind === 'other' ? 'fixed' : row.unit,
    units,
    rate_from: from,
    source,
    monthly_m3_day: monthly,
    peak_m3_day: peak,
    peak_month: peakMonth,
  };
}

/** A drip-row use: per metre of row, the flow per length × run hours (hot-month run hours in heat). */
function dripNeed(budget: BudgetDocument, use: BudgetUse, drip: DripRows): UseNeed {
  const length = drip.rows * drip.row_length_m;
  const perM = length > 0 ? dripFlow(drip) / length : 0;
  const rate = perM * drip.run_h * 3600;
  const hot = perM * (drip.hot_run_h ?? drip.run_h) * 3600;
  return finish(budget, use, { rate, hot, unit: 'per-row-metre', units: length, from: 'typed', source: DRIP_SOURCE });
}

function finish(
  budget: BudgetDocument,
  use: BudgetUse,
  r: { rate: number; hot: number; unit: RateUnit; units: number; from: UseNeed['rate_from']; source: string },
): UseNeed {
  const hotMonths = new Set(budget.hot_months ?? DEFAULT_HOT_MONTHS);
  const season = new Set(use.months);
  const monthly = Array.from({ length: 12 }, (_, j) => (season.has(j + 1) ? r.units * (hotMonths.has(j + 1) ? r.hot : r.rate) : 0));
  let peak = 0;
  let peakMonth = 0;
  monthly.forEach((v, j) => {
    if (v > peak) {
      peak = v;
      peakMonth = j + 1;
    }
  });
  return {
    id: use.id,
    name: use.name,
    rate: r.rate,
    hot_rate: r.hot,
    unit: r.unit,
    units: r.units,
    rate_from: r.from,
    source: r.source,
    monthly_m3_day: monthly,
    peak_m3_day: peak,
    peak_month: peakMonth,
  };
}

function unitsOf(use: BudgetUse): number {
  switch (use.kind) {
    case 'garden':
    case 'tunnel':
      return use.area_m2 ?? 0;
    case 'other':
      return 1;
    default:
      return use.count ?? 0;
  }
}

export interface MonthTotal {
  month: number;
  /** Total daily need, m³/day. */
  daily_m3: number;
  /** Peak-hour flow = average flow × peak factor, m³/s. */
  peak_flow_m3s: number;
  /** Daily need per use id, m³/day. */
  per_use: Record<string, number>;
}

/** Totals per month (January first) from the uses' needs and the budget's peak factor. */
export function monthTotals(budget: BudgetDocument, needs: UseNeed[]): MonthTotal[] {
  return Array.from({ length: 12 }, (_, j) => {
    const per: Record<string, number> = {};
    let total = 0;
    for (const need of needs) {
      per[need.id] = need.monthly_m3_day[j];
      total += need.monthly_m3_day[j];
    }
    return { month: j + 1, daily_m3: total, peak_flow_m3s: (total / 86400) * budget.peak_factor, per_use: per };
  });
}
