import { hillSmallholding } from '../engine/examples/hill-smallholding';
import { solve, type SteadyResult } from '../engine/steady';
import { runIfMain, type BenchCase } from './harness';

/** The demo farm (55 elements), full public solve(): validation, compile, ordering, Newton, checks. */
export const demoSteady: BenchCase = {
  name: 'demo farm steady solve',
  detail: 'solve(hillSmallholding): validate + compile + order + Newton + checks',
  warmup: 300,
  repeats: 2000,
  target_ms: 0.5,
  check: (out) => {
    if (!(out as SteadyResult).converged) throw new Error('demo did not converge');
  },
  run: () => solve(hillSmallholding),
};

runIfMain(import.meta.url, demoSteady);
