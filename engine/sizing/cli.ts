/**
 * Command line for pipe sizing (Node only; excluded from the browser build).
 *
 *   npm run -s size -- doc.json --catalogue prices.json [--min-pressure-m P] [--omega W]
 *       [--velocity-limit V] [--rating-fraction F] [--pipes P1,P2] [--same-series]
 *
 * doc.json is a network document; prices.json a priced catalogue (format in ./price-catalogue and
 * engine/README.md "Sizing"). Prints one JSON object: { feasible, currency, cost, largestCost,
 * choices, skipped, regions, check, settings, document } (the sized document last).
 * Exit codes: 0 success (an infeasible design is a result, with feasible: false and the reason in
 * regions[].note), 2 bad input, with a message on stderr naming the file, row and field.
 */
import { readFileSync } from 'node:fs';
import { validateDocument } from '../validate';
import { parsePriceCatalogue } from './price-catalogue';
import { sizeNetwork } from './size-network';
import type { NetworkDocument } from '../network-document';

function fail(message: string): never {
  process.stderr.write(`${message}\n`);
  process.exit(2);
}

const VALUE_OPTIONS = ['--catalogue', '--min-pressure-m', '--omega', '--velocity-limit', '--rating-fraction', '--pipes', '--max-evaluations'];

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

function main(args: string[]): void {
  const file = args.find((a, i) => !a.startsWith('--') && !VALUE_OPTIONS.includes(args[i - 1]));
  const value = (name: string): string | undefined => {
    const i = args.indexOf(name);
    return i < 0 ? undefined : (args[i + 1] ?? '');
  };
  const number = (name: string): number | undefined => {
    const v = value(name);
    if (v === undefined) return undefined;
    const n = Number(v);
    if (v === '' || !Number.isFinite(n) || n < 0) fail(`${name}: must be a non-negative number (got ${v || 'nothing'})`);
    return n;
  };
  const catalogueFile = value('--catalogue');
  if (!file || !catalogueFile)
    fail(
      'usage: size <doc.json> --catalogue <prices.json> [--min-pressure-m P] [--omega W] [--velocity-limit V] [--rating-fraction F] [--pipes P1,P2] [--same-series]',
    );
  const doc = readJson(file);
  const invalid = validateDocument(doc);
  if (invalid.length > 0) fail(invalid.map((w) => `${file}: ${w.message}`).join('\n'));
  const typed = doc as NetworkDocument;
  const catalogue = parsePriceCatalogue(readJson(catalogueFile), typed.headloss ?? 'hazen-williams');
  if (catalogue.errors.length > 0) fail(catalogue.errors.map((e) => `${catalogueFile}: ${e}`).join('\n'));
  const pipes = value('--pipes')?.split(',').filter(Boolean);
  for (const id of pipes ?? []) if (!typed.links.some((l) => l.id === id && l.kind === 'pipe')) fail(`--pipes: ${id} is not a pipe of ${file}`);
  const result = sizeNetwork(typed, catalogue.candidates, {
    minPressure_m: number('--min-pressure-m'),
    omega: number('--omega'),
    velocityLimit_ms: number('--velocity-limit'),
    ratingFraction: number('--rating-fraction'),
    maxEvaluations: number('--max-evaluations'),
    pipes,
    sameSeries: args.includes('--same-series'),
  });
  const { document, ...rest } = result;
  process.stdout.write(`${JSON.stringify({ ...rest, currency: catalogue.currency, document })}\n`);
}

main(process.argv.slice(2));
