/**
 * Diagnostic (not part of run-all): where the time of one solve() of the 10,000-tee long grid goes,
 * phase by phase, best of six runs. Run with `npx tsx bench/breakdown.ts` (NY=500 for the 20,000-tee grid).
 */
import { steadyChecks } from '../engine/checks';
import { clearStructureCache, GradientSolver } from '../engine/gradient-solver';
import { compileNetwork } from '../engine/network-model';
import { collectResult, steadyState } from '../engine/steady';
import { validateDocument } from '../engine/validate';
import { loopedGrid } from './looped-grid';

const doc = loopedGrid(40, Number(process.env.NY ?? 250));
const best: Record<string, number> = {};
const time = <X>(phase: string, f: () => X): X => {
  const t0 = performance.now();
  const r = f();
  best[phase] = Math.min(best[phase] ?? Infinity, performance.now() - t0);
  return r;
};
let iterations = 0;
for (let rep = 0; rep < 6; rep++) {
  time('validate', () => validateDocument(doc));
  const model = time('compile', () => compileNetwork(doc));
  clearStructureCache();
  time('order + symbolic (first solve)', () => new GradientSolver(model));
  const solver = time('solver setup (layout cached)', () => new GradientSolver(model));
  const state = steadyState(solver);
  iterations = time('Newton iterations', () => solver.solve(state)).iterations;
  time('results', () => collectResult(model, solver));
  time('checks', () =>
    steadyChecks(model, {
      head: solver.head,
      flow: solver.flow,
      demand: solver.demand,
      requested: solver.requested,
      active: solver.active,
      level: new Float64Array(model.nodeCount),
      closed: new Uint8Array(model.linkCount),
    }),
  );
}
console.log(
  Object.entries(best)
    .map(([k, v]) => `${k} ${v.toFixed(1)} ms`)
    .join(' | '),
  `| ${iterations} iterations`,
);
