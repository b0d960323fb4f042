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
  constructor(readonly field: string, message: string) { super(`${field}: ${message}`); this.name = 'RouteError'; }
}

interface Edge { to: number; link: number; w: number }

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

/** Dijkstra from s to t avoiding banned nodes and links; null when t is unreachable. */
function shortest(adj: Edge[][], s: number, t: number, bannedNodes: Set<number>, bannedLinks: Set<number>): { nodes: number[]; links: number[]; w: number } | null {
  const n = adj.length;
  const dist = new Float64Array(n).fill(Infinity);
  const prevNode = new Int32Array(n).fill(-1);
  const prevLink = new Int32Array(n).fill(-1);
  const done = new Uint8Array(n);
  dist[s] = 0;
  // networks here are small (hundreds of elements): a linear scan beats a heap's bookkeeping
  for (;;) {
    let u = -1;
    for (let i = 0; i < n; i++) if (!done[i] && dist[i] < Infinity && (u < 0 || dist[i] < dist[u])) u = i;
    if (u < 0 || u === t) break;
    done[u] = 1;
    for (const e of adj[u]) {
      if (bannedNodes.has(e.to) || bannedLinks.has(e.link) || done[e.to]) continue;
      const d = dist[u] + e.w;
      if (d < dist[e.to]) { dist[e.to] = d; prevNode[e.to] = u; prevLink[e.to] = e.link; }
    }
  }
  if (dist[t] === Infinity) return null;
  const nodes = [t];
  const links: number[] = [];
  for (let v = t; v !== s; v = prevNode[v]) { links.push(prevLink[v]); nodes.push(prevNode[v]); }
  return { nodes: nodes.reverse(), links: links.reverse(), w: dist[t] };
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
  const weight = (links: number[]): number => links.reduce((sum, k) => { const l = doc.links[k]; return sum + (l.kind === 'pipe' ? l.length_m : 0); }, 0);
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
 * The longest of the shortest routes from any source or tank to any outlet (the demo's "longest
 * route"): for each outlet the shortest route from the nearest source or tank, then the longest.
 * @returns null when no outlet is connected to a source or tank
 */
export function longestSupplyRoute(doc: NetworkDocument): Route | null {
  const supplies = doc.nodes.filter((n) => n.kind === 'tank' || n.kind === 'source');
  let best: Route | null = null;
  for (const outlet of doc.nodes.filter((n) => n.kind === 'outlet')) {
    let nearest: Route | null = null;
    for (const s of supplies) {
      try {
        const [r] = findRoutes(doc, s.id, outlet.id, 1);
        // a route through the fill pump is not a supply route for the outlet
        if (r.links.some((id) => doc.links.find((l) => l.id === id)?.kind === 'pump')) continue;
        if (!nearest || r.length_m < nearest.length_m) nearest = r;
      } catch { /* not connected to this supply */ }
    }
    if (nearest && (!best || nearest.length_m > best.length_m)) best = nearest;
  }
  return best;
}
