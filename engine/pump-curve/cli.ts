/**
 * Fit a pump curve from a JSON file of points: `npm run -s pump-curve -- points.json`
 * where points.json is [[flow_m3s, head_m], …]. Prints the fit as JSON; exit 2 with a message
 * naming the row on bad input.
 */
import { readFileSync } from 'node:fs';
import { fitPumpCurve } from './fit';

function fail(message: string): never {
  process.stderr.write(`${message}\n`);
  process.exit(2);
}

const file = process.argv[2];
if (!file) fail('usage: pump-curve <points.json>   (points: [[flow_m3s, head_m], …])');
let data: unknown;
try {
  data = JSON.parse(readFileSync(file, 'utf8'));
} catch (e) {
  fail(`${file}: ${(e as Error).message}`);
}
if (!Array.isArray(data)) fail(`${file}: expected an array of [flow_m3s, head_m] rows`);
const rows = data as unknown[];
rows.forEach((r, i) => {
  if (!Array.isArray(r) || r.length !== 2 || !r.every((v) => typeof v === 'number' && Number.isFinite(v)))
    fail(`row ${i + 1}: expected [flow_m3s, head_m] numbers`);
  if ((r as number[])[0] < 0) fail(`row ${i + 1}: flow_m3s must not be negative`);
});
if (rows.length < 2) fail('a curve needs at least two rows');
process.stdout.write(`${JSON.stringify(fitPumpCurve(rows as [number, number][]))}\n`);
