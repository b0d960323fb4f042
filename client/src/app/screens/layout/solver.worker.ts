/// <reference lib="webworker" />
/**
 * Live results: solves each document the Layout screen posts, off the main thread, so the canvas
 * never waits. Each solve starts from the last converged answer (engine LiveSolver: after an
 * edit a large looped network re-solves in a few Newton iterations; the answer is the one a cold
 * solve gives). Messages in: { seq, doc }, or { forget: true } when another project opens (its
 * first solve then starts cold); out: { seq, result, ms } or { seq, error, ms }.
 */
import { z } from 'zod';
import { LiveSolver } from '../../../../../engine/index';

// The page's CSP forbids eval: tell zod (the document schema) not to try compiling its checks.
z.config({ jitless: true });

const live = new LiveSolver();

addEventListener('message', (event: MessageEvent<{ seq: number; doc: unknown } | { forget: true }>) => {
  if ('forget' in event.data) {
    live.forget();
    return;
  }
  const { seq, doc } = event.data;
  const t0 = performance.now();
  try {
    const result = live.solve(doc);
    postMessage({ seq, result, ms: performance.now() - t0 });
  } catch (e) {
    postMessage({ seq, error: e instanceof Error ? e.message : String(e), ms: performance.now() - t0 });
  }
});
