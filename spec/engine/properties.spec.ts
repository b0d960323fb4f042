import { expect } from 'chai';
import fc from 'fast-check';
import { darcyWeisbachHeadloss } from '../../engine/darcy-weisbach';
import { hazenWilliamsHeadloss } from '../../engine/hazen-williams';
import { minorLossCoefficient } from '../../engine/minor-loss';
import type { NetworkDocument, PipeLink } from '../../engine/network-document';
import { solve } from '../../engine/steady';

/**
 * Property tests (fast-check) on random looped and branched networks. The identities checked are
 * the ones that define a steady solution (Todini & Pilati 1988):
 * - continuity: at every tee, inflow − outflow − demand = 0;
 * - energy: around every loop (fundamental cycles of a spanning tree) the headlosses computed from
 *   the reported flows by the headloss law itself sum to zero, and on paths between two fixed heads
 *   they sum to the head difference.
 */

interface Spec {
  nodes: number;
  extra: [number, number][];
  parents: number[];
  elev: number[];
  demand: number[];
  diam: number[];
  len: number[];
  sources: number;
  dw: boolean;
  minor: number[];
}

const specArb = fc.integer({ min: 2, max: 40 }).chain((n) =>
  fc.record({
    nodes: fc.constant(n),
    parents: fc.array(fc.nat(), { minLength: n - 1, maxLength: n - 1 }),
    extra: fc.array(fc.tuple(fc.nat(n - 1), fc.nat(n - 1)), { maxLength: Math.min(12, n) }),
    elev: fc.array(fc.double({ min: 0, max: 40, noNaN: true }), { minLength: n, maxLength: n }),
    demand: fc.array(fc.double({ min: 0, max: 0.002, noNaN: true }), { minLength: n, maxLength: n }),
    diam: fc.array(fc.constantFrom(0.0158, 0.0209, 0.0266, 0.0351, 0.0409, 0.0525, 0.0779, 0.1023), { minLength: n - 1 + 12, maxLength: n - 1 + 12 }),
    len: fc.array(fc.double({ min: 1, max: 400, noNaN: true }), { minLength: n - 1 + 12, maxLength: n - 1 + 12 }),
    minor: fc.array(fc.constantFrom(0, 0, 0.5, 2), { minLength: n - 1 + 12, maxLength: n - 1 + 12 }),
    sources: fc.integer({ min: 1, max: 2 }),
    dw: fc.boolean(),
  }),
);

function build(s: Spec): NetworkDocument {
  const nodes: NetworkDocument['nodes'] = [];
  for (let i = 0; i < s.nodes; i++) {
    if (i < s.sources) nodes.push({ id: `N${i}`, kind: 'source', elevation_m: 60 + 5 * i, head_m: 60 + 5 * i });
    else nodes.push({ id: `N${i}`, kind: 'tee', elevation_m: s.elev[i], demand_m3s: s.demand[i] });
  }
  const links: PipeLink[] = [];
  const edge = (a: number, b: number, k: number): void => {
    links.push({
      id: `P${links.length}`,
      kind: 'pipe',
      from: `N${a}`,
      to: `N${b}`,
      length_m: s.len[k],
      diameter_m: s.diam[k],
      roughness: s.dw ? 0.0015 : 140,
      minor_loss: s.minor[k],
    });
  };
  for (let i = 1; i < s.nodes; i++) edge(s.parents[i - 1] % i, i, i - 1); // random spanning tree
  s.extra.forEach(([a, b], j) => {
    if (a !== b) edge(a, b, s.nodes - 1 + j);
  }); // loops
  return { schema: 'runnel.network/1', headloss: s.dw ? 'darcy-weisbach' : 'hazen-williams', nodes, links };
}

function lawHeadloss(doc: NetworkDocument, link: PipeLink, q: number): number {
  const friction =
    doc.headloss === 'darcy-weisbach'
      ? darcyWeisbachHeadloss(q, link.length_m, link.diameter_m, link.roughness)
      : hazenWilliamsHeadloss(q, link.length_m, link.diameter_m, link.roughness);
  return friction + minorLossCoefficient(link.minor_loss ?? 0, link.diameter_m) * Math.abs(q) * q;
}

describe('random networks (fast-check): continuity and energy identities', () => {
  it('flow balance at every tee to 1e-9 of the total demand (floor 1e-10 m³/s + 1e-13·max|H|), and no NaN', () => {
    fc.assert(
      fc.property(specArb, (s) => {
        const doc = build(s);
        const result = solve(doc);
        expect(result.converged).to.equal(true);
        const net = new Map<string, number>();
        for (const link of doc.links) {
          const q = result.links[link.id].flow_m3s;
          expect(Number.isFinite(q)).to.equal(true);
          net.set(link.to, (net.get(link.to) ?? 0) + q);
          net.set(link.from, (net.get(link.from) ?? 0) - q);
        }
        const total = doc.nodes.reduce((a, n) => a + (n.kind === 'tee' ? n.demand_m3s : 0), 0);
        // rounding of p·ΔH (p ≤ 100 m³/s per m) grows with the heads, which reach −10⁵ m in the
        // absurd corners fast-check finds (7 L/s through 16 mm pipe)
        const maxHead = Math.max(...Object.values(result.nodes).map((x) => Math.abs(x.head_m)));
        const tolerance = 1e-9 * Math.max(total, 0.1) + 1e-13 * maxHead;
        for (const node of doc.nodes) {
          const r = result.nodes[node.id];
          expect(Number.isFinite(r.head_m)).to.equal(true);
          if (node.kind !== 'tee') continue;
          expect(Math.abs((net.get(node.id) ?? 0) - r.demand_m3s)).to.be.below(tolerance);
          expect(r.demand_m3s).to.be.closeTo(node.demand_m3s, 1e-15);
        }
      }),
      { numRuns: 120 },
    );
  });

  it('energy balance around every loop and between fixed heads to 1e-5 m', () => {
    fc.assert(
      fc.property(specArb, (s) => {
        const doc = build(s);
        const result = solve(doc, { headTolerance_m: 1e-8 });
        expect(result.converged).to.equal(true);
        // the law's headloss on every pipe equals the head drop; summed over the fundamental cycle of
        // each non-tree pipe it is zero
        const head = (id: string): number => result.nodes[id].head_m;
        const tree = new Map<string, { parent: string | null; link: PipeLink | null }>();
        tree.set('N0', { parent: null, link: null });
        const links = doc.links as PipeLink[];
        // BFS spanning tree over all links
        const queue = ['N0'];
        const inTree = new Set<string>();
        while (queue.length > 0) {
          const v = queue.shift() as string;
          for (const link of links) {
            const u = link.from === v ? link.to : link.to === v ? link.from : null;
            if (u === null || tree.has(u)) continue;
            tree.set(u, { parent: v, link });
            inTree.add(link.id);
            queue.push(u);
          }
        }
        // potential from the tree: Φ(v) = head(N0) − Σ law headloss along the tree path
        const phi = new Map<string, number>();
        const potential = (v: string): number => {
          const known = phi.get(v);
          if (known !== undefined) return known;
          const t = tree.get(v);
          if (!t || t.parent === null || t.link === null) {
            phi.set(v, head('N0'));
            return head('N0');
          }
          const h = lawHeadloss(doc, t.link, result.links[t.link.id].flow_m3s);
          const value = t.link.from === t.parent ? potential(t.parent) - h : potential(t.parent) + h;
          phi.set(v, value);
          return value;
        };
        for (const link of links) {
          if (inTree.has(link.id)) continue;
          const loopSum = potential(link.from) - potential(link.to) - lawHeadloss(doc, link, result.links[link.id].flow_m3s);
          expect(Math.abs(loopSum), `loop closed by ${link.id}`).to.be.below(1e-5);
        }
        // a second source: the path N0 → N1 through the tree loses exactly the head difference
        if (s.sources === 2) expect(Math.abs(potential('N1') - head('N1'))).to.be.below(1e-5);
      }),
      { numRuns: 120 },
    );
  });

  it('never throws and never returns NaN on arbitrary JSON-like input', () => {
    fc.assert(
      fc.property(fc.anything(), (junk) => {
        const result = solve(junk);
        expect(result.converged).to.equal(false);
        expect(result.warnings.length).to.be.above(0);
      }),
      { numRuns: 200 },
    );
  });

  it('never throws on structurally valid but odd networks (zero demands, dead ends, closed pipes)', () => {
    fc.assert(
      fc.property(specArb, fc.array(fc.nat(), { maxLength: 5 }), (s, closures) => {
        const doc = build(s);
        for (const c of closures) (doc.links[c % doc.links.length] as PipeLink).closed = true;
        const result = solve(doc);
        for (const r of Object.values(result.nodes)) expect(Number.isNaN(r.head_m)).to.equal(false);
        for (const r of Object.values(result.links)) expect(Number.isNaN(r.flow_m3s)).to.equal(false);
      }),
      { numRuns: 100 },
    );
  });
});
