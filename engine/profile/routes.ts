import type { NetworkDocument } from '../network-document';

/**
 * Routes along the pipes between two elements: the shortest by pipe length (Dijkstra 1959), and
 * further loopless routes in order of length where a looped network offers them (Yen 1971,
 * "Finding the k shortest loopless paths in a network", Management Science 17:712). Every link
 * counts, in either direction; pipes weigh their length_m, valves and pumps nothing.
 *
 * @example
 * findRoutes(hillSmallholding, 'T1', 'TR4', 3)[0].links // ['HD1', 'V0', 'M1', …, 'L-TR4']
 */

export interface Route {
  /** Node ids from start to end. */
  nodes: string[];
  /** Link ids between them (links[i] joins nodes[i] and nodes[i + 1]). */
  links: string[];
  /** Total pipe length, m. */
  length_m: number;
}

/** A route cannot be found: unknown elements or no path; the message names the field. */
export class RouteError extends Error {
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(`${field}: ${message}`);
    this.name = 'RouteError';
  }
}

interface Edge {
  to: number;
  link: number;
  w: number;
}

function graph(doc: NetworkDocument): { index: Map<string, number>; adj: Edge[][] } {
  const index = new Map(doc.nodes.map((n, i) => [n.id, i]));
  const adj: Edge[][] = doc.nodes.map(() => []);
  doc.links.forEach((l, k) => {
    const a = index.get(l.from);
    const b = index.get(l.to);
    if (a === undefined || b === undefined || a === b) return;
    const w = l.kind === 'pipe' ? l.length_m : 0;
    adj[a].push({ to: b, link: k, w });
    adj[b].push({ to: a, link: k, w });
  });
  return { index, adj };
}

/** Min-heap of (distance, node) pairs for Dijkstra. */
class Heap {
  private d: number[] = [];
  private v: number[] = [];
  get size(): number {
    return this.d.length;
  }
  push(dist: number, node: number): void {
    let i = this.d.length;
    this.d.push(dist);
    this.v.push(node);
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (this.d[p] <= this.d[i]) break;
      this.swap(i, p);
      i = p;
    }
  }
  pop(): [number, number] {
    const top: [number, number] = [this.d[0], this.v[0]];
    const lastD = this.d.pop() as number;
    const lastV = this.v.pop() as number;
    if (this.d.length > 0) {
      this.d[0] = lastD;
      this.v[0] = lastV;
      let i = 0;
      for (;;) {
        const l = 2 * i + 1;
        const r = l + 1;
        let m = i;
        if (l < this.d.length && this.d[l] < this.d[m]) m = l;
        if (r < this.d.length && this.d[r] < this.d[m]) m = r;
        if (m === i) break;
        this.swap(i, m);
        i = m;
      }
    }
    return top;
  }
  private swap(a: number, b: number): void {
    [this.d[a], this.d[b]] = [this.d[b], this.d[a]];
    [this.v[a], this.v[b]] = [this.v[b], this.v[a]];
  }
}

interface Tree {
  dist: Float64Array;
  prevNode: Int32Array;
  prevLink: Int32Array;
}

/** Dijkstra from the sources (all at distance 0), avoiding banned nodes and links; stops at t when given. */
function dijkstra(adj: Edge[][], sources: number[], t: number, bannedNodes: Set<number>, bannedLinks: Set<number>): Tree {
  const n = adj.length;
  const dist = new Float64Array(n).fill(Infinity);
  const prevNode = new Int32Array(n).fill(-1);
  const prevLink = new Int32Array(n).fill(-1);
  const done = new Uint8Array(n);
  const heap = new Heap();
  for (const s of sources) {
    dist[s] = 0;
    heap.push(0, s);
  }
  while (heap.size > 0) {
    const [d, u] = heap.pop();
    if (done[u] || d > dist[u]) continue;
    done[u] = 1;
    if (u === t) break;
    for (const e of adj[u]) {
      if (bannedNodes.has(e.to) || bannedLinks.has(e.link) || done[e.to]) continue;
      const nd = d + e.w;
      if (nd < dist[e.to]) {
        dist[e.to] = nd;
        prevNode[e.to] = u;
        prevLink[e.to] = e.link;
        heap.push(nd, e.to);
      }
    }
  }
  return { dist, prevNode, prevLink };
}

function pathTo(tree: Tree, t: number): { nodes: number[]; links: number[]; w: number } {
  const nodes = [t];
  const links: number[] = [];
  for (let v = t; tree.prevNode[v] >= 0; v = tree.prevNode[v]) {
    links.push(tree.prevLink[v]);
    nodes.push(tree.prevNode[v]);
  }
  return { nodes: nodes.reverse(), links: links.reverse(), w: tree.dist[t] };
}

/** Dijkstra from s to t avoiding banned nodes and links; null when t is unreachable. */
function shortest(
  adj: Edge[][],
  s: number,
  t: number,
  bannedNodes: Set<number>,
  bannedLinks: Set<number>,
): { nodes: number[]; links: number[]; w: number } | null {
  const tree = dijkstra(adj, [s], t, bannedNodes, bannedLinks);
  return tree.dist[t] === Infinity ? null : pathTo(tree, t);
}

/**
 * Up to `count` loopless routes from → to, shortest first (see module doc).
 * @throws RouteError for an unknown element, the same element twice, or elements not connected
 */
export function findRoutes(doc: NetworkDocument, from: string, to: string, count = 3): Route[] {
  const { index, adj } = graph(doc);
  const s = index.get(from);
  const t = index.get(to);
  if (s === undefined) throw new RouteError('from', `no element ${from} in the network`);
  if (t === undefined) throw new RouteError('to', `no element ${to} in the network`);
  if (s === t) throw new RouteError('to', 'must differ from the start of the route');
  const first = shortest(adj, s, t, new Set(), new Set());
  if (!first) throw new RouteError('to', `${to} is not connected to ${from} by any pipe, valve or pump`);
  const weight = (links: number[]): number =>
    links.reduce((sum, k) => {
      const l = doc.links[k];
      return sum + (l.kind === 'pipe' ? l.length_m : 0);
    }, 0);
  const found = [first];
  const candidates: { nodes: number[]; links: number[]; w: number }[] = [];
  const key = (links: number[]): string => links.join(',');
  const seen = new Set([key(first.links)]);
  while (found.length < count) {
    const last = found[found.length - 1];
    for (let i = 0; i < last.nodes.length - 1; i++) {
      const spur = last.nodes[i];
      const rootNodes = last.nodes.slice(0, i + 1);
      const rootLinks = last.links.slice(0, i);
      const bannedLinks = new Set<number>();
      for (const p of found) if (p.links.length > i && key(p.links.slice(0, i)) === key(rootLinks) && p.nodes[i] === spur) bannedLinks.add(p.links[i]);
      const bannedNodes = new Set(rootNodes.slice(0, -1));
      const tail = shortest(adj, spur, t, bannedNodes, bannedLinks);
      if (!tail) continue;
      const links = [...rootLinks, ...tail.links];
      const k = key(links);
      if (seen.has(k)) continue;
      seen.add(k);
      candidates.push({ nodes: [...rootNodes.slice(0, -1), ...tail.nodes], links, w: weight(links) });
    }
    if (candidates.length === 0) break;
    candidates.sort((a, b) => a.w - b.w || a.links.length - b.links.length);
    found.push(candidates.shift() as (typeof candidates)[number]);
  }
  return found.map((p) => ({ nodes: p.nodes.map((i) => doc.nodes[i].id), links: p.links.map((k) => doc.links[k].id), length_m: p.w }));
}

/**
 * The shortest route from its nearest supply (source or tank) to every outlet it reaches: one
 * Dijkstra from every source and tank at once over pipes and valves (a fill pump's rising main is
 * not a supply route), as in longestSupplyRoute. Outlets no supply reaches have no route.
 */
export function supplyRoutes(doc: NetworkDocument): Route[] {
  const { index, adj } = graph(doc);
  const pumps = new Set(doc.links.flatMap((l, k) => (l.kind === 'pump' ? [k] : [])));
  const supplies = doc.nodes.flatMap((n, i) => (n.kind === 'tank' || n.kind === 'source' ? [i] : []));
  if (supplies.length === 0) return [];
  const tree = dijkstra(adj, supplies, -1, new Set(), pumps);
  const out: Route[] = [];
  for (const n of doc.nodes) {
    const i = index.get(n.id) as number;
    if (n.kind !== 'outlet' || tree.dist[i] === Infinity || tree.prevNode[i] < 0) continue;
    const p = pathTo(tree, i);
    out.push({ nodes: p.nodes.map((v) => doc.nodes[v].id), links: p.links.map((k) => doc.links[k].id), length_m: p.w });
  }
  return out;
}

/**
 * The longest of the shortest routes from any source or tank to any outlet (the demo's "longest
 * route"): one Dijkstra from every source and tank at once over pipes and valves (a fill pump's
 * rising main is not a supply route), then the outlet farthest from its nearest supply.
 * @returns null when no outlet is connected to a source or tank
 */
export function longestSupplyRoute(doc: NetworkDocument): Route | null {
  const { index, adj } = graph(doc);
  const pumps = new Set(doc.links.flatMap((l, k) => (l.kind === 'pump' ? [k] : [])));
  const supplies = doc.nodes.flatMap((n, i) => (n.kind === 'tank' || n.kind === 'source' ? [i] : []));
  if (supplies.length === 0) return null;
  const tree = dijkstra(adj, supplies, -1, new Set(), pumps);
  let far = -1;
  for (const n of doc.nodes) {
    const i = index.get(n.id) as number;
    if (n.kind === 'outlet' && tree.dist[i] < Infinity && (far < 0 || tree.dist[i] > tree.dist[far])) far = i;
  }
  if (far < 0) return null;
  const p = pathTo(tree, far);
  return { nodes: p.nodes.map((i) => doc.nodes[i].id), links: p.links.map((k) => doc.links[k].id), length_m: p.w };
}
