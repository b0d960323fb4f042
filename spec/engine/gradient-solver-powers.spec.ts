import { expect } from 'chai';
import { GradientSolver } from '../../engine/gradient-solver';
import { hazenWilliamsSecant } from '../../engine/hazen-williams';
import { compileNetwork } from '../../engine/network-model';
import { steadyState } from '../../engine/steady';
import { loopedGrid } from '../../bench/looped-grid';

describe('the gradient solver’s Hazen-Williams powers (kept per pipe between iterations)', () => {
  it('equal r·|Q|^0.852 at the final flows to 1e-14 after a cold solve and after re-solves from it', () => {
    // reference: the law itself (engine/hazen-williams.ts), evaluated afresh at each pipe's final flow
    const model = compileNetwork(loopedGrid(40, 30));
    const solver = new GradientSolver(model);
    const check = (): void => {
      let worst = 0;
      for (let k = 0; k < model.linkCount; k++) {
        const a = Math.abs(solver.flow[k]);
        if (solver.secantFlow[k] !== a || a === 0) continue;
        const exact = hazenWilliamsSecant(model.resistance[k], a);
        worst = Math.max(worst, Math.abs(solver.secant[k] / exact - 1));
      }
      expect(worst).to.be.below(1e-14);
    };
    expect(solver.solve(steadyState(solver)).converged).to.equal(true);
    check();
    // twenty re-solves, each from the last answer with demands 0.01 % apart: the powers are carried
    // forward by the binomial series for most pipes, and must not drift
    for (let r = 1; r <= 20; r++) {
      const state = steadyState(solver);
      state.demandFactor.forEach((f, i) => (state.demandFactor[i] = f * (1 + 1e-4 * (r % 2 ? 1 : -1))));
      expect(solver.solve(state, { warmStart: true }).converged).to.equal(true);
    }
    check();
  });
});
