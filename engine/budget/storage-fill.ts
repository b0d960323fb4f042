import type { NetworkDocument, PumpLink, TankNode } from '../network-document';
import type { BudgetDocument } from './budget-document';
import type { MonthTotal } from './daily-need';

/**
 * Storage and fill, month by month: usable storage of the tank bank, the fill pump's daily
 * volume, days of reserve and the cloudy-spell rule, with a verdict per month.
 * - Usable storage: each tank's area × (full level − low level), full being the pump's stop level
 *   (carried across the bank by water surface) or the tank's max level, low its min_level_m.
 * - Daily fill: the pump's flow at the lift (the caller passes the steady solve's flow; constant
 *   flow pumps fall back to flow_m3s) × the month's peak-sun hours for a solar pump (one with a
 *   daylight schedule; standard definition and common practice, REFERENCES.md "Storage and fill"),
 *   or × 24 h for a pump without one.
 * - Storage asked: a solar (unreliable) source needs at least 3 days of the daily need (NRCS South
 *   Dakota Design Technical Note SD2006-1, 2010, V2); a reliable source meeting the daily total
 *   but not the peak rate needs the larger of 2 days' need or 6 h of peak-hour flow (Canadian fact
 *   sheet on water storage for livestock watering, V2). budget.storage_days overrides the days.
 *
 * @example
 * monthlyVerdicts(budget, totals, storageOf(network, budget), fillOf(network, budget, 0.00075))
 */

export interface TankStorage {
  id: string;
  full_level_m: number;
  low_level_m: number;
  usable_m3: number;
}

export interface Storage {
  usable_m3: number;
  tanks: TankStorage[];
}

export interface Fill {
  /** Pump id, or null when the network has none. */
  pump: string | null;
  /** Full-sun flow at the lift, m³/s. */
  flow_m3s: number;
  /** Where the flow comes from: the steady solve at the lift, or the pump's typed flow. */
  flow_from: 'solve' | 'typed' | 'none';
  solar: boolean;
}

export type VerdictStatus = 'enough' | 'short' | 'storage-low' | 'short-and-storage-low' | 'no-use';

export interface MonthVerdict {
  month: number;
  status: VerdictStatus;
  daily_need_m3: number;
  peak_sun_hours: number;
  daily_fill_m3: number;
  /** Fill − need, m³/day (negative: short). */
  balance_m3: number;
  usable_m3: number;
  /** Usable storage ÷ daily need, days (Infinity with no need). */
  reserve_days: number;
  /** Storage the rule asks for, m³, and as days of need. */
  required_m3: number;
  required_days: number;
  rule: string;
  source: string;
}

export const SOLAR_STORAGE_DAYS = 3;
export const RELIABLE_STORAGE_DAYS = 2;
export const RELIABLE_PEAK_HOURS = 6;

/** Usable storage of the budget's tanks (all tanks by default). */
export function storageOf(network: NetworkDocument, budget: BudgetDocument): Storage {
  const chosen = budget.tanks ? new Set(budget.tanks) : null;
  const tanks = network.nodes.filter((n): n is TankNode => n.kind === 'tank' && (!chosen || chosen.has(n.id)));
  const pump = fillPump(network, budget);
  // the pump's stop level, carried to the tanks of the same bank as a water surface
  let stopSurface: number | null = null;
  let stopBank: string | undefined;
  let stopTank: string | undefined;
  if (pump?.control) {
    const t = network.nodes.find((n) => n.id === pump.control?.tank);
    if (t && t.kind === 'tank') {
      stopSurface = t.elevation_m + pump.control.stop_level_m;
      stopBank = t.bank;
      stopTank = t.id;
    }
  }
  const list = tanks.map((t) => {
    let full = t.max_level_m;
    if (stopSurface !== null && (t.id === stopTank || (stopBank !== undefined && t.bank === stopBank))) {
      full = Math.min(t.max_level_m, Math.max(t.min_level_m, stopSurface - t.elevation_m));
    }
    const area = (Math.PI * t.diameter_m * t.diameter_m) / 4;
    return { id: t.id, full_level_m: full, low_level_m: t.min_level_m, usable_m3: area * Math.max(full - t.min_level_m, 0) };
  });
  return { usable_m3: list.reduce((s, t) => s + t.usable_m3, 0), tanks: list };
}

/** The budget's fill pump (named, or the first pump). */
export function fillPump(network: NetworkDocument, budget: BudgetDocument): PumpLink | undefined {
  const pumps = network.links.filter((l): l is PumpLink => l.kind === 'pump');
  return budget.fill_pump ? pumps.find((p) => p.id === budget.fill_pump) : pumps[0];
}

/** The fill pump's full-sun flow: the solved flow at the lift when given and positive, else flow_m3s. */
export function fillOf(network: NetworkDocument, budget: BudgetDocument, solvedFlow_m3s: number | undefined): Fill {
  const pump = fillPump(network, budget);
  if (!pump) return { pump: null, flow_m3s: 0, flow_from: 'none', solar: false };
  const solar = Array.isArray(pump.schedule) && pump.schedule.some((f) => f < 1);
  if (solvedFlow_m3s !== undefined && solvedFlow_m3s > 0) return { pump: pump.id, flow_m3s: solvedFlow_m3s, flow_from: 'solve', solar };
  return { pump: pump.id, flow_m3s: pump.flow_m3s ?? 0, flow_from: pump.flow_m3s ? 'typed' : 'none', solar };
}

/** One verdict per month (see module doc). */
export function monthlyVerdicts(budget: BudgetDocument, totals: MonthTotal[], storage: Storage, fill: Fill): MonthVerdict[] {
  return totals.map((total, j) => {
    const psh = budget.peak_sun_hours[j] ?? 0;
    const hours = fill.solar ? psh : fill.pump ? 24 : 0;
    const dailyFill = fill.flow_m3s * hours * 3600;
    const need = total.daily_m3;
    let required: number;
    let days: number;
    let rule: string;
    let source: string;
    if (fill.solar || fill.pump === null) {
      days = budget.storage_days ?? SOLAR_STORAGE_DAYS;
      required = days * need;
      rule = `a solar or unreliable source keeps ${days} days of the daily need in storage`;
      source = 'NRCS South Dakota Design Technical Note SD2006-1 (2010), V2';
    } else {
      days = budget.storage_days ?? RELIABLE_STORAGE_DAYS;
      required = Math.max(days * need, RELIABLE_PEAK_HOURS * 3600 * total.peak_flow_m3s);
      rule = `the larger of ${days} days' need or ${RELIABLE_PEAK_HOURS} h of peak-hour flow`;
      source = 'Canadian fact sheet on water storage for livestock watering, V2';
    }
    const short = need > 0 && dailyFill < need - 1e-9;
    const low = need > 0 && storage.usable_m3 < required - 1e-9;
    const status: VerdictStatus = need <= 0 ? 'no-use' : short && low ? 'short-and-storage-low' : short ? 'short' : low ? 'storage-low' : 'enough';
    return {
      month: j + 1,
      status,
      daily_need_m3: need,
      peak_sun_hours: psh,
      daily_fill_m3: dailyFill,
      balance_m3: dailyFill - need,
      usable_m3: storage.usable_m3,
      reserve_days: need > 0 ? storage.usable_m3 / need : Number.POSITIVE_INFINITY,
      required_m3: required,
      required_days: need > 0 ? required / need : days,
      rule,
      source,
    };
  });
}
