/** The save-conflict summary: what each side changed, compared element by element. */
import { expect } from 'chai';
import type { NetworkDocument, PipeLink, TeeNode } from '../../engine/network-document';
import { conflictSummary, describeChanges } from '../../client/src/app/screens/layout/editor/document-diff';
import { diffVersions } from '../../engine/review/version-diff';

function base(): NetworkDocument {
  return {
    schema: 'runnel.network/1',
    headloss: 'hazen-williams',
    nodes: [
      { id: 'T1', kind: 'tank', name: 'Ridge tank', elevation_m: 40, diameter_m: 1.6, level_m: 1.2, min_level_m: 0.1, max_level_m: 1.5, x_m: 0, y_m: 0 },
      { id: 'J1', kind: 'tee', name: 'Upper tee', elevation_m: 30, demand_m3s: 0, x_m: 10, y_m: 0 },
      { id: 'O1', kind: 'outlet', name: 'Garden', elevation_m: 20, demand_m3s: 0.0003, min_pressure_m: 7, x_m: 20, y_m: 0 },
    ],
    links: [
      { id: 'P1', kind: 'pipe', from: 'T1', to: 'J1', length_m: 10, diameter_m: 0.025, roughness: 140 },
      { id: 'P4', kind: 'pipe', from: 'J1', to: 'O1', length_m: 10, diameter_m: 0.025, roughness: 140 },
    ],
  } as NetworkDocument;
}

describe('Layout editor: document diff for the save conflict', () => {
  it('finds changed, added and removed elements by id; key order and identical copies do not count', () => {
    const a = base();
    const b = structuredClone(a);
    b.nodes[1] = { ...b.nodes[1], elevation_m: 31 };
    b.links[1] = { ...(b.links[1] as PipeLink), diameter_m: 0.032 };
    // Same tank, keys in another order: no change.
    const t = b.nodes[0] as unknown as Record<string, unknown>;
    b.nodes[0] = Object.fromEntries(Object.entries(t).reverse()) as never;
    b.nodes.push({ id: 'O2', kind: 'outlet', name: 'East trough', elevation_m: 15, demand_m3s: 0.0001, min_pressure_m: 3, x_m: 30, y_m: 0 } as never);
    b.links = b.links.filter((l) => l.id !== 'P1');
    const d = diffVersions(a, b);
    expect(d.changed.map((e) => e.id)).to.deep.equal(['J1', 'P4']);
    expect(d.added.map((e) => e.id)).to.deep.equal(['O2']);
    expect(d.removed.map((e) => e.id)).to.deep.equal(['P1']);
    expect(d.settings).to.deep.equal([]);
    expect(describeChanges(d)).to.equal('2 elements changed (Upper tee, P4), 1 added (East trough), 1 removed (P1)');
  });

  it('summarises each side against the version both started from', () => {
    const start = base();
    const theirs = structuredClone(start);
    theirs.nodes[1] = { ...(theirs.nodes[1] as TeeNode), demand_m3s: 0.0001 };
    theirs.nodes.push({ id: 'O2', kind: 'outlet', name: 'East trough', elevation_m: 15, demand_m3s: 0.0001, min_pressure_m: 3 } as never);
    const mine = structuredClone(start);
    mine.nodes = mine.nodes.map((n) => ({ ...n, x_m: (n.x_m ?? 0) + 1 }));
    expect(conflictSummary(start, mine, theirs)).to.equal(
      'Theirs: 1 element changed (Upper tee), 1 added (East trough); yours: 3 elements changed (Ridge tank, Upper tee, Garden).',
    );
  });

  it('long lists are cut after three names; settings changes are mentioned; no base compares the copies directly', () => {
    const a = base();
    const b = structuredClone(a);
    b.nodes = b.nodes.map((n) => ({ ...n, elevation_m: n.elevation_m + 1 }));
    b.links = b.links.map((l) => ({ ...l, roughness: 130 }));
    (b as { title?: string }).title = 'Renamed';
    expect(describeChanges(diffVersions(a, b))).to.equal('5 elements changed (Ridge tank, Upper tee, Garden, +2 more), network settings changed');
    expect(conflictSummary(null, a, a)).to.equal('Their copy compared with yours: no changes.');
  });
});
