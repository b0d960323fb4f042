import { expect } from 'chai';
import { hillSmallholding } from '../../engine/examples/hill-smallholding';
import type { NetworkDocument, NetworkLink, NetworkNode } from '../../engine/network-document';
import { findRoutes, longestSupplyRoute, pressureState, profileRoute, RouteError, VACUUM_HEAD_M, WORKING_SHARE } from '../../engine/profile';

function grid(w: number, h: number): NetworkDocument {
  const nodes: NetworkNode[] = [];
  const links: NetworkLink[] = [];
  for (let y = 0; y < h; y++) for (let x = 0; x < w; x++) nodes.push({ id: `N${x}_${y}`, kind: 'tee', elevation_m: 0, demand_m3s: 0 });
  // lengths vary so the shortest routes are unique-ish
  let k = 0;
  for (let y = 0; y < h; y++)
    for (let x = 0; x < w; x++) {
      if (x + 1 < w)
        links.push({
          id: `H${x}_${y}`,
          kind: 'pipe',
          from: `N${x}_${y}`,
          to: `N${x + 1}_${y}`,
          length_m: 10 + ((k++ * 7) % 13),
          diameter_m: 0.05,
          roughness: 150,
        });
      if (y + 1 < h)
        links.push({
          id: `V${x}_${y}`,
          kind: 'pipe',
          from: `N${x}_${y}`,
          to: `N${x}_${y + 1}`,
          length_m: 10 + ((k++ * 5) % 11),
          diameter_m: 0.05,
          roughness: 150,
        });
    }
  return { schema: 'runnel.network/1', headloss: 'hazen-williams', nodes, links };
}

/** Every simple path's length by depth-first enumeration (the definition Yen's method must reproduce). */
function allSimplePathLengths(doc: NetworkDocument, from: string, to: string): number[] {
  const out: number[] = [];
  const seen = new Set<string>([from]);
  const walk = (at: string, length: number): void => {
    if (at === to) {
      out.push(length);
      return;
    }
    for (const l of doc.links) {
      const next = l.from === at ? l.to : l.to === at ? l.from : null;
      if (next === null || seen.has(next)) continue;
      seen.add(next);
      walk(next, length + (l.kind === 'pipe' ? l.length_m : 0));
      seen.delete(next);
    }
  };
  walk(from, 0);
  return out.sort((a, b) => a - b);
}

describe('profile: route finding along the pipes', () => {
  it('on a looped 3 × 3 grid the routes are the shortest loopless paths in order (Yen 1971; checked by enumeration)', () => {
    const doc = grid(3, 3);
    const routes = findRoutes(doc, 'N0_0', 'N2_2', 5);
    const expected = allSimplePathLengths(doc, 'N0_0', 'N2_2').slice(0, 5);
    expect(routes.map((r) => r.length_m)).to.deep.equal(expected);
    for (const r of routes) {
      // a route is a chain: each link joins consecutive nodes, its length the sum of its pipes
      r.links.forEach((id, i) => {
        const l = doc.links.find((x) => x.id === id)!;
        expect([l.from, l.to].sort()).to.deep.equal([r.nodes[i], r.nodes[i + 1]].sort());
      });
      expect(new Set(r.nodes).size).to.equal(r.nodes.length);
    }
    expect(new Set(routes.map((r) => r.links.join())).size).to.equal(5);
  });
  it('a route between unconnected elements is refused, naming the field', () => {
    const doc = grid(2, 1);
    doc.nodes.push({ id: 'LONE', kind: 'outlet', elevation_m: 0, demand_m3s: 0 });
    expect(() => findRoutes(doc, 'N0_0', 'LONE')).to.throw(RouteError, 'to: LONE is not connected to N0_0 by any pipe, valve or pump');
    expect(() => findRoutes(doc, 'NOPE', 'LONE')).to.throw(RouteError, 'from: no element NOPE in the network');
  });
  it("the demo farm's longest supply route runs from the ridge tanks to the south trough across the dip", () => {
    const r = longestSupplyRoute(hillSmallholding)!;
    expect(r.nodes[0]).to.match(/^T[12]$/);
    expect(r.nodes[r.nodes.length - 1]).to.equal('TR4');
    expect(r.length_m).to.equal(75 + 50 + 55 + 110 + 270);
  });
});

describe('profile: a hand-built line with a hump and a dip (hand-worked, C)', () => {
  // tank floor at 100 m, level 1 m (head 101), full at 2 m (static 102); no flow, so the HGL is flat at 101.
  // Ground 100 → 96 → 103 → 55 → 60 over 1000 m, cover 0.5 m: pipe 95.5 at 250, 102.5 at 500, 54.5 at 750.
  const doc: NetworkDocument = {
    schema: 'runnel.network/1',
    headloss: 'hazen-williams',
    nodes: [
      { id: 'T', kind: 'tank', elevation_m: 100, diameter_m: 2, level_m: 1, min_level_m: 0, max_level_m: 2 },
      { id: 'O', kind: 'outlet', elevation_m: 60, demand_m3s: 0 },
    ],
    links: [
      {
        id: 'P',
        kind: 'pipe',
        from: 'T',
        to: 'O',
        length_m: 1000,
        diameter_m: 0.05,
        roughness: 150,
        cover_m: 0.5,
        rating_m: 60,
        profile: [
          [0, 100],
          [250, 96],
          [500, 103],
          [750, 55],
          [1000, 60],
        ],
      },
    ],
  };
  const profile = profileRoute(doc, findRoutes(doc, 'T', 'O')[0]);
  const find = (kind: string) => profile.findings.filter((f) => f.kind === kind);
  it('the HGL falls below the pipe over the hump: 446.43–507.81 m by linear interpolation', () => {
    const [below] = find('hgl-below-pipe');
    expect(below.from_m).to.be.closeTo(250 + (250 * 5.5) / 7, 1e-9);
    expect(below.to_m).to.be.closeTo(500 + (250 * 1.5) / 48, 1e-9);
    expect(below.value_m).to.be.closeTo(1.5, 1e-6);
    expect(below.caution).to.match(/air-lock or siphon/);
  });
  it('a high point at the hump (air-release valve) and low points in the dips (drains), with their source', () => {
    expect(find('high-point').map((f) => f.at_m)).to.deep.equal([500]);
    expect(find('low-point').map((f) => f.at_m)).to.deep.equal([250, 750]);
    expect(find('high-point')[0].caution).to.match(/air-release/);
    expect(find('high-point')[0].source).to.match(/NRCS Washington Eng\. Tech\. Note 16/);
  });
  it('static 47.5 m at the dip is over 72 % of a 60 m rating (ASAE S376.1, V2) but under the rating: 727.6–945.45 m', () => {
    expect(find('over-rating')).to.have.length(0);
    const [working] = find('over-working');
    // 72 % of the rating when surge is not analysed (ASAE S376.1 via the Missouri handbook, V2)
    expect(WORKING_SHARE).to.equal(0.72);
    const limit = 0.72 * 60;
    expect(working.limit_m).to.be.closeTo(43.2, 1e-12);
    expect(working.from_m).to.be.closeTo(500 + (250 * (102.5 - (102 - limit))) / 48, 1e-9);
    expect(working.to_m).to.be.closeTo(750 + (250 * (102 - limit - 54.5)) / 5.5, 1e-9);
    expect(working.value_m).to.be.closeTo(47.5, 1e-9);
    expect(profile.static_margin?.working_margin_m).to.be.closeTo(43.2 - 47.5, 1e-9);
    expect(profile.static_margin?.rating_margin_m).to.be.closeTo(12.5, 1e-9);
    expect(profile.ground).to.equal('survey');
  });
  it('a pipe without a survey runs straight between its elements, and the profile says so', () => {
    const plain: NetworkDocument = { ...doc, links: [{ ...doc.links[0], profile: undefined } as NetworkLink] };
    const p = profileRoute(plain, findRoutes(plain, 'O', 'T')[0]);
    expect(p.ground).to.equal('straight');
    expect(p.points.map((x) => x.ground_m)).to.deep.equal([60, 100]);
    expect(p.findings.filter((f) => f.kind === 'high-point' || f.kind === 'low-point')).to.deep.equal([]);
  });
});

describe('profile: pressures that cannot be', () => {
  it('below one atmosphere of suction the column separates (101.325 kPa / 9.80665 = 10.33 m, C)', () => {
    expect(VACUUM_HEAD_M).to.be.closeTo(10.332, 0.001);
    expect(pressureState(-10.4, true)).to.equal('below-vacuum');
    expect(pressureState(-3, true)).to.equal('negative');
    expect(pressureState(12, true)).to.equal('ok');
    expect(pressureState(0, false)).to.equal('no-supply');
  });
  it('elements cut off by a shut valve have no supply on the profile', () => {
    const doc: NetworkDocument = {
      schema: 'runnel.network/1',
      headloss: 'hazen-williams',
      nodes: [
        { id: 'T', kind: 'tank', elevation_m: 50, diameter_m: 2, level_m: 1, min_level_m: 0, max_level_m: 2 },
        { id: 'J', kind: 'tee', elevation_m: 40, demand_m3s: 0 },
        { id: 'O', kind: 'outlet', elevation_m: 30, demand_m3s: 0.0001 },
      ],
      links: [
        { id: 'V', kind: 'valve', valve_type: 'shutoff', from: 'T', to: 'J', diameter_m: 0.05, open: false },
        { id: 'P', kind: 'pipe', from: 'J', to: 'O', length_m: 100, diameter_m: 0.05, roughness: 150 },
      ],
    };
    const p = profileRoute(doc, findRoutes(doc, 'T', 'O')[0]);
    expect(p.elements.map((e) => e.supplied)).to.deep.equal([true, false, false]);
    expect(pressureState(p.elements[2].pressure_m, p.elements[2].supplied)).to.equal('no-supply');
  });
});

describe('profile: fittings already in the document', () => {
  it('an air valve within reach of the high point (10 m, engine/review/rules) marks it fitted', () => {
    const doc: NetworkDocument = {
      schema: 'runnel.network/1',
      headloss: 'hazen-williams',
      nodes: [
        { id: 'T', kind: 'tank', elevation_m: 100, diameter_m: 2, level_m: 1, min_level_m: 0, max_level_m: 2 },
        { id: 'O', kind: 'outlet', elevation_m: 60, demand_m3s: 0 },
      ],
      links: [
        {
          id: 'P',
          kind: 'pipe',
          from: 'T',
          to: 'O',
          length_m: 1000,
          diameter_m: 0.05,
          roughness: 150,
          profile: [
            [0, 100],
            [250, 96],
            [500, 103],
            [750, 55],
            [1000, 60],
          ],
          air_valves_m: [505],
          drains_m: [100],
        } as NetworkLink,
      ],
    };
    // walked from the outlet end, the hump is 500 m from O but the valve is measured from T: still the same point
    const p = profileRoute(doc, findRoutes(doc, 'O', 'T')[0]);
    const high = p.findings.find((f) => f.kind === 'high-point')!;
    expect(high.fitted).to.equal(true);
    expect(high.caution).to.match(/is fitted here/);
    expect(p.findings.filter((f) => f.kind === 'low-point').map((f) => f.fitted)).to.deep.equal([false, false]);
  });
});
