import type { NetworkDocument, NetworkLink } from '../../../../../../engine/network-document';
import { linkPoints } from './document-store';
import type { Point } from './geometry';

/** Where two lines cross on the plan without joining: which passes over, and both directions (radians). */
export interface Crossing { at: Point; over: string; under: string; overAngle: number; underAngle: number }

/**
 * Links a pump drives: from each pump's delivery end along pipes and valves up to the first tank
 * or source (the rising main). They are drawn over the gravity lines they cross.
 */
export function pumpedLinks(doc: NetworkDocument): Set<string> {
  const kind = new Map(doc.nodes.map((n) => [n.id, n.kind]));
  const byNode = new Map<string, NetworkLink[]>();
  for (const l of doc.links) for (const end of [l.from, l.to]) byNode.set(end, [...(byNode.get(end) ?? []), l]);
  const out = new Set<string>();
  for (const p of doc.links) {
    if (p.kind !== 'pump') continue;
    const stack = [p.to];
    const seen = new Set<string>([p.from]);
    while (stack.length) {
      const id = stack.pop()!;
      if (seen.has(id)) continue;
      seen.add(id);
      if (id !== p.to && (kind.get(id) === 'tank' || kind.get(id) === 'source')) continue;
      for (const l of byNode.get(id) ?? []) {
        if (l.kind === 'pump' || out.has(l.id)) continue;
        out.add(l.id);
        stack.push(l.from === id ? l.to : l.from);
      }
    }
  }
  return out;
}

function segmentCross(a: Point, b: Point, c: Point, d: Point): { t: number; u: number } | null {
  const r = { x: b.x - a.x, y: b.y - a.y };
  const s = { x: d.x - c.x, y: d.y - c.y };
  const den = r.x * s.y - r.y * s.x;
  if (Math.abs(den) < 1e-12) return null;
  const t = ((c.x - a.x) * s.y - (c.y - a.y) * s.x) / den;
  const u = ((c.x - a.x) * r.y - (c.y - a.y) * r.x) / den;
  // Interior of both segments only: lines meeting at a shared point are joined, not crossing.
  return t > 1e-6 && t < 1 - 1e-6 && u > 1e-6 && u < 1 - 1e-6 ? { t, u } : null;
}

/**
 * Every point where two links cross without sharing an end node (world metres). The pumped line
 * passes over; otherwise the later link in the document does.
 */
export function lineCrossings(doc: NetworkDocument): Crossing[] {
  const byId = new Map(doc.nodes.map((n) => [n.id, n]));
  const pumped = pumpedLinks(doc);
  const lines = doc.links.map((l, order) => {
    const pts = linkPoints(l, byId);
    const xs = pts.map((p) => p.x);
    const ys = pts.map((p) => p.y);
    return { l, order, pts, box: { x0: Math.min(...xs), x1: Math.max(...xs), y0: Math.min(...ys), y1: Math.max(...ys) } };
  });
  const out: Crossing[] = [];
  for (let i = 0; i < lines.length; i++) {
    for (let j = i + 1; j < lines.length; j++) {
      const A = lines[i];
      const B = lines[j];
      if (A.box.x1 < B.box.x0 || B.box.x1 < A.box.x0 || A.box.y1 < B.box.y0 || B.box.y1 < A.box.y0) continue;
      if (A.l.from === B.l.from || A.l.from === B.l.to || A.l.to === B.l.from || A.l.to === B.l.to) continue;
      const aOver = pumped.has(A.l.id) && !pumped.has(B.l.id) ? true : pumped.has(B.l.id) && !pumped.has(A.l.id) ? false : A.order > B.order;
      for (let p = 1; p < A.pts.length; p++) {
        for (let q = 1; q < B.pts.length; q++) {
          const a = A.pts[p - 1], b = A.pts[p], c = B.pts[q - 1], d = B.pts[q];
          const hit = segmentCross(a, b, c, d);
          if (!hit) continue;
          const angA = Math.atan2(b.y - a.y, b.x - a.x);
          const angB = Math.atan2(d.y - c.y, d.x - c.x);
          out.push({
            at: { x: a.x + (b.x - a.x) * hit.t, y: a.y + (b.y - a.y) * hit.t },
            over: aOver ? A.l.id : B.l.id, under: aOver ? B.l.id : A.l.id,
            overAngle: aOver ? angA : angB, underAngle: aOver ? angB : angA,
          });
        }
      }
    }
  }
  return out;
}
