import { expect } from 'chai';
import type { NetworkDocument, NetworkLink, NetworkNode } from '../../engine/network-document';
import { simulate } from '../../engine/simulate';
import { solve, type SteadyResult } from '../../engine/steady';

/**
 * Cases where the engine once reported a wrong answer as converged (issue 14), each rebuilt from
 * its description and checked against an answer computed here independently of the engine:
 * Hazen-Williams written out from its published SI form, hL = 10.67·L·Q^1.852/(C^1.852·D^4.8704)
 * (Williams & Hazen; REFERENCES.md, V), and scalar roots found by bisection (C, computed here).
 */

const hw = (q: number, L: number, D: number, C: number): number =>
  (10.67 * L * Math.sign(q) * Math.pow(Math.abs(q), 1.852)) / (Math.pow(C, 1.852) * Math.pow(D, 4.8704));
/** Root of a function increasing on [lo, hi], by bisection to machine precision. */
function bisect(f: (x: number) => number, lo: number, hi: number): number {
  for (let i = 0; i < 200; i++) {
    const mid = (lo + hi) / 2;
    if (f(mid) > 0) hi = mid;
    else lo = mid;
  }
  return (lo + hi) / 2;
}
const doc = (nodes: NetworkNode[], links: NetworkLink[]): NetworkDocument => ({ schema: 'runnel.network/1', headloss: 'hazen-williams', nodes, links });
const pipe = (id: string, from: string, to: string, length_m = 100, diameter_m = 0.05, roughness = 140): NetworkLink => ({
  id,
  kind: 'pipe',
  from,
  to,
  length_m,
  diameter_m,
  roughness,
});
const prv = (id: string, from: string, to: string, setting_m: number, diameter_m = 0.05): NetworkLink => ({
  id,
  kind: 'valve',
  valve_type: 'prv',
  from,
  to,
  diameter_m,
  setting_m,
});
const tee = (id: string, demand_m3s = 0, elevation_m = 0): NetworkNode => ({ id, kind: 'tee', elevation_m, demand_m3s });
const source = (id: string, head_m: number): NetworkNode => ({ id, kind: 'source', elevation_m: head_m, head_m });
const codes = (r: SteadyResult, element: string): string[] => r.warnings.filter((w) => w.element === element).map((w) => w.code);

describe('issue 14: a pressure-dependent outlet never reports full demand at negative pressure', () => {
  it('source 30 m, 200 m × 30 mm (C 140), outlet 2 L/s full at 5 m, none at 0 m: about 1.33 L/s at about 2.2 m', () => {
    const r = solve(
      doc(
        [
          source('S', 30),
          {
            id: 'O',
            kind: 'outlet',
            elevation_m: 0,
            demand_m3s: 0.002,
            demand_model: { type: 'pressure-dependent', required_pressure_m: 5, zero_pressure_m: 0 },
          },
        ],
        [pipe('P', 'S', 'O', 200, 0.03)],
      ),
    );
    // q solves 30 − hL(q) = 5·(q/0.002)² (the square-root law of Wagner et al. 1988 inverted)
    const q = bisect((x) => hw(x, 200, 0.03, 140) + 5 * (x / 0.002) ** 2 - 30, 0, 0.002);
    expect(r.converged).to.equal(true);
    expect(r.nodes['O'].demand_m3s).to.be.closeTo(q, 1e-9);
    expect(r.nodes['O'].pressure_m).to.be.closeTo(5 * (q / 0.002) ** 2, 1e-5);
    expect(q).to.be.closeTo(0.00133, 0.00001); // the figures quoted in the issue
    expect(r.nodes['O'].pressure_m).to.be.closeTo(2.2, 0.05);
  });

  it('simulate at t = 0: a 4 L/s outlet on a 30 mm line delivers what its pressure allows, not 4 L/s at −183 m', () => {
    // simulate makes outlets pressure-driven: full demand at 0.5 m without a minimum (engine/README.md, scenario 8), none at 0 m
    const day = simulate(
      doc(
        [
          { id: 'T', kind: 'tank', elevation_m: 30, diameter_m: 2, level_m: 1, min_level_m: 0.1, max_level_m: 2 },
          { id: 'O', kind: 'outlet', elevation_m: 0, demand_m3s: 0.004 },
        ],
        [pipe('P', 'T', 'O', 200, 0.03)],
      ),
      { duration_s: 600, step_s: 600 },
    );
    const q = bisect((x) => hw(x, 200, 0.03, 140) + 0.5 * (x / 0.004) ** 2 - 31, 0, 0.004);
    expect(day.links['P'].flow_m3s[0]).to.be.closeTo(q, 1e-9);
    expect(day.nodes['O'].pressure_m[0]).to.be.closeTo(0.5 * (q / 0.004) ** 2, 1e-5);
    expect(day.warnings.map((w) => w.code)).to.not.include('not-converged');
  });
});

describe('issue 14: pressure-reducing valves', () => {
  it('a valve drawn from a dead end toward the main shuts; the main still serves its outlet (no singular system)', () => {
    const r = solve(
      doc(
        [source('S', 50), tee('A'), { id: 'O', kind: 'outlet', elevation_m: 0, demand_m3s: 0.001 }, tee('D')],
        [pipe('P1', 'S', 'A'), pipe('P2', 'A', 'O'), prv('V', 'D', 'A', 20)],
      ),
    );
    expect(r.converged).to.equal(true);
    expect(r.links['V'].flow_m3s).to.equal(0);
    expect(r.links['V'].status).to.equal('isolated');
    expect(r.links['P1'].flow_m3s).to.be.closeTo(0.001, 1e-12);
    expect(r.nodes['O'].demand_m3s).to.be.closeTo(0.001, 1e-12);
    expect(r.nodes['O'].head_m).to.be.closeTo(50 - 2 * hw(0.001, 100, 0.05, 140), 1e-6);
    expect(codes(r, 'D')).to.deep.equal(['disconnected']);
  });

  it('a valve feeding straight into another: each carries what lies below it (mass kept at the middle node)', () => {
    const r = solve(
      doc(
        [source('S', 60), tee('A'), tee('B', 0.0005), tee('C'), { id: 'O', kind: 'outlet', elevation_m: 0, demand_m3s: 0.001 }],
        [pipe('P1', 'S', 'A'), prv('V1', 'A', 'B', 40), prv('V2', 'B', 'C', 20), pipe('P2', 'C', 'O')],
      ),
    );
    expect(r.converged).to.equal(true);
    expect(r.links['V1'].flow_m3s).to.be.closeTo(0.0015, 1e-12);
    expect(r.links['V2'].flow_m3s).to.be.closeTo(0.001, 1e-12);
    expect(r.nodes['B'].pressure_m).to.be.closeTo(40, 1e-6);
    expect(r.nodes['C'].pressure_m).to.be.closeTo(20, 1e-6);
    expect(r.links['V1'].status).to.equal('active');
    expect(r.links['V2'].status).to.equal('active');
  });

  it('two valves in parallel with different settings: the higher setting governs and carries the flow; the lower one shuts', () => {
    for (const [small, large] of [
      [30, 25],
      [25, 30],
    ]) {
      const r = solve(
        doc(
          [source('S', 60), tee('A'), tee('B'), { id: 'O', kind: 'outlet', elevation_m: 0, demand_m3s: 0.0015 }],
          [pipe('P1', 'S', 'A'), prv('VS', 'A', 'B', small, 0.02), prv('VL', 'A', 'B', large, 0.05), pipe('P2', 'B', 'O')],
        ),
      );
      const [hi, lo] = small > large ? ['VS', 'VL'] : ['VL', 'VS'];
      expect(r.converged).to.equal(true);
      expect(r.nodes['B'].pressure_m).to.be.closeTo(Math.max(small, large), 1e-6);
      expect(r.links[hi].status).to.equal('active');
      expect(r.links[hi].flow_m3s).to.be.closeTo(0.0015, 1e-12);
      expect(r.links[lo].status).to.equal('closed');
      expect(r.links[lo].flow_m3s).to.equal(0);
    }
  });
});

describe('issue 14: the stopping rule looks at flows and zero-flow loops converge in a handful of iterations', () => {
  // a balanced loop (B–C carries nothing by symmetry) and loops with no demand at all
  const diamond = doc(
    [source('S', 50), tee('A'), tee('B'), tee('C'), tee('D', 0.001)],
    [pipe('P1', 'S', 'A'), pipe('P2', 'A', 'B'), pipe('P3', 'A', 'C'), pipe('P4', 'B', 'D'), pipe('P5', 'C', 'D'), pipe('P6', 'B', 'C')],
  );
  const idleLoop = doc(
    [source('S', 50), tee('A'), tee('B'), tee('C'), tee('D')],
    [pipe('P1', 'S', 'A'), pipe('P2', 'A', 'B'), pipe('P3', 'B', 'C'), pipe('P4', 'C', 'D'), pipe('P5', 'D', 'A')],
  );
  const twoEqualSources = doc(
    [source('S1', 50), source('S2', 50), tee('A'), tee('B'), tee('C')],
    [pipe('P1', 'S1', 'A'), pipe('P2', 'A', 'B'), pipe('P3', 'B', 'S2'), pipe('P4', 'A', 'C'), pipe('P5', 'C', 'B')],
  );
  for (const [name, net, idle] of [
    ['balanced diamond', diamond, ['P6']],
    ['loop without demand', idleLoop, ['P1', 'P2', 'P3', 'P4', 'P5']],
    ['two equal sources', twoEqualSources, ['P1', 'P2', 'P3', 'P4', 'P5']],
  ] as const) {
    it(`${name}: zero flows to 1e-9 m³/s in at most 8 iterations`, () => {
      const r = solve(net);
      expect(r.converged).to.equal(true);
      expect(r.iterations).to.be.at.most(8);
      for (const id of idle) expect(Math.abs(r.links[id].flow_m3s), id).to.be.below(1e-9);
    });
  }

  it('two sources 0.1 mm apart exchange Q = (ΔH/2r)^(1/1.852) through two equal pipes, to 1e-6 of Q', () => {
    const r = solve(
      doc([{ id: 'S1', kind: 'source', elevation_m: 50, head_m: 50.0001 }, source('S2', 50), tee('A')], [pipe('P1', 'S1', 'A'), pipe('P2', 'A', 'S2')]),
    );
    const q = bisect((x) => 2 * hw(x, 100, 0.05, 140) - 1e-4, 0, 1e-3);
    expect(r.converged).to.equal(true);
    expect(r.links['P1'].flow_m3s).to.be.closeTo(q, 1e-6 * q);
    expect(r.links['P2'].flow_m3s).to.be.closeTo(q, 1e-6 * q);
  });

  it('a looped grid: every pipe flow matches the flow its own head difference drives, low-headloss pipes included', () => {
    const nodes: NetworkNode[] = [source('S', 40)];
    const links: NetworkLink[] = [pipe('IN', 'S', 'J0_0', 50, 0.15)];
    const nx = 12;
    const ny = 10;
    for (let i = 0; i < nx; i++) for (let j = 0; j < ny; j++) nodes.push(tee(`J${i}_${j}`, 0.0002 * (1 + ((i * 7 + j * 3) % 5)), (i + j) % 4));
    for (let i = 0; i < nx; i++)
      for (let j = 0; j < ny; j++) {
        if (i + 1 < nx) links.push(pipe(`H${i}_${j}`, `J${i}_${j}`, `J${i + 1}_${j}`, 80 + 10 * (j % 3), [0.08, 0.065, 0.05][(i + j) % 3]));
        if (j + 1 < ny) links.push(pipe(`V${i}_${j}`, `J${i}_${j}`, `J${i}_${j + 1}`, 90 + 10 * (i % 4), [0.065, 0.05, 0.08][(i * j) % 3]));
      }
    const r = solve(doc(nodes, links));
    expect(r.converged).to.equal(true);
    let checked = 0;
    for (const link of links) {
      if (link.kind !== 'pipe') continue;
      const dh = r.nodes[link.from].head_m - r.nodes[link.to].head_m;
      if (Math.abs(dh) < 1e-7) continue; // below the heads' own rounding the inverse law says nothing
      const expected = Math.sign(dh) * bisect((x) => hw(x, link.length_m, link.diameter_m, link.roughness) - Math.abs(dh), 0, 1);
      expect(r.links[link.id].flow_m3s, link.id).to.be.closeTo(expected, 1e-4 * Math.abs(expected) + 1e-10);
      checked++;
    }
    expect(checked).to.be.above(200);
  });
});

describe('issue 14: isolated parts are reported as such', () => {
  const island = doc(
    [source('S', 40), tee('A'), tee('X'), tee('Y'), { id: 'OX', kind: 'outlet', elevation_m: 0, demand_m3s: 0.0005, min_pressure_m: 10 }],
    [
      pipe('P1', 'S', 'A'),
      { id: 'SV', kind: 'valve', valve_type: 'shutoff', from: 'A', to: 'X', diameter_m: 0.05, open: false },
      prv('VX', 'X', 'Y', 20),
      pipe('PX', 'Y', 'OX'),
    ],
  );
  it('a valve and a pipe behind a shut valve are isolated (not active, not open); the cut-off outlet is warned about', () => {
    const r = solve(island);
    expect(r.converged).to.equal(true);
    expect(r.links['SV'].status).to.equal('closed');
    expect(r.links['VX'].status).to.equal('isolated');
    expect(r.links['PX'].status).to.equal('isolated');
    expect(r.links['PX'].flow_m3s).to.equal(0);
    expect(codes(r, 'OX')).to.include.members(['disconnected', 'unmet-demand', 'below-minimum']);
  });
});
