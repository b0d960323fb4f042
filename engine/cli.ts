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
import { readFileSync } from 'node:fs';
import { equalisationTime } from './equalise';
import { simulate } from './simulate';
import { solve } from './steady';
import { validateDocument } from './validate';

function fail(message: string): never {
  process.stderr.write(`${message}\n`);
  process.exit(2);
}

function main(argv: string[]): void {
  const args = [...argv];
  const file = args.find((a) => !a.startsWith('--') && !isOptionValue(args, a));
  if (!file) fail('usage: solve <network.json> [--simulate --hours H --step S] [--equalise T1,T2 --tolerance M]');
  const number = (name: string, fallback: number): number => {
    const i = args.indexOf(name);
    if (i < 0) return fallback;
    const v = Number(args[i + 1]);
    if (!Number.isFinite(v) || v <= 0) fail(`${name}: must be a positive number (got ${args[i + 1] ?? 'nothing'})`);
    return v;
  };
  let text: string;
  try {
    text = readFileSync(file, 'utf8');
  } catch (error) {
    fail(`${file}: cannot read (${(error as NodeJS.ErrnoException).code ?? 'error'})`);
  }
  let doc: unknown;
  try {
    doc = JSON.parse(text);
  } catch (error) {
    fail(`${file}: not valid JSON (${(error as Error).message})`);
  }
  let out: unknown;
  const simulating = args.includes('--simulate');
  const equalising = args.includes('--equalise');
  if (simulating || equalising) {
    const invalid = validateDocument(doc);
    if (invalid.length > 0) fail(invalid.map((w) => w.message).join('\n'));
  }
  if (simulating) {
    out = simulate(doc, { duration_s: number('--hours', 24) * 3600, step_s: number('--step', 60) });
  } else if (equalising) {
    const i = args.indexOf('--equalise');
    const tanks = (args[i + 1] ?? '').split(',').filter(Boolean);
    if (tanks.length < 2) fail('--equalise: give at least two tank ids, e.g. --equalise T1,T2');
    out = equalisationTime(doc, { tanks, tolerance_m: number('--tolerance', 0.01) });
  } else {
    // solve validates the document itself (once: on a large network that is a fifth of a cold run)
    const result = solve(doc);
    const invalid = result.warnings.filter((w) => w.code === 'invalid');
    if (invalid.length > 0) fail(invalid.map((w) => w.message).join('\n'));
    out = result;
  }
  process.stdout.write(`${JSON.stringify(out)}\n`);
}

function isOptionValue(args: string[], a: string): boolean {
  const i = args.indexOf(a);
  return i > 0 && ['--hours', '--step', '--equalise', '--tolerance'].includes(args[i - 1]);
}

main(process.argv.slice(2));
