import type { BudgetUse, MonthVerdict, UseNeed } from '../../../../../engine/budget';
import { MONTH_NAMES } from '../../../../../engine/budget';
import { formatQuantity, type UnitSystem } from '../../../../../engine/units';

/**
 * Words and numbers for the Water budget screen, from the engine's plan (pure; every number
 * through engine/units.ts with its unit).
 */

/** "enough", "short by 1,234 gal per day", "storage below 3 days (holds 2.2 days)", or both. */
export function verdictText(v: MonthVerdict, units: UnitSystem): string {
  if (v.status === 'no-use') return 'no use this month';
  const parts: string[] = [];
  if (v.status === 'short' || v.status === 'short-and-storage-low') parts.push(`short by ${formatQuantity('volume', -v.balance_m3, units)} per day`);
  if (v.status === 'storage-low' || v.status === 'short-and-storage-low') {
    parts.push(`storage below ${v.required_days.toFixed(0)} days (holds ${v.reserve_days.toFixed(1)} days)`);
  }
  return parts.length ? parts.join('; ') : 'enough';
}

/** "all year", "Apr–Oct", "Mar, May–Jun". */
export function seasonText(months: readonly number[]): string {
  const set = [...new Set(months)].filter((m) => m >= 1 && m <= 12).sort((a, b) => a - b);
  if (set.length === 12) return 'all year';
  if (set.length === 0) return 'never';
  const runs: [number, number][] = [];
  for (const m of set) {
    const last = runs[runs.length - 1];
    if (last && m === last[1] + 1) last[1] = m;
    else runs.push([m, m]);
  }
  // a run through December joins one from January (winter seasons)
  if (runs.length > 1 && runs[0][0] === 1 && runs[runs.length - 1][1] === 12) {
    const first = runs.shift() as [number, number];
    runs[runs.length - 1][1] = first[1];
  }
  return runs.map(([a, b]) => (a === b ? MONTH_NAMES[a - 1] : `${MONTH_NAMES[a - 1]}–${MONTH_NAMES[b - 1]}`)).join(', ');
}

/** How much of the use there is: "120 head", "90 m²", "60 trees", "3 people", "fixed". */
export function amountText(use: BudgetUse, units: UnitSystem): string {
  switch (use.kind) {
    case 'livestock':
      return `${use.count ?? 0} head`;
    case 'orchard':
      return `${use.count ?? 0} trees`;
    case 'household': {
      const n = Object.values(use.fixtures ?? {}).reduce((a, b) => a + (b ?? 0), 0);
      return `${use.count ?? 0} people${n ? `, ${n} fixtures` : ''}`;
    }
    case 'garden':
    case 'tunnel':
      if (use.drip) return `${use.drip.rows} rows × ${formatQuantity('length', use.drip.row_length_m, units)}`;
      return formatQuantity('area', use.area_m2 ?? 0, units, 0);
    default:
      return 'fixed';
  }
}

/** The per-unit rate used, normal / hot: "3.6 / 14 L/day per head", "0.15 / 0.30 in/day". */
export function rateText(need: UseNeed, units: UnitSystem): string {
  if (need.unit === 'fixed') return `${formatQuantity('daily-volume', need.rate, units)}`;
  if (need.unit === 'depth') return `${formatQuantity('depth-rate', need.rate, units)} · hot ${formatQuantity('depth-rate', need.hot_rate, units)}`;
  if (need.unit === 'per-row-metre') {
    const per = units === 'us' ? 100 * 0.3048 : 1;
    return `${formatQuantity('daily-volume', need.rate * per, units)} · hot ${formatQuantity('daily-volume', need.hot_rate * per, units)} per ${units === 'us' ? '100 ft' : 'm'} of row`;
  }
  const per = need.unit === 'per-head' ? 'head' : need.unit === 'per-tree' ? 'tree' : 'person';
  const digits = units === 'us' ? 1 : 1;
  return `${formatQuantity('daily-volume', need.rate, units, digits)} · hot ${formatQuantity('daily-volume', need.hot_rate, units, digits)} per ${per}`;
}

export const KIND_LABELS: Record<BudgetUse['kind'], string> = {
  livestock: 'Livestock',
  garden: 'Garden',
  tunnel: 'Greenhouse / high tunnel',
  orchard: 'Orchard',
  household: 'Household',
  other: 'Other',
};
