import { expect } from 'chai';
import { createEditor } from '../../client/src/app/screens/layout/create-editor';
import { fitRect } from '../../client/src/app/screens/layout/editor/fitting';
import { surveyElevationChanges, withSurveyElevations } from '../../client/src/app/screens/layout/editor/survey';
import type { NetworkDocument } from '../../engine/network-document';

const survey = {
  points: [
    { label: 'Gate post', x_m: 0, y_m: 0, elevation_m: 52.4 },
    { label: 'Spring', x_m: 200, y_m: 80, elevation_m: 71.0 },
  ],
};

function doc(): NetworkDocument {
  return {
    schema: 'runnel.network/1',
    headloss: 'hazen-williams',
    layout: { survey },
    nodes: [
      { id: 'S1', name: 'Spring box', kind: 'source', elevation_m: 60, head_m: 60.3, x_m: 205, y_m: 80 },
      { id: 'O1', name: 'Trough', kind: 'outlet', elevation_m: 50, demand_m3s: 0.0001, x_m: 3, y_m: 4 },
      { id: 'J1', name: 'Far tee', kind: 'tee', elevation_m: 40, demand_m3s: 0, x_m: 100, y_m: -300 },
    ],
    links: [],
  };
}

describe('Layout: survey points (newcomer item 6)', () => {
  it('previews the elevation each nearby element would take, names the point and its distance, and leaves far ones alone', () => {
    const changes = surveyElevationChanges(doc());
    expect(changes.map((c) => [c.id, c.to_m, c.point])).to.deep.equal([
      ['S1', 71.0, 'Spring'],
      ['O1', 52.4, 'Gate post'],
    ]);
    expect(changes[1].distance_m).to.be.closeTo(5, 1e-9); // 3-4-5 triangle
  });

  it("applying moves a source's water surface with its ground and marks each elevation as from the survey", () => {
    const d = withSurveyElevations(doc(), surveyElevationChanges(doc()));
    const s = d.nodes.find((n) => n.id === 'S1')!;
    expect(s.elevation_m).to.equal(71);
    expect(s.kind === 'source' && s.head_m).to.be.closeTo(71.3, 1e-9);
    expect(s).to.include({ elevation_source: 'survey', elevation_from: 'Spring' });
    expect(d.nodes.find((n) => n.id === 'J1')!.elevation_m).to.equal(40);
  });

  it('is one undo step through the editor', () => {
    const ed = createEditor(doc());
    ed.store.update('elevations from survey', (d) => withSurveyElevations(d, surveyElevationChanges(d)));
    expect(ed.store.node('O1')!.elevation_m).to.equal(52.4);
    ed.undo();
    expect(ed.store.node('O1')!.elevation_m).to.equal(50);
  });

  it('Fit includes the survey points (a survey loaded before any drawing is in view)', () => {
    const r = fitRect({ ...doc(), nodes: [] }, null);
    expect([r.x, r.y, r.x + r.width, r.y + r.height]).to.deep.equal([0, 0, 200, 80]);
  });

  it('an element placed or dragged within 10 px of a survey point snaps onto it and takes its elevation', () => {
    const ed = createEditor({ ...doc(), nodes: [] }, 800, 600);
    ed.fitToView();
    const px = ed.viewport.metres(1);
    const id = ed.placeNode('tee', { x: 200 + 6 * px, y: 80 - 3 * px })!;
    const n = ed.store.node(id)!;
    expect([n.x_m, n.y_m, n.elevation_m]).to.deep.equal([200, 80, 71]);
    expect(n).to.include({ elevation_source: 'survey', elevation_from: 'Spring' });
  });
});
