import { hillSmallholding } from '../engine/examples/hill-smallholding';
import { simulate, type TimeSeriesResult } from '../engine/simulate';
import { runIfMain, type BenchCase } from './harness';

/** Seven days of the demo farm at 60 s report steps (10,080 implicit steps plus event cuts). */
export const farmWeek: BenchCase = {
  name: 'demo farm 7-day simulation, 60 s steps',
  detail: 'simulate(hillSmallholding, 7 d, 60 s)',
  warmup: 1,
  repeats: 5,
  target_ms: 1000,
  check: (out) => {
    if ((out as TimeSeriesResult).times_s.length !== 7 * 1440 + 1) throw new Error('wrong number of steps');
  },
  run: () => simulate(hillSmallholding, { duration_s: 7 * 86400, step_s: 60 }),
};

runIfMain(import.meta.url, farmWeek);
