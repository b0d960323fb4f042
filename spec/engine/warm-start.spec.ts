import { expect } from 'chai';
import { hillSmallholding } from '../../engine/examples/hill-smallholding';
import type { NetworkDocument } from '../../engine/network-document';
import { solve, type SteadyResult } from '../../engine/steady';
import { loopedGrid } from '../../bench/looped-grid';

/**
 * Warm starts (solve(doc, { start })): re-solving an edited network from the previous answer must
 * give the answer a cold start gives (the same equations hold to the same tolerances), in fewer
 * Newton iterations. Behaviours of the solver, compared with its own cold solve.
 */

const maxHeadGap = (a: SteadyResult, b: SteadyResult): number =>
  Math.max(...Object.keys(a.nodes).map((id) => Math.abs(a.nodes[id].head_m - b.nodes[id].head_m)));

describe('warm start from a previous answer (steady.ts, start option)', () => {
  it('a looped grid with every demand 10 % higher: same heads as a cold solve to 1e-8 m, in under half the iterations', () => {
    const doc = loopedGrid(20, 30);
    const before = solve(doc);
    const edited = structuredClone(doc) as NetworkDocument;
    for (const node of edited.nodes) if (node.kind === 'tee') node.demand_m3s *= 1.1;
    const cold = solve(edited);
    const warm = solve(edited, { start: before });
    expect(cold.converged).to.equal(true);
    expect(warm.converged).to.equal(true);
    expect(maxHeadGap(cold, warm)).to.be.below(1e-8);
    expect(warm.iterations).to.be.below(cold.iterations / 2 + 0.5);
  });

  it('the answer itself as the start is recognised without a factorisation (0 iterations)', () => {
    const r = solve(hillSmallholding);
    const again = solve(hillSmallholding, { start: r });
    expect(again.converged).to.equal(true);
    expect(again.iterations).to.equal(0);
    expect(maxHeadGap(r, again)).to.be.below(1e-12);
  });

  it('a start from another layout (ids missing or extra) still reaches the cold answer, valves and all', () => {
    const r = solve(hillSmallholding);
    const trimmed: SteadyResult = {
      ...r,
      nodes: Object.fromEntries(Object.entries(r.nodes).slice(0, 10)),
      links: { ...r.links, GHOST: { flow_m3s: 1, velocity_ms: 0, headloss_m: 0, status: 'open' } },
    };
    const edited = structuredClone(hillSmallholding) as NetworkDocument;
    for (const node of edited.nodes) if (node.kind === 'outlet') node.demand_m3s *= 0.8;
    const cold = solve(edited);
    const warm = solve(edited, { start: trimmed });
    expect(warm.converged).to.equal(true);
    expect(maxHeadGap(cold, warm)).to.be.below(1e-6);
    for (const id of Object.keys(cold.links)) expect(warm.links[id].status, id).to.equal(cold.links[id].status);
  });
});
