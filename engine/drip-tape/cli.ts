/**
 * A drip zone's flow from its tape: `npm run -s drip-tape -- zone.json` where zone.json is
 * { rows, row_length_m, spacing_m, emitter_flow_m3s } or { rows, row_length_m, flow_per_m_m3s }
 * (or an array of them). Prints the result(s) as JSON; exit 2 with a message naming the row and field.
 */
import { fail, printJson, readJson } from '../cli-io';
import { dripTapeFlow, dripTapeProblem, type DripTapeInput } from './tape';

const file = process.argv[2];
if (!file) fail('usage: drip-tape <zone.json>   ({ rows, row_length_m, spacing_m, emitter_flow_m3s } or { rows, row_length_m, flow_per_m_m3s })');
const data = readJson(file);
const many = Array.isArray(data);
const zones = (many ? data : [data]) as unknown[];
const out = zones.map((z, i) => {
  if (!z || typeof z !== 'object' || Array.isArray(z)) fail(`row ${i + 1}: expected an object`);
  const problem = dripTapeProblem(z as DripTapeInput);
  if (problem) fail(`row ${i + 1}: ${problem}`);
  return dripTapeFlow(z as DripTapeInput);
});
printJson(many ? out : out[0]);
