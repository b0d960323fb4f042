/**
 * Single-failure what-ifs on a small looped network whose answers are worked by hand (C): two equal
 * parallel pipes feed a tee, so breaking either leaves one pipe carrying the whole flow with 2^1.852
 * times the headloss; a dead-end line loses everything; a tank out of service starves everything.
 */
import { expect } from 'chai';
import type { NetworkDocument } from '../../engine';
import { HW_OMEGA_SI } from '../../engine';
import { hillSmallholding } from '../../engine/examples/hill-smallholding';
import { whatIfs } from '../../engine/review/what-ifs';

const Q1 = 0.001;
const MIN1 = 20;

function looped(): NetworkDocument {
  return {
    schema: 'runnel.network/1',
    headloss: 'hazen-williams',
    nodes: [
      { id: 'T', kind: 'tank', elevation_m: 50, diameter_m: 3, level_m: 1, min_level_m: 0, max_level_m: 2 },
      { id: 'J', kind: 'tee', elevation_m: 0, demand_m3s: 0 },
      { id: 'O1', kind: 'outlet', elevation_m: 0, demand_m3s: Q1, min_pressure_m: MIN1 },
      { id: 'K', kind: 'tee', elevation_m: 0, demand_m3s: 0 },
      { id: 'O2', kind: 'outlet', elevation_m: 0, demand_m3s: 0.0005, min_pressure_m: 10 },
    ],
    links: [
      { id: 'P1', kind: 'pipe', from: 'T', to: 'J', length_m: 500, diameter_m: 0.03, roughness: 130 },
      { id: 'P2', kind: 'pipe', from: 'T', to: 'J', length_m: 500, diameter_m: 0.03, roughness: 130 },
      { id: 'P3', kind: 'pipe', from: 'J', to: 'O1', length_m: 100, diameter_m: 0.03, roughness: 130 },
      { id: 'P4', kind: 'pipe', from: 'T', to: 'K', length_m: 200, diameter_m: 0.025, roughness: 130 },
      { id: 'V4', kind: 'valve', valve_type: 'shutoff', from: 'K', to: 'O2', diameter_m: 0.025, open: true, minor_loss: 0 },
    ],
  };
}

/** Hazen-Williams resistance r with h = r·Q^1.852 (REFERENCES.md, ω = 10.67 SI). */
const r = (L: number, D: number, C: number) => (HW_OMEGA_SI * L) / (C ** 1.852 * D ** 4.8704);

describe('what-ifs: every single failure on a small looped network', () => {
  const table = whatIfs(looped());
  const result = (key: string) => table.results.find((x) => x.scenario.key === key)!;

  it('the intact design has no outlet short (by hand: 51 m less 13.0 m in the parallel pair and 9.4 m in P3 leaves about 28.6 m ≥ 20 m)', () => {
    const hand = 51 - r(500, 0.03, 130) * (Q1 / 2) ** 1.852 - r(100, 0.03, 130) * Q1 ** 1.852;
    expect(hand).to.be.within(28, 29.5);
    expect(table.alreadyShort).to.deep.equal([]);
  });

  it('lists every pipe broken, every valve stuck shut and every tank out, once each', () => {
    expect(table.results.map((x) => x.scenario.key).sort()).to.deep.equal(
      ['pipe-broken:P1', 'pipe-broken:P2', 'pipe-broken:P3', 'pipe-broken:P4', 'tank-out:T', 'valve-stuck-shut:V4'].sort(),
    );
    expect(table.results.every((x) => x.solved)).to.equal(true);
  });

  it('one parallel pipe broken: O1 goes short by the amount worked by hand (pressure-driven square-root law), O2 unaffected', () => {
    // One pipe carries q: p = 51 − (r1 + r3)·q^1.852 and q = Q·√(p/20) below 20 m. Bisection on q (C).
    const R = r(500, 0.03, 130) + r(100, 0.03, 130);
    let lo = 0;
    let hi = Q1;
    for (let i = 0; i < 200; i++) {
      const q = (lo + hi) / 2;
      const p = 51 - R * q ** 1.852;
      if (q > Q1 * Math.sqrt(Math.max(p, 0) / MIN1)) hi = q;
      else lo = q;
    }
    const q = (lo + hi) / 2;
    const p = 51 - R * q ** 1.852;
    for (const key of ['pipe-broken:P1', 'pipe-broken:P2']) {
      const res = result(key);
      expect(res.hit.map((h) => h.outlet)).to.deep.equal(['O1']);
      expect(res.unaffected).to.deep.equal(['O2']);
      expect(res.hit[0].delivered_m3s).to.be.closeTo(q, 1e-3 * Q1);
      expect(res.hit[0].pressure_m).to.be.closeTo(p, 0.01);
      expect(res.hit[0].pressureShort_m).to.be.closeTo(MIN1 - p, 0.01);
      expect(res.hit[0].lostShare).to.be.closeTo(1 - q / Q1, 1e-3);
      expect(res.hit[0].noSupply).to.equal(false);
    }
  });

  it('the dead-end line P3 broken cuts O1 off entirely; V4 stuck shut or P4 broken cuts O2 off', () => {
    const p3 = result('pipe-broken:P3');
    expect(p3.hit).to.have.length(1);
    expect(p3.hit[0]).to.include({ outlet: 'O1', noSupply: true, lostShare: 1, delivered_m3s: 0 });
    expect(p3.unaffected).to.deep.equal(['O2']);
    for (const key of ['valve-stuck-shut:V4', 'pipe-broken:P4']) {
      expect(result(key).hit.map((h) => [h.outlet, h.noSupply])).to.deep.equal([['O2', true]]);
    }
  });

  it('the tank out of service starves both outlets and sorts first (most outlets hit)', () => {
    expect(table.results[0].scenario.key).to.equal('tank-out:T');
    expect(table.results[0].hit.map((h) => h.outlet)).to.deep.equal(['O1', 'O2']);
    // Then the two-way ties broken by how much is lost: the no-supply cases (share 1) before the partial loop loss.
    const ones = table.results.slice(1).map((x) => x.hit.length);
    expect(ones).to.deep.equal([...ones].sort((a, b) => b - a));
  });

  it("fill pump off for a day: the outlet misses the daily need less the tank's usable water (by hand, C)", () => {
    // Tank 2 m across, 1.5 m of usable water (π·1.5 = 4.712 m³); an outlet drawing 0.1 L/s all day wants 8.64 m³.
    const doc: NetworkDocument = {
      schema: 'runnel.network/1',
      headloss: 'hazen-williams',
      nodes: [
        { id: 'W', kind: 'source', elevation_m: 0, head_m: 0 },
        { id: 'T', kind: 'tank', elevation_m: 40, diameter_m: 2, level_m: 1.6, min_level_m: 0.1, max_level_m: 2 },
        { id: 'O', kind: 'outlet', elevation_m: 10, demand_m3s: 0.0001, min_pressure_m: 5 },
      ],
      links: [
        { id: 'PU', kind: 'pump', from: 'W', to: 'T', flow_m3s: 0.0002 },
        { id: 'P', kind: 'pipe', from: 'T', to: 'O', length_m: 100, diameter_m: 0.025, roughness: 140 },
      ],
    };
    const t = whatIfs(doc);
    const day = t.results.find((x) => x.scenario.key === 'fill-off:1')!;
    const hand = 0.0001 * 86400 - Math.PI * 1.5;
    expect(day.hit).to.have.length(1);
    // Hourly steps: the tank's last partial hour is settled within a step (≤ 0.36 m³ here).
    expect(day.hit[0].unmet_m3).to.be.closeTo(hand, 0.36);
    const three = t.results.find((x) => x.scenario.key === 'fill-off:3')!;
    expect(three.hit[0].unmet_m3).to.be.closeTo(3 * 0.0001 * 86400 - Math.PI * 1.5, 0.36);
    // All hit one outlet: the broken pipe and the tank out (everything lost, then by key) sort first, then the longer outages.
    expect(t.results.map((x) => x.scenario.key)).to.deep.equal(['pipe-broken:P', 'tank-out:T', 'fill-off:3', 'fill-off:2', 'fill-off:1']);
  });

  it('the demo farm: the main below the tanks hits every outlet; a branch line hits only its own', () => {
    const demo = whatIfs(hillSmallholding);
    const outlets = hillSmallholding.nodes.filter((n) => n.kind === 'outlet').length;
    expect(demo.results[0].hit).to.have.length(outlets);
    expect(demo.results.find((x) => x.scenario.key === 'pipe-broken:L-TR4')!.hit.map((h) => h.outlet)).to.deep.equal(['TR4']);
    expect(demo.results.find((x) => x.scenario.key === 'tank-out:T1')!.hit).to.deep.equal([]);
    expect(
      demo.results
        .filter((x) => x.scenario.kind === 'fill-off')
        .map((x) => x.scenario.days)
        .sort(),
    ).to.deep.equal([1, 2, 3]);
  });
});
