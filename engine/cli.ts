/**
 * Command line for the engine (Node only; excluded from the browser build).
 *
 *   npm run -s solve -- network.json                       → SteadyResult JSON on stdout
 *   npm run -s solve -- network.json --simulate --hours 24 --step 60   → TimeSeriesResult JSON
 *   npm run -s solve -- network.json --equalise T1,T2 --tolerance 0.005 → equalisation result
 *
 * Exit codes: 0 success (warnings are part of the JSON), 2 bad input (unreadable file, bad JSON,
 * invalid document or options), with a message on stderr naming the element and field.
 */
import { CliArgs, checkedDocument, fail, printJson, readJson } from './cli-io';
import { equalisationTime } from './equalise';
import { simulate } from './simulate';
import { solve } from './steady';

function main(argv: string[]): void {
  const args = new CliArgs(argv, ['--hours', '--step', '--equalise', '--tolerance']);
  const file = args.file;
  if (!file) fail('usage: solve <network.json> [--simulate --hours H --step S] [--equalise T1,T2 --tolerance M]');
  const doc = readJson(file);
  if (args.has('--simulate')) {
    printJson(
      simulate(checkedDocument(doc), { duration_s: (args.number('--hours', 'positive') ?? 24) * 3600, step_s: args.number('--step', 'positive') ?? 60 }),
    );
  } else if (args.has('--equalise')) {
    checkedDocument(doc);
    const tanks = (args.text('--equalise') ?? '').split(',').filter(Boolean);
    if (tanks.length < 2) fail('--equalise: give at least two tank ids, e.g. --equalise T1,T2');
    printJson(equalisationTime(doc, { tanks, tolerance_m: args.number('--tolerance', 'positive') ?? 0.01 }));
  } else {
    // solve validates the document itself (once: on a large network that is a fifth of a cold run)
    const result = solve(doc);
    const invalid = result.warnings.filter((w) => w.code === 'invalid');
    if (invalid.length > 0) fail(invalid.map((w) => w.message).join('\n'));
    printJson(result);
  }
}

main(process.argv.slice(2));
