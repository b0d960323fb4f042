import { expect } from 'chai';
import { hillSmallholding } from '../../engine/index';
import type { NetworkDocument } from '../../engine/network-document';
import { lineCrossings, nodesUnderLines, pumpedLinks } from '../../client/src/app/screens/layout/editor/crossings';

describe('Layout: crossing marks (newcomer item 8)', () => {
  it('the demo rising main is the pumped line, and it crosses the gravity network without joining it', () => {
    const doc = structuredClone(hillSmallholding) as NetworkDocument;
    expect([...pumpedLinks(doc)].sort()).to.deep.equal(['CV1', 'R1']);
    const crossings = lineCrossings(doc);
    const overR1 = crossings.filter((c) => c.over === 'R1');
    expect(overR1.length).to.be.greaterThan(0);
    // The rising main always passes over, never under.
    expect(crossings.filter((c) => c.under === 'R1')).to.deep.equal([]);
  });

  it('two lines meeting at a shared node or only touching do not cross; an X does, at its middle', () => {
    const base = { schema: 'runnel.network/1' as const, headloss: 'hazen-williams' as const };
    const node = (id: string, x: number, y: number) => ({ id, kind: 'tee' as const, elevation_m: 0, demand_m3s: 0, x_m: x, y_m: y });
    const pipe = (id: string, from: string, to: string) => ({ id, kind: 'pipe' as const, from, to, length_m: 1, diameter_m: 0.02, roughness: 140 });
    const doc: NetworkDocument = {
      ...base,
      nodes: [node('A', 0, 0), node('B', 10, 10), node('C', 0, 10), node('D', 10, 0), node('E', 20, 10)],
      links: [pipe('P1', 'A', 'B'), pipe('P2', 'C', 'D'), pipe('P3', 'B', 'E')],
    };
    const c = lineCrossings(doc);
    expect(c).to.have.length(1);
    expect(c[0].at.x).to.be.closeTo(5, 1e-9);
    expect(c[0].at.y).to.be.closeTo(5, 1e-9);
    expect([c[0].over, c[0].under].sort()).to.deep.equal(['P1', 'P2']);
  });

  it('a node a line passes over without joining is found (the demo rising main over the tee J8), its own ends and nodes off the line are not', () => {
    const demo = nodesUnderLines(structuredClone(hillSmallholding) as NetworkDocument, 1);
    expect(demo.map((p) => `${p.link}/${p.node}`)).to.deep.equal(['R1/J8']);
    const base = { schema: 'runnel.network/1' as const, headloss: 'hazen-williams' as const };
    const node = (id: string, x: number, y: number) => ({ id, kind: 'tee' as const, elevation_m: 0, demand_m3s: 0, x_m: x, y_m: y });
    const pipe = (id: string, from: string, to: string) => ({ id, kind: 'pipe' as const, from, to, length_m: 1, diameter_m: 0.02, roughness: 140 });
    const doc: NetworkDocument = {
      ...base,
      nodes: [node('A', 0, 0), node('B', 100, 0), node('ON', 40, 0.5), node('OFF', 60, 5), node('PAST', 101, 0)],
      links: [pipe('P1', 'A', 'B')],
    };
    const found = nodesUnderLines(doc, 2);
    expect(found.map((p) => p.node)).to.deep.equal(['ON']);
    expect(found[0].at).to.deep.equal({ x: 40, y: 0 });
    expect(found[0].distance_m).to.be.closeTo(0.5, 1e-12);
    expect(
      nodesUnderLines(doc, 6)
        .map((p) => p.node)
        .sort(),
    ).to.deep.equal(['OFF', 'ON']);
  });
});
