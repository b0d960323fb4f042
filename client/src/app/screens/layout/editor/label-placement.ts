/**
 * Label placement for the site plan, in screen pixels (y down). Pure functions, no DOM.
 *
 * Greedy placement in priority order: each request offers candidate boxes, best first; the first
 * candidate that stays inside the bounds and touches neither an obstacle (symbols, the legend,
 * the scale bar) nor an already placed label is taken, else the label is dropped (the screen
 * still shows it on hover and in the results list). Collision tests go through a uniform grid,
 * so a plan of 500 elements places in a few milliseconds.
 */
import type { Point } from './geometry';

/** Axis-aligned box, screen px: top-left corner and size. */
export interface Box {
  x: number;
  y: number;
  w: number;
  h: number;
}

/** Where a label sits relative to its anchor. */
export type Side = 'right' | 'left' | 'above' | 'below' | 'above-right' | 'below-right' | 'above-left' | 'below-left' | 'along';

export interface Candidate {
  box: Box;
  side: Side;
  /** Index of the content variant this box is sized for (0 = fullest). */ variant: number;
}

export interface LabelRequest {
  id: string;
  /** Lower places first; ties keep the order given. */
  priority: number;
  /** Candidate boxes, best first. */
  candidates: Candidate[];
}

export interface Placement {
  id: string;
  box: Box;
  side: Side;
  variant: number;
}

/** Two boxes overlap (touching edges do not count). */
export function boxesIntersect(a: Box, b: Box): boolean {
  return a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h;
}

function inside(outer: Box, b: Box): boolean {
  return b.x >= outer.x && b.y >= outer.y && b.x + b.w <= outer.x + outer.w && b.y + b.h <= outer.y + outer.h;
}

/**
 * Boxes bucketed in square cells; `hits` tests a box against those sharing a cell with it.
 * @example const g = new BoxGrid(40); g.add({ x: 0, y: 0, w: 10, h: 10 }); g.hits({ x: 5, y: 5, w: 2, h: 2 }) // → true
 */
export class BoxGrid {
  private readonly cells = new Map<number, Box[]>();
  constructor(private readonly cell = 48) {}

  add(b: Box): void {
    this.visit(b, (list, key) => {
      if (list) list.push(b);
      else this.cells.set(key, [b]);
      return false;
    });
  }

  hits(b: Box): boolean {
    return this.visit(b, (list) => !!list && list.some((o) => boxesIntersect(o, b)));
  }

  private visit(b: Box, fn: (list: Box[] | undefined, key: number) => boolean): boolean {
    const c = this.cell;
    const x0 = Math.floor(b.x / c),
      x1 = Math.floor((b.x + b.w) / c);
    const y0 = Math.floor(b.y / c),
      y1 = Math.floor((b.y + b.h) / c);
    for (let i = x0; i <= x1; i++) {
      for (let j = y0; j <= y1; j++) {
        // Cells are numbered on a 2^20-wide lattice: unique for any screen a canvas can have.
        const key = (i + 524288) * 1048576 + (j + 524288);
        if (fn(this.cells.get(key), key)) return true;
      }
    }
    return false;
  }
}

/**
 * Place labels greedily. `bounds` (usually the canvas) keeps labels on screen; `gap` px of air is
 * kept between labels. `soft` obstacles (the pipe lines) are avoided when some candidate allows,
 * else crossed: a name over a line reads better than no name, a name over a symbol or another
 * label never does.
 * @example placeLabels([{ id: 'A', priority: 0, candidates: around({ x: 50, y: 50 }, 10, [{ w: 40, h: 12 }]) }], [], { x: 0, y: 0, w: 200, h: 200 })
 */
export function placeLabels(
  requests: readonly LabelRequest[],
  obstacles: readonly Box[],
  bounds: Box | null,
  gap = 2,
  soft: readonly Box[] = [],
): Map<string, Placement> {
  const grid = new BoxGrid();
  for (const o of obstacles) grid.add(o);
  const softGrid = new BoxGrid();
  for (const o of soft) softGrid.add(o);
  const order = requests.map((r, i) => ({ r, i })).sort((a, b) => a.r.priority - b.r.priority || a.i - b.i);
  const out = new Map<string, Placement>();
  const pad = (b: Box): Box => ({ x: b.x - gap / 2, y: b.y - gap / 2, w: b.w + gap, h: b.h + gap });
  for (const { r } of order) {
    // Within the fullest content variant that fits at all, prefer a box clear of the lines.
    let chosen: Candidate | null = null;
    let fallback: Candidate | null = null;
    for (let k = 0; k < r.candidates.length && !chosen; k++) {
      const c = r.candidates[k];
      if (fallback && c.variant !== fallback.variant) break;
      if ((bounds && !inside(bounds, c.box)) || grid.hits(pad(c.box))) continue;
      if (!softGrid.hits(c.box)) chosen = c;
      else fallback ??= c;
    }
    chosen ??= fallback;
    if (!chosen) continue;
    grid.add(pad(chosen.box));
    out.set(r.id, { id: r.id, box: chosen.box, side: chosen.side, variant: chosen.variant });
  }
  return out;
}

/**
 * Small boxes along a screen polyline, about `step` px apart, for use as soft obstacles.
 * @example lineBoxes([{ x: 0, y: 0 }, { x: 20, y: 0 }], 10).length // → 3
 */
export function lineBoxes(points: readonly Point[], step = 8, half = 1.5): Box[] {
  const out: Box[] = [];
  for (let i = 1; i < points.length; i++) {
    const a = points[i - 1];
    const b = points[i];
    const n = Math.max(1, Math.ceil(Math.hypot(b.x - a.x, b.y - a.y) / step));
    for (let k = i === 1 ? 0 : 1; k <= n; k++) {
      const x = a.x + ((b.x - a.x) * k) / n;
      const y = a.y + ((b.y - a.y) * k) / n;
      out.push({ x: x - half, y: y - half, w: 2 * half, h: 2 * half });
    }
  }
  return out;
}

/** Candidate boxes of `size` around a rectangle (a bank header, a group of symbols), `gap` px off it. */
export function aroundBox(b: Box, size: { w: number; h: number }, sides: readonly Side[] = ['below', 'above', 'right', 'left'], gap = 3): Candidate[] {
  const cx = b.x + b.w / 2;
  const cy = b.y + b.h / 2;
  return sides.map((side) => {
    const x = side.endsWith('right') ? b.x + b.w + gap : side.endsWith('left') ? b.x - gap - size.w : cx - size.w / 2;
    const y = side.startsWith('above') ? b.y - gap - size.h : side.startsWith('below') ? b.y + b.h + gap : cy - size.h / 2;
    return { box: { x, y, w: size.w, h: size.h }, side, variant: 0 };
  });
}

/** The usual order of sides around a point symbol: right, left, above, below, then the corners. */
export const POINT_SIDES: readonly Side[] = ['right', 'left', 'above', 'below', 'above-right', 'below-right', 'above-left', 'below-left'];

/**
 * Candidate boxes around a point symbol of radius `clearance` px, for each content size in
 * `variants` (fullest first), on each of `sides` in order.
 */
export function around(anchor: Point, clearance: number, variants: readonly { w: number; h: number }[], sides: readonly Side[] = POINT_SIDES): Candidate[] {
  const out: Candidate[] = [];
  const c = clearance + 3;
  variants.forEach(({ w, h }, variant) => {
    for (const side of sides) {
      const { x, y } = anchor;
      const box =
        side === 'right'
          ? { x: x + c, y: y - h / 2 }
          : side === 'left'
            ? { x: x - c - w, y: y - h / 2 }
            : side === 'above'
              ? { x: x - w / 2, y: y - c - h }
              : side === 'below'
                ? { x: x - w / 2, y: y + c }
                : side === 'above-right'
                  ? { x: x + c * 0.7, y: y - c * 0.7 - h }
                  : side === 'below-right'
                    ? { x: x + c * 0.7, y: y + c * 0.7 }
                    : side === 'above-left'
                      ? { x: x - c * 0.7 - w, y: y - c * 0.7 - h }
                      : side === 'below-left'
                        ? { x: x - c * 0.7 - w, y: y + c * 0.7 }
                        : { x: x - w / 2, y: y - h / 2 };
      out.push({ box: { ...box, w, h }, side, variant });
    }
  });
  return out;
}

/**
 * Candidate boxes for a label beside a straight stretch of line from a to b (screen px): on
 * either side of it at `offset` px, at the middle and at a quarter either way. Empty when the
 * stretch is shorter than the label plus `margin` px (short pipes carry no number).
 */
export function besideLine(a: Point, b: Point, size: { w: number; h: number }, offset = 9, margin = 28): Candidate[] {
  const dx = b.x - a.x;
  const dy = b.y - a.y;
  const len = Math.hypot(dx, dy);
  if (len < size.w + margin) return [];
  const ux = dx / len,
    uy = dy / len;
  const nx = -uy,
    ny = ux;
  const out: Candidate[] = [];
  for (const t of [0.5, 0.3, 0.7]) {
    for (const s of [1, -1]) {
      const px = a.x + dx * t + nx * s * offset;
      const py = a.y + dy * t + ny * s * offset;
      // Push the box off the line along the normal until its nearest corner clears it.
      const reach = (Math.abs(nx) * size.w + Math.abs(ny) * size.h) / 2;
      const cx = px + nx * s * reach;
      const cy = py + ny * s * reach;
      out.push({ box: { x: cx - size.w / 2, y: cy - size.h / 2, w: size.w, h: size.h }, side: 'along', variant: 0 });
    }
  }
  return out;
}

/** Box of a square symbol of half-size r centred on p. */
export function symbolBox(p: Point, r: number): Box {
  return { x: p.x - r, y: p.y - r, w: 2 * r, h: 2 * r };
}
