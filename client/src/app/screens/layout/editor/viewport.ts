import { Point, Rect } from './geometry';

/** Screen margins, CSS px. */
export interface Insets {
  top: number;
  right: number;
  bottom: number;
  left: number;
}

/**
 * The view onto the site plan: `scale` CSS pixels per metre and the screen position of the
 * world origin. World y points up, screen y points down. Pure state, no DOM.
 *
 * @example
 * const v = new Viewport(800, 600); v.zoomAt({ x: 400, y: 300 }, 2); // the point under the cursor stays put
 */
export class Viewport {
  scale = 4;
  originX = 0;
  originY = 0;
  static readonly MIN_SCALE = 0.02;
  static readonly MAX_SCALE = 400;

  constructor(
    public width: number,
    public height: number,
  ) {
    this.originX = width / 2;
    this.originY = height / 2;
  }

  resize(width: number, height: number): void {
    this.width = width;
    this.height = height;
  }

  toScreen(p: Point): Point {
    return { x: this.originX + p.x * this.scale, y: this.originY - p.y * this.scale };
  }

  toWorld(s: Point): Point {
    return { x: (s.x - this.originX) / this.scale, y: (this.originY - s.y) / this.scale };
  }

  /** Metres covered by `px` screen pixels at the current zoom. */
  metres(px: number): number {
    return px / this.scale;
  }

  panBy(dx: number, dy: number): void {
    this.originX += dx;
    this.originY += dy;
  }

  /** Multiply the zoom by `factor`, keeping the world point under `screen` fixed. */
  zoomAt(screen: Point, factor: number): void {
    const before = this.toWorld(screen);
    this.scale = Math.min(Viewport.MAX_SCALE, Math.max(Viewport.MIN_SCALE, this.scale * factor));
    this.originX = screen.x - before.x * this.scale;
    this.originY = screen.y + before.y * this.scale;
  }

  /**
   * Show the world rectangle (metres) with a margin around it: the same `margin` px on every side,
   * or per side (room for labels and for the legend and scale bar over the canvas corners).
   */
  fit(r: Rect, margin: number | Insets = 48): void {
    const m = typeof margin === 'number' ? { top: margin, right: margin, bottom: margin, left: margin } : margin;
    const w = Math.max(r.width, 1);
    const h = Math.max(r.height, 1);
    const availW = Math.max(this.width - m.left - m.right, this.width * 0.3);
    const availH = Math.max(this.height - m.top - m.bottom, this.height * 0.3);
    this.scale = Math.min(Viewport.MAX_SCALE, Math.max(Viewport.MIN_SCALE, Math.min(availW / w, availH / h)));
    const cx = r.x + r.width / 2;
    const cy = r.y + r.height / 2;
    const left = (this.width - availW) * (m.left / Math.max(m.left + m.right, 1e-9));
    const top = (this.height - availH) * (m.top / Math.max(m.top + m.bottom, 1e-9));
    this.originX = left + availW / 2 - cx * this.scale;
    this.originY = top + availH / 2 + cy * this.scale;
  }

  /** The visible world rectangle. */
  visibleWorld(): Rect {
    const a = this.toWorld({ x: 0, y: this.height });
    const b = this.toWorld({ x: this.width, y: 0 });
    return { x: a.x, y: a.y, width: b.x - a.x, height: b.y - a.y };
  }
}
