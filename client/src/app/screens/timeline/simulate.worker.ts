/// <reference lib="webworker" />
/**
 * The Timeline's solver worker: runs the engine's extended-period simulation off the main
 * thread, then derives the plotted series, the events and each tank bank's equalisation time.
 * In: { doc, duration_s, step_s }. Out: { stage }, { progress } (fraction of the simulated time, at
 * most about a hundred messages), then { result } or { error }. Cancel = the page terminates the
 * worker (the simulation is one synchronous call, so stopping the thread is the only way to stop it).
 */
import { simulate } from '../../../../../engine/simulate';
import { bankEqualisation, timelineEvents, timelineSeries } from '../../../../../engine/timeline';
import type { NetworkDocument } from '../../../../../engine/network-document';

addEventListener('message', (event: MessageEvent<{ doc: NetworkDocument; duration_s: number; step_s: number }>) => {
  const { doc, duration_s, step_s } = event.data;
  const t0 = performance.now();
  try {
    postMessage({ stage: 'simulating' });
    const sim = simulate(doc, { duration_s, step_s, onProgress: (progress) => postMessage({ progress }) });
    const simMs = performance.now() - t0;
    if (sim.times_s.length === 0) {
      postMessage({ error: sim.warnings.map((w) => w.message).join('; ') || 'The simulation produced nothing' });
      return;
    }
    postMessage({ stage: 'events' });
    const series = timelineSeries(doc, sim);
    const events = timelineEvents(doc, series);
    const banks = bankEqualisation(doc, sim);
    postMessage({ result: { series, events, banks, warnings: sim.warnings, summary: sim.summary, simMs, ms: performance.now() - t0 } });
  } catch (e) {
    postMessage({ error: e instanceof Error ? e.message : String(e) });
  }
});
