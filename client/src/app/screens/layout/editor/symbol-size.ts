/**
 * How big node symbols are drawn on screen. Symbols are designed 24 px across; at whole-site
 * zoom they shrink (never below 12 px) so a plan of several hundred metres stays legible, and a
 * node whose nearest neighbour sits closer on screen than a symbol's width shrinks further so
 * both stay visible and each can be clicked (hit testing uses the same scale). Pure functions.
 */
import type { Point } from './geometry';

/** Smallest symbol scale (12 px of the designed 24 px). */
export const MIN_SYMBOL_SCALE = 0.5;
/** Zoom (CSS px per metre) at and above which symbols are full size. */
export const FULL_SIZE_PX_PER_M = 2.5;
/** On-screen gap to the nearest neighbour (px) at and above which crowding does not shrink a symbol. */
export const UNCROWDED_PX = 30;

/**
 * Scale factor (0.5…1) of a node's symbol at `pxPerMetre` when its nearest neighbour is
 * `nearestPx` screen px away.
 * @example symbolScale(100, 4) // → 1; symbolScale(11, 1.6) // → 0.5
 */
export function symbolScale(nearestPx: number, pxPerMetre: number): number {
  const zoom = Math.min(1, Math.max(0.65, pxPerMetre / FULL_SIZE_PX_PER_M));
  const crowd = Math.min(1, nearestPx / UNCROWDED_PX);
  return Math.max(MIN_SYMBOL_SCALE, Math.min(zoom, crowd));
}

/**
 * Distance from each point to its nearest other point (Infinity for a lone point), in the
 * points' units. Points are bucketed in a grid whose cell is the median spacing guess, so large
 * plans stay near-linear.
 */
export function nearestDistances(points: readonly Point[]): number[] {
  const n = points.length;
  const out = new Array<number>(n).fill(Infinity);
  if (n < 2) return out;
  let minX = Infinity,
    minY = Infinity,
    maxX = -Infinity,
    maxY = -Infinity;
  for (const p of points) {
    minX = Math.min(minX, p.x);
    maxX = Math.max(maxX, p.x);
    minY = Math.min(minY, p.y);
    maxY = Math.max(maxY, p.y);
  }
  const span = Math.max(maxX - minX, maxY - minY);
  // About one point per cell; never so small that a line of points spans millions of cells.
  const cell = Math.max(Math.sqrt(((maxX - minX) * (maxY - minY)) / n), span / n, 1e-9);
  const grid = new Map<string, number[]>();
  const key = (i: number, j: number) => i + ',' + j;
  points.forEach((p, idx) => {
    const k = key(Math.floor((p.x - minX) / cell), Math.floor((p.y - minY) / cell));
    const list = grid.get(k);
    if (list) list.push(idx);
    else grid.set(k, [idx]);
  });
  const maxRing = Math.ceil(span / cell) + 1;
  points.forEach((p, idx) => {
    const ci = Math.floor((p.x - minX) / cell);
    const cj = Math.floor((p.y - minY) / cell);
    let best = Infinity;
    // Grow rings of cells until the ring lies beyond the best distance found.
    for (let ring = 0; ring <= maxRing; ring++) {
      if (best <= (ring - 1) * cell) break;
      for (let i = ci - ring; i <= ci + ring; i++) {
        // Only the ring's border cells: full rows at the top and bottom, two cells elsewhere.
        const edge = i === ci - ring || i === ci + ring;
        for (let j = cj - ring; j <= cj + ring; j += edge || ring === 0 ? 1 : 2 * ring) {
          for (const other of grid.get(key(i, j)) ?? []) {
            if (other === idx) continue;
            const d = Math.hypot(points[other].x - p.x, points[other].y - p.y);
            if (d < best) best = d;
          }
        }
      }
    }
    out[idx] = best;
  });
  return out;
}
