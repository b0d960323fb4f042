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
 * When python3 with SciPy is on the machine, each round also times one `scipy.sparse.linalg.splu`
 * factor + solve of the same matrix (default options: COLAMD ordering, SuperLU; ordering included,
 * as a one-off sparse solve does) in a child process, the reference the goal was set
 * against; its per-round ratios are printed in a second column.
 * Run with `npx tsx bench/factorisation-ratio.ts` (also part of `npm run bench`).
 */
import { spawnSync } from 'node:child_process';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
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
    'factor + solve (one)': () => {
      inner.ldl.values.set(saved);
      inner.chol.factor();
      inner.chol.solve(rhs, x);
      return 0;
    },
    'Newton, cold start': () => solver.solve(steadyState(solver)).iterations,
    'Newton, warm start': () => {
      const s = steadyState(solver);
      solver.setStart(warmHead, warmFlow, s);
      return solver.solve(s, { warmStart: true }).iterations;
    },
    'solve(), cold start': () => solve(doc).iterations,
    'solve(), warm start': () => solve(doc, { start: previous }).iterations,
  };
  const names = Object.keys(cases);
  const matrixFile = join(mkdtempSync(join(tmpdir(), 'runnel-bench-')), 'newton-matrix.json');
  writeFileSync(
    matrixFile,
    JSON.stringify({ n: inner.ldl.n, colPtr: Array.from(inner.ldl.colPtr), rowIdx: Array.from(inner.ldl.rowIdx), values: Array.from(saved) }),
  );
  const superlu = (): number => {
    // three factor + solve in one child, the median in ms (NaN without python3 and SciPy)
    const script = `import json, time, numpy as np, scipy.sparse as sp, scipy.sparse.linalg as sla
d = json.load(open(${JSON.stringify(matrixFile)}))
A = sp.csc_matrix((np.array(d['values']), np.array(d['rowIdx']), np.array(d['colPtr'])), shape=(d['n'], d['n']))
b = np.ones(d['n']); ts = []
for r in range(3):
  t0 = time.perf_counter(); x = sla.splu(A).solve(b); ts.append(time.perf_counter() - t0)
print(sorted(ts)[1] * 1000)`;
    const out = spawnSync('python3', ['-c', script], { encoding: 'utf8' });
    return out.status === 0 ? Number(out.stdout.trim()) : Number.NaN;
  };
  const scipy: number[] = [];
  const times: Record<string, number[]> = Object.fromEntries(names.map((n) => [n, []]));
  const iterations: Record<string, number> = {};
  for (const n of names) iterations[n] = cases[n](); // warm-up
  for (let r = 0; r < rounds; r++) {
    for (const n of names) {
      const t0 = performance.now();
      cases[n]();
      times[n].push(performance.now() - t0);
    }
    scipy.push(superlu());
  }
  const withScipy = scipy.every(Number.isFinite);
  const median = (v: number[]): number => {
    const s = [...v].sort((a, b) => a - b);
    return s.length % 2 ? s[s.length >> 1] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
  };
  const base = times[names[0]];
  const lines = [
    `10,000-tee grid (40×250) against one factorisation, ${rounds} interleaved rounds`,
    `case | median ms | Newton iterations | ratio to one factor + solve (median of rounds)${withScipy ? ' | ratio to one SciPy splu factor + solve' : ''}`,
    `--- | --- | --- | ---${withScipy ? ' | ---' : ''}`,
  ];
  for (const n of names) {
    const ratio = median(times[n].map((t, i) => t / base[i]));
    const toScipy = withScipy ? ` | ${median(times[n].map((t, i) => t / scipy[i])).toFixed(2)}` : '';
    lines.push(`${n} | ${median(times[n]).toFixed(1)} | ${n.startsWith('factor') ? '–' : iterations[n]} | ${ratio.toFixed(1)}${toScipy}`);
  }
  if (withScipy)
    lines.push(
      `SciPy splu factor + solve (child process, same rounds) | ${median(scipy).toFixed(1)} | – | ${median(scipy.map((t, i) => t / base[i])).toFixed(1)} | 1.00`,
    );
  else lines.push('(python3 with SciPy not found: no SciPy column)');
  return lines.join('\n');
}

runIfMainScript(import.meta.url, () => console.log(factorisationRatio()));
