import { expect } from 'chai';
import { clearStructureCache, GradientSolver, GRADIENT_MEMORY } from '../../engine/gradient-solver';
import type { NetworkDocument, NetworkLink, NetworkNode } from '../../engine/network-document';
import { compileNetwork } from '../../engine/network-model';
import { solve, steadyState } from '../../engine/steady';
import { hwLoss } from './hand-formulas';

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
    // and the moved pipe carries the flow its new ends' head difference drives through it by the
    // Hazen-Williams law solved for Q by hand: Q = (Δh·C^1.852·D^4.8704 / (10.67·L))^(1/1.852) (REFERENCES.md, C)
    const dh = reused.nodes['J0_7'].head_m - reused.nodes['J7_0'].head_m;
    const q = Math.sign(dh) * ((Math.abs(dh) * 140 ** 1.852 * 0.08 ** 4.8704) / (10.67 * 40)) ** (1 / 1.852);
    expect(Math.abs(dh)).to.be.above(1e-3); // about 1.8 mm across the grid's diagonal
    expect(reused.links[b.links[5].id].flow_m3s).to.be.closeTo(q, 1e-3 * Math.abs(q));
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

  it('the gradient memory leaves the solution unchanged: every pipe of a looped grid obeys Hazen-Williams and every tee balances', () => {
    // The memory (GRADIENT_MEMORY) only shapes the Newton steps; the answer must still satisfy the
    // laws, worked here apart from the engine (hand-formulas.ts: 10.67·L·Q^1.852/(C^1.852·D^4.8704), REFERENCES.md).
    expect(GRADIENT_MEMORY).to.be.within(0, 1);
    const doc = grid(12, 9, (k) => [0.1, 0.05, 0.08, 0.065][k % 4]);
    const r = solve(doc);
    expect(r.converged).to.equal(true);
    const inflow = new Map<string, number>();
    let checked = 0;
    for (const link of doc.links) {
      if (link.kind !== 'pipe') continue;
      const q = r.links[link.id].flow_m3s;
      const drop = r.nodes[link.from].head_m - r.nodes[link.to].head_m;
      // 1e-6 m of head: the solver's own stopping test is on heads and flows to about that
      expect(drop, link.id).to.be.closeTo(hwLoss(q, link.length_m, link.diameter_m, 140), 1e-6);
      inflow.set(link.to, (inflow.get(link.to) ?? 0) + q);
      inflow.set(link.from, (inflow.get(link.from) ?? 0) - q);
      checked++;
    }
    expect(checked).to.equal(1 + 11 * 9 + 12 * 8);
    // 0.2 L/s drawn at each of the 108 tees: 21.6 L/s leave the source
    expect(r.links['M'].flow_m3s).to.be.closeTo(108 * 0.0002, 1e-12);
    for (const node of doc.nodes) if (node.kind === 'tee') expect(inflow.get(node.id), node.id).to.be.closeTo(0.0002, 1e-12);
  });
});
