import type { NetworkDocument, NetworkLink, NetworkNode } from '../network-document';

/**
 * Split a network into the parts sizing treats separately. Fixed heads (sources, tanks) cut the
 * network: what lies between them is a *region* of tees and outlets fed through boundary links.
 * - a region fed through exactly one link from one fixed head, with no loop inside, is a tree:
 *   flows there follow from the demands alone, whatever the sizes (exact dynamic programming);
 * - any other region (a loop, or fed from two tanks) is looped: flows depend on the sizes;
 * - a region touched by a pump is the pump's side (rising main): sized for the pump, not here;
 * - a link joining two fixed heads directly (a tank header) carries no design flow: not sized.
 * Closed links (shut valves, closed pipes) are left out of the graph.
 *
 * @example partitionNetwork(hillSmallholding).regions.filter((r) => r.kind === 'tree').length // 1
 */

export interface Region {
  kind: 'tree' | 'looped' | 'pump';
  /** Tee and outlet ids in the region. */
  nodes: string[];
  /** Links inside the region and its boundary links. */
  links: string[];
  /** Tree regions: the fixed-head node and the link that feeds the region. */
  root?: { node: string; link: string };
}

export interface Partition {
  regions: Region[];
  /** Links no region owns (headers between tanks, closed links) with the reason. */
  outside: { link: string; reason: string }[];
}

function isFixed(node: NetworkNode | undefined): boolean {
  return node?.kind === 'source' || node?.kind === 'tank';
}

function isClosed(link: NetworkLink): boolean {
  return (link.kind === 'pipe' && link.closed === true) || (link.kind === 'valve' && link.valve_type === 'shutoff' && link.open === false);
}

/** Partition a (validated) document into regions; see the module comment. */
export function partitionNetwork(doc: NetworkDocument): Partition {
  const byId = new Map(doc.nodes.map((n) => [n.id, n]));
  const parent = new Map<string, string>();
  const find = (id: string): string => {
    let r = id;
    while (parent.get(r) !== r) r = parent.get(r) as string;
    parent.set(id, r);
    return r;
  };
  for (const n of doc.nodes) if (!isFixed(n)) parent.set(n.id, n.id);
  const outside: Partition['outside'] = [];
  for (const link of doc.links) {
    if (isClosed(link)) {
      outside.push({ link: link.id, reason: 'closed' });
      continue;
    }
    const a = byId.get(link.from);
    const b = byId.get(link.to);
    if (isFixed(a) && isFixed(b)) {
      outside.push({ link: link.id, reason: 'joins two fixed heads (a tank header or bypass): carries no design flow' });
      continue;
    }
    if (!isFixed(a) && !isFixed(b)) {
      const ra = find(link.from);
      const rb = find(link.to);
      if (ra !== rb) parent.set(ra, rb);
    }
  }
  const groups = new Map<string, { nodes: string[]; internal: NetworkLink[]; boundary: NetworkLink[] }>();
  for (const n of doc.nodes) {
    if (isFixed(n)) continue;
    const r = find(n.id);
    if (!groups.has(r)) groups.set(r, { nodes: [], internal: [], boundary: [] });
    groups.get(r)?.nodes.push(n.id);
  }
  const skipped = new Set(outside.map((o) => o.link));
  for (const link of doc.links) {
    if (skipped.has(link.id)) continue;
    const inner = isFixed(byId.get(link.from)) ? link.to : link.from;
    const g = groups.get(find(inner));
    if (!g) continue;
    if (isFixed(byId.get(link.from)) || isFixed(byId.get(link.to))) g.boundary.push(link);
    else g.internal.push(link);
  }
  const regions: Region[] = [];
  for (const g of groups.values()) {
    const all = [...g.internal, ...g.boundary];
    const links = all.map((l) => l.id);
    if (all.some((l) => l.kind === 'pump')) {
      regions.push({ kind: 'pump', nodes: g.nodes, links });
      continue;
    }
    if (g.boundary.length === 0) continue; // disconnected: nothing feeds it (the solver reports it)
    const tree = g.boundary.length === 1 && g.internal.length === g.nodes.length - 1;
    if (tree) {
      const b = g.boundary[0];
      regions.push({ kind: 'tree', nodes: g.nodes, links, root: { node: isFixed(byId.get(b.from)) ? b.from : b.to, link: b.id } });
    } else {
      regions.push({ kind: 'looped', nodes: g.nodes, links });
    }
  }
  return { regions, outside };
}
