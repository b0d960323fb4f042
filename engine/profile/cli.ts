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
import { readFileSync } from 'node:fs';
import type { NetworkDocument } from '../network-document';
import { validateDocument } from '../validate';
import { profileRoute } from './profile-line';
import { findRoutes, longestSupplyRoute, RouteError, type Route } from './routes';

function fail(message: string): never {
  process.stderr.write(`${message}\n`);
  process.exit(2);
}

function option(args: string[], name: string): string | undefined {
  const i = args.indexOf(name);
  if (i < 0) return undefined;
  const v = args[i + 1];
  if (v === undefined || v.startsWith('--')) fail(`${name}: needs a value`);
  return v;
}

function positive(args: string[], name: string): number | undefined {
  const v = option(args, name);
  if (v === undefined) return undefined;
  const n = Number(v);
  if (!Number.isFinite(n) || n <= 0) fail(`${name}: must be a positive number (got ${v})`);
  return n;
}

function main(args: string[]): void {
  const valued = new Set(['--from', '--to', '--routes', '--cover', '--route']);
  const file = args.find((a, i) => !a.startsWith('--') && !valued.has(args[i - 1]));
  if (!file) fail('usage: profile <network.json> [--from ID --to ID] [--routes N] [--route N] [--cover M]');
  let doc: unknown;
  try {
    doc = JSON.parse(readFileSync(file, 'utf8'));
  } catch (error) {
    fail(`${file}: cannot read as JSON (${(error as Error).message})`);
  }
  const invalid = validateDocument(doc);
  if (invalid.length > 0) fail(invalid.map((w) => w.message).join('\n'));
  const network = doc as NetworkDocument;
  const from = option(args, '--from');
  const to = option(args, '--to');
  if ((from === undefined) !== (to === undefined))
    fail(`${from === undefined ? '--from' : '--to'}: give both --from and --to, or neither for the longest supply route`);
  let routes: Route[];
  try {
    if (from !== undefined && to !== undefined) routes = findRoutes(network, from, to, positive(args, '--routes') ?? 3);
    else {
      const longest = longestSupplyRoute(network);
      if (!longest) fail('network: no outlet is connected to a source or tank');
      routes = [longest];
    }
  } catch (error) {
    if (error instanceof RouteError) fail(error.message);
    throw error;
  }
  const pick = positive(args, '--route') ?? 1;
  if (!Number.isInteger(pick) || pick > routes.length) fail(`--route: must be a whole number 1–${routes.length} (got ${pick})`);
  const profile = profileRoute(network, routes[pick - 1], { cover_m: positive(args, '--cover') });
  process.stdout.write(`${JSON.stringify({ routes, profile }, (_k, v) => (typeof v === 'number' && !Number.isFinite(v) ? null : v))}\n`);
}

main(process.argv.slice(2));
