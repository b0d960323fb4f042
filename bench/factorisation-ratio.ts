/**
 * The speed goal of the engine issue, side by side: a steady solve of the 10,000-tee long grid
 * (40 × 250) against ONE sparse factorisation + triangular solve of that grid's Newton matrix (the
 * engine's own supernodal Cholesky, ./engine/supernodal-cholesky). Nine interleaved rounds, each
 * timing every case once, so all see the same machine load; medians and the median of the
 * per-round ratios are printed. Cases:
 * - factor + solve: one numeric factorisation and solve (ordering cached);
 * - Newton, cold: GradientSolver.solve from the cold start (layout cached);
 * - Newton, warm: from the answer to the grid with every demand 10 % lower (a what-if edit);
 * - solve(), cold / warm: the whole API call (validation, compile, Newton, results, checks).
 * Run with `npx tsx bench/factorisation-ratio.ts` (also part of `npm run bench`).
 */
import { GradientSolver } from '../engine/gradient-solver';
import { compileNetwork } from '../engine/network-model';
import { solve, steadyState } from '../engine/steady';
import type { NetworkDocument } from '../engine/network-document';
import type { SparseLdl } from '../engine/sparse-ldl';
import type { SupernodalCholesky } from '../engine/supernodal-cholesky';
import { loopedGrid } from './looped-grid';
import { runIfMainScript } from './harness';

export function factorisationRatio(rounds = 9): string {
  const doc = loopedGrid(40, 250);
  const lighter = structuredClone(doc) as NetworkDocument;
  for (const node of lighter.nodes) if (node.kind === 'tee') node.demand_m3s *= 0.9;
  const previous = solve(lighter);
  const model = compileNetwork(doc);
  const solver = new GradientSolver(model);
  const state = steadyState(solver);
  solver.solve(state);
  // the solver's own factorisation objects, holding the last Newton matrix
  const inner = solver as unknown as { ldl: SparseLdl; chol: SupernodalCholesky };
  const rhs = new Float64Array(inner.ldl.n).fill(1);
  const x = new Float64Array(inner.ldl.n);
  const saved = Float64Array.from(inner.ldl.values);
  const warmModel = compileNetwork(lighter);
  const warmSolver = new GradientSolver(warmModel);
  warmSolver.solve(steadyState(warmSolver));
  const warmHead = Float64Array.from(warmSolver.head);
  const warmFlow = Float64Array.from(warmSolver.flow);
  const cases: Record<string, () => number> = {
    'factor + solve (one)': () => { inner.ldl.values.set(saved); inner.chol.factor(); inner.chol.solve(rhs, x); return 0; },
    'Newton, cold start': () => solver.solve(steadyState(solver)).iterations,
    'Newton, warm start': () => { const s = steadyState(solver); solver.setStart(warmHead, warmFlow, s); return solver.solve(s, { warmStart: true }).iterations; },
    'solve(), cold start': () => solve(doc).iterations,
    'solve(), warm start': () => solve(doc, { start: previous }).iterations,
  };
  const names = Object.keys(cases);
  const times: Record<string, number[]> = Object.fromEntries(names.map((n) => [n, []]));
  const iterations: Record<string, number> = {};
  for (const n of names) iterations[n] = cases[n](); // warm-up
  for (let r = 0; r < rounds; r++) for (const n of names) { const t0 = performance.now(); cases[n](); times[n].push(performance.now() - t0); }
  const median = (v: number[]): number => { const s = [...v].sort((a, b) => a - b); return s.length % 2 ? s[s.length >> 1] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2; };
  const base = times[names[0]];
  const lines = [`10,000-tee grid (40×250) against one factorisation, ${rounds} interleaved rounds`, 'case | median ms | Newton iterations | ratio to one factor + solve (median of rounds)', '--- | --- | --- | ---'];
  for (const n of names) {
    const ratio = median(times[n].map((t, i) => t / base[i]));
    lines.push(`${n} | ${median(times[n]).toFixed(1)} | ${n.startsWith('factor') ? '–' : iterations[n]} | ${ratio.toFixed(1)}`);
  }
  return lines.join('\n');
}

runIfMainScript(import.meta.url, () => console.log(factorisationRatio()));
