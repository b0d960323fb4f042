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
import { CliArgs, checkedDocument, fail, printJson, readJson } from '../cli-io';
import { parsePriceCatalogue } from './price-catalogue';
import { sizeNetwork } from './size-network';

function main(argv: string[]): void {
  const args = new CliArgs(argv, ['--catalogue', '--min-pressure-m', '--omega', '--velocity-limit', '--rating-fraction', '--pipes', '--max-evaluations']);
  const file = args.file;
  const number = (name: string): number | undefined => args.number(name, 'non-negative');
  const catalogueFile = args.text('--catalogue');
  if (!file || !catalogueFile)
    fail(
      'usage: size <doc.json> --catalogue <prices.json> [--min-pressure-m P] [--omega W] [--velocity-limit V] [--rating-fraction F] [--pipes P1,P2] [--same-series]',
    );
  const typed = checkedDocument(readJson(file), `${file}: `);
  const catalogue = parsePriceCatalogue(readJson(catalogueFile), typed.headloss ?? 'hazen-williams');
  if (catalogue.errors.length > 0) fail(catalogue.errors.map((e) => `${catalogueFile}: ${e}`).join('\n'));
  const pipes = args.text('--pipes')?.split(',').filter(Boolean);
  for (const id of pipes ?? []) if (!typed.links.some((l) => l.id === id && l.kind === 'pipe')) fail(`--pipes: ${id} is not a pipe of ${file}`);
  const result = sizeNetwork(typed, catalogue.candidates, {
    minPressure_m: number('--min-pressure-m'),
    omega: number('--omega'),
    velocityLimit_ms: number('--velocity-limit'),
    ratingFraction: number('--rating-fraction'),
    maxEvaluations: number('--max-evaluations'),
    pipes,
    sameSeries: args.has('--same-series'),
  });
  const { document, ...rest } = result;
  printJson({ ...rest, currency: catalogue.currency, document });
}

main(process.argv.slice(2));
