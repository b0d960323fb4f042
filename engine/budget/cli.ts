/**
 * Water budget from the command line (Node only; excluded from the browser build).
 *
 *   npm run -s budget -- plan.json                      → BudgetPlan JSON on stdout
 *   npm run -s budget -- budget.json --network net.json → the same, budget and network in two files
 *
 * plan.json is either a budget document (runnel.budget/1; totals and outlet flows only) or
 * `{ "budget": {…}, "network": {…} }` (adds storage, fill and the monthly verdicts).
 * Exit codes: 0 success, 2 bad input with one line per problem on stderr naming the row and field.
 */
import { fail, printJson, readJson } from '../cli-io';
import { BudgetInputError, planBudget } from './plan';

function main(argv: string[]): void {
  const n = argv.indexOf('--network');
  const networkFile = n >= 0 ? argv[n + 1] : undefined;
  if (n >= 0 && !networkFile) fail('--network: give the network file, e.g. --network network.json');
  const file = argv.find((a, i) => !a.startsWith('--') && (n < 0 || i !== n + 1));
  if (!file) fail('usage: budget <plan.json> [--network network.json]');
  const input = readJson(file);
  let budget: unknown = input;
  let network: unknown = networkFile ? readJson(networkFile) : undefined;
  if (typeof input === 'object' && input !== null && 'budget' in input) {
    budget = (input as { budget: unknown }).budget;
    if (network === undefined && 'network' in input) network = (input as { network: unknown }).network;
  }
  try {
    printJson(planBudget(budget, network));
  } catch (error) {
    if (error instanceof BudgetInputError) fail(error.problems.join('\n'));
    throw error;
  }
}

main(process.argv.slice(2));
