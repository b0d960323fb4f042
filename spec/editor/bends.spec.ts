/**
 * Adding and removing bend points on a selected line, headlessly: double-click on the line, the
 * add-bend handle at a segment's middle, double-click on a bend, click a bend then Delete. Each
 * is one undo step, and a drawn pipe's length follows its new shape.
 */
import { expect } from 'chai';
import type { Editor } from '../../client/src/app/screens/layout/editor/editor';
import { createEditor } from '../../client/src/app/screens/layout/create-editor';
import type { PointerInput } from '../../client/src/app/screens/layout/tools/tool';
import type { PipeLink } from '../../engine/network-document';

function at(ed: Editor, x: number, y: number): PointerInput {
  const world = { x, y };
  return { world, screen: ed.viewport.toScreen(world), button: 0, shift: false, mod: false };
}

function click(ed: Editor, x: number, y: number): void {
  ed.pointerDown(at(ed, x, y));
  ed.pointerUp(at(ed, x, y));
}

/** A browser double-click: two clicks, then the dblclick event. */
function doubleClick(ed: Editor, x: number, y: number): boolean {
  click(ed, x, y);
  click(ed, x, y);
  return ed.doubleClick(at(ed, x, y));
}

/** Tank T1 at (0, 0), tee J1 at (40, 0), pipe P1 between them with `vertices`; 4 px/m. */
function pipeEditor(vertices: [number, number][] = []): Editor {
  const ed = createEditor(undefined, 800, 600);
  ed.placeNode('tank', { x: 0, y: 0 });
  ed.placeNode('tee', { x: 40, y: 0 });
  ed.addLink('pipe', 'T1', 'J1', vertices);
  ed.select([]);
  return ed;
}

const pipe = (ed: Editor) => ed.store.link('P1') as PipeLink;

describe('Layout editor: adding and removing bend points', () => {
  it('double-click on a pipe selects it and adds a bend on the line there, as one undo step', () => {
    const ed = pipeEditor();
    expect(doubleClick(ed, 12, 0.4)).to.equal(true);
    expect([...ed.selection]).to.deep.equal(['P1']);
    expect(pipe(ed).vertices).to.deep.equal([[12, 0]]);
    expect(pipe(ed).length_m).to.be.closeTo(40, 1e-9); // on the line: the length is unchanged
    expect(ed.selectedVertex).to.deep.equal({ link: 'P1', index: 0 });
    ed.undo();
    expect(pipe(ed).vertices ?? []).to.deep.equal([]);
    ed.undo(); // the step before was adding the pipe
    expect(ed.store.link('P1')).to.equal(undefined);
  });

  it('a bend goes into the segment it was added on, keeping the order along the line', () => {
    const ed = pipeEditor([
      [10, 20],
      [30, 20],
    ]);
    ed.select(['P1']);
    ed.doubleClick(at(ed, 20, 20.3)); // middle segment
    expect(pipe(ed).vertices).to.deep.equal([
      [10, 20],
      [20, 20],
      [30, 20],
    ]);
    ed.doubleClick(at(ed, 35, 10)); // last segment, (30,20)→(40,0)
    expect(pipe(ed).vertices?.length).to.equal(4);
    expect(pipe(ed).vertices?.[3][0]).to.be.closeTo(35, 1e-9);
    expect(pipe(ed).vertices?.[3][1]).to.be.closeTo(10, 1e-9);
  });

  it('dragging the + handle at a segment middle adds a bend and moves it (snapped) in one undo step; the length follows', () => {
    const ed = pipeEditor();
    ed.select(['P1']);
    const handles = ed.segmentHandles();
    expect(handles).to.have.length(1);
    expect(ed.viewport.toWorld(handles[0].screen)).to.deep.equal({ x: 20, y: 0 });
    ed.pointerDown(at(ed, 20, 0));
    ed.pointerMove(at(ed, 20, 8));
    ed.pointerMove(at(ed, 20.2, 15.1));
    ed.pointerUp(at(ed, 20.2, 15.1));
    expect(pipe(ed).vertices).to.deep.equal([[20, 15]]);
    expect(pipe(ed).length_m).to.be.closeTo(50, 1e-9); // two 20-15-25 legs
    ed.undo();
    expect(pipe(ed).vertices ?? []).to.deep.equal([]);
    expect(pipe(ed).length_m).to.be.closeTo(40, 1e-9);
  });

  it('Escape while dragging a new bend takes it away again', () => {
    const ed = pipeEditor();
    ed.select(['P1']);
    ed.pointerDown(at(ed, 20, 0));
    ed.pointerMove(at(ed, 20, 10));
    ed.handleKey('Escape', { mod: false, shift: false });
    expect(pipe(ed).vertices ?? []).to.deep.equal([]);
    expect(ed.store.canUndo()).to.equal(true); // only the earlier placing steps
    ed.undo();
    expect(ed.store.link('P1')).to.equal(undefined);
  });

  it('double-click on a bend removes it, as one undo step', () => {
    const ed = pipeEditor([[20, 10]]);
    ed.select(['P1']);
    expect(doubleClick(ed, 20, 10)).to.equal(true);
    expect(pipe(ed).vertices).to.deep.equal([]);
    expect(pipe(ed).length_m).to.be.closeTo(40, 1e-9);
    ed.undo();
    expect(pipe(ed).vertices).to.deep.equal([[20, 10]]);
    ed.redo();
    expect(pipe(ed).vertices).to.deep.equal([]);
  });

  it('a click on a bend chooses it and Delete removes only that bend, not the pipe', () => {
    const ed = pipeEditor([
      [10, 10],
      [30, 10],
    ]);
    ed.select(['P1']);
    click(ed, 30, 10);
    expect(ed.selectedVertex).to.deep.equal({ link: 'P1', index: 1 });
    expect(pipe(ed).vertices).to.deep.equal([
      [10, 10],
      [30, 10],
    ]); // a click does not move it
    ed.handleKey('Delete', { mod: false, shift: false });
    expect(pipe(ed).vertices).to.deep.equal([[10, 10]]);
    expect([...ed.selection]).to.deep.equal(['P1']);
    ed.undo();
    expect(pipe(ed).vertices).to.deep.equal([
      [10, 10],
      [30, 10],
    ]);
    // With no bend chosen, Delete removes the pipe as before.
    ed.select([]);
    ed.select(['P1']);
    ed.handleKey('Delete', { mod: false, shift: false });
    expect(ed.store.link('P1')).to.equal(undefined);
  });

  it('a click that only chooses a bend adds no undo step', () => {
    const ed = pipeEditor([[20, 10]]);
    ed.select(['P1']);
    click(ed, 20, 10);
    expect(ed.selectedVertex).to.deep.equal({ link: 'P1', index: 0 });
    ed.undo();
    expect(ed.store.link('P1')).to.equal(undefined); // the undo removed the pipe, not a no-op
  });

  it('read-only editors neither add nor remove bends', () => {
    const ed = pipeEditor([[20, 10]]);
    ed.readOnly = true;
    ed.select(['P1']);
    expect(ed.doubleClick(at(ed, 20, 10))).to.equal(false);
    expect(ed.doubleClick(at(ed, 5, 2.5))).to.equal(false);
    expect(ed.segmentHandles()).to.deep.equal([]);
    expect(pipe(ed).vertices).to.deep.equal([[20, 10]]);
  });
});
