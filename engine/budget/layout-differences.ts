import type { NetworkDocument } from '../network-document';
import type { BudgetDocument } from './budget-document';
import { useNeed } from './daily-need';
import { outletFlows, type OutletFlow } from './outlet-flows';

/**
 * Which budget-driven outlets would have a flow typed on the Layout overwritten by a budget save.
 * An outlet whose flow in the network still equals what the previously saved budget gave it follows
 * the budget: a new budget flow replaces it without asking. An outlet whose network flow differs
 * both from the new budget flow and from the previous one was edited on the Layout since (or was
 * typed there before the budget was linked to it): the designer chooses per outlet, and until they
 * do the network keeps its flow. Pure; no validation (the budgets passed validateBudget).
 *
 * @example
 * layoutDifferences(network, previousBudget, planBudget(draft, network))
 * // [{ id: 'TR4', network_m3s: 0.0003, budget_m3s: 0.00021, previous_m3s: 0.00021, reason: 'edited-on-layout' }]
 */

export interface LayoutDifference {
  id: string;
  /** The outlet's flow in the saved network, m³/s. */
  network_m3s: number;
  /** The flow the budget being saved gives it, m³/s. */
  budget_m3s: number;
  /** The flow the previously saved budget gave it (null: that budget did not drive this outlet). */
  previous_m3s: number | null;
  /** 'edited-on-layout': changed since the budget set it; 'not-yet-from-budget': newly linked. */
  reason: 'edited-on-layout' | 'not-yet-from-budget';
}

/** The same flow, allowing for JSON round trips of the same arithmetic. */
export function sameFlow(a: number, b: number): boolean {
  return Math.abs(a - b) <= 1e-12 + 1e-9 * Math.max(Math.abs(a), Math.abs(b));
}

/** Outlet design flows of a budget alone (they do not depend on the network). */
export function budgetOutletFlows(budget: BudgetDocument): OutletFlow[] {
  return outletFlows(
    budget,
    budget.uses,
    budget.uses.map((u) => useNeed(budget, u)),
  );
}

export function layoutDifferences(network: NetworkDocument, previous: BudgetDocument | null, plan: { outlets: OutletFlow[] }): LayoutDifference[] {
  const before = new Map((previous ? budgetOutletFlows(previous) : []).filter((o) => o.from_budget).map((o) => [o.id, o.design_flow_m3s]));
  const nodes = new Map(network.nodes.map((n) => [n.id, n]));
  const out: LayoutDifference[] = [];
  for (const o of plan.outlets) {
    const node = nodes.get(o.id);
    if (!o.from_budget || node?.kind !== 'outlet' || sameFlow(node.demand_m3s, o.design_flow_m3s)) continue;
    const prev = before.get(o.id);
    if (prev !== undefined && sameFlow(node.demand_m3s, prev)) continue;
    out.push({
      id: o.id,
      network_m3s: node.demand_m3s,
      budget_m3s: o.design_flow_m3s,
      previous_m3s: prev ?? null,
      reason: prev === undefined ? 'not-yet-from-budget' : 'edited-on-layout',
    });
  }
  return out;
}
