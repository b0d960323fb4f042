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
import { readFileSync } from 'node:fs';
import { BudgetInputError, planBudget } from './plan';

function fail(message: string): never {
  process.stderr.write(`${message}\n`);
  process.exit(2);
}

function readJson(file: string): unknown {
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (error) {
    fail(`${file}: cannot read (${(error as NodeJS.ErrnoException).code ?? 'error'})`);
  }
  try {
    return JSON.parse(text);
  } catch (error) {
    fail(`${file}: not valid JSON (${(error as Error).message})`);
  }
}

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
    process.stdout.write(`${JSON.stringify(planBudget(budget, network), (_k, v) => (v === Infinity ? null : v))}\n`);
  } catch (error) {
    if (error instanceof BudgetInputError) fail(error.problems.join('\n'));
    throw error;
  }
}

main(process.argv.slice(2));
