/**
 * Water budget: uses and their daily needs (defaults table with sources), monthly totals, outlet
 * design flows, storage and fill verdicts. Pure TypeScript; see engine/README.md ("Water budget").
 *
 * @example
 * import { planBudget } from '../engine/budget';
 * const plan = planBudget(budget, network);
 */
export * from './budget-document';
export { DEFAULT_RATES, DEFAULT_RATE_ROWS, DEFAULT_KEY_BY_KIND, type DefaultRate, type RateUnit } from './defaults';
export { validateBudget } from './validate-budget';
export { useNeed, monthTotals, dripFlow, type UseNeed, type MonthTotal } from './daily-need';
export {
  FIXTURES,
  FIXTURE_BY_KEY,
  fixturePeak,
  fixtureUnits,
  demandFromFixtureUnits,
  MAX_FIXTURE_UNITS,
  type Fixture,
  type FixtureKey,
  type FixturePeak,
} from './fixtures';
export { outletFlows, windowOf, windowRule, DEFAULT_WINDOW_H, DEFAULT_WASTE_ALLOWANCE, type OutletFlow, type OutletShare } from './outlet-flows';
export {
  storageOf,
  fillOf,
  fillPump,
  monthlyVerdicts,
  SOLAR_STORAGE_DAYS,
  RELIABLE_STORAGE_DAYS,
  RELIABLE_PEAK_HOURS,
  type Storage,
  type TankStorage,
  type Fill,
  type MonthVerdict,
  type VerdictStatus,
} from './storage-fill';
export { planBudget, applyBudget, budgetChangesNetwork, BudgetInputError, type BudgetPlan } from './plan';
export { layoutDifferences, budgetOutletFlows, sameFlow, type LayoutDifference } from './layout-differences';
