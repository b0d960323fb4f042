/**
 * Headless Layout editor checks: pointer and key input driven in a chain, asserting the tool
 * state and the document. No browser, no Angular, no Konva.
 */
import { expect } from 'chai';
import type { Editor } from '../../client/src/app/screens/layout/editor/editor';
import { unsetElevations } from '../../client/src/app/screens/layout/editor/survey';
import { createEditor } from '../../client/src/app/screens/layout/create-editor';
import type { PointerInput } from '../../client/src/app/screens/layout/tools/tool';
import type { PipeLink, TankNode } from '../../engine/network-document';

/** A pointer event at a world point (the editor's viewport gives the screen point). */
function at(ed: Editor, x: number, y: number, extra: Partial<PointerInput> = {}): PointerInput {
  const world = { x, y };
  return { world, screen: ed.viewport.toScreen(world), button: 0, shift: false, mod: false, ...extra };
}

function click(ed: Editor, x: number, y: number, extra: Partial<PointerInput> = {}): void {
  ed.pointerDown(at(ed, x, y, extra));
  ed.pointerUp(at(ed, x, y, extra));
}

function drag(ed: Editor, from: [number, number], to: [number, number], extra: Partial<PointerInput> = {}): void {
  ed.pointerDown(at(ed, from[0], from[1], extra));
  ed.pointerMove(at(ed, (from[0] + to[0]) / 2, (from[1] + to[1]) / 2, extra));
  ed.pointerMove(at(ed, to[0], to[1], extra));
  ed.pointerUp(at(ed, to[0], to[1], extra));
}

/** Editor at 4 px/m with the world origin at the canvas centre. */
function editor(): Editor {
  return createEditor(undefined, 800, 600);
}

describe('Layout editor: placing elements', () => {
  it('place tool puts a tank on the grid, selects it and returns to Select', () => {
    const ed = editor();
    ed.setTool('place', 'tank');
    click(ed, 10.3, 4.8);
    const t = ed.store.doc.nodes[0] as TankNode;
    expect(t).to.include({ id: 'T1', kind: 'tank', x_m: 10, y_m: 5 });
    expect([...ed.selection]).to.deep.equal(['T1']);
    expect(ed.activeTool.id).to.equal('select');
  });

  it('numbers ids after the highest in use and undoes each placement as one step', () => {
    const ed = editor();
    ed.placeNode('tee', { x: 0, y: 0 });
    ed.placeNode('tee', { x: 5, y: 0 });
    expect(ed.store.doc.nodes.map((n) => n.id)).to.deep.equal(['J1', 'J2']);
    ed.handleKey('z', { mod: true, shift: false });
    expect(ed.store.doc.nodes.map((n) => n.id)).to.deep.equal(['J1']);
    ed.handleKey('z', { mod: true, shift: true });
    expect(ed.store.doc.nodes.map((n) => n.id)).to.deep.equal(['J1', 'J2']);
  });

  it('read-only editors place nothing', () => {
    const ed = editor();
    ed.readOnly = true;
    expect(ed.placeNode('tank', { x: 0, y: 0 })).to.equal(null);
    ed.setTool('link', 'pipe');
    expect(ed.activeTool.id).to.equal('select');
    expect(ed.store.doc.nodes).to.have.length(0);
  });
});

describe('Layout editor: drawing a pipe', () => {
  it('start element, two bend points, end element → one pipe with vertices and the drawn length', () => {
    const ed = editor();
    ed.placeNode('tank', { x: 0, y: 0 });
    ed.placeNode('outlet', { x: 30, y: 40 });
    ed.setTool('link', 'pipe');
    click(ed, 0, 0);
    expect(ed.activeTool.state).to.equal('drawing');
    click(ed, 0, 40);
    click(ed, 10, 40);
    expect(ed.store.doc.links).to.have.length(0);
    expect(ed.preview.rubberBand).to.have.length(4);
    click(ed, 30, 40);
    const p = ed.store.doc.links[0] as PipeLink;
    expect(p).to.include({ id: 'P1', from: 'T1', to: 'O1', kind: 'pipe' });
    expect(p.vertices).to.deep.equal([
      [0, 40],
      [10, 40],
    ]);
    expect(p.length_m).to.equal(70); // 40 + 10 + 20 along the drawn polyline
    expect(ed.activeTool.state).to.equal('idle');
    ed.undo();
    expect(ed.store.doc.links).to.have.length(0);
    expect(ed.store.doc.nodes).to.have.length(2);
  });

  it('Escape abandons a line in progress and leaves the document untouched', () => {
    const ed = editor();
    ed.placeNode('tank', { x: 0, y: 0 });
    const before = ed.store.doc;
    ed.setTool('link', 'pump');
    click(ed, 0, 0);
    click(ed, 10, 10);
    ed.handleKey('Escape', { mod: false, shift: false });
    expect(ed.activeTool.state).to.equal('idle');
    expect(ed.store.doc).to.equal(before);
    expect(ed.preview).to.deep.equal({});
  });

  it('Backspace drops the last bend point; clicking empty space first does not start a line', () => {
    const ed = editor();
    ed.placeNode('source', { x: 0, y: 0 });
    ed.placeNode('tank', { x: 20, y: 0 });
    ed.setTool('link', 'valve');
    click(ed, 50, 50);
    expect(ed.activeTool.state).to.equal('idle');
    click(ed, 0, 0);
    click(ed, 10, 10);
    ed.handleKey('Backspace', { mod: false, shift: false });
    click(ed, 20, 0);
    expect(ed.store.doc.links[0]).to.include({ kind: 'valve', from: 'S1', to: 'T1' });
    expect(ed.store.doc.links[0].vertices).to.deep.equal([]);
  });
});

describe('Layout editor: selecting and moving', () => {
  function twoTanksAndPipe(): Editor {
    const ed = editor();
    ed.placeNode('tank', { x: 0, y: 0 });
    ed.placeNode('tee', { x: 30, y: 0 });
    ed.addLink('pipe', 'T1', 'J1');
    ed.select([]);
    return ed;
  }

  it('click selects, shift-click adds, click on empty space clears', () => {
    const ed = twoTanksAndPipe();
    click(ed, 0, 0);
    expect([...ed.selection]).to.deep.equal(['T1']);
    click(ed, 30, 0, { shift: true });
    expect([...ed.selection].sort()).to.deep.equal(['J1', 'T1']);
    click(ed, 15, 0.2); // on the pipe
    expect([...ed.selection]).to.deep.equal(['P1']);
    click(ed, 15, 40);
    expect(ed.selection.size).to.equal(0);
  });

  it('marquee selects the nodes inside and the links wholly inside', () => {
    const ed = twoTanksAndPipe();
    drag(ed, [-5, -5], [10, 5]);
    expect([...ed.selection]).to.deep.equal(['T1']);
    drag(ed, [-5, -5], [35, 5]);
    expect([...ed.selection].sort()).to.deep.equal(['J1', 'P1', 'T1']);
  });

  it('dragging a node snaps it, carries the pipe end, re-measures the pipe, and is one undo step', () => {
    const ed = twoTanksAndPipe();
    drag(ed, [30, 0], [30.4, 39.7]);
    expect(ed.store.node('J1')).to.include({ x_m: 30, y_m: 40 });
    expect((ed.store.link('P1') as PipeLink).length_m).to.equal(50); // 30-40-50 triangle
    ed.undo();
    expect(ed.store.node('J1')).to.include({ x_m: 30, y_m: 0 });
    expect((ed.store.link('P1') as PipeLink).length_m).to.equal(30);
    expect(ed.store.canUndo()).to.equal(true); // the pipe and placements are still there
  });

  it('Escape during a drag rolls the move back', () => {
    const ed = twoTanksAndPipe();
    const before = ed.store.doc;
    ed.pointerDown(at(ed, 0, 0));
    ed.pointerMove(at(ed, 10, 10));
    expect(ed.activeTool.state).to.equal('dragging');
    ed.handleKey('Escape', { mod: false, shift: false });
    expect(ed.store.doc).to.equal(before);
  });

  it('a typed pipe length is kept when its ends move', () => {
    const ed = twoTanksAndPipe();
    ed.store.patchElement('P1', { length_m: 75, length_source: 'typed' });
    drag(ed, [30, 0], [60, 0]);
    expect((ed.store.link('P1') as PipeLink).length_m).to.equal(75);
  });

  it('delete removes the selection and the links attached to deleted nodes', () => {
    const ed = twoTanksAndPipe();
    click(ed, 0, 0);
    ed.handleKey('Delete', { mod: false, shift: false });
    expect(ed.store.doc.nodes.map((n) => n.id)).to.deep.equal(['J1']);
    expect(ed.store.doc.links).to.have.length(0);
    ed.handleKey('z', { mod: true, shift: false });
    expect(ed.store.doc.links).to.have.length(1);
  });

  it('copy and paste duplicates nodes and the links among them with new ids', () => {
    const ed = twoTanksAndPipe();
    ed.handleKey('a', { mod: true, shift: false });
    ed.handleKey('c', { mod: true, shift: false });
    ed.handleKey('v', { mod: true, shift: false });
    expect(ed.store.doc.nodes.map((n) => n.id)).to.deep.equal(['T1', 'J1', 'T2', 'J2']);
    expect(ed.store.doc.links.map((l) => [l.id, l.from, l.to])).to.deep.equal([
      ['P1', 'T1', 'J1'],
      ['P2', 'T2', 'J2'],
    ]);
    expect([...ed.selection].sort()).to.deep.equal(['J2', 'P2', 'T2']);
    ed.handleKey('z', { mod: true, shift: false });
    expect(ed.store.doc.nodes).to.have.length(2);
  });
});

describe('Layout editor: view and scale', () => {
  it('zooming at the cursor keeps the world point under it', () => {
    const ed = editor();
    const screen = { x: 123, y: 456 };
    const before = ed.viewport.toWorld(screen);
    ed.zoomAt(screen, 2.5);
    const after = ed.viewport.toWorld(screen);
    expect(after.x).to.be.closeTo(before.x, 1e-9);
    expect(after.y).to.be.closeTo(before.y, 1e-9);
  });

  it('space + drag pans without changing the tool or the document', () => {
    const ed = editor();
    ed.placeNode('tee', { x: 0, y: 0 });
    const doc = ed.store.doc;
    const x0 = ed.viewport.originX;
    ed.spaceHeld = true;
    ed.pointerDown({ world: { x: 0, y: 0 }, screen: { x: 100, y: 100 }, button: 0, shift: false, mod: false });
    ed.pointerMove({ world: { x: 0, y: 0 }, screen: { x: 150, y: 100 }, button: 0, shift: false, mod: false });
    ed.pointerUp({ world: { x: 0, y: 0 }, screen: { x: 150, y: 100 }, button: 0, shift: false, mod: false });
    expect(ed.viewport.originX - x0).to.equal(50);
    expect(ed.store.doc).to.equal(doc);
  });

  it('calibrating with two points rescales the plan and re-measures pipes, as one undo step', () => {
    const ed = editor();
    ed.placeNode('tank', { x: 0, y: 0 });
    ed.placeNode('tee', { x: 10, y: 0 });
    ed.addLink('pipe', 'T1', 'J1');
    let asked: [number, number] | null = null;
    ed.onCalibrationRequest = (a, b) => (asked = [a.x, b.x]);
    ed.setTool('calibrate');
    click(ed, 0, 0);
    click(ed, 10, 0);
    expect(asked).to.deep.equal([0, 10]);
    expect(ed.activeTool.state).to.equal('asking');
    ed.applyCalibration({ x: 0, y: 0 }, { x: 10, y: 0 }, 25);
    expect(ed.store.node('J1')?.x_m).to.be.closeTo(25, 1e-9);
    expect((ed.store.link('P1') as PipeLink).length_m).to.equal(25);
    ed.undo();
    expect(ed.store.node('J1')?.x_m).to.equal(10);
  });
});

describe('Layout editor: change notification', () => {
  it('listeners already see an edit as undoable when they are told about it', () => {
    const ed = editor();
    const seen: boolean[] = [];
    ed.store.subscribe(() => seen.push(ed.store.canUndo()));
    ed.placeNode('tee', { x: 0, y: 0 });
    ed.undo();
    expect(seen).to.deep.equal([true, false]);
  });
});

describe('Layout editor: lengths from elsewhere', () => {
  it('marks a loaded pipe whose length differs from its drawing as typed, and leaves matching ones alone', async () => {
    const { markTypedLengths } = await import('../../client/src/app/screens/layout/editor/document-store');
    const ed = editor();
    ed.placeNode('tank', { x: 0, y: 0 });
    ed.placeNode('tee', { x: 30, y: 40 });
    ed.addLink('pipe', 'T1', 'J1');
    ed.addLink('pipe', 'J1', 'T1');
    ed.store.patchElement('P2', { length_m: 80, length_source: undefined });
    const raw = { ...ed.store.doc, links: ed.store.doc.links.map((l) => (l.id === 'P2' ? { ...l, length_m: 80 } : l)) };
    const marked = markTypedLengths(raw);
    expect((marked.links[0] as { length_source?: string }).length_source).to.equal(undefined); // drawn 50 m = stored 50 m
    expect((marked.links[1] as { length_source?: string }).length_source).to.equal('typed');
  });
});

describe('Layout editor: scaling the backdrop only', () => {
  it('with network: false only the backdrop changes scale (about the first point)', () => {
    const ed = editor();
    ed.placeNode('tee', { x: 10, y: 0 });
    ed.store.patchLayout({ backdrop: { fileId: 'f', opacity: 0.5, x_m: 0, y_m: 0, m_per_px: 0.1, width_px: 100, height_px: 100 } });
    ed.applyCalibration({ x: 0, y: 0 }, { x: 10, y: 0 }, 20, { network: false });
    expect(ed.store.node('J1')?.x_m).to.equal(10);
    expect(ed.backdrop()?.m_per_px).to.be.closeTo(0.2, 1e-12);
    expect(ed.backdrop()?.scale?.distance_m).to.equal(20);
  });
});

describe('Layout editor: elevation of new elements', () => {
  const source = (ed: ReturnType<typeof editor>, id: string) => ed.store.node(id) as { elevation_source?: string; elevation_from?: string } | undefined;

  it('newcomer item 1: the first element has an unset elevation (marked, asked for), and so does one placed beside an unset one', () => {
    const ed = editor();
    ed.placeNode('tank', { x: 0, y: 0 });
    expect(source(ed, 'T1')?.elevation_source).to.equal('unset');
    expect(ed.message).to.match(/What is the ground elevation at T1\?/);
    ed.placeNode('tee', { x: 20, y: 0 });
    expect(source(ed, 'J1')?.elevation_source).to.equal('unset');
    expect(unsetElevations(ed.store.doc)).to.deep.equal(['T1', 'J1']);
  });

  it('takes the nearest survey point, else the nearest node (marked with where it came from), else leaves it unset', () => {
    const ed = editor();
    ed.placeNode('tank', { x: 0, y: 0 });
    expect(ed.store.node('T1')?.elevation_m).to.equal(0);
    // What the Elevation field writes when a value is typed (kinds/kind-types.ts elevationField).
    ed.store.patchElement('T1', { elevation_m: 41, elevation_source: undefined });
    ed.placeNode('tee', { x: 20, y: 0 });
    expect(ed.store.node('J1')?.elevation_m).to.equal(41);
    expect(source(ed, 'J1')).to.include({ elevation_source: 'nearest', elevation_from: 'T1' });
    ed.store.patchLayout({ survey: { points: [{ x_m: 100, y_m: 0, elevation_m: 18 }] } });
    ed.placeNode('source', { x: 90, y: 0 });
    const s = ed.store.node('S1');
    expect(s?.elevation_m).to.equal(18);
    expect(s?.kind === 'source' && s.head_m).to.be.closeTo(18.3, 1e-9); // water surface keeps its 0.3 m over the box
    expect(source(ed, 'S1')?.elevation_source).to.equal('survey');
  });
});

describe('Layout editor: bend points', () => {
  it('dragging a bend point of the selected pipe moves it (snapped), re-measures, and is one undo step', () => {
    const ed = editor();
    ed.placeNode('tank', { x: 0, y: 0 });
    ed.placeNode('tee', { x: 30, y: 0 });
    ed.addLink('pipe', 'T1', 'J1', [[15, 0]]);
    ed.select(['P1']);
    drag(ed, [15, 0], [15.2, 19.9]);
    expect(ed.store.link('P1')?.vertices).to.deep.equal([[15, 20]]);
    expect((ed.store.link('P1') as PipeLink).length_m).to.equal(50); // two 15-20-25 legs
    ed.undo();
    expect(ed.store.link('P1')?.vertices).to.deep.equal([[15, 0]]);
  });
});

describe('Layout editor: moving the backdrop', () => {
  it('a drag slides the backdrop by the pointer travel as one undo step; Escape mid-drag puts it back', () => {
    const ed = editor();
    ed.store.patchLayout({ backdrop: { fileId: 'f', opacity: 0.5, x_m: 0, y_m: 0, m_per_px: 0.1, width_px: 100, height_px: 100 } });
    ed.setTool('backdrop');
    drag(ed, [5, 5], [12, 2]);
    expect(ed.backdrop()).to.include({ x_m: 7, y_m: -3 });
    ed.pointerDown(at(ed, 0, 0));
    ed.pointerMove(at(ed, 50, 50));
    ed.handleKey('Escape', { mod: false, shift: false });
    expect(ed.backdrop()).to.include({ x_m: 7, y_m: -3 });
    ed.undo();
    expect(ed.backdrop()).to.include({ x_m: 0, y_m: 0 });
  });
});

describe('Layout editor: revealing an element', () => {
  it('selects it and centres the view only when it is off screen', () => {
    const ed = editor();
    ed.placeNode('tee', { x: 10, y: 10 });
    ed.placeNode('outlet', { x: 1000, y: 0 });
    const origin = ed.viewport.originX;
    ed.reveal('J1');
    expect(ed.viewport.originX).to.equal(origin);
    ed.reveal('O1');
    expect([...ed.selection]).to.deep.equal(['O1']);
    const s = ed.viewport.toScreen({ x: 1000, y: 0 });
    expect(s).to.deep.equal({ x: 400, y: 300 });
  });
});
