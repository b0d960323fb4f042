/// <reference lib="webworker" />
/**
 * Live results: solves each document the Layout screen posts, off the main thread, so the canvas
 * never waits. Messages in: { seq, doc }; out: { seq, result, ms } or { seq, error, ms }.
 */
import { z } from 'zod';
import { solve } from '../../../../../engine/index';

// The page's CSP forbids eval: tell zod (the document schema) not to try compiling its checks.
z.config({ jitless: true });

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
