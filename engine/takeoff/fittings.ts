import type { NetworkDocument, NetworkLink, NetworkNode } from '../network-document';
import { type FittingKind, IPS_OD_IN, nominalForDiameter } from '../pipe-catalogue';
import { INCH_M } from '../units';

/**
 * Fittings counted from the network's topology and geometry (never typed):
 * - tees: a tee or outlet joined to n ≥ 3 pipes or valves needs n − 2 tees, sized to the largest;
 * - reducers: at a tee or outlet, one per joined link smaller than the largest there;
 * - elbows: at a pipe's bend points, and at a node joining just two links, where the line turns
 *   by more than `bendAngle_deg` (default 30°): a 90° elbow above 67.5°, else a 45° elbow;
 * - adapters: one tank adapter per link into a tank; one pump adapter per pipe or valve at a pump's ends.
 * Each fitting records the node or pipe it belongs to (the minor-loss allowance uses that).
 *
 * @example countFittings(hillSmallholding, { bendAngle_deg: 30 }).filter((f) => f.kind === 'tee').length
 */

export interface CountedFitting {
  kind: FittingKind;
  /** Size label (`1"`, `1-1/2"x1"` for a reducer, `40 mm` for a custom pipe). */
  size: string;
  /** Node or pipe it sits at. */
  at: string;
  /** Pipe whose minor loss it adds to (a branch, the smaller side of a reducer, the bent pipe). */
  pipe?: string;
  /** Tee on the branch side (K through the branch) rather than the run. */
  branch?: boolean;
}

const ORDER = Object.keys(IPS_OD_IN);

/** Size label of a link (its catalogue nominal, else the nearest nominal to its inside diameter). */
export function linkSize(link: NetworkLink): string {
  if (link.kind === 'pipe') return link.nominal ?? nominalForDiameter(link.diameter_m);
  if (link.kind === 'valve') return nominalForDiameter(link.diameter_m);
  return '';
}

/** Rank of a size label for "larger than" (inches by catalogue order, millimetres by value). */
export function sizeRank(size: string): number {
  const i = ORDER.indexOf(size);
  if (i >= 0) return IPS_OD_IN[size] * INCH_M * 1000;
  const mm = Number.parseFloat(size);
  return Number.isFinite(mm) ? mm : 0;
}

function deflection(a: [number, number], b: [number, number], c: [number, number]): number {
  const u = [b[0] - a[0], b[1] - a[1]];
  const v = [c[0] - b[0], c[1] - b[1]];
  const nu = Math.hypot(u[0], u[1]);
  const nv = Math.hypot(v[0], v[1]);
  if (nu === 0 || nv === 0) return 0;
  const cos = Math.min(1, Math.max(-1, (u[0] * v[0] + u[1] * v[1]) / (nu * nv)));
  return (Math.acos(cos) * 180) / Math.PI;
}

export function countFittings(doc: NetworkDocument, options: { bendAngle_deg?: number } = {}): CountedFitting[] {
  const bend = options.bendAngle_deg ?? 30;
  const out: CountedFitting[] = [];
  const nodes = new Map<string, NetworkNode>(doc.nodes.map((n) => [n.id, n]));
  const at = new Map<string, NetworkLink[]>();
  for (const l of doc.links)
    for (const end of [l.from, l.to]) {
      if (!at.has(end)) at.set(end, []);
      at.get(end)?.push(l);
    }
  const xy = (id: string): [number, number] | null => {
    const n = nodes.get(id);
    return n && n.x_m !== undefined && n.y_m !== undefined ? [n.x_m, n.y_m] : null;
  };
  const elbow = (angle: number, size: string, where: string, pipe?: string): void => {
    if (angle > bend) out.push({ kind: angle > 67.5 ? 'elbow-90' : 'elbow-45', size, at: where, pipe });
  };
  // polyline of a link starting at node `start`
  const line = (l: NetworkLink, start: string): [number, number][] => {
    const a = xy(l.from);
    const b = xy(l.to);
    if (!a || !b) return [];
    const pts: [number, number][] = [a, ...(l.vertices ?? []), b];
    return start === l.from ? pts : pts.reverse();
  };
  for (const l of doc.links) {
    if (l.kind !== 'pipe') continue;
    const pts = line(l, l.from);
    for (let i = 1; i < pts.length - 1; i++) elbow(deflection(pts[i - 1], pts[i], pts[i + 1]), linkSize(l), l.id, l.id);
  }
  for (const node of doc.nodes) {
    const links = at.get(node.id) ?? [];
    const flowLinks = links.filter((l) => l.kind !== 'pump');
    if (node.kind === 'tank') {
      for (const l of flowLinks) out.push({ kind: 'tank-adapter', size: linkSize(l), at: node.id, pipe: l.kind === 'pipe' ? l.id : undefined });
      continue;
    }
    if (node.kind === 'source') continue;
    for (const p of links.filter((l) => l.kind === 'pump')) {
      for (const l of flowLinks) out.push({ kind: 'pump-adapter', size: linkSize(l), at: `${p.id}@${node.id}` });
    }
    if (flowLinks.length === 0) continue;
    const sizes = flowLinks.map(linkSize);
    const largest = sizes.reduce((m, s) => (sizeRank(s) > sizeRank(m) ? s : m), sizes[0]);
    const largestRank = sizeRank(largest);
    if (flowLinks.length >= 3) {
      // the two largest links form the run; the rest are branches
      const ranked = flowLinks.map((l, i) => ({ l, r: sizeRank(sizes[i]) })).sort((a, b) => b.r - a.r);
      for (let i = 2; i < ranked.length; i++) {
        const l = ranked[i].l;
        out.push({ kind: 'tee', size: largest, at: node.id, pipe: l.kind === 'pipe' ? l.id : undefined, branch: true });
      }
    }
    flowLinks.forEach((l, i) => {
      if (sizeRank(sizes[i]) < largestRank - 1e-9)
        out.push({ kind: 'reducer', size: `${largest}x${sizes[i]}`, at: node.id, pipe: l.kind === 'pipe' ? l.id : undefined });
    });
    if (flowLinks.length === 2) {
      const [a, b] = flowLinks;
      const la = line(a, node.id);
      const lb = line(b, node.id);
      if (la.length >= 2 && lb.length >= 2)
        elbow(deflection(la[1], la[0], lb[1]), largest, node.id, b.kind === 'pipe' ? b.id : a.kind === 'pipe' ? a.id : undefined);
    }
  }
  return out;
}
