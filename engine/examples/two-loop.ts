import type { NetworkDocument } from '../network-document';
import { INCH_M } from '../units';

/**
 * The two-loop network of Alperovits & Shamir (1977), Water Resources Research 13(6):885–900, as
 * given in REFERENCES.md: inputs (V), pipe numbering (M), diameter options and costs per metre (V).
 * `twoLoopPrices` is its cost table in the sizing catalogue format (custom items, inches → metres);
 * the published least-cost design (M) 18, 10, 16, 4, 16, 10, 10, 1 in costs $419,000 (C).
 *
 * @example sizeNetwork(twoLoop(), parsePriceCatalogue(twoLoopPrices).candidates, { minPressure_m: 30, omega: 10.667 })
 */

const ELEVATION = [150, 160, 155, 150, 165, 160];
const DEMAND_M3H = [100, 100, 120, 270, 330, 200];
const PIPES: [number, number][] = [
  [1, 2],
  [2, 3],
  [2, 4],
  [4, 5],
  [4, 6],
  [6, 7],
  [3, 5],
  [7, 5],
];
/** Published least-cost diameters, in, pipes 1–8 (M). */
export const TWO_LOOP_LEAST_COST_IN = [18, 10, 16, 4, 16, 10, 10, 1];
/** Diameter (in) → cost ($/m) (V). */
export const TWO_LOOP_COST_PER_M: Record<number, number> = {
  1: 2,
  2: 5,
  3: 8,
  4: 11,
  6: 16,
  8: 23,
  10: 32,
  12: 50,
  14: 60,
  16: 90,
  18: 130,
  20: 170,
  22: 300,
  24: 550,
};

/** The network with the given diameters in inches (default: the published least-cost design). */
export function twoLoop(diameters_in: number[] = TWO_LOOP_LEAST_COST_IN): NetworkDocument {
  return {
    schema: 'runnel.network/1',
    headloss: 'hazen-williams',
    title: 'Two-loop network (Alperovits & Shamir 1977)',
    nodes: [
      { id: '1', kind: 'source', elevation_m: 210, head_m: 210 },
      ...ELEVATION.map((e, i) => ({ id: String(i + 2), kind: 'tee' as const, elevation_m: e, demand_m3s: DEMAND_M3H[i] / 3600 })),
    ],
    links: PIPES.map(([a, b], k) => ({
      id: `P${k + 1}`,
      kind: 'pipe' as const,
      from: String(a),
      to: String(b),
      length_m: 1000,
      diameter_m: diameters_in[k] * INCH_M,
      roughness: 130,
    })),
  };
}

/** The published cost table as a priced catalogue (the `--catalogue` JSON format). */
export const twoLoopPrices = {
  currency: 'USD',
  items: Object.entries(TWO_LOOP_COST_PER_M).map(([d, cost]) => ({ id: `${d}in`, label: `${d} in`, diameter_m: Number(d) * INCH_M, price_per_m: cost })),
};
