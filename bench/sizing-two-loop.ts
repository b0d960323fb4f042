import { twoLoop, twoLoopPrices } from '../engine/examples/two-loop';
import { parsePriceCatalogue } from '../engine/sizing/price-catalogue';
import { sizeNetwork, type SizingResult } from '../engine/sizing/size-network';
import { runIfMain, type BenchCase } from './harness';

const candidates = parsePriceCatalogue(twoLoopPrices).candidates;

/** Alperovits & Shamir two-loop network, 30 m minimum, ω = 10.667: heuristic local search. */
export const sizingTwoLoop: BenchCase = {
  name: 'size the two-loop network (8 pipes × 14 sizes)',
  detail: 'sizeNetwork(twoLoop, published costs, 30 m, ω 10.667): local search, 40,000-solve budget',
  warmup: 1,
  repeats: 5,
  target_ms: 5000,
  check: (out) => {
    const r = out as SizingResult;
    if (!r.feasible || r.cost > 419000) throw new Error(`two-loop sizing found ${r.cost}`);
  },
  run: () => sizeNetwork(twoLoop(), candidates, { minPressure_m: 30, omega: 10.667, velocityLimit_ms: 1e9 }),
};

runIfMain(import.meta.url, sizingTwoLoop);
