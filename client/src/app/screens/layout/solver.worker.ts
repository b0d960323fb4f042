/// <reference lib="webworker" />
/**
 * Live results: solves each document the Layout screen posts, off the main thread, so the canvas
 * never waits. Messages in: { seq, doc }; out: { seq, result, ms } or { seq, error, ms }.
 */
import { solve } from '../../../../../engine/index';

addEventListener('message', (event: MessageEvent<{ seq: number; doc: unknown }>) => {
  const { seq, doc } = event.data;
  const t0 = performance.now();
  try {
    const result = solve(doc);
    postMessage({ seq, result, ms: performance.now() - t0 });
  } catch (e) {
    postMessage({ seq, error: e instanceof Error ? e.message : String(e), ms: performance.now() - t0 });
  }
});
