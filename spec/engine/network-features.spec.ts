import { expect } from 'chai';
import type { NetworkDocument, NetworkLink, NetworkNode } from '../../engine/network-document';
import { solve } from '../../engine/steady';
import { area, bisect, dwLoss, hwLoss, minorLoss } from './hand-formulas';

const doc = (nodes: NetworkNode[], links: NetworkLink[], extra: Partial<NetworkDocument> = {}): NetworkDocument => ({
  schema: 'runnel.network/1',
  headloss: 'hazen-williams',
  nodes,
  links,
  ...extra,
});
const pipe = (id: string, from: string, to: string, length_m = 100, diameter_m = 0.05, extra: object = {}): NetworkLink =>
  ({ id, kind: 'pipe', from, to, length_m, diameter_m, roughness: 150, ...extra }) as NetworkLink;
const codes = (r: ReturnType<typeof solve>, element?: string): string[] =>
  r.warnings.filter((w) => element === undefined || w.element === element).map((w) => w.code);

describe('valves (gradient-solver.ts status logic)', () => {
  const prvNet = (head: number): NetworkDocument =>
    doc(
      [
        { id: 'S', kind: 'source', elevation_m: head, head_m: head },
        { id: 'A', kind: 'tee', elevation_m: 0, demand_m3s: 0 },
        { id: 'B', kind: 'tee', elevation_m: 0, demand_m3s: 0 },
        { id: 'O', kind: 'outlet', elevation_m: 0, demand_m3s: 0.001 },
      ],
      [pipe('P1', 'S', 'A'), { id: 'PRV', kind: 'valve', valve_type: 'prv', from: 'A', to: 'B', diameter_m: 0.05, setting_m: 20 }, pipe('P2', 'B', 'O')],
    );
  it('a pressure-reducing valve holds its setting downstream when the upstream head is higher', () => {
    const r = solve(prvNet(60));
    expect(r.converged).to.equal(true);
    expect(r.links['PRV'].status).to.equal('active');
    expect(r.nodes['B'].pressure_m).to.be.closeTo(20, 1e-6);
    expect(r.links['PRV'].flow_m3s).to.be.closeTo(0.001, 1e-12);
    // upstream: 60 m less the Hazen-Williams loss of 1 L/s in 100 m of 50 mm, C 150 (hand-formulas.ts, C) = 59.40 m
    expect(r.nodes['A'].pressure_m).to.be.closeTo(60 - hwLoss(0.001, 100, 0.05, 150), 1e-6);
  });
  it('…and opens fully when the upstream head cannot reach the setting', () => {
    const r = solve(prvNet(15));
    expect(r.links['PRV'].status).to.equal('open');
    // wide open it is a fitting of K 0.2 (the engine's default valve loss, trade practice): 15 m less that and P1's loss (C)
    expect(r.nodes['B'].pressure_m).to.be.closeTo(15 - hwLoss(0.001, 100, 0.05, 150) - minorLoss(0.2, 0.001, 0.05), 1e-6);
    expect(r.links['PRV'].flow_m3s).to.be.closeTo(0.001, 1e-12);
  });
  it('a check valve stops reverse flow (status check-closed), and passes forward flow', () => {
    const net = (upHead: number) =>
      doc(
        [
          { id: 'S1', kind: 'source', elevation_m: upHead, head_m: upHead },
          { id: 'S2', kind: 'source', elevation_m: 50, head_m: 50 },
          { id: 'A', kind: 'tee', elevation_m: 0, demand_m3s: 0 },
        ],
        [pipe('P1', 'S1', 'A'), { id: 'CV', kind: 'valve', valve_type: 'check', from: 'A', to: 'S2', diameter_m: 0.05 }],
      );
    const back = solve(net(40));
    expect(back.links['CV'].status).to.equal('check-closed');
    expect(back.links['CV'].flow_m3s).to.equal(0);
    expect(back.nodes['A'].head_m).to.be.closeTo(40, 1e-6);
    const forward = solve(net(60));
    expect(forward.links['CV'].status).to.equal('open');
    // 10 m of head difference spent in P1 (Hazen-Williams) and the open valve (K 0.2), flow found by bisection (C): 4.55 L/s
    const q = bisect((x) => hwLoss(x, 100, 0.05, 150) + minorLoss(0.2, x, 0.05) - 10, 0, 0.1);
    expect(forward.links['CV'].flow_m3s).to.be.closeTo(q, 1e-7);
  });
  it('a shut valve cuts off what lies behind it: disconnected, no flow, no NaN', () => {
    const r = solve(
      doc(
        [
          { id: 'S', kind: 'source', elevation_m: 30, head_m: 30 },
          { id: 'A', kind: 'tee', elevation_m: 0, demand_m3s: 0 },
          { id: 'O', kind: 'outlet', elevation_m: 0, demand_m3s: 0.001 },
        ],
        [pipe('P1', 'S', 'A'), { id: 'V', kind: 'valve', valve_type: 'shutoff', from: 'A', to: 'O', diameter_m: 0.05, open: false }],
      ),
    );
    expect(r.converged).to.equal(true);
    expect(r.links['V'].status).to.equal('closed');
    expect(r.links['V'].flow_m3s).to.equal(0);
    expect(r.nodes['O'].demand_m3s).to.equal(0);
    expect(codes(r, 'O')).to.deep.equal(['disconnected', 'unmet-demand']); // cut off, so its demand goes unmet (issue 14 item 7)
  });
  it('a float valve is shut when the tank it feeds is full', () => {
    const r = solve(
      doc(
        [
          { id: 'S', kind: 'source', elevation_m: 30, head_m: 30 },
          { id: 'T', kind: 'tank', elevation_m: 10, diameter_m: 1, level_m: 1.5, min_level_m: 0.1, max_level_m: 1.5 },
        ],
        [{ id: 'FV', kind: 'valve', valve_type: 'float', from: 'S', to: 'T', diameter_m: 0.02, tank: 'T' }],
      ),
    );
    expect(r.links['FV'].status).to.equal('closed');
    expect(r.links['FV'].flow_m3s).to.equal(0);
  });
});

describe('outlets: pressure-dependent and emitter demand (Wagner et al. 1988; emitter law q = k·p^x)', () => {
  const outletNet = (head: number, node: NetworkNode): NetworkDocument =>
    doc([{ id: 'S', kind: 'source', elevation_m: head, head_m: head }, node], [pipe('P', 'S', 'O', 50, 0.05)]);
  it('pressure-dependent: q = Q·√((p − p0)/(preq − p0)) between the pressures, full above (identity at the solution)', () => {
    for (const head of [3, 8, 12, 16, 30]) {
      const r = solve(
        outletNet(head, {
          id: 'O',
          kind: 'outlet',
          elevation_m: 0,
          demand_m3s: 0.002,
          demand_model: { type: 'pressure-dependent', required_pressure_m: 14, zero_pressure_m: 4 },
        }),
      );
      expect(r.converged, `head ${head}`).to.equal(true);
      const p = r.nodes['O'].pressure_m;
      const s = Math.min(Math.max((p - 4) / 10, 0), 1);
      expect(r.nodes['O'].demand_m3s, `head ${head}`).to.be.closeTo(0.002 * Math.sqrt(s), 1e-9);
      expect(r.links['P'].flow_m3s).to.be.closeTo(r.nodes['O'].demand_m3s, 1e-9);
    }
  });
  it('emitter: q = k·p^x at the solved pressure', () => {
    const k = 0.0003 / Math.sqrt(20);
    for (const head of [5, 20, 45]) {
      const r = solve(outletNet(head, { id: 'O', kind: 'outlet', elevation_m: 0, demand_m3s: 0.0003, demand_model: { type: 'emitter', k, exponent: 0.5 } }));
      expect(r.converged).to.equal(true);
      expect(r.nodes['O'].demand_m3s).to.be.closeTo(k * Math.sqrt(r.nodes['O'].pressure_m), 1e-10);
    }
  });
  it('pressure-driven mode: a fixed outlet fed below ground level gets nothing instead of negative pressure', () => {
    const r = solve(outletNet(-5, { id: 'O', kind: 'outlet', elevation_m: 0, demand_m3s: 0.001, min_pressure_m: 7 }), { pressureDriven: true });
    expect(r.converged).to.equal(true);
    expect(r.nodes['O'].demand_m3s).to.be.closeTo(0, 1e-9);
    expect(codes(r, 'O')).to.include('unmet-demand');
  });
});

describe('pumps', () => {
  it('a head–flow curve pump runs where its curve meets the system curve', () => {
    const r = solve(
      doc(
        [
          { id: 'S', kind: 'source', elevation_m: 0, head_m: 0 },
          { id: 'A', kind: 'tee', elevation_m: 0, demand_m3s: 0 },
          { id: 'T', kind: 'tank', elevation_m: 30, diameter_m: 2, level_m: 1, min_level_m: 0, max_level_m: 2 },
        ],
        [
          {
            id: 'PU',
            kind: 'pump',
            from: 'S',
            to: 'A',
            curve: [
              [0, 50],
              [0.002, 40],
              [0.004, 20],
            ],
          },
          pipe('R', 'A', 'T', 200, 0.04),
        ],
      ),
    );
    expect(r.converged).to.equal(true);
    const q = r.links['PU'].flow_m3s;
    const curveHead = q <= 0.002 ? 50 - 5000 * q : 40 - 10000 * (q - 0.002);
    expect(-r.links['PU'].headloss_m).to.be.closeTo(curveHead, 1e-6); // head gain on the curve
    expect(r.links['R'].flow_m3s).to.be.closeTo(q, 1e-12);
  });
  it('a pump that cannot reach the tank stops rather than running backwards', () => {
    const r = solve(
      doc(
        [
          { id: 'S', kind: 'source', elevation_m: 0, head_m: 0 },
          { id: 'A', kind: 'tee', elevation_m: 0, demand_m3s: 0 },
          { id: 'T', kind: 'tank', elevation_m: 80, diameter_m: 2, level_m: 1, min_level_m: 0, max_level_m: 2 },
        ],
        [{ id: 'PU', kind: 'pump', from: 'S', to: 'A', curve: [[0.002, 40]] }, pipe('R', 'A', 'T', 200, 0.04)],
      ),
    );
    expect(r.links['PU'].status).to.equal('check-closed');
    expect(r.links['PU'].flow_m3s).to.equal(0);
  });
  it('a pump whose control tank is at its stop level is off', () => {
    const r = solve(
      doc(
        [
          { id: 'S', kind: 'source', elevation_m: 0, head_m: 0 },
          { id: 'T', kind: 'tank', elevation_m: 30, diameter_m: 2, level_m: 1.8, min_level_m: 0, max_level_m: 2 },
        ],
        [{ id: 'PU', kind: 'pump', from: 'S', to: 'T', flow_m3s: 0.001, control: { tank: 'T', stop_level_m: 1.8, start_level_m: 1.2 } }],
      ),
    );
    expect(r.links['PU'].status).to.equal('closed');
  });
});

describe('design checks (checks.ts)', () => {
  it('velocity above 1.5 m/s (5 ft/s, Jarrett 2000, V2) and below-minimum at an outlet', () => {
    const net = (minPressure?: number) =>
      doc(
        [
          { id: 'S', kind: 'source', elevation_m: 30, head_m: 30 },
          { id: 'O', kind: 'outlet', elevation_m: 0, demand_m3s: 0.00055, min_pressure_m: minPressure },
        ],
        [pipe('P', 'S', 'O', 100, 0.02)],
      );
    const r = solve(net(19));
    // v = Q/A = 0.55 L/s over π·(0.02 m)²/4 = 1.751 m/s (C), above 1.5 m/s
    expect(r.links['P'].velocity_ms).to.be.closeTo(0.00055 / area(0.02), 1e-9);
    expect(0.00055 / area(0.02)).to.be.closeTo(1.751, 0.001);
    // 30 m less the Hazen-Williams loss in 100 m of 20 mm (C) = 12.8 m, under the 19 m asked
    expect(r.nodes['O'].pressure_m).to.be.closeTo(30 - hwLoss(0.00055, 100, 0.02, 150), 1e-6);
    expect(r.nodes['O'].pressure_m).to.be.below(19);
    expect(codes(r, 'P')).to.deep.equal(['velocity-high']);
    expect(codes(r, 'O')).to.deep.equal(['below-minimum']);
    expect(solve(net(), { velocityLimit_ms: 3 }).warnings).to.deep.equal([]);
  });
  it('static pressure above the pipe rating at the bottom of a long drop (tank full)', () => {
    const r = solve(
      doc(
        [
          { id: 'T', kind: 'tank', elevation_m: 120, diameter_m: 2, level_m: 1, min_level_m: 0.1, max_level_m: 2 },
          { id: 'O', kind: 'outlet', elevation_m: 0, demand_m3s: 0.0001 },
        ],
        [pipe('P', 'T', 'O', 500, 0.03, { rating_m: 112.5 })],
      ),
    );
    // static head 122 m (tank at max level) − 0 m = 122 m > 112.5 m (160 psi)
    const w = r.warnings.find((x) => x.code === 'over-rating');
    expect(w?.element).to.equal('P');
    expect(w?.message).to.equal('P: static pressure 122 m is above the pipe rating 112.5 m');
  });
  it('HGL below the pipe at a hump of the ground profile: air-lock / siphon risk', () => {
    const r = solve(
      doc(
        [
          { id: 'S', kind: 'source', elevation_m: 20, head_m: 20 },
          { id: 'O', kind: 'outlet', elevation_m: 0, demand_m3s: 0.0005 },
        ],
        [
          pipe('P', 'S', 'O', 300, 0.03, {
            profile: [
              [0, 20],
              [100, 19],
              [150, 5],
              [300, 0],
            ],
            cover_m: 0.5,
          }),
        ],
      ),
    );
    const w = r.warnings.find((x) => x.code === 'negative-pressure');
    expect(w?.element).to.equal('P');
    // by hand: the HGL falls linearly by the Hazen-Williams loss over 300 m; at 100 m it stands at
    // 20 − loss/3, and the pipe lies 0.5 m under the 19 m ground (C)
    const deficit = 19 - 0.5 - (20 - hwLoss(0.0005, 300, 0.03, 150) / 3);
    expect(deficit).to.be.closeTo(0.5025, 1e-4);
    expect(w?.message).to.match(/^P: HGL is 0\.5\d* m below the pipe at 100 m from S; air-lock \/ siphon risk/);
    expect(Number(/HGL is ([0-9.]+) m/.exec(w?.message ?? '')?.[1])).to.be.closeTo(deficit, 0.01);
  });
  it('a tank at its minimum level is flagged tank-empty', () => {
    const r = solve(
      doc(
        [
          { id: 'T', kind: 'tank', elevation_m: 20, diameter_m: 2, level_m: 0.1, min_level_m: 0.1, max_level_m: 2 },
          { id: 'O', kind: 'outlet', elevation_m: 0, demand_m3s: 0.0001 },
        ],
        [pipe('P', 'T', 'O')],
      ),
    );
    expect(codes(r, 'T')).to.deep.equal(['tank-empty']);
  });
  it('Darcy-Weisbach networks solve with the same checks', () => {
    const r = solve(
      doc(
        [
          { id: 'S', kind: 'source', elevation_m: 20, head_m: 20 },
          { id: 'O', kind: 'outlet', elevation_m: 0, demand_m3s: 0.0005 },
        ],
        [{ id: 'P', kind: 'pipe', from: 'S', to: 'O', length_m: 100, diameter_m: 0.03, roughness: 0.0015 }],
        { headloss: 'darcy-weisbach' },
      ),
    );
    expect(r.converged).to.equal(true);
    // 20 m less f·(L/D)·v²/2g with Colebrook's f iterated by hand (ε 0.0015 mm, ν 1.004e-6 m²/s; hand-formulas.ts, C) = 17.82 m
    expect(r.nodes['O'].pressure_m).to.be.closeTo(20 - dwLoss(0.0005, 100, 0.03, 0.0015e-3), 1e-4);
  });
});
