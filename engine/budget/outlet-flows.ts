import type { BudgetDocument, BudgetUse, UseKind } from './budget-document';
import { dripFlow, DRIP_SOURCE, type UseNeed } from './daily-need';
import { FIXTURE_METHOD_SOURCE, fixturePeak, fixtureUnits } from './fixtures';

/**
 * Outlet design flows from the budget: each use's peak-month daily need is shared equally among
 * the outlets linked to it and delivered within the use's window (a trough's refill time, a drip
 * block's run time); stock water adds an allowance for evaporation and waste. An outlet serving
 * several uses gets the sum. Rules (REFERENCES.md, "Pipeline capacity and refill"):
 * - stock drinking singly (pasture within 600–900 ft): deliver the daily need in 4 h; as a group
 *   (walks over ~1000 ft) refill within 1 h (Ohio State ANR-12, 2003, after Gerrish & Davis 1995, V2);
 * - any stock pipeline: the peak daily need in 24 h at least, better in 4, 6 or 12 h, with 10 %
 *   added for evaporation and waste (Nebraska Stockwater Pipeline Handbook, USDA-NRCS 2008, V2);
 * - drip, garden and household: the day's water in the run time the designer sets (common practice).
 *
 * @example
 * outletFlows(budget, needs).find((o) => o.id === 'TR1')?.design_flow_m3s
 */

/** Default window per kind, h (stock: 4 h, Ohio State ANR-12; the rest common practice). */
export const DEFAULT_WINDOW_H: Readonly<Record<UseKind, number>> = {
  livestock: 4,
  garden: 2,
  tunnel: 2,
  orchard: 6,
  household: 6,
  other: 12,
};
/** Stock water allowance for evaporation and waste (Nebraska Stockwater Pipeline Handbook, V2). */
export const DEFAULT_WASTE_ALLOWANCE = 0.1;

export interface OutletShare {
  use: string;
  /** This outlet's share of the use's peak-month daily need, m³/day. */
  share_m3_day: number;
  window_h: number;
  /** Flow this use asks of the outlet, m³/s. */
  flow_m3s: number;
  rule: string;
  source: string;
  /** Pressure the use's fixtures ask at the outlet, m of water (household by fixtures). */
  min_pressure_m?: number;
}

export interface OutletFlow {
  id: string;
  /** Sum of the shares' flows, m³/s. */
  design_flow_m3s: number;
  /** Daily volume the outlet serves in the peak month, m³/day. */
  daily_m3: number;
  shares: OutletShare[];
  /** False when the outlet's flow is typed by hand ("not from budget"): the network keeps its own. */
  from_budget: boolean;
}

export function windowOf(use: BudgetUse): number {
  return use.window_h ?? DEFAULT_WINDOW_H[use.kind];
}

/** The rule behind a use's window, and its source. */
export function windowRule(use: BudgetUse, waste: number): { rule: string; source: string } {
  const w = windowOf(use);
  if (use.kind === 'livestock') {
    const pct = Math.round(waste * 100);
    if (w <= 1)
      return {
        rule: `herd drinks as a group: refill within ${w} h, +${pct} % for evaporation and waste`,
        source: 'Ohio State ANR-12 (2003) after Gerrish & Davis 1995, V2; Nebraska Stockwater Pipeline Handbook (USDA-NRCS 2008), V2',
      };
    if (w <= 4)
      return {
        rule: `stock drink singly: the daily need in ${w} h, +${pct} % for evaporation and waste`,
        source: 'Ohio State ANR-12 (2003), V2; Nebraska Stockwater Pipeline Handbook (USDA-NRCS 2008), V2',
      };
    return {
      rule: `the daily need in ${w} h (24 h at the least, better 4–12 h), +${pct} % for evaporation and waste`,
      source: 'Nebraska Stockwater Pipeline Handbook (USDA-NRCS 2008), V2',
    };
  }
  if (use.kind === 'garden' || use.kind === 'tunnel' || use.kind === 'orchard')
    return { rule: `the day's water applied in a ${w} h run`, source: 'common practice (run time set by the designer)' };
  return { rule: `the day's water drawn over ${w} h`, source: 'common practice' };
}

/** A use whose outlets draw a flow of their own: a drip block's rows, or a house's fixtures (./fixtures). */
function peakFlowOf(use: BudgetUse): { flow_m3s: number; window_h: number; min_pressure_m?: number; rule: { rule: string; source: string } } | null {
  if (use.drip && (use.kind === 'garden' || use.kind === 'tunnel')) {
    const d = use.drip;
    const how = d.tape_flow_m3s_per_m !== undefined ? 'drip tape flow per length' : 'emitter flow ÷ emitter spacing';
    return {
      flow_m3s: dripFlow(d),
      window_h: d.hot_run_h ?? d.run_h,
      rule: { rule: `the drip block's flow: ${d.rows} rows × row length × ${how}`, source: DRIP_SOURCE },
    };
  }
  if (use.kind === 'household' && use.fixtures && fixtureUnits(use.fixtures) > 0) {
    const p = fixturePeak(use.fixtures);
    return {
      flow_m3s: p.flow_m3s,
      window_h: windowOf(use),
      min_pressure_m: p.min_pressure_m,
      rule: {
        rule: `the house's probable peak from ${p.fixture_units} fixture units (flush-tank demand table; ${p.min_pressure_for.toLowerCase()} asks the most pressure)`,
        source: FIXTURE_METHOD_SOURCE,
      },
    };
  }
  return null;
}

/** Design flow per linked outlet (see module doc); manual outlets are listed with from_budget false. */
export function outletFlows(budget: BudgetDocument, uses: BudgetUse[], needs: UseNeed[]): OutletFlow[] {
  const waste = budget.waste_allowance ?? DEFAULT_WASTE_ALLOWANCE;
  const manual = new Set(budget.manual_outlets ?? []);
  const byOutlet = new Map<string, OutletFlow>();
  uses.forEach((use, j) => {
    const linked = [...new Set(use.outlets)];
    if (linked.length === 0) return;
    const need = needs[j];
    const w = windowOf(use);
    const extra = use.kind === 'livestock' ? 1 + waste : 1;
    const peak = peakFlowOf(use);
    const { rule, source } = peak?.rule ?? windowRule(use, waste);
    for (const id of linked) {
      const share = need.peak_m3_day / linked.length;
      // drip rows and house fixtures set a flow of their own; the rest deliver the day in the window
      const flow = peak ? peak.flow_m3s / linked.length : (share * extra) / (w * 3600);
      let out = byOutlet.get(id);
      if (!out) {
        out = { id, design_flow_m3s: 0, daily_m3: 0, shares: [], from_budget: !manual.has(id) };
        byOutlet.set(id, out);
      }
      out.shares.push({
        use: use.id,
        share_m3_day: share,
        window_h: peak?.window_h ?? w,
        flow_m3s: flow,
        rule,
        source,
        ...(peak?.min_pressure_m ? { min_pressure_m: peak.min_pressure_m } : {}),
      });
      out.design_flow_m3s += flow;
      out.daily_m3 += share;
    }
  });
  return [...byOutlet.values()];
}
