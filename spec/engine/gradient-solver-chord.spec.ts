import { expect } from 'chai';
import { factorStillServes, CHORD_LIMIT } from '../../engine/gradient-solver-chord';
import { GradientSolver } from '../../engine/gradient-solver';
import { compileNetwork } from '../../engine/network-model';
import type { NetworkDocument } from '../../engine/network-document';
import { SparseLdl } from '../../engine/sparse-ldl';
import { steadyState } from '../../engine/steady';
import { SupernodalCholesky } from '../../engine/supernodal-cholesky';
import { loopedGrid } from '../../bench/looped-grid';

describe('chord steps of the gradient solver (engine/gradient-solver-chord.ts)', () => {
  it('reuses a factorisation only while every entry stays within CHORD_LIMIT of its column’s diagonal', () => {
    const ldl = new SparseLdl(2, [[0, 1]]);
    const set = (v: number[]): void => {
      ldl.values[ldl.position(0, 0)] = v[0];
      ldl.values[ldl.position(1, 1)] = v[1];
      ldl.values[ldl.position(0, 1)] = ldl.values[ldl.position(1, 0)] = v[2];
    };
    set([10, 10, -5]);
    const last = Float64Array.from(ldl.values);
    const posDiag = Int32Array.from([ldl.position(0, 0), ldl.position(1, 1)]);
    set([10, 10, -5 + 0.9 * CHORD_LIMIT * 10]);
    expect(factorStillServes(last, ldl, posDiag)).to.equal(true);
    set([10, 10, -5 + 1.1 * CHORD_LIMIT * 10]);
    expect(factorStillServes(last, ldl, posDiag)).to.equal(false);
    set([10 - 1.1 * CHORD_LIMIT * 10, 10, -5]);
    expect(factorStillServes(last, ldl, posDiag)).to.equal(false);
  });

  it('a re-solve of a slightly changed state takes chord steps and lands on the answer a fresh solve gives', () => {
    // computed (C): the edited grid solved from scratch by a second solver is the reference
    const doc = loopedGrid(40, 30); // 1,200 unknowns: the supernodal factorisation, where chord steps apply
    const solver = new GradientSolver(compileNetwork(doc));
    expect(solver.solve(steadyState(solver)).converged).to.equal(true);
    // the same solver, every demand 0.1 % higher (as a simulation's next step would be)
    const state = steadyState(solver);
    state.demandFactor.forEach((f, i) => (state.demandFactor[i] = f * 1.001));
    let factorisations = 0;
    const factor = SupernodalCholesky.prototype.factor;
    SupernodalCholesky.prototype.factor = function (this: SupernodalCholesky): number {
      factorisations++;
      return factor.call(this);
    };
    let outcome;
    try {
      outcome = solver.solve(state, { warmStart: true });
    } finally {
      SupernodalCholesky.prototype.factor = factor;
    }
    expect(outcome.converged, outcome.reason ?? '').to.equal(true);
    expect(factorisations, `factorisations in ${outcome.iterations} iterations`).to.be.below(outcome.iterations);
    const edited = structuredClone(doc) as NetworkDocument;
    for (const node of edited.nodes) if (node.kind === 'tee') node.demand_m3s *= 1.001;
    const model = compileNetwork(edited);
    const fresh = new GradientSolver(model);
    expect(fresh.solve(steadyState(fresh)).converged).to.equal(true);
    for (let i = 0; i < model.nodeCount; i++) expect(solver.head[i]).to.be.closeTo(fresh.head[i], 1e-8);
    for (let k = 0; k < model.linkCount; k++) expect(solver.flow[k]).to.be.closeTo(fresh.flow[k], 1e-9 + 1e-6 * Math.abs(fresh.flow[k]));
  });
});
