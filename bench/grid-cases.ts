import { clearStructureCache } from '../engine/gradient-solver';
import { solve, type SteadyResult } from '../engine/steady';
import type { BenchCase } from './harness';
import { loopedGrid } from './looped-grid';

/**
 * A full solve() of a looped grid nx × ny (built once, outside the timing). Repeated solves of one
 * layout share its ordering (the solver caches it by topology, as when the browser re-solves after
 * each edit of a size or demand); `cold` clears that cache before every run, timing a first solve.
 */
export function gridCase(nx: number, ny: number, target_ms?: number, cold = false): BenchCase {
  const doc = loopedGrid(nx, ny);
  const n = nx * ny;
  return {
    name: `looped grid ${n.toLocaleString('en-US')} tees (${nx}×${ny})${cold ? ', first solve' : ''}`,
    detail: `solve() of ${n} tees and ${doc.links.length} pipes${cold ? ', ordering included' : ''}`,
    warmup: n > 5000 ? 2 : 3,
    repeats: n > 5000 ? 9 : 15,
    target_ms,
    check: (out) => { if (!(out as SteadyResult).converged) throw new Error(`grid ${nx}×${ny} did not converge`); },
    run: () => { if (cold) clearStructureCache(); return solve(doc); },
  };
}
