/**
 * Exact least-cost sizing of a tree by dynamic programming over Pareto frontiers.
 * On a tree fed from one fixed head the flow in every link is the sum of the design demands
 * below it, whatever the sizes, so each link's headloss per choice is known in advance. Working
 * up from the leaves, each node keeps the frontier of (head needed at the node, cost of the
 * subtree): every entry is the cheapest subtree that works with that head, and no entry needs
 * more head for more money. A link shifts its child's frontier by each choice's headloss and cost;
 * a node's frontier is the sum of its children's cheapest costs at every head threshold (a node
 * needs the highest head any child needs). At the root the cheapest entry whose head the fixed
 * head can supply is the optimum over every combination of choices (Bellman's principle; the
 * method in the spirit of dynamic-programming pipe sizing, e.g. Yang, Liang & Wu 1975, M).
 * Frontiers longer than `cap` are thinned by rounding heads up to a grid (still feasible, maybe
 * not optimal), and the result then says `exact: false`.
 *
 * @example
 * solveTree({ rootHead: 50, rootEdge: { link: 'P1', child: 'A', options: [{ tag: 0, cost: 10, headloss: 3, floor: -Infinity, cap: Infinity }] },
 *   children: new Map(), required: new Map([['A', 40]]) }).cost // 10
 */

export interface EdgeOption {
  /** Caller's id of the choice (index into its candidates). */
  tag: number;
  cost: number;
  /** Headloss at the design flow, m. */
  headloss: number;
  /** Lowest head allowed at the downstream end (profile HGL floor), m; −∞ for none. */
  floor: number;
  /** Highest head the link can deliver downstream (a PRV setting), m; +∞ for none. */
  cap: number;
}

export interface TreeEdge {
  link: string;
  child: string;
  options: EdgeOption[];
}

export interface TreeProblem {
  /** Head of the fixed head feeding the tree, m. */
  rootHead: number;
  rootEdge: TreeEdge;
  /** Links leaving each node towards the leaves. */
  children: Map<string, TreeEdge[]>;
  /** Lowest head allowed at each node (elevation + required pressure), m. */
  required: Map<string, number>;
}

export interface TreeSolution {
  feasible: boolean;
  cost: number;
  /** Chosen option tag per link. */
  picks: Map<string, number>;
  /** Lowest head at the root that any combination would need, m (why it is infeasible). */
  minimumRootHead: number;
  exact: boolean;
  /** Largest frontier seen (a measure of the work done). */
  largestFrontier: number;
}

interface Frontier {
  heads: number[];
  costs: number[];
}
interface EdgeFrontier extends Frontier {
  opt: number[];
  entry: number[];
}
interface NodeFrontier extends Frontier {
  picks: Int32Array[];
}

function thin<T extends Frontier>(f: T, cap: number, keep: (from: number, to: number) => void): boolean {
  if (f.heads.length <= cap) return false;
  const lo = f.heads[0];
  const step = (f.heads[f.heads.length - 1] - lo) / cap || 1e-9;
  let w = 0;
  for (let i = 0; i < f.heads.length; i++) {
    const h = lo + Math.ceil((f.heads[i] - lo) / step - 1e-12) * step;
    if (w > 0 && f.heads[w - 1] >= h - 1e-12) {
      // same bucket: this entry is cheaper (costs fall), needs at most h
      if (f.costs[i] < f.costs[w - 1]) {
        f.costs[w - 1] = f.costs[i];
        keep(i, w - 1);
      }
      continue;
    }
    f.heads[w] = Math.max(h, f.heads[i]);
    f.costs[w] = f.costs[i];
    keep(i, w);
    w++;
  }
  f.heads.length = w;
  f.costs.length = w;
  return true;
}

function edgeFrontier(child: NodeFrontier, options: EdgeOption[]): EdgeFrontier {
  const items: [number, number, number, number][] = [];
  for (let o = 0; o < options.length; o++) {
    const op = options[o];
    for (let e = 0; e < child.heads.length; e++) {
      const down = Math.max(child.heads[e], op.floor);
      if (down > op.cap + 1e-9) continue;
      items.push([down + op.headloss, child.costs[e] + op.cost, o, e]);
    }
  }
  items.sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  const out: EdgeFrontier = { heads: [], costs: [], opt: [], entry: [] };
  for (const [h, c, o, e] of items) {
    if (out.costs.length > 0 && c >= out.costs[out.costs.length - 1]) continue;
    out.heads.push(h);
    out.costs.push(c);
    out.opt.push(o);
    out.entry.push(e);
  }
  return out;
}

function nodeFrontier(required: number, edges: EdgeFrontier[]): NodeFrontier {
  let lower = required;
  for (const e of edges) lower = Math.max(lower, e.heads[0] ?? Infinity);
  const out: NodeFrontier = { heads: [], costs: [], picks: [] };
  if (!Number.isFinite(lower)) return out;
  const thresholds = [lower];
  for (const e of edges) for (const h of e.heads) if (h > lower) thresholds.push(h);
  thresholds.sort((a, b) => a - b);
  const ptr = new Int32Array(edges.length);
  for (const h of thresholds) {
    let cost = 0;
    for (let k = 0; k < edges.length; k++) {
      const f = edges[k];
      while (ptr[k] + 1 < f.heads.length && f.heads[ptr[k] + 1] <= h) ptr[k]++;
      cost += f.costs[ptr[k]];
    }
    if (out.costs.length > 0 && cost >= out.costs[out.costs.length - 1]) continue;
    out.heads.push(h);
    out.costs.push(cost);
    out.picks.push(Int32Array.from(ptr));
  }
  return out;
}

/** Solve one tree problem exactly (see the module comment). */
export function solveTree(p: TreeProblem, cap = 20000): TreeSolution {
  // iterative post-order over the nodes below the root edge
  const order: string[] = [];
  const stack = [p.rootEdge.child];
  while (stack.length > 0) {
    const v = stack.pop() as string;
    order.push(v);
    for (const e of p.children.get(v) ?? []) stack.push(e.child);
  }
  const nodeF = new Map<string, NodeFrontier>();
  const edgeF = new Map<string, EdgeFrontier>();
  let exact = true;
  let largest = 0;
  for (let i = order.length - 1; i >= 0; i--) {
    const v = order[i];
    const edges = (p.children.get(v) ?? []).map((e) => {
      const f = edgeFrontier(nodeF.get(e.child) as NodeFrontier, e.options);
      if (
        thin(f, cap, (from, to) => {
          f.opt[to] = f.opt[from];
          f.entry[to] = f.entry[from];
        })
      ) {
        exact = false;
        f.opt.length = f.heads.length;
        f.entry.length = f.heads.length;
      }
      edgeF.set(e.link, f);
      largest = Math.max(largest, f.heads.length);
      return f;
    });
    const nf = nodeFrontier(p.required.get(v) ?? -Infinity, edges);
    if (
      thin(nf, cap, (from, to) => {
        nf.picks[to] = nf.picks[from];
      })
    ) {
      exact = false;
      nf.picks.length = nf.heads.length;
    }
    nodeF.set(v, nf);
    largest = Math.max(largest, nf.heads.length);
  }
  const rootF = edgeFrontier(nodeF.get(p.rootEdge.child) as NodeFrontier, p.rootEdge.options);
  const picks = new Map<string, number>();
  const minimumRootHead = rootF.heads[0] ?? Infinity;
  let best = -1;
  for (let e = 0; e < rootF.heads.length; e++) if (rootF.heads[e] <= p.rootHead + 1e-9) best = e; // costs fall as heads rise
  if (best < 0) return { feasible: false, cost: Infinity, picks, minimumRootHead, exact, largestFrontier: largest };
  const todo: [TreeEdge, EdgeFrontier, number][] = [[p.rootEdge, rootF, best]];
  while (todo.length > 0) {
    const [edge, f, e] = todo.pop() as [TreeEdge, EdgeFrontier, number];
    picks.set(edge.link, edge.options[f.opt[e]].tag);
    const nf = nodeF.get(edge.child) as NodeFrontier;
    const chosen = nf.picks[f.entry[e]];
    (p.children.get(edge.child) ?? []).forEach((ce, k) => todo.push([ce, edgeF.get(ce.link) as EdgeFrontier, chosen[k]]));
  }
  return { feasible: true, cost: rootF.costs[best], picks, minimumRootHead, exact, largestFrontier: largest };
}
