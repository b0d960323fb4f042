import { loopedGrid } from './looped-grid';
import { validateDocument } from '../engine/validate';
import { compileNetwork } from '../engine/network-model';
import { GradientSolver } from '../engine/gradient-solver';
import { steadyState, collectResult } from '../engine/steady';
import { steadyChecks } from '../engine/checks';
const d = loopedGrid(40, 250);
const best: Record<string, number> = {};
for (let rep = 0; rep < 6; rep++) {
  const time = <X>(k: string, f: () => X): X => { const t0 = performance.now(); const r = f(); best[k] = Math.min(best[k] ?? 1e9, performance.now() - t0); return r; };
  time('validate', () => validateDocument(d)); const m = time('compile', () => compileNetwork(d)); const s = time('ctor', () => new GradientSolver(m));
  const st = time('state', () => steadyState(s)); const o = time('solve', () => s.solve(st)); time('collect', () => collectResult(m, s));
  time('checks', () => steadyChecks(m, { head: s.head, flow: s.flow, demand: s.demand, requested: s.requested, active: s.active, level: new Float64Array(m.nodeCount), closed: new Uint8Array(m.linkCount) }));
  const ch = (s as any).chol; time('factor', () => ch.factor()); best.iterations = o.iterations;
}
console.log(Object.entries(best).map(([k, v]) => `${k} ${v.toFixed(1)}`).join(' | ')); 
