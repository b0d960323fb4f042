import { hillSmallholding } from '../engine/examples/hill-smallholding';
import { whatIfs, type WhatIfTable } from '../engine/review/what-ifs';
import { runIfMain, type BenchCase } from './harness';

/**
 * The demo farm's full single-failure set: every pipe broken and every valve stuck shut (one shared
 * solver, only closed flags change), every tank out, and the fill pump off for 1, 2 and 3 days
 * (six hourly-step simulations). The Review tab runs the same call in the browser worker.
 */
export const reviewWhatIfs: BenchCase = {
  name: 'demo farm what-ifs (every single failure)',
  detail: 'whatIfs(hillSmallholding): each pipe, valve, tank + fill off 1/2/3 days',
  warmup: 5,
  repeats: 40,
  target_ms: 200,
  check: (out) => {
    if ((out as WhatIfTable).results.length < 30) throw new Error('what-ifs: too few scenarios');
  },
  run: () => whatIfs(hillSmallholding),
};

runIfMain(import.meta.url, reviewWhatIfs);
