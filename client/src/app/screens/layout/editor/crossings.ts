import type { NetworkDocument, NetworkLink } from '../../../../../../engine/network-document';
import { linkPoints } from './document-store';
import type { Point } from './geometry';

/** Where two lines cross on the plan without joining: which passes over, and both directions (radians). */
export interface Crossing {
  at: Point;
  over: string;
  under: string;
  overAngle: number;
  underAngle: number;
}

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
          const a = A.pts[p - 1],
            b = A.pts[p],
            c = B.pts[q - 1],
            d = B.pts[q];
          const hit = segmentCross(a, b, c, d);
          if (!hit) continue;
          const angA = Math.atan2(b.y - a.y, b.x - a.x);
          const angB = Math.atan2(d.y - c.y, d.x - c.x);
          out.push({
            at: { x: a.x + (b.x - a.x) * hit.t, y: a.y + (b.y - a.y) * hit.t },
            over: aOver ? A.l.id : B.l.id,
            under: aOver ? B.l.id : A.l.id,
            overAngle: aOver ? angA : angB,
            underAngle: aOver ? angB : angA,
          });
        }
      }
    }
  }
  return out;
}

/** A line drawn over a node it does not join (a tee under the rising main): where, and the line's direction. */
export interface PassOver {
  at: Point;
  link: string;
  node: string;
  angle: number;
  distance_m: number;
}

/**
 * Every node that sits on (within `within_m` of) a line it is not an end of, with the point on the
 * line nearest to it. Nodes are bucketed on a grid of `within_m` so a large network is not
 * compared pair by pair.
 */
export function nodesUnderLines(doc: NetworkDocument, within_m: number): PassOver[] {
  if (!(within_m > 0)) return [];
  const byId = new Map(doc.nodes.map((n) => [n.id, n]));
  const cell = (v: number) => Math.floor(v / within_m);
  const grid = new Map<string, NetworkDocument['nodes']>();
  for (const n of doc.nodes) {
    if (n.x_m === undefined || n.y_m === undefined) continue;
    const k = `${cell(n.x_m)},${cell(n.y_m)}`;
    grid.set(k, [...(grid.get(k) ?? []), n]);
  }
  const out: PassOver[] = [];
  for (const l of doc.links) {
    const pts = linkPoints(l, byId);
    const seen = new Set<string>([l.from, l.to]);
    for (let i = 1; i < pts.length; i++) {
      const a = pts[i - 1],
        b = pts[i];
      const dx = b.x - a.x,
        dy = b.y - a.y;
      const len2 = dx * dx + dy * dy;
      if (len2 === 0) continue;
      const x0 = cell(Math.min(a.x, b.x) - within_m),
        x1 = cell(Math.max(a.x, b.x) + within_m);
      const y0 = cell(Math.min(a.y, b.y) - within_m),
        y1 = cell(Math.max(a.y, b.y) + within_m);
      // A long line at a fine grid: walk the nodes instead of the cells.
      const candidates =
        (x1 - x0 + 1) * (y1 - y0 + 1) > doc.nodes.length
          ? doc.nodes
          : Array.from({ length: x1 - x0 + 1 }, (_, i) => x0 + i).flatMap((cx) =>
              Array.from({ length: y1 - y0 + 1 }, (_, j) => grid.get(`${cx},${y0 + j}`) ?? []).flat(),
            );
      for (const n of candidates) {
        if (seen.has(n.id) || n.x_m === undefined || n.y_m === undefined) continue;
        const t = ((n.x_m - a.x) * dx + (n.y_m - a.y) * dy) / len2;
        if (t <= 0 || t >= 1) continue;
        const at = { x: a.x + dx * t, y: a.y + dy * t };
        const d = Math.hypot(n.x_m - at.x, n.y_m - at.y);
        if (d > within_m) continue;
        seen.add(n.id);
        out.push({ at, link: l.id, node: n.id, angle: Math.atan2(dy, dx), distance_m: d });
      }
    }
  }
  return out;
}
