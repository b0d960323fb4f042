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
    // Worked apart: every proper intersection of R1's drawn polyline with each line that shares no end with it
    // (segments p + t·r and q + u·s meet where t, u ∈ (0, 1); any geometry text)
    const xy = (id: string): [number, number] => {
      const n = doc.nodes.find((m) => m.id === id)!;
      return [n.x_m as number, n.y_m as number];
    };
    const path = (l: NetworkDocument['links'][number]) => [xy(l.from), ...((l as { vertices?: [number, number][] }).vertices ?? []), xy(l.to)];
    const r1 = doc.links.find((l) => l.id === 'R1')!;
    const expected: { under: string; x: number; y: number }[] = [];
    for (const other of doc.links) {
      if (other.id === 'R1' || [other.from, other.to].some((e) => e === r1.from || e === r1.to)) continue;
      const a = path(r1);
      const b = path(other);
      for (let i = 1; i < a.length; i++)
        for (let j = 1; j < b.length; j++) {
          const [px, py] = a[i - 1];
          const [rx, ry] = [a[i][0] - px, a[i][1] - py];
          const [qx, qy] = b[j - 1];
          const [sx, sy] = [b[j][0] - qx, b[j][1] - qy];
          const den = rx * sy - ry * sx;
          if (den === 0) continue;
          const t = ((qx - px) * sy - (qy - py) * sx) / den;
          const u = ((qx - px) * ry - (qy - py) * rx) / den;
          if (t > 1e-9 && t < 1 - 1e-9 && u > 1e-9 && u < 1 - 1e-9) expected.push({ under: other.id, x: px + t * rx, y: py + t * ry });
        }
    }
    expect(overR1.map((c) => c.under).sort()).to.deep.equal(expected.map((e) => e.under).sort());
    expect(overR1.map((c) => c.under).sort()).to.deep.equal(['L-HOUSE', 'L-HYD', 'L-J8', 'L-SHED', 'V-WEST']);
    for (const e of expected) {
      const got = overR1.find((c) => c.under === e.under)!;
      expect(got.at.x, e.under).to.be.closeTo(e.x, 1e-6);
      expect(got.at.y, e.under).to.be.closeTo(e.y, 1e-6);
    }
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
