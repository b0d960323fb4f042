import { solve, type SteadyResult } from '../engine/steady';
import type { BenchCase } from './harness';
import { loopedGrid } from './looped-grid';

/** A full solve() of a looped grid nx × ny (built once, outside the timing). */
export function gridCase(nx: number, ny: number, target_ms?: number): BenchCase {
  const doc = loopedGrid(nx, ny);
  const n = nx * ny;
  return {
    name: `looped grid ${n.toLocaleString('en-US')} tees (${nx}×${ny})`,
    detail: `solve() of ${n} tees and ${doc.links.length} pipes`,
    warmup: n > 5000 ? 2 : 3,
    repeats: n > 5000 ? 9 : 15,
    target_ms,
    check: (out) => { if (!(out as SteadyResult).converged) throw new Error(`grid ${nx}×${ny} did not converge`); },
    run: () => solve(doc),
  };
}
