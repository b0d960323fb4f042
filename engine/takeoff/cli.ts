/**
 * Command line for the takeoff and estimate (Node only; excluded from the browser build).
 *
 *   npm run -s takeoff -- doc.json [--prices list.json] [--waste 0.05] [--bend-angle 30]
 *       [--labour-hours H --labour-rate R --markup 0.15 --tax 0.07]
 *
 * list.json is a price list: [{ "code": "pe-sidr9/1\"", "description": "…", "unit": "m", "price": 1.9 }, …]
 * (price null = not priced yet). Prints { takeoff, estimate } (estimate only with --prices).
 * Exit 2 on bad input, naming the file, row and field.
 */
import { readFileSync } from 'node:fs';
import { validateDocument } from '../validate';
import type { NetworkDocument } from '../network-document';
import { estimate } from './estimate';
import { takeoff } from './takeoff';

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

const VALUES = ['--prices', '--waste', '--bend-angle', '--labour-hours', '--labour-rate', '--markup', '--tax'];

function main(args: string[]): void {
  const file = args.find((a, i) => !a.startsWith('--') && !VALUES.includes(args[i - 1]));
  if (!file) fail('usage: takeoff <doc.json> [--prices list.json] [--waste F] [--bend-angle DEG] [--labour-hours H --labour-rate R --markup F --tax F]');
  const value = (name: string): number | undefined => {
    const i = args.indexOf(name);
    if (i < 0) return undefined;
    const n = Number(args[i + 1]);
    if (args[i + 1] === undefined || !Number.isFinite(n) || n < 0) fail(`${name}: must be a non-negative number (got ${args[i + 1] ?? 'nothing'})`);
    return n;
  };
  const doc = readJson(file);
  const invalid = validateDocument(doc);
  if (invalid.length > 0) fail(invalid.map((w) => `${file}: ${w.message}`).join('\n'));
  const t = takeoff(doc as NetworkDocument, { waste_fraction: value('--waste'), bendAngle_deg: value('--bend-angle') });
  const pricesFile = args[args.indexOf('--prices') + 1];
  let out: unknown = { takeoff: t };
  if (args.includes('--prices')) {
    const list = readJson(pricesFile);
    if (!Array.isArray(list)) fail(`${pricesFile}: must be a list of { code, price } rows`);
    const prices = new Map<string, number | null>();
    list.forEach((row, i) => {
      const r = row as { code?: unknown; price?: unknown };
      if (typeof r?.code !== 'string' || !r.code.trim()) fail(`${pricesFile}: row ${i + 1}, code: must be text`);
      if (r.price !== null && (typeof r.price !== 'number' || !Number.isFinite(r.price) || r.price < 0))
        fail(`${pricesFile}: row ${i + 1}, price: must be a non-negative number or null (got ${JSON.stringify(r.price)})`);
      prices.set(r.code, r.price as number | null);
    });
    out = {
      takeoff: t,
      estimate: estimate(t, prices, {
        labour_hours: value('--labour-hours'),
        labour_rate: value('--labour-rate'),
        markup_fraction: value('--markup'),
        tax_fraction: value('--tax'),
      }),
    };
  }
  process.stdout.write(`${JSON.stringify(out)}\n`);
}

main(process.argv.slice(2));
