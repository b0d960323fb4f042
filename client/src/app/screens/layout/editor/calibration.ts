import type { Backdrop, NetworkDocument } from '../../../../../../engine/network-document';
import { distance, Point, Rect } from './geometry';

/** The site backdrop image, placed in world metres (doc.layout.backdrop; typed by the document schema). */
export type { Backdrop };

export function backdropOf(doc: NetworkDocument): Backdrop | null {
  return doc.layout?.backdrop ?? null;
}

/** The backdrop's world rectangle (y up: `y` is its bottom edge). */
export function backdropRect(b: Backdrop | null): Rect | null {
  if (!b) return null;
  const w = b.width_px * b.m_per_px;
  const h = b.height_px * b.m_per_px;
  return { x: b.x_m, y: b.y_m - h, width: w, height: h };
}

/**
 * The document rescaled about point a so that a and b are `distance_m` apart: the backdrop
 * always, the drawn network (nodes and bend points) when `network` is true. Null when either
 * distance is not positive. Drawn pipe lengths are re-measured by the caller.
 */
export function calibratedDocument(doc: NetworkDocument, a: Point, b: Point, distance_m: number, network: boolean): NetworkDocument | null {
  const drawn = distance(a, b);
  if (!(drawn > 0) || !(distance_m > 0)) return null;
  const f = distance_m / drawn;
  const sc = (x: number, y: number): [number, number] => [a.x + (x - a.x) * f, a.y + (y - a.y) * f];
  const nodes = !network
    ? doc.nodes
    : doc.nodes.map((n) => {
        const [x, y] = sc(n.x_m ?? 0, n.y_m ?? 0);
        return { ...n, x_m: x, y_m: y };
      });
  const links = !network ? doc.links : doc.links.map((l) => (l.vertices?.length ? { ...l, vertices: l.vertices.map(([x, y]) => sc(x, y)) } : l));
  const layout = { ...(doc.layout ?? {}) };
  const bd = layout.backdrop;
  if (bd) {
    const [x, y] = sc(bd.x_m, bd.y_m);
    layout.backdrop = { ...bd, x_m: x, y_m: y, m_per_px: bd.m_per_px * f, scale: { a: [a.x, a.y], b: sc(b.x, b.y), distance_m } };
  }
  return { ...doc, nodes, links, layout };
}
