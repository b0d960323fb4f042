/**
 * Route profile from the command line (Node only; excluded from the browser build).
 *
 *   npm run -s profile -- network.json --from T1 --to TR4 [--routes 3] [--cover 0.45] [--route 2]
 *   npm run -s profile -- network.json          → the longest supply route (tank or source to outlet)
 *
 * Prints `{ routes: Route[], profile: RouteProfile }` (the profile of the first route, or of the
 * one chosen with --route N, 1-based). Exit 2 on bad input with a message naming the field
 * (unreadable file, invalid document, unknown or unconnected elements).
 */
import { CliArgs, checkedDocument, fail, printJson, readJson } from '../cli-io';
import { profileRoute } from './profile-line';
import { findRoutes, longestSupplyRoute, RouteError, type Route } from './routes';

/** An element id option: absent, or a value that is not the next option. */
function option(args: CliArgs, name: string): string | undefined {
  const v = args.text(name);
  if (v !== undefined && (v === '' || v.startsWith('--'))) fail(`${name}: needs a value`);
  return v;
}

function main(argv: string[]): void {
  const args = new CliArgs(argv, ['--from', '--to', '--routes', '--cover', '--route']);
  const file = args.file;
  if (!file) fail('usage: profile <network.json> [--from ID --to ID] [--routes N] [--route N] [--cover M]');
  const network = checkedDocument(readJson(file));
  const from = option(args, '--from');
  const to = option(args, '--to');
  if ((from === undefined) !== (to === undefined))
    fail(`${from === undefined ? '--from' : '--to'}: give both --from and --to, or neither for the longest supply route`);
  let routes: Route[];
  try {
    if (from !== undefined && to !== undefined) routes = findRoutes(network, from, to, args.number('--routes', 'positive') ?? 3);
    else {
      const longest = longestSupplyRoute(network);
      if (!longest) fail('network: no outlet is connected to a source or tank');
      routes = [longest];
    }
  } catch (error) {
    if (error instanceof RouteError) fail(error.message);
    throw error;
  }
  const pick = args.number('--route', 'positive') ?? 1;
  if (!Number.isInteger(pick) || pick > routes.length) fail(`--route: must be a whole number 1–${routes.length} (got ${pick})`);
  const profile = profileRoute(network, routes[pick - 1], { cover_m: args.number('--cover', 'positive') });
  printJson({ routes, profile });
}

main(process.argv.slice(2));
