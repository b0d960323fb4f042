/**
 * Label placement, symbol sizing and fitting (pure TypeScript, no browser). The identities
 * checked are the ones that define the placement: no two placed labels intersect, none covers a
 * symbol or a reserved area, none leaves the canvas, and a higher-priority label is never
 * displaced by a lower one.
 */
import { expect } from 'chai';
import fc from 'fast-check';
import { createEditor } from '../../client/src/app/screens/layout/create-editor';
import {
  around,
  besideLine,
  Box,
  BoxGrid,
  boxesIntersect,
  LabelRequest,
  placeLabels,
  symbolBox,
} from '../../client/src/app/screens/layout/editor/label-placement';
import { MIN_SYMBOL_SCALE, nearestDistances, symbolScale } from '../../client/src/app/screens/layout/editor/symbol-size';
import { hillSmallholding } from '../../engine/examples/hill-smallholding';
import type { NetworkDocument } from '../../engine/network-document';

const CANVAS: Box = { x: 0, y: 0, w: 960, h: 640 };

function expectNoOverlaps(placed: Box[], obstacles: Box[]): void {
  for (let i = 0; i < placed.length; i++) {
    for (let j = i + 1; j < placed.length; j++) expect(boxesIntersect(placed[i], placed[j]), `labels ${i} and ${j}`).to.equal(false);
    for (const o of obstacles) expect(boxesIntersect(placed[i], o), `label ${i} on an obstacle`).to.equal(false);
    expect(placed[i].x >= CANVAS.x && placed[i].y >= CANVAS.y && placed[i].x + placed[i].w <= CANVAS.w && placed[i].y + placed[i].h <= CANVAS.h).to.equal(true);
  }
}

/** Requests and symbol obstacles for point symbols of radius 12 at the given screen points. */
function pointLabels(points: { x: number; y: number }[], size = { w: 60, h: 13 }): { requests: LabelRequest[]; obstacles: Box[] } {
  const obstacles = points.map((p) => symbolBox(p, 12));
  const requests = points.map((p, i) => ({ id: 'n' + i, priority: i % 3, candidates: around(p, 12, [{ w: size.w, h: size.h + 17 }, size]) }));
  return { requests, obstacles };
}

describe('Layout labels: greedy placement', () => {
  it('a lone label goes to the first side offered (right of the symbol)', () => {
    const placed = placeLabels(
      [{ id: 'A', priority: 0, candidates: around({ x: 100, y: 100 }, 12, [{ w: 40, h: 12 }]) }],
      [symbolBox({ x: 100, y: 100 }, 12)],
      CANVAS,
    );
    expect(placed.get('A')?.side).to.equal('right');
    expect(placed.get('A')?.box.x).to.be.greaterThan(112);
  });

  it('a tight cluster (three symbols 11 px apart, like a wellhead beside its well) never prints labels over each other or over symbols', () => {
    const pts = [
      { x: 300, y: 300 },
      { x: 309, y: 294 },
      { x: 318, y: 288 },
      { x: 330, y: 300 },
    ];
    const { requests, obstacles } = pointLabels(pts);
    const placed = placeLabels(requests, obstacles, CANVAS);
    expect(placed.size).to.be.greaterThan(0);
    expectNoOverlaps(
      [...placed.values()].map((p) => p.box),
      obstacles,
    );
  });

  it('drops labels that fit nowhere instead of overlapping them', () => {
    const pts = Array.from({ length: 30 }, (_, i) => ({ x: 400 + (i % 6) * 8, y: 300 + Math.floor(i / 6) * 8 }));
    const { requests, obstacles } = pointLabels(pts);
    const placed = placeLabels(requests, obstacles, CANVAS);
    expect(placed.size).to.be.lessThan(30);
    expectNoOverlaps(
      [...placed.values()].map((p) => p.box),
      obstacles,
    );
  });

  it('places in priority order: the first-ranked label keeps its preferred side even when listed last', () => {
    const p = { x: 200, y: 200 };
    const q = { x: 200, y: 222 }; // q's right-hand label would sit where p's wants to be
    const requests: LabelRequest[] = [
      { id: 'tee', priority: 3, candidates: around(q, 10, [{ w: 50, h: 40 }], ['right']) },
      { id: 'outlet', priority: 1, candidates: around(p, 10, [{ w: 50, h: 40 }], ['right']) },
    ];
    const placed = placeLabels(requests, [], CANVAS);
    expect(placed.has('outlet')).to.equal(true);
    expect(placed.has('tee')).to.equal(false);
  });

  it('keeps labels off reserved screen areas (legend, scale bar) and inside the canvas', () => {
    const legend = { x: 740, y: 560, w: 210, h: 70 };
    const p = { x: 730, y: 590 };
    const placed = placeLabels([{ id: 'A', priority: 0, candidates: around(p, 12, [{ w: 60, h: 30 }]) }], [legend, symbolBox(p, 12)], CANVAS);
    expect(placed.get('A')?.side).to.equal('left');
    expectNoOverlaps([placed.get('A')!.box], [legend]);
  });

  it('velocity labels: none on a pipe shorter on screen than the label plus a margin; beside, not on, a long one', () => {
    expect(besideLine({ x: 0, y: 0 }, { x: 50, y: 0 }, { w: 40, h: 12 })).to.deep.equal([]);
    const c = besideLine({ x: 0, y: 100 }, { x: 200, y: 100 }, { w: 40, h: 12 });
    expect(c.length).to.be.greaterThan(1);
    for (const { box } of c) expect(box.y + box.h <= 100 || box.y >= 100).to.equal(true);
    // A diagonal line: the box clears the line at its middle.
    const d = besideLine({ x: 0, y: 0 }, { x: 200, y: 200 }, { w: 40, h: 12 })[0].box;
    const corners = [
      [d.x, d.y],
      [d.x + d.w, d.y],
      [d.x, d.y + d.h],
      [d.x + d.w, d.y + d.h],
    ].map(([x, y]) => y - x);
    expect(corners.every((s) => s > 0) || corners.every((s) => s < 0)).to.equal(true);
  });

  it('property: for random plans of up to 500 symbols, placed labels never intersect each other, symbols or the canvas edge', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ x: fc.integer({ min: 0, max: 960 }), y: fc.integer({ min: 0, max: 640 }) }), { minLength: 1, maxLength: 500 }),
        (pts) => {
          const { requests, obstacles } = pointLabels(pts);
          const placed = [...placeLabels(requests, obstacles, CANVAS).values()].map((p) => p.box);
          for (let i = 0; i < placed.length; i++) {
            for (let j = i + 1; j < placed.length; j++) if (boxesIntersect(placed[i], placed[j])) return false;
            if (obstacles.some((o) => boxesIntersect(o, placed[i]))) return false;
          }
          return true;
        },
      ),
      { numRuns: 25 },
    );
  });

  it('the grid finds a box spanning several cells', () => {
    const g = new BoxGrid(10);
    g.add({ x: 0, y: 0, w: 100, h: 5 });
    expect(g.hits({ x: 95, y: 1, w: 2, h: 2 })).to.equal(true);
    expect(g.hits({ x: 95, y: 6, w: 2, h: 2 })).to.equal(false);
  });
});

describe('Layout symbols: size with zoom and crowding', () => {
  it('full 24 px when zoomed in and uncrowded; never below the minimum', () => {
    expect(symbolScale(200, 4)).to.equal(1);
    expect(symbolScale(2, 0.1)).to.equal(MIN_SYMBOL_SCALE);
    expect(symbolScale(200, 1)).to.be.within(0.6, 0.7); // whole-site zoom: smaller but readable
  });

  it('nearest distances match a brute-force search', () => {
    fc.assert(
      fc.property(
        fc.array(fc.record({ x: fc.double({ min: -500, max: 500, noNaN: true }), y: fc.double({ min: -500, max: 500, noNaN: true }) }), {
          minLength: 2,
          maxLength: 60,
        }),
        (pts) => {
          const fast = nearestDistances(pts);
          return pts.every((p, i) => {
            const brute = Math.min(...pts.filter((_, j) => j !== i).map((q) => Math.hypot(q.x - p.x, q.y - p.y)));
            return Math.abs(brute - fast[i]) < 1e-9;
          });
        },
      ),
      { numRuns: 50 },
    );
  });

  it('demo plan at fit zoom: the two ridge tanks 8 m apart shrink, and a click on each picks that tank', () => {
    const ed = createEditor(structuredClone(hillSmallholding) as NetworkDocument, 956, 645);
    ed.fitToView();
    expect(ed.symbolScale('T1')).to.be.lessThan(0.7);
    for (const id of ['T1', 'T2', 'W', 'WH', 'WH2', 'J4', 'J5']) {
      const n = ed.store.node(id)!;
      expect(ed.hitTest(ed.viewport.toScreen({ x: n.x_m!, y: n.y_m! })), id).to.equal(id);
    }
  });
});

describe('Layout view: fitting the network', () => {
  it('the first fit keeps every element inside the margins, clear of the legend (bottom right) and scale bar (bottom left)', () => {
    for (const [w, h] of [
      [956, 645],
      [916, 536],
    ]) {
      const ed = createEditor(structuredClone(hillSmallholding) as NetworkDocument, w, h);
      ed.fitToView();
      const m = ed.fitInsets;
      for (const n of ed.store.doc.nodes) {
        const s = ed.viewport.toScreen({ x: n.x_m!, y: n.y_m! });
        expect(s.x, n.id).to.be.within(m.left - 1e-6, w - m.right + 1e-6);
        expect(s.y, n.id).to.be.within(m.top - 1e-6, h - m.bottom + 1e-6);
      }
      // The legend is about 70 px tall at 12 px from the bottom; the scale bar about 24 px.
      expect(m.bottom).to.be.greaterThan(82);
    }
  });
});

describe('Layout view: fit survives the canvas settling', () => {
  it('a resize right after a fit fits again (same as pressing Fit); after a pan or an edit it leaves the view alone', () => {
    const ed = createEditor(structuredClone(hillSmallholding) as NetworkDocument, 700, 500);
    ed.fitToView();
    ed.resize(956, 645);
    const refit = createEditor(structuredClone(hillSmallholding) as NetworkDocument, 956, 645);
    refit.fitToView();
    expect(ed.viewport.scale).to.be.closeTo(refit.viewport.scale, 1e-12);
    expect(ed.viewport.originX).to.be.closeTo(refit.viewport.originX, 1e-9);
    expect(ed.viewport.originY).to.be.closeTo(refit.viewport.originY, 1e-9);

    ed.panBy(30, 0);
    const origin = ed.viewport.originX;
    ed.resize(900, 645);
    expect(ed.viewport.originX).to.equal(origin);

    ed.fitToView();
    ed.placeNode('tee', { x: 0, y: 0 });
    const scale = ed.viewport.scale;
    ed.resize(956, 645);
    expect(ed.viewport.scale).to.equal(scale);
  });
});
