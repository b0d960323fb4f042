import { loopedGrid } from './looped-grid';
import { compileNetwork } from '../engine/network-model';
import { GradientSolver } from '../engine/gradient-solver';
for (const [nx, ny] of [[40, 250], [40, 500], [100, 100], [141, 142]]) {
  const m = compileNetwork(loopedGrid(nx, ny)); let best = 1e9; let s: any;
  for (let r = 0; r < 5; r++) { const t0 = performance.now(); s = new GradientSolver(m); best = Math.min(best, performance.now() - t0); }
  const ldl = s.ldl; let flops = 0; for (let j = 0; j < ldl.n; j++) { const c = ldl.lp[j + 1] - ldl.lp[j]; flops += c * c; }
  const ch = s.chol; for (let j = 0; j < ldl.n; j++) ldl.values[ldl.position(j, j)] += 1;
  let tf = 1e9; for (let r = 0; r < 5; r++) { const t0 = performance.now(); ch.factor(); tf = Math.min(tf, performance.now() - t0); }
  console.log(`${nx}x${ny}`, 'nnzL', ldl.factorNonZeros, 'flops', (flops / 1e6).toFixed(1), 'M ctor', best.toFixed(1), 'factor', tf.toFixed(1));
}
