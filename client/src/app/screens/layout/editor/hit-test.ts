import type { NetworkDocument, NetworkLink, NetworkNode } from '../../../../../../engine/network-document';
import { NODE_KINDS } from '../kinds';
import type { VertexRef } from '../tools/tool';
import { linkPoints } from './document-store';
import { distance, Point, projectOnPolyline, Rect, rectContains } from './geometry';
import { nearestDistances, symbolScale } from './symbol-size';
import type { Viewport } from './viewport';

/** Link hit tolerance, CSS px either side of the line. */
const LINK_HIT_PX = 6;
/** Bend and add-bend handles answer within this many CSS px. */
const HANDLE_HIT_PX = 7;
/** A segment shorter than this on screen offers no add-bend handle at its middle. */
const MIN_SEGMENT_FOR_HANDLE_PX = 36;

export interface SegmentHandle {
  link: string;
  segment: number;
  screen: Point;
}

/**
 * Hit testing as plain maths on the document (no Konva shape listens): symbols at the size the
 * canvas draws them, lines within a few pixels, bend and add-bend handles of one link.
 */
export class HitTester {
  private spacingOf: NetworkNode[] | null = null;
  private spacing = new Map<string, number>();

  constructor(
    private readonly doc: () => NetworkDocument,
    private readonly viewport: Viewport,
  ) {}

  /**
   * Scale (0.5…1) at which a node's symbol is drawn now: smaller at whole-site zoom and where
   * neighbours crowd it (`symbol-size.ts`). The canvas draws with it and hit testing uses it.
   */
  symbolScale(id: string): number {
    const nodes = this.doc().nodes;
    if (this.spacingOf !== nodes) {
      const d = nearestDistances(nodes.map((n) => ({ x: n.x_m ?? 0, y: n.y_m ?? 0 })));
      this.spacing = new Map(nodes.map((n, i) => [n.id, d[i]]));
      this.spacingOf = nodes;
    }
    return symbolScale((this.spacing.get(id) ?? Infinity) * this.viewport.scale, this.viewport.scale);
  }

  /** Topmost element under a screen point: nodes first (the nearest within its drawn symbol), then links. */
  hitTest(screen: Point): string | null {
    const doc = this.doc();
    let best: { id: string; d: number } | null = null;
    for (const n of doc.nodes) {
      const s = this.viewport.toScreen({ x: n.x_m ?? 0, y: n.y_m ?? 0 });
      const d = distance(s, screen);
      const r = Math.max(6, NODE_KINDS[n.kind].hitRadiusPx * this.symbolScale(n.id));
      if (d <= r && (!best || d < best.d)) best = { id: n.id, d };
    }
    if (best) return best.id;
    const world = this.viewport.toWorld(screen);
    const tol = this.viewport.metres(LINK_HIT_PX);
    const byId = new Map(doc.nodes.map((n) => [n.id, n]));
    for (const l of doc.links) {
      const d = projectOnPolyline(world, linkPoints(l, byId)).distance;
      if (d <= tol && (!best || d < best.d)) best = { id: l.id, d };
    }
    return best?.id ?? null;
  }

  /** A bend point of `link` under a screen point (within 7 px), or null. */
  vertexAt(link: NetworkLink | undefined, screen: Point): VertexRef | null {
    const i = link?.vertices?.findIndex(([x, y]) => distance(this.viewport.toScreen({ x, y }), screen) <= HANDLE_HIT_PX) ?? -1;
    return link && i >= 0 ? { link: link.id, index: i } : null;
  }

  /**
   * Add-bend handles of a link: the screen middle of each segment long enough on screen to take
   * one. `segment` i runs from drawn point i to i + 1 (0 is the start node).
   */
  segmentHandles(link: NetworkLink | undefined): SegmentHandle[] {
    if (!link) return [];
    const pts = linkPoints(link, this.doc()).map((p) => this.viewport.toScreen(p));
    const out: SegmentHandle[] = [];
    for (let i = 1; i < pts.length; i++) {
      if (distance(pts[i - 1], pts[i]) < MIN_SEGMENT_FOR_HANDLE_PX) continue;
      out.push({ link: link.id, segment: i - 1, screen: { x: (pts[i - 1].x + pts[i].x) / 2, y: (pts[i - 1].y + pts[i].y) / 2 } });
    }
    return out;
  }

  /** The add-bend handle of `link` under a screen point, or null. */
  segmentHandleAt(link: NetworkLink | undefined, screen: Point): { link: string; segment: number } | null {
    const h = this.segmentHandles(link).find((s) => distance(s.screen, screen) <= HANDLE_HIT_PX);
    return h ? { link: h.link, segment: h.segment } : null;
  }

  /** Nodes inside a world rectangle, and links whose whole line is inside it. */
  elementsInRect(r: Rect): string[] {
    const doc = this.doc();
    const byId = new Map(doc.nodes.map((n) => [n.id, n]));
    const ids = doc.nodes.filter((n) => rectContains(r, { x: n.x_m ?? 0, y: n.y_m ?? 0 })).map((n) => n.id);
    for (const l of doc.links) if (linkPoints(l, byId).every((p) => rectContains(r, p))) ids.push(l.id);
    return ids;
  }
}
