import { demoPriceCatalogue } from '../engine/examples/demo-prices';
import { hillSmallholding } from '../engine/examples/hill-smallholding';
import { parsePriceCatalogue } from '../engine/sizing/price-catalogue';
import { sizeNetwork, type SizingResult } from '../engine/sizing/size-network';
import { runIfMain, type BenchCase } from './harness';

const candidates = parsePriceCatalogue(demoPriceCatalogue()).candidates;

/** Size every gravity pipe of the demo farm from the demo price list (exact tree DP + verifying solve). */
export const sizingDemo: BenchCase = {
  name: 'size the demo farm (19 pipes, 72 priced items)',
  detail: 'sizeNetwork(hillSmallholding, demo prices): exact DP + verifying solve',
  warmup: 3,
  repeats: 15,
  target_ms: 1000,
  check: (out) => {
    const r = out as SizingResult;
    if (!r.feasible || r.cost >= r.largestCost) throw new Error('demo sizing failed');
  },
  run: () => sizeNetwork(hillSmallholding, candidates, {}),
};

runIfMain(import.meta.url, sizingDemo);
