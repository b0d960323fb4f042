import { steadyChecks } from '../engine/checks';
import { MAX_ELEMENTS } from '../engine/bounds';
import { clearStructureCache, GradientSolver } from '../engine/gradient-solver';
import { compileNetwork } from '../engine/network-model';
import { collectResult, solve, steadyState, type SteadyResult } from '../engine/steady';
import type { BenchCase } from './harness';
import { loopedGrid } from './looped-grid';

/**
 * A full solve() of a looped grid nx × ny (built once, outside the timing). Repeated solves of one
 * layout share its ordering (the solver caches it by topology, as when the browser re-solves after
 * each edit of a size or demand); `cold` clears that cache before every run, timing a first solve.
 *
 * Grids over the document bound (MAX_ELEMENTS nodes or links: the 20,000-tee grids) cannot pass
 * solve()'s door, so they, and any case asked for with `inside`, time everything solve() does
 * after validation: compile, solver set-up, Newton, results and checks. Ratios between sizes
 * compare cases timed the same way.
 */
export function gridCase(nx: number, ny: number, target_ms?: number, cold = false, inside = false): BenchCase {
  const doc = loopedGrid(nx, ny);
  const n = nx * ny;
  const withinBounds = doc.nodes.length <= MAX_ELEMENTS && doc.links.length <= MAX_ELEMENTS;
  const door = withinBounds && !inside;
  const solveInside = (): SteadyResult => {
    const model = compileNetwork(doc);
    const solver = new GradientSolver(model);
    const outcome = solver.solve(steadyState(solver));
    const { nodes, links } = collectResult(model, solver);
    const warnings = steadyChecks(model, {
      head: solver.head,
      flow: solver.flow,
      demand: solver.demand,
      requested: solver.requested,
      active: solver.active,
      level: new Float64Array(model.nodeCount),
      closed: new Uint8Array(model.linkCount),
    });
    return { converged: outcome.converged, iterations: outcome.iterations, nodes, links, warnings };
  };
  return {
    name: `looped grid ${n.toLocaleString('en-US')} tees (${nx}×${ny})${cold ? ', first solve' : ''}${door ? '' : ', no validation'}`,
    detail: `${door ? 'solve()' : 'compile + Newton + results + checks'} of ${n} tees and ${doc.links.length} pipes${cold ? ', ordering included' : ''}`,
    warmup: n > 5000 ? 2 : 3,
    repeats: n > 5000 ? 9 : 15,
    target_ms,
    check: (out) => {
      if (!(out as SteadyResult).converged) throw new Error(`grid ${nx}×${ny} did not converge`);
    },
    run: () => {
      if (cold) clearStructureCache();
      return door ? solve(doc) : solveInside();
    },
  };
}
