import type { NetworkDocument, OutletNode } from '../network-document';
import { solve } from '../steady';
import { validateDocument } from '../validate';
import type { BudgetDocument } from './budget-document';
import { MONTH_NAMES } from './budget-document';
import { monthTotals, useNeed, type MonthTotal, type UseNeed } from './daily-need';
import { outletFlows, type OutletFlow } from './outlet-flows';
import { fillOf, monthlyVerdicts, storageOf, type Fill, type MonthVerdict, type Storage } from './storage-fill';
import { validateBudget } from './validate-budget';
import { sameFlow } from './layout-differences';

/**
 * The whole water-budget computation for a screen or the CLI: per-use needs, monthly totals,
 * outlet design flows, and (with a network) storage, fill and the monthly verdicts. Pure; never
 * throws on a budget that passed validateBudget. `applyBudget` writes the outlet design flows into
 * a copy of the network (outlets marked "not from budget" keep their own).
 *
 * @example
 * const plan = planBudget(budget, network);
 * plan.verdicts[6].status // 'enough' | 'short' | …
 */

export interface BudgetPlan {
  uses: UseNeed[];
  months: MonthTotal[];
  /** The month of the largest total daily need (1–12; 0 with no use). */
  peak_month: number;
  outlets: OutletFlow[];
  storage: Storage | null;
  fill: Fill | null;
  verdicts: MonthVerdict[] | null;
  /** Plain sentences: undersized pump (month and shortfall), links to missing outlets, low storage. */
  warnings: string[];
}

/** Validate, then plan; throws BudgetInputError naming row and field on bad input. */
export class BudgetInputError extends Error {
  constructor(readonly problems: string[]) {
    super(problems.join('\n'));
    this.name = 'BudgetInputError';
  }
}

export function planBudget(budget: unknown, network?: unknown): BudgetPlan {
  const problems = validateBudget(budget);
  if (network !== undefined) problems.push(...validateDocument(network).map((w) => `network: ${w.message}`));
  if (problems.length > 0) throw new BudgetInputError(problems);
  return plan(budget as BudgetDocument, network as NetworkDocument | undefined);
}

function plan(budget: BudgetDocument, network: NetworkDocument | undefined): BudgetPlan {
  const needs = budget.uses.map((u) => useNeed(budget, u));
  const months = monthTotals(budget, needs);
  let peakMonth = 0;
  months.forEach((m) => {
    if (m.daily_m3 > (months[peakMonth - 1]?.daily_m3 ?? 0)) peakMonth = m.month;
  });
  const outlets = outletFlows(budget, budget.uses, needs);
  const warnings: string[] = [];
  if (!network) return { uses: needs, months, peak_month: peakMonth, outlets, storage: null, fill: null, verdicts: null, warnings };

  const outletIds = new Set(network.nodes.filter((n) => n.kind === 'outlet').map((n) => n.id));
  budget.uses.forEach((use, i) => {
    for (const id of use.outlets) {
      if (!outletIds.has(id)) warnings.push(`uses[${i}] "${use.name}".outlets: ${id} is not an outlet in the network (its share is not applied)`);
    }
  });
  const storage = storageOf(network, budget);
  const withFlows = applyBudget(network, { outlets });
  let solved: number | undefined;
  const pumpId = fillOf(network, budget, undefined).pump;
  if (pumpId) {
    const result = solve(withFlows);
    const flow = result.links[pumpId]?.flow_m3s;
    if (result.converged && flow !== undefined && Number.isFinite(flow)) solved = flow;
  }
  const fill = fillOf(network, budget, solved);
  const verdicts = monthlyVerdicts(budget, months, storage, fill);
  if (!fill.pump) warnings.push('network: no fill pump, so the monthly fill cannot be checked');
  for (const v of verdicts) {
    const name = MONTH_NAMES[v.month - 1];
    if (v.status === 'short' || v.status === 'short-and-storage-low') {
      warnings.push(
        `${fill.pump}: fill pump too small in ${name}: fills ${litres(v.daily_fill_m3)} L/day for a need of ${litres(v.daily_need_m3)} L/day (short by ${litres(-v.balance_m3)} L/day)`,
      );
    }
    if (v.status === 'storage-low' || v.status === 'short-and-storage-low') {
      warnings.push(
        `storage: ${name} needs ${v.required_days.toFixed(1)} days (${litres(v.required_m3)} L); the tanks hold ${v.reserve_days.toFixed(1)} days (${litres(v.usable_m3)} L)`,
      );
    }
  }
  return { uses: needs, months, peak_month: peakMonth, outlets, storage, fill, verdicts, warnings };
}

/**
 * A copy of the network with each budget-driven outlet's demand_m3s set to its design flow.
 * Outlets not in the plan, not in the network, marked "not from budget", or in `hold` (a flow
 * edited on the Layout the designer has not yet chosen to replace, ./layout-differences) are left
 * as they are.
 */
export function applyBudget(network: NetworkDocument, plan: Pick<BudgetPlan, 'outlets'>, hold: ReadonlySet<string> = new Set()): NetworkDocument {
  const flows = new Map(plan.outlets.filter((o) => o.from_budget && !hold.has(o.id)).map((o) => [o.id, o.design_flow_m3s]));
  return {
    ...network,
    nodes: network.nodes.map((n) => (n.kind === 'outlet' && flows.has(n.id) ? withFlow(n, flows.get(n.id) as number) : n)),
  };
}

/** An outlet at a new design flow; an emitter block's coefficient scales with it (same emitters, more of them). */
function withFlow(n: OutletNode, flow: number): OutletNode {
  const model = n.demand_model;
  if (model?.type === 'emitter' && n.demand_m3s > 0) return { ...n, demand_m3s: flow, demand_model: { ...model, k: (model.k * flow) / n.demand_m3s } };
  return { ...n, demand_m3s: flow };
}

/** True when applying the plan (less the held outlets) would change some outlet's flow (beyond rounding). */
export function budgetChangesNetwork(network: NetworkDocument, plan: Pick<BudgetPlan, 'outlets'>, hold: ReadonlySet<string> = new Set()): boolean {
  const nodes = new Map(network.nodes.map((n) => [n.id, n]));
  return plan.outlets.some((o) => {
    const n = nodes.get(o.id);
    return o.from_budget && !hold.has(o.id) && n?.kind === 'outlet' && !sameFlow(n.demand_m3s, o.design_flow_m3s);
  });
}

function litres(m3: number): string {
  return Math.round(m3 * 1000).toLocaleString('en-US');
}
