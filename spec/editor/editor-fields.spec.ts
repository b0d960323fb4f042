import { expect } from 'chai';
import { parseDocument } from '../../engine/validate';

/** The editor's own fields (issue 12) are part of the one document schema: kept, typed and checked. */
describe('Layout: editor fields in the document schema', () => {
  const doc = (extra: { node?: object; outlet?: object; pump?: object }) => ({
    schema: 'runnel.network/1',
    headloss: 'hazen-williams',
    nodes: [
      { id: 'W', kind: 'source', elevation_m: 0, head_m: 0, ...(extra.node ?? {}) },
      { id: 'O', kind: 'outlet', elevation_m: 0, demand_m3s: 0.0001, outlet_type: 'trough', ...(extra.outlet ?? {}) },
    ],
    links: [
      {
        id: 'P',
        kind: 'pump',
        from: 'W',
        to: 'O',
        curve: [
          [0, 30],
          [0.001, 20],
        ],
        ...(extra.pump ?? {}),
      },
    ],
  });

  it("keeps an elevation's provenance, a trough's refill, a drip zone's emitters and a pump's typed points", () => {
    const r = parseDocument(
      doc({
        node: { elevation_source: 'nearest', elevation_from: 'Ridge tank' },
        outlet: { refill_m3: 0.15, emitters: 240 },
        pump: {
          curve_points: [
            [0, 31],
            [0.0005, 27],
            [0.001, 19],
          ],
        },
      }),
    );
    if (!r.ok) throw new Error(JSON.stringify(r.problems));
    const n = r.doc.nodes[0] as { elevation_source?: string };
    expect(n.elevation_source).to.equal('nearest');
  });

  it('refuses nonsense in them, naming the element and field', () => {
    const r = parseDocument(doc({ node: { elevation_source: 'guessed' }, outlet: { emitters: 0 } }));
    expect(r.ok).to.equal(false);
    const text = r.problems.map((p) => p.message).join('\n');
    expect(text).to.match(/elevation_source/);
    expect(text).to.match(/emitters/);
  });
});
