/**
 * What every check reads: the document, its pressure-driven steady solve, and per node the static
 * head (tanks full, no flow) from the engine's staticHeads. Built once per checklist.
 */
import { DEFAULT_COVER_M, staticHeads } from '../checks';
import type { NetworkDocument, NetworkLink, NetworkNode, PipeLink } from '../network-document';
import { compileNetwork } from '../network-model';
import { normaliseDocument, solve, type SteadyResult } from '../steady';

export interface ReviewContext {
  doc: NetworkDocument;
  result: SteadyResult;
  solved: boolean;
  node: Map<string, NetworkNode>;
  link: Map<string, NetworkLink>;
  /** Static head by node id, m (−Infinity where no fixed head reaches). */
  staticHead: Map<string, number>;
}

export function reviewContext(doc: NetworkDocument): ReviewContext {
  const network = normaliseDocument(doc);
  const result = solve(network, { pressureDriven: true });
  const staticHead = new Map<string, number>();
  if (network.nodes.length) {
    const model = compileNetwork(network);
    const heads = staticHeads(model, { closed: model.closedInDocument });
    model.nodeIds.forEach((id, i) => staticHead.set(id, heads[i]));
  }
  return {
    doc: network,
    result,
    solved: result.converged,
    node: new Map(network.nodes.map((n) => [n.id, n])),
    link: new Map(network.links.map((l) => [l.id, l])),
    staticHead,
  };
}

/** The pipe's lowest point, m: ground less cover along its profile, or its lower end. */
export function lowestPoint(ctx: ReviewContext, pipe: PipeLink): { elevation_m: number; at_m: number } {
  const a = ctx.node.get(pipe.from)?.elevation_m ?? Infinity;
  const b = ctx.node.get(pipe.to)?.elevation_m ?? Infinity;
  let best = a <= b ? { elevation_m: a, at_m: 0 } : { elevation_m: b, at_m: pipe.length_m };
  const cover = pipe.cover_m ?? DEFAULT_COVER_M;
  for (const [dist, ground] of pipe.profile ?? []) {
    if (ground - cover < best.elevation_m) best = { elevation_m: ground - cover, at_m: dist };
  }
  return best;
}

/** Mean of an hourly pattern (1 without one): the share of the day a base demand runs. */
export function dailyFactor(doc: NetworkDocument, pattern: string | undefined): number {
  const p = pattern ? doc.patterns?.[pattern] : undefined;
  if (!p || p.length === 0) return 1;
  return p.reduce((s, v) => s + v, 0) / p.length;
}

export function nameOf(e: { name?: string } | undefined): { elementName?: string } {
  return e?.name ? { elementName: e.name } : {};
}
