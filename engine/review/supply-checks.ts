/**
 * Storage and supply: days of usable storage against the 3-day minimum for a solar (or otherwise
 * unreliable) fill, the fill pump's daily volume against the worst month's daily need, and each
 * trough's refill time against the herd rule. The daily need comes from the water budget when the
 * caller passes one (`SupplyInputs`), otherwise from the outlets' design flows × their patterns.
 */
import type { BudgetPlan } from '../budget/index';
import type { NetworkDocument } from '../network-document';
import { dailyFactor, nameOf, type ReviewContext } from './review-context';
import { RULES, STORAGE_DAYS_UNRELIABLE, TROUGH_REFILL_HOURS, WASTE_ALLOWANCE } from './rules';
import type { CheckRow, CheckStatus } from './types';

/** What the water budget knows better than the network (all optional). */
export interface SupplyInputs {
  /** The worst month's daily need (smallest fill-minus-need balance), m³/day. */
  worstDailyNeed_m3?: number;
  /** The largest monthly daily need, m³/day: what storage must carry through cloudy days. */
  peakDailyNeed_m3?: number;
  worstMonth?: string;
  /** The fill's daily volume in that month (flow × the month's sun hours), m³/day. */
  fillDailyVolume_m3?: number;
  /** Per trough outlet id: its herd's daily need, m³/day. */
  troughDailyNeed_m3?: Record<string, number>;
}

const DAY_S = 86400;
const MONTHS = ['January', 'February', 'March', 'April', 'May', 'June', 'July', 'August', 'September', 'October', 'November', 'December'];

/**
 * The water budget's plan (engine/budget planBudget with the network) as supply inputs: the worst
 * month is the one with the smallest fill-minus-need balance; troughs take their daily volume.
 */
export function supplyFromBudget(plan: Pick<BudgetPlan, 'verdicts' | 'outlets' | 'months' | 'peak_month'>, doc: NetworkDocument): SupplyInputs {
  const out: SupplyInputs = {};
  const verdicts = (plan.verdicts ?? []).filter((v) => v.daily_need_m3 > 0);
  if (verdicts.length) {
    const worst = verdicts.reduce((a, b) => (b.balance_m3 < a.balance_m3 ? b : a));
    out.worstDailyNeed_m3 = worst.daily_need_m3;
    out.fillDailyVolume_m3 = worst.daily_fill_m3;
    out.worstMonth = MONTHS[worst.month - 1];
    out.peakDailyNeed_m3 = Math.max(...verdicts.map((v) => v.daily_need_m3));
  } else if (plan.peak_month > 0) {
    out.worstDailyNeed_m3 = plan.months.find((m) => m.month === plan.peak_month)?.daily_m3;
    out.worstMonth = MONTHS[plan.peak_month - 1];
    out.peakDailyNeed_m3 = out.worstDailyNeed_m3;
  }
  const troughs = new Set(doc.nodes.filter((n) => n.kind === 'outlet' && n.outlet_type === 'trough').map((n) => n.id));
  const need: Record<string, number> = {};
  for (const o of plan.outlets) if (troughs.has(o.id) && o.daily_m3 > 0) need[o.id] = o.daily_m3;
  if (Object.keys(need).length) out.troughDailyNeed_m3 = need;
  return out;
}

/** Daily need from the outlets' (and tees') design flows, each × the mean of its pattern, m³/day. */
export function dailyNeedFromFlows(doc: NetworkDocument): number {
  let total = 0;
  for (const n of doc.nodes) if (n.kind === 'outlet' || n.kind === 'tee') total += n.demand_m3s * dailyFactor(doc, n.pattern) * DAY_S;
  return total;
}

/** Usable storage of every tank between its minimum and maximum level, m³. */
export function usableStorage(doc: NetworkDocument): number {
  let v = 0;
  for (const n of doc.nodes) if (n.kind === 'tank') v += (Math.PI / 4) * n.diameter_m ** 2 * Math.max(0, n.max_level_m - n.min_level_m);
  return v;
}

/** The pumps' daily volume: constant flow (or the steady flow of a curve pump) × hours of availability, m³/day. */
export function pumpDailyVolume(ctx: ReviewContext): number {
  let v = 0;
  for (const l of ctx.doc.links) {
    if (l.kind !== 'pump') continue;
    const flow = l.flow_m3s ?? Math.max(0, ctx.result.links[l.id]?.flow_m3s ?? 0);
    const hours = l.schedule && l.schedule.length ? l.schedule.reduce((s, f) => s + f, 0) * (24 / l.schedule.length) : 24;
    v += flow * hours * 3600;
  }
  return v;
}

export const storageStatus = (days: number): CheckStatus => (days >= STORAGE_DAYS_UNRELIABLE ? 'pass' : 'fail');
export function fillStatus(volume: number, need: number): CheckStatus {
  if (volume < need) return 'fail';
  return volume < need + need * WASTE_ALLOWANCE ? 'caution' : 'pass';
}
/** Refill verdict: the delivered flow must supply the daily need within TROUGH_REFILL_HOURS. */
export const refillStatus = (delivered_m3s: number, dailyNeed_m3: number): CheckStatus =>
  delivered_m3s * TROUGH_REFILL_HOURS * 3600 >= dailyNeed_m3 ? 'pass' : 'fail';

export function supplyChecks(ctx: ReviewContext, inputs: SupplyInputs = {}): CheckRow[] {
  const rows: CheckRow[] = [];
  const doc = ctx.doc;
  const fromBudget = inputs.worstDailyNeed_m3 !== undefined;
  const need = inputs.worstDailyNeed_m3 ?? dailyNeedFromFlows(doc);
  const needText = fromBudget
    ? `the water budget's worst month${inputs.worstMonth ? ` (${inputs.worstMonth})` : ''}`
    : "the outlets' design flows and patterns (no water budget yet)";
  const pumps = doc.links.filter((l) => l.kind === 'pump');
  const unreliable = pumps.some((p) => p.kind === 'pump' && (p.schedule ?? []).some((f) => f < 1));
  const storage = usableStorage(doc);
  const storageNeed = inputs.peakDailyNeed_m3 ?? need;
  if (doc.nodes.some((n) => n.kind === 'tank') && storageNeed > 0) {
    const rule = RULES['storage-days'];
    const days = storage / storageNeed;
    const status: CheckStatus = unreliable ? storageStatus(days) : 'pass';
    rows.push({
      key: rule.id,
      group: 'storage',
      rule: rule.id,
      title: rule.title,
      element: null,
      status,
      measured: { value: days, quantity: 'days' },
      limit: { value: STORAGE_DAYS_UNRELIABLE, quantity: 'days' },
      margin: { value: days - STORAGE_DAYS_UNRELIABLE, quantity: 'days' },
      detail: [
        { label: 'usable storage', amount: { value: storage, quantity: 'volume' } },
        { label: 'daily need', amount: { value: storageNeed, quantity: 'volume-per-day' } },
      ],
      note: `${!unreliable ? 'The fill is not on a sun or time schedule, so the 3-day rule for unreliable sources does not apply' : status === 'pass' ? 'Enough storage to ride out cloudy days' : 'Too little storage for a solar fill: add tanks or cut the daily need'}; need from ${fromBudget ? "the water budget's peak month" : needText}`,
      ruleText: rule.text,
      source: rule.source,
    });
  }
  if (pumps.length && need > 0) {
    const rule = RULES['fill-daily-volume'];
    const volume = inputs.fillDailyVolume_m3 ?? pumpDailyVolume(ctx);
    const status = fillStatus(volume, need);
    rows.push({
      key: rule.id,
      group: 'storage',
      rule: rule.id,
      title: rule.title,
      element: pumps[0].id,
      ...nameOf(pumps[0]),
      status,
      measured: { value: volume, quantity: 'volume-per-day' },
      limit: { value: need * (1 + WASTE_ALLOWANCE), quantity: 'volume-per-day' },
      margin: { value: volume - need * (1 + WASTE_ALLOWANCE), quantity: 'volume-per-day' },
      note: `${status === 'pass' ? 'The fill keeps up with the need and its allowance' : status === 'caution' ? 'The fill only just keeps up: nothing left for evaporation and waste' : 'The fill cannot keep up: the tanks draw down day after day'}; need from ${needText}`,
      ruleText: rule.text,
      source: rule.source,
    });
  }
  for (const n of doc.nodes) {
    if (n.kind !== 'outlet' || n.outlet_type !== 'trough') continue;
    const rule = RULES['trough-refill'];
    const herdNeed = inputs.troughDailyNeed_m3?.[n.id];
    const delivered = ctx.result.nodes[n.id]?.demand_m3s ?? 0;
    const base = {
      key: `${rule.id}:${n.id}`,
      group: 'storage' as const,
      rule: rule.id,
      title: rule.title,
      element: n.id,
      ...nameOf(n),
      ruleText: rule.text,
      source: rule.source,
    };
    if (herdNeed === undefined) {
      rows.push({
        ...base,
        status: 'caution',
        measured: { value: delivered, quantity: 'flow' },
        note: 'No herd is linked to this trough in the water budget, so its refill time cannot be judged',
      });
      continue;
    }
    const status = refillStatus(delivered, herdNeed);
    const hours = delivered > 0 ? herdNeed / delivered / 3600 : Infinity;
    rows.push({
      ...base,
      status,
      measured: { value: hours, quantity: 'hours' },
      limit: { value: TROUGH_REFILL_HOURS, quantity: 'hours' },
      margin: { value: TROUGH_REFILL_HOURS - hours, quantity: 'hours' },
      detail: [{ label: 'herd daily need', amount: { value: herdNeed, quantity: 'volume-per-day' } }],
      note:
        status === 'pass'
          ? "Refills the herd's daily need in time"
          : 'Too slow: stock wait at the trough; a bigger line, more pressure or a bigger trough helps',
    });
  }
  return rows;
}
