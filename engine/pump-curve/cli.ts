/**
 * Fit a pump curve from a JSON file of points: `npm run -s pump-curve -- points.json`
 * where points.json is [[flow_m3s, head_m], …]. Prints the fit as JSON; exit 2 with a message
 * naming the row on bad input.
 */
import { fail, printJson, readJson } from '../cli-io';
import { fitPumpCurve } from './fit';

const file = process.argv[2];
if (!file) fail('usage: pump-curve <points.json>   (points: [[flow_m3s, head_m], …])');
const data = readJson(file);
if (!Array.isArray(data)) fail(`${file}: expected an array of [flow_m3s, head_m] rows`);
const rows = data as unknown[];
rows.forEach((r, i) => {
  if (!Array.isArray(r) || r.length !== 2 || !r.every((v) => typeof v === 'number' && Number.isFinite(v)))
    fail(`row ${i + 1}: expected [flow_m3s, head_m] numbers`);
  if ((r as number[])[0] < 0) fail(`row ${i + 1}: flow_m3s must not be negative`);
});
if (rows.length < 2) fail('a curve needs at least two rows');
printJson(fitPumpCurve(rows as [number, number][]));
