import { applyBudget, planBudget } from '../engine/budget';
import { hillSmallholding } from '../engine/examples/hill-smallholding';
import { hillSmallholdingBudget } from '../engine/examples/hill-smallholding-budget';
import { simulate } from '../engine/simulate';
import { timelineEvents, timelineSeries, type TimelineEvent } from '../engine/timeline';
import { runIfMain, type BenchCase } from './harness';

/**
 * What the Timeline's worker does for the demo farm's week at 1-minute steps: the network with the
 * demo budget's outlet flows, simulate (10,080 report steps), then the plotted series and events.
 * Target from the issue: ≤ 100 ms median.
 */
const doc = applyBudget(hillSmallholding, planBudget(hillSmallholdingBudget, hillSmallholding));

export const timelineWeek: BenchCase = {
  name: 'Timeline: demo farm with budget, 7 days, 60 s steps (simulate + series + events)',
  detail: 'simulate + timelineSeries + timelineEvents',
  warmup: 1,
  repeats: 5,
  target_ms: 100,
  check: (out) => {
    if ((out as { times: number }).times !== 7 * 1440 + 1) throw new Error('wrong number of steps');
  },
  run: () => {
    const sim = simulate(doc, { duration_s: 7 * 86400, step_s: 60 });
    const series = timelineSeries(doc, sim);
    const events: TimelineEvent[] = timelineEvents(doc, series);
    return { times: series.times_s.length, events: events.length };
  },
};

runIfMain(import.meta.url, timelineWeek);
