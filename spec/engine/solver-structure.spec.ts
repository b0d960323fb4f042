import { expect } from 'chai';
import { clearStructureCache, GradientSolver, GRADIENT_MEMORY } from '../../engine/gradient-solver';
import type { NetworkDocument, NetworkLink, NetworkNode } from '../../engine/network-document';
import { compileNetwork } from '../../engine/network-model';
import { solve, steadyState } from '../../engine/steady';

/**
 * The solver shares each layout's ordering and symbolic factorisation between solves
 * (gradient-solver.ts, structureFor). These are identities (C, computed): a solve that reuses a
 * layout must give exactly what a first solve of the same document gives, and solvers alive at
 * the same time on one layout must not disturb each other.
 */

/** A looped grid nx × ny fed from one corner, pipe diameters from `sizes` (the layout is fixed). */
function grid(nx: number, ny: number, sizes: (k: number) => number, sourceHead = 60): NetworkDocument {
  const nodes: NetworkNode[] = [{ id: 'S', kind: 'source', elevation_m: sourceHead, head_m: sourceHead }];
  const links: NetworkLink[] = [];
  for (let y = 0; y < ny; y++) for (let x = 0; x < nx; x++) nodes.push({ id: `J${x}_${y}`, kind: 'tee', elevation_m: (x * 7 + y * 3) % 5, demand_m3s: 0.0002 });
  const pipe = (id: string, from: string, to: string): void => {
    links.push({ id, kind: 'pipe', from, to, length_m: 40, diameter_m: sizes(links.length), roughness: 140 });
  };
  pipe('M', 'S', 'J0_0');
  for (let y = 0; y < ny; y++)
    for (let x = 0; x < nx; x++) {
      if (x + 1 < nx) pipe(`H${x}_${y}`, `J${x}_${y}`, `J${x + 1}_${y}`);
      if (y + 1 < ny) pipe(`V${x}_${y}`, `J${x}_${y}`, `J${x}_${y + 1}`);
    }
  return { schema: 'runnel.network/1', headloss: 'hazen-williams', nodes, links };
}

const heads = (r: ReturnType<typeof solve>): number[] => Object.values(r.nodes).map((n) => n.head_m);

describe('solver structure shared by layout (gradient-solver.ts)', () => {
  beforeEach(() => clearStructureCache());

  it('a second document with the same layout and other pipe sizes solves exactly as a first solve does (small and supernodal sizes)', () => {
    for (const [nx, ny] of [
      [6, 5],
      [40, 30],
    ]) {
      const a = grid(nx, ny, (k) => [0.1, 0.08, 0.065][k % 3]);
      const b = grid(nx, ny, (k) => [0.05, 0.1, 0.08][k % 3]);
      solve(a); // the layout is now cached
      const reused = solve(b);
      clearStructureCache();
      const first = solve(b);
      expect(reused.converged).to.equal(true);
      expect(reused.iterations).to.equal(first.iterations);
      expect(heads(reused)).to.deep.equal(heads(first));
    }
  });

  it('a different layout with the same counts is not mistaken for a cached one', () => {
    const a = grid(8, 8, () => 0.08);
    const b = grid(8, 8, () => 0.08);
    // same numbers of nodes and links, one pipe moved to other ends
    b.links[5] = { ...(b.links[5] as NetworkLink & { kind: 'pipe' }), from: 'J0_7', to: 'J7_0' };
    solve(a);
    const reused = solve(b);
    clearStructureCache();
    const first = solve(b);
    expect(heads(reused)).to.deep.equal(heads(first));
    // and the moved pipe carries flow between its new ends
    expect(Math.abs(reused.links[b.links[5].id].flow_m3s)).to.be.above(0);
  });

  it('two solvers alive on one layout keep their own factorisations', () => {
    const a = grid(40, 30, () => 0.1);
    const b = grid(40, 30, () => 0.05, 45);
    const sa = new GradientSolver(compileNetwork(a));
    const sb = new GradientSolver(compileNetwork(b));
    expect(sa.solve(steadyState(sa)).converged).to.equal(true);
    const headA = Float64Array.from(sa.head);
    expect(sb.solve(steadyState(sb)).converged).to.equal(true);
    const headB = Float64Array.from(sb.head);
    // solving either again, in any order, repeats its own answer exactly
    sa.solve(steadyState(sa));
    sb.solve(steadyState(sb));
    expect(Array.from(sa.head)).to.deep.equal(Array.from(headA));
    expect(Array.from(sb.head)).to.deep.equal(Array.from(headB));
    expect(Array.from(headB)).to.not.deep.equal(Array.from(headA));
  });

  it('the gradient memory only acts on a collapse of more than 4× in one step (1.852-power law)', () => {
    // the Newton step towards zero flow leaves (1 − 1/1.852) of the flow; its gradient then falls by
    // that ratio to the power 0.852, which must stay above GRADIENT_MEMORY so such links keep Newton's step
    expect((1 - 1 / 1.852) ** 0.852).to.be.above(GRADIENT_MEMORY);
    expect(0.24 ** 0.852).to.be.below(GRADIENT_MEMORY);
  });
});
