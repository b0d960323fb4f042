import type { NetworkLink } from '../../../../../../engine/network-document';
import type { VertexRef } from '../tools/tool';
import { linkPoints } from './document-store';
import type { DocumentStore } from './document-store';
import { Point, projectOnSegment } from './geometry';

/**
 * The bend points a link would have with one inserted at a world point: into `segment` when
 * given, else into the segment nearest the point. Null when the segment does not exist.
 */
export function withBend(store: DocumentStore, link: NetworkLink, at: Point, segment?: number): { vertices: [number, number][]; index: number } | null {
  const pts = linkPoints(link, store.doc);
  let seg = segment ?? 0;
  if (segment === undefined) {
    let best = Infinity;
    for (let i = 1; i < pts.length; i++) {
      const d = projectOnSegment(at, pts[i - 1], pts[i]).distance;
      if (d < best) {
        best = d;
        seg = i - 1;
      }
    }
  }
  const vertices = [...(link.vertices ?? [])];
  if (seg < 0 || seg > vertices.length) return null;
  vertices.splice(seg, 0, [at.x, at.y]);
  return { vertices, index: seg };
}

/** The bend points of a link without the referenced one, or null when there is no such bend. */
export function withoutBend(link: NetworkLink | undefined, ref: VertexRef): [number, number][] | null {
  if (!link?.vertices || ref.index < 0 || ref.index >= link.vertices.length) return null;
  return link.vertices.filter((_, i) => i !== ref.index);
}
