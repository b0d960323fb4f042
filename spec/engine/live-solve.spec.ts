import { expect } from 'chai';
import { hillSmallholding } from '../../engine/examples/hill-smallholding';
import { LiveSolver } from '../../engine/live-solve';
import type { NetworkDocument } from '../../engine/network-document';
import { solve, type SteadyResult } from '../../engine/steady';
import { loopedGrid } from '../../bench/looped-grid';

/**
 * The Layout's live re-solve (engine/live-solve.ts): every answer must be the one a cold solve of
 * the same document gives (the same equations hold to the same tolerances), an edit re-solves in
 * fewer Newton iterations, and a start that leads nowhere falls back to a cold solve. Behaviours of
 * the solver, compared with its own cold solve.
 */

const maxHeadGap = (a: SteadyResult, b: SteadyResult): number =>
  Math.max(...Object.keys(a.nodes).map((id) => Math.abs(a.nodes[id].head_m - b.nodes[id].head_m)));

describe('live re-solve from the last answer (engine/live-solve.ts)', () => {
  it('an edited looped grid: the cold answer to 1e-8 m, in under half the iterations of a cold solve', () => {
    const live = new LiveSolver();
    const doc = loopedGrid(20, 30);
    expect(live.solve(doc).converged).to.equal(true);
    const edited = structuredClone(doc) as NetworkDocument;
    for (const node of edited.nodes) if (node.kind === 'tee' && node.id.endsWith('_7')) node.demand_m3s *= 1.5;
    const warm = live.solve(edited);
    const cold = solve(edited);
    expect(warm.converged).to.equal(true);
    expect(maxHeadGap(cold, warm)).to.be.below(1e-8);
    expect(warm.iterations).to.be.below(cold.iterations / 2 + 0.5);
  });

  it('another network entirely: the cold answer, statuses included', () => {
    const live = new LiveSolver();
    live.solve(loopedGrid(10, 10));
    const r = live.solve(hillSmallholding);
    const cold = solve(hillSmallholding);
    expect(r.converged).to.equal(true);
    expect(maxHeadGap(cold, r)).to.be.below(1e-6);
    for (const id of Object.keys(cold.links)) expect(r.links[id].status, id).to.equal(cold.links[id].status);
  });

  it('an invalid document answers with its messages, and the next valid one still starts from the last answer', () => {
    const live = new LiveSolver();
    const doc = loopedGrid(10, 10);
    live.solve(doc);
    const bad = { ...doc, links: [{ ...doc.links[0], diameter_m: 0 }, ...doc.links.slice(1)] };
    const r = live.solve(bad);
    expect(r.converged).to.equal(false);
    expect(r.warnings[0].message).to.equal('H0_0.diameter_m: must be a positive number (got 0)');
    expect(live.solve(doc).iterations).to.equal(0); // the answer to doc itself, recognised as it stands
  });

  it('a start that does not converge within the cap falls back to a cold solve', () => {
    const live = new LiveSolver();
    live.solve(loopedGrid(10, 10));
    // one iteration is never enough for a cold grid: the warm try fails, the cold one too, and the answer is the cold one's
    const edited = structuredClone(loopedGrid(10, 10)) as NetworkDocument;
    for (const node of edited.nodes) if (node.kind === 'tee') node.demand_m3s *= 3;
    const r = live.solve(edited, { maxIterations: 1 });
    const cold = solve(edited, { maxIterations: 1 });
    expect(r.converged).to.equal(false);
    expect(r.iterations).to.equal(cold.iterations);
    expect(maxHeadGap(cold, r)).to.equal(0);
  });
});
