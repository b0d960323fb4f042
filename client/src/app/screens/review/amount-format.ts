import type { Amount } from '../../../../../engine/review/types';
import { formatQuantity, type UnitSystem } from '../../../../../engine/units';

/**
 * A checklist number with its unit in the project's system: physical quantities through
 * engine/units.ts, daily volumes as volume per day, shares in %, days and hours as such.
 */
export function formatAmount(a: Amount | undefined, units: UnitSystem): string {
  if (!a) return '—';
  if (!Number.isFinite(a.value)) return a.value > 0 ? '∞' : '—';
  switch (a.quantity) {
    case 'percent':
      return `${a.value.toFixed(0)} %`;
    case 'days':
      return `${a.value.toFixed(1)} days`;
    case 'hours':
      return `${a.value.toFixed(1)} h`;
    case 'volume-per-day':
      return `${formatQuantity('volume', a.value, units)}/day`;
    default:
      return formatQuantity(a.quantity, a.value, units);
  }
}
