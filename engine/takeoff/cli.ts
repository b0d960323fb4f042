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
import { CliArgs, checkedDocument, fail, printJson, readJson } from '../cli-io';
import { estimate } from './estimate';
import { takeoff } from './takeoff';

function main(argv: string[]): void {
  const args = new CliArgs(argv, ['--prices', '--waste', '--bend-angle', '--labour-hours', '--labour-rate', '--markup', '--tax']);
  const file = args.file;
  if (!file) fail('usage: takeoff <doc.json> [--prices list.json] [--waste F] [--bend-angle DEG] [--labour-hours H --labour-rate R --markup F --tax F]');
  const value = (name: string): number | undefined => args.number(name, 'non-negative');
  const doc = checkedDocument(readJson(file), `${file}: `);
  const t = takeoff(doc, { waste_fraction: value('--waste'), bendAngle_deg: value('--bend-angle') });
  const pricesFile = args.text('--prices');
  let out: unknown = { takeoff: t };
  if (pricesFile !== undefined) {
    if (!pricesFile) fail('--prices: give the price list file, e.g. --prices list.json');
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
  printJson(out);
}

main(process.argv.slice(2));
