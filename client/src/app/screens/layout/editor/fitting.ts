import type { NetworkDocument } from '../../../../../../engine/network-document';
import { linkPoints } from './document-store';
import { boundsOf, Point, polylineMidpoint, Rect } from './geometry';

/**
 * The world rectangle "fit to view" shows: every node, bend point, survey point and the backdrop, widened to
 * 20 m when the network is smaller (a lone element is not zoomed in to fill the screen).
 */
export function fitRect(doc: NetworkDocument, backdrop: Rect | null): Rect {
  const pts: Point[] = doc.nodes.map((n) => ({ x: n.x_m ?? 0, y: n.y_m ?? 0 }));
  for (const l of doc.links) for (const [x, y] of l.vertices ?? []) pts.push({ x, y });
  // Survey points are part of the site: a survey loaded before any drawing is in view.
  for (const s of doc.layout?.survey?.points ?? []) pts.push({ x: s.x_m, y: s.y_m });
  if (backdrop) pts.push({ x: backdrop.x, y: backdrop.y }, { x: backdrop.x + backdrop.width, y: backdrop.y + backdrop.height });
  const r = boundsOf(pts) ?? { x: -50, y: -50, width: 100, height: 100 };
  const pad = Math.max(r.width, r.height) < 20 ? 20 : 0;
  return { x: r.x - pad / 2, y: r.y - pad / 2, width: r.width + pad, height: r.height + pad };
}

/** The world point that stands for an element when revealing it (a node, or a line's middle). */
export function elementAnchor(doc: NetworkDocument, id: string): Point | null {
  const n = doc.nodes.find((x) => x.id === id);
  if (n) return { x: n.x_m ?? 0, y: n.y_m ?? 0 };
  const l = doc.links.find((x) => x.id === id);
  if (!l) return null;
  const pts = linkPoints(l, doc);
  return pts.length === 1 ? pts[0] : polylineMidpoint(pts).point;
}
