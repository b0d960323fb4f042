/**
 * Plane geometry for the site plan. World coordinates are site metres with y pointing up
 * (north); screen coordinates are CSS pixels with y pointing down. Pure functions, no DOM.
 */

export interface Point {
  x: number;
  y: number;
}
export interface Rect {
  x: number;
  y: number;
  width: number;
  height: number;
}

export function distance(a: Point, b: Point): number {
  return Math.hypot(a.x - b.x, a.y - b.y);
}

/** Length of a polyline through the given points, in the points' units. */
export function polylineLength(points: readonly Point[]): number {
  let total = 0;
  for (let i = 1; i < points.length; i++) total += distance(points[i - 1], points[i]);
  return total;
}

/** Closest point on segment ab to p, with its parameter t in [0, 1] and the distance to p. */
export function projectOnSegment(p: Point, a: Point, b: Point): { point: Point; t: number; distance: number } {
  const dx = b.x - a.x;
  const dy = b.y - a.y;
  const len2 = dx * dx + dy * dy;
  const t = len2 === 0 ? 0 : Math.max(0, Math.min(1, ((p.x - a.x) * dx + (p.y - a.y) * dy) / len2));
  const point = { x: a.x + t * dx, y: a.y + t * dy };
  return { point, t, distance: distance(p, point) };
}

/**
 * Closest point on a polyline to p: the distance to it and its chainage (distance along the
 * polyline from its first point).
 */
export function projectOnPolyline(p: Point, points: readonly Point[]): { distance: number; chainage: number; point: Point } {
  let best = { distance: Infinity, chainage: 0, point: points[0] ?? p };
  let walked = 0;
  for (let i = 1; i < points.length; i++) {
    const seg = projectOnSegment(p, points[i - 1], points[i]);
    const segLen = distance(points[i - 1], points[i]);
    if (seg.distance < best.distance) best = { distance: seg.distance, chainage: walked + seg.t * segLen, point: seg.point };
    walked += segLen;
  }
  if (points.length === 1) best = { distance: distance(p, points[0]), chainage: 0, point: points[0] };
  return best;
}

/** The point at half the polyline's length and the direction (radians, world frame) there. */
export function polylineMidpoint(points: readonly Point[]): { point: Point; angle: number } {
  const half = polylineLength(points) / 2;
  let walked = 0;
  for (let i = 1; i < points.length; i++) {
    const a = points[i - 1];
    const b = points[i];
    const len = distance(a, b);
    if (walked + len >= half && len > 0) {
      const t = (half - walked) / len;
      return { point: { x: a.x + t * (b.x - a.x), y: a.y + t * (b.y - a.y) }, angle: Math.atan2(b.y - a.y, b.x - a.x) };
    }
    walked += len;
  }
  return { point: points[0] ?? { x: 0, y: 0 }, angle: 0 };
}

export function snapValue(v: number, step: number): number {
  return step > 0 ? Math.round(v / step) * step : v;
}

export function snapPoint(p: Point, step: number): Point {
  return { x: snapValue(p.x, step), y: snapValue(p.y, step) };
}

/** Normalised rectangle spanned by two corners. */
export function rectFromCorners(a: Point, b: Point): Rect {
  return { x: Math.min(a.x, b.x), y: Math.min(a.y, b.y), width: Math.abs(a.x - b.x), height: Math.abs(a.y - b.y) };
}

export function rectContains(r: Rect, p: Point): boolean {
  return p.x >= r.x && p.x <= r.x + r.width && p.y >= r.y && p.y <= r.y + r.height;
}

/** Bounding box of points, or null for none. */
export function boundsOf(points: readonly Point[]): Rect | null {
  if (points.length === 0) return null;
  let minX = Infinity,
    minY = Infinity,
    maxX = -Infinity,
    maxY = -Infinity;
  for (const p of points) {
    if (p.x < minX) minX = p.x;
    if (p.y < minY) minY = p.y;
    if (p.x > maxX) maxX = p.x;
    if (p.y > maxY) maxY = p.y;
  }
  return { x: minX, y: minY, width: maxX - minX, height: maxY - minY };
}

/**
 * A "nice" round length (1, 2 or 5 × 10^n) no longer than maxValue, for scale bars and grids.
 * @example niceStep(73) // → 50
 */
export function niceStep(maxValue: number): number {
  if (!(maxValue > 0)) return 1;
  const p = Math.pow(10, Math.floor(Math.log10(maxValue)));
  for (const m of [5, 2, 1]) if (m * p <= maxValue) return m * p;
  return p;
}
