/** Version comparison: field-by-field diff, the save summary line, outlets before and after. */
import { expect } from 'chai';
import type { NetworkDocument } from '../../engine';
import { compareOutlets, diffVersions, isEmptyDiff, summariseDiff } from '../../engine/review/version-diff';

const base = (): NetworkDocument => ({
  schema: 'runnel.network/1',
  headloss: 'hazen-williams',
  nodes: [
    { id: 'T1', kind: 'tank', elevation_m: 40, diameter_m: 1.6, level_m: 1.2, min_level_m: 0.1, max_level_m: 1.5, x_m: 0, y_m: 0 },
    { id: 'O1', kind: 'outlet', name: 'Garden', elevation_m: 20, demand_m3s: 0.0003, min_pressure_m: 7, x_m: 20, y_m: 0 },
  ],
  links: [{ id: 'P1', kind: 'pipe', from: 'T1', to: 'O1', length_m: 10, diameter_m: 0.025, roughness: 140 }],
});

describe('engine/review/version-diff', () => {
  it('identical documents (keys in another order) differ in nothing', () => {
    const a = base();
    const b = structuredClone(a);
    b.nodes[0] = Object.fromEntries(Object.entries(b.nodes[0]).reverse()) as never;
    const d = diffVersions(a, b);
    expect(isEmptyDiff(d)).to.equal(true);
    expect(summariseDiff(d)).to.equal('no changes');
  });

  it('lists changed fields with before and after, added and removed elements, and settings', () => {
    const a = base();
    const b = structuredClone(a);
    (b.links[0] as { diameter_m: number }).diameter_m = 0.032;
    (b.nodes[1] as { min_pressure_m?: number }).min_pressure_m = undefined;
    b.nodes.push({ id: 'O2', kind: 'outlet', elevation_m: 15, demand_m3s: 0.0001 });
    b.title = 'Second cut';
    a.nodes.push({ id: 'J9', kind: 'tee', elevation_m: 30, demand_m3s: 0 });
    const d = diffVersions(a, b);
    expect(d.changed).to.deep.equal([
      { id: 'O1', kind: 'outlet', name: 'Garden', fields: [{ field: 'min_pressure_m', before: 7, after: null }] },
      { id: 'P1', kind: 'pipe', fields: [{ field: 'diameter_m', before: 0.025, after: 0.032 }] },
    ]);
    expect(d.added).to.deep.equal([{ id: 'O2', kind: 'outlet' }]);
    expect(d.removed).to.deep.equal([{ id: 'J9', kind: 'tee' }]);
    expect(d.settings).to.deep.equal([{ field: 'title', before: null, after: 'Second cut' }]);
    expect(summariseDiff(d)).to.equal('changed O1 (min_pressure_m), P1 (diameter_m); added O2; removed J9; settings (title)');
  });

  it('a change to placement only is summarised as moved; long lists are cut with "+n more"', () => {
    const a = base();
    const b = structuredClone(a);
    b.nodes[0].x_m = 5;
    for (let i = 0; i < 6; i++) b.nodes.push({ id: `J${i}`, kind: 'tee', elevation_m: 30, demand_m3s: 0 });
    expect(summariseDiff(diffVersions(a, b))).to.equal('added J0, J1, J2, J3, +2 more; moved T1');
  });

  it('outlets before and after: change where both exist, null where one side lacks the outlet or results', () => {
    const a = base();
    const b = structuredClone(a);
    b.nodes.push({ id: 'O2', kind: 'outlet', elevation_m: 15, demand_m3s: 0.0001 });
    const ra = { nodes: { O1: { pressure_m: 19, demand_m3s: 0.0003 } } };
    const rb = { nodes: { O1: { pressure_m: 17.5, demand_m3s: 0.00025 }, O2: { pressure_m: 24, demand_m3s: 0.0001 } } };
    const out = compareOutlets(a, ra, b, rb);
    expect(out.map((o) => o.id)).to.deep.equal(['O1', 'O2']);
    expect(out[0].pressureChange_m).to.be.closeTo(-1.5, 1e-12);
    expect(out[0].flowChange_m3s).to.be.closeTo(-0.00005, 1e-12);
    expect(out[1].before).to.equal(null);
    expect(out[1].pressureChange_m).to.equal(null);
    expect(compareOutlets(a, null, b, rb)[0].before).to.equal(null);
  });
});
