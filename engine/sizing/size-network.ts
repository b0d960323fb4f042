import { DEFAULT_VELOCITY_LIMIT_MS, withProjectCover } from '../checks';
import { HW_OMEGA_SI } from '../hazen-williams';
import type { NetworkDocument, NetworkLink, PipeLink } from '../network-document';
import { DEFAULT_VALVE_MINOR_LOSS } from '../network-model';
import { solve } from '../steady';
import { validateDocument } from '../validate';
import { localSearch } from './local-search';
import { type SizingCandidate } from './price-catalogue';
import { partitionNetwork, type Region } from './regions';
import { designDemand, pipeHeadloss, profileHeadFloor, requiredPressure, type HydraulicSettings } from './requirements';
import { type EdgeOption, solveTree, type TreeEdge } from './tree-dp';
import { type CheckSettings, type DesignCheck, designChecks, pipeStaticPressures } from './verify';
import { GRAVITY_MS2 } from '../constants';
import { joukowskyHead } from '../review/joukowsky';
import { pipeWaveSpeed } from '../review/wave-speed';

/**
 * "Size the lines": the cheapest choice from a priced catalogue for the chosen pipes (or all) such
 * that every outlet meets its required pressure at design flow and every pipe meets the velocity
 * and rating checks (./requirements, ./verify). Tree regions (./regions; most farms) are sized
 * exactly by dynamic programming (./tree-dp); looped regions by a reported heuristic search
 * (./local-search). The result is always re-checked with a real steady solve of the sized design;
 * on a tree, if that solve draws more than the design flows (an emitter above its design
 * pressure), the flows are raised to what it drew and the tree is sized again (at most 3 rounds).
 * Tanks stand at their document levels, as in the steady solve; rising mains (pump side) and tank
 * headers are not sized here.
 *
 * @example
 * const r = sizeNetwork(hillSmallholding, candidates, {});
 * r.feasible && r.cost < r.largestCost
 */

export interface SizingOptions extends CheckSettings {
  /** Pipe ids to size (default: every pipe sizing can change). */
  pipes?: string[];
  /** Hazen-Williams SI coefficient ω (default 10.67). */
  omega?: number;
  /** Keep each pipe's own series (material and class) and change only its size (default false). */
  sameSeries?: boolean;
  /**
   * Also require static pressure plus the Joukowsky surge of stopping a pipe's flow at once (wave
   * speed by Korteweg from the candidate's material and wall, ../review) to stay within the rating,
   * as the review's surge check does (NRCS Standard 430: pressure including transients below the
   * rating, V2). Trees filter each pipe's candidates at its design flow (fixed by the demands);
   * looped regions check every design the search solves, at the flows that solve gives, and the
   * final re-check of every region does the same. Default true.
   */
  surge?: boolean;
  /** Looped regions: budget of hydraulic solves (default 40,000). */
  maxEvaluations?: number;
  seed?: number;
  /** The project's default cover over pipes without their own, m (Profile tab); the sized document keeps pipes without a cover of their own. */
  cover_m?: number | null;
}

export interface PipeChoice {
  pipe: string;
  key: string;
  label: string;
  diameter_m: number;
  length_m: number;
  price_per_m: number;
  cost: number;
  /** What the pipe was before (series/nominal or diameter). */
  was: string;
}

export interface RegionReport {
  kind: Region['kind'];
  pipes: string[];
  method: 'exact dynamic programming' | 'heuristic local search' | 'not sized';
  /** True when the method proves the least cost (trees without frontier thinning). */
  exact: boolean;
  feasible: boolean;
  note: string;
  evaluations?: number;
}

export interface SizingResult {
  feasible: boolean;
  document: NetworkDocument;
  /** Cost of the sized pipes. */
  cost: number;
  /** The same pipes at the largest choice each may take (the "largest-size design"). */
  largestCost: number;
  choices: PipeChoice[];
  skipped: { pipe: string; reason: string }[];
  regions: RegionReport[];
  check: DesignCheck;
  settings: { omega: number; velocityLimit_ms: number; ratingFraction: number; minPressure_m?: number; surge: boolean };
}

const describe = (p: PipeLink): string => (p.series && p.nominal ? `${p.series}/${p.nominal}` : `${Math.round(p.diameter_m * 1e4) / 10} mm`);

/**
 * A pipe with a candidate fitted: diameter, roughness, rating, series and size.
 * @example applyCandidate(pipe, cand).diameter_m === cand.diameter_m
 */
export function applyCandidate(pipe: PipeLink, c: SizingCandidate): PipeLink {
  const out: PipeLink = { ...pipe, diameter_m: c.diameter_m, roughness: c.roughness ?? pipe.roughness };
  if (c.series) {
    out.series = c.series;
    out.nominal = c.nominal;
    out.material = c.material;
  } else {
    delete out.series;
    delete out.nominal;
    if (c.material) out.material = c.material;
  }
  if (c.rating_m !== undefined) out.rating_m = c.rating_m;
  else delete out.rating_m;
  return out;
}

function better(a: SizingCandidate, b: SizingCandidate, headloss: string): boolean {
  // a at least as good as b hydraulically, rated at least as well, and no dearer
  const ra = a.roughness ?? 0;
  const rb = b.roughness ?? 0;
  const rough = headloss === 'darcy-weisbach' ? ra <= rb : ra >= rb;
  const rated = (a.rating_m ?? Infinity) >= (b.rating_m ?? Infinity);
  return a.diameter_m >= b.diameter_m && a.price_per_m <= b.price_per_m && rough && rated;
}

/** Size a document's pipes from priced candidates (see the module comment). Throws on an invalid document. */
export function sizeNetwork(input: NetworkDocument, candidates: SizingCandidate[], options: SizingOptions = {}): SizingResult {
  const invalid = validateDocument(input);
  if (invalid.length > 0) throw new Error(invalid.map((w) => w.message).join('\n'));
  const covered = withProjectCover(input, options.cover_m);
  const doc: NetworkDocument = { ...covered, links: covered.links.map((l) => ({ ...l })) as NetworkLink[], nodes: input.nodes };
  const omega = options.omega ?? HW_OMEGA_SI;
  const limit = options.velocityLimit_ms ?? DEFAULT_VELOCITY_LIMIT_MS;
  const share = options.ratingFraction ?? 1;
  const hyd: HydraulicSettings = { headloss: doc.headloss, omega };
  const settings = { omega, velocityLimit_ms: limit, ratingFraction: share, minPressure_m: options.minPressure_m, surge: options.surge !== false };
  const checkSettings: CheckSettings = { minPressure_m: options.minPressure_m, velocityLimit_ms: limit, ratingFraction: share, surge: options.surge !== false };
  const nodeById = new Map(doc.nodes.map((n) => [n.id, n]));
  const linkIndex = new Map(doc.links.map((l, k) => [l.id, k]));
  const wanted = options.pipes ? new Set(options.pipes) : null;
  const statics = pipeStaticPressures(doc);
  const partition = partitionNetwork(doc);
  const skipped: SizingResult['skipped'] = [];
  for (const o of partition.outside) if (doc.links[linkIndex.get(o.link) ?? -1]?.kind === 'pipe') skipped.push({ pipe: o.link, reason: o.reason });

  const allowed = new Map<string, SizingCandidate[]>();
  const choices = new Map<string, SizingCandidate>();
  const reports: RegionReport[] = [];
  const pipeOf = (id: string): PipeLink => doc.links[linkIndex.get(id) as number] as PipeLink;
  const filterByRating = (p: PipeLink): SizingCandidate[] => {
    const ps = statics.get(p.id) ?? -Infinity;
    return candidates.filter(
      (c) => (!options.sameSeries || !p.series || c.series === p.series) && (c.rating_m === undefined || ps <= share * c.rating_m + 1e-9),
    );
  };
  const prune = (list: SizingCandidate[]): SizingCandidate[] =>
    list
      .filter((c, i) => !list.some((o, j) => j !== i && better(o, c, doc.headloss) && (!better(c, o, doc.headloss) || j < i)))
      .sort((a, b) => a.diameter_m - b.diameter_m || a.price_per_m - b.price_per_m);

  for (const region of partition.regions) {
    const pipes = region.links.filter((id) => pipeOf(id).kind === 'pipe' && (!wanted || wanted.has(id)));
    if (region.kind === 'pump') {
      for (const id of region.links)
        if (pipeOf(id).kind === 'pipe') skipped.push({ pipe: id, reason: 'on a pump line (rising main): size it for the pump, not here' });
      reports.push({
        kind: 'pump',
        pipes: [],
        method: 'not sized',
        exact: false,
        feasible: true,
        note: 'pump side: the pump sets the flow, so pipe size trades against pump head, which sizing does not price',
      });
      continue;
    }
    if (wanted)
      for (const id of region.links)
        if (pipeOf(id).kind === 'pipe' && !wanted.has(id)) skipped.push({ pipe: id, reason: 'not chosen for sizing (kept as drawn)' });
    if (region.kind === 'tree') reports.push(sizeTree(region, pipes));
    else reports.push(sizeLooped(region, pipes));
  }

  function sizeTree(region: Region, pipes: string[]): RegionReport {
    const root = region.root as { node: string; link: string };
    const sized = new Set(pipes);
    const children = new Map<string, { link: NetworkLink; child: string }[]>();
    const order: string[] = [];
    const upstreamIsFrom = new Map<string, boolean>();
    const seen = new Set<string>([root.node]);
    const rootLink = doc.links[linkIndex.get(root.link) as number];
    const first = rootLink.from === root.node ? rootLink.to : rootLink.from;
    upstreamIsFrom.set(rootLink.id, rootLink.from === root.node);
    const adjacency = new Map<string, NetworkLink[]>();
    for (const id of region.links) {
      const l = doc.links[linkIndex.get(id) as number];
      for (const end of [l.from, l.to]) {
        if (!adjacency.has(end)) adjacency.set(end, []);
        adjacency.get(end)?.push(l);
      }
    }
    const queue = [first];
    seen.add(first);
    while (queue.length > 0) {
      const v = queue.shift() as string;
      order.push(v);
      for (const l of adjacency.get(v) ?? []) {
        const w = l.from === v ? l.to : l.from;
        if (seen.has(w)) continue;
        seen.add(w);
        upstreamIsFrom.set(l.id, l.from === v);
        if (!children.has(v)) children.set(v, []);
        children.get(v)?.push({ link: l, child: w });
        queue.push(w);
      }
    }
    const flows = new Map<string, number>();
    const subtree = new Map<string, number>();
    for (let i = order.length - 1; i >= 0; i--) {
      const v = order[i];
      let q = designDemand(nodeById.get(v) as never);
      for (const c of children.get(v) ?? []) {
        q += subtree.get(c.child) ?? 0;
        flows.set(c.link.id, subtree.get(c.child) ?? 0);
      }
      subtree.set(v, q);
    }
    flows.set(rootLink.id, subtree.get(first) ?? 0);
    const rootNode = nodeById.get(root.node);
    const rootHead = rootNode?.kind === 'source' ? rootNode.head_m : rootNode?.kind === 'tank' ? rootNode.elevation_m + rootNode.level_m : 0;
    const required = new Map<string, number>();
    for (const v of order) {
      const n = nodeById.get(v);
      if (n) required.set(v, n.elevation_m + requiredPressure(n, options.minPressure_m));
    }
    const only = new Set([...region.nodes, ...region.links]);
    let exact = true;
    let problem = '';
    for (let round = 0; round < 3; round++) {
      const lists = new Map<string, SizingCandidate[]>();
      const edgeOf = (l: NetworkLink, child: string): TreeEdge => {
        const q = flows.get(l.id) ?? 0;
        const up = upstreamIsFrom.get(l.id) ?? true;
        const downNode = nodeById.get(child);
        if (l.kind === 'pipe' && sized.has(l.id)) {
          const ps = statics.get(l.id) ?? -Infinity;
          const list = prune(
            filterByRating(l).filter((c) => {
              const v = q / ((Math.PI * c.diameter_m ** 2) / 4);
              if (v > limit + 1e-12) return false;
              if (options.surge === false || c.rating_m === undefined || !Number.isFinite(ps)) return true;
              return ps + joukowskyHead(pipeWaveSpeed(applyCandidate(l, c)).waveSpeed_ms, v) <= c.rating_m + 1e-9;
            }),
          );
          lists.set(l.id, list);
          allowed.set(l.id, list);
          if (list.length === 0) problem ||= `${l.id}: no catalogue pipe meets the rating, surge and velocity checks at ${Math.round(q * 1e5) / 100} L/s`;
          return {
            link: l.id,
            child,
            options: list.map((c, j) => {
              const hl = pipeHeadloss(l, c, q, hyd);
              return { tag: j, cost: c.price_per_m * l.length_m, headloss: hl, floor: profileHeadFloor(l, hl, up), cap: Infinity };
            }),
          };
        }
        let option: EdgeOption;
        if (l.kind === 'pipe') {
          const hl = pipeHeadloss(l, { key: '', label: '', diameter_m: l.diameter_m, price_per_m: 0 }, q, hyd);
          option = { tag: -1, cost: 0, headloss: hl, floor: profileHeadFloor(l, hl, up), cap: Infinity };
        } else if (l.kind === 'valve') {
          const area = (Math.PI * l.diameter_m ** 2) / 4;
          const hl = ((l.minor_loss ?? DEFAULT_VALVE_MINOR_LOSS) * (q / area) ** 2) / (2 * GRAVITY_MS2);
          const wrongWay = (l.valve_type === 'check' || l.valve_type === 'prv') && !up && q > 0;
          const cap = wrongWay ? -Infinity : l.valve_type === 'prv' ? (downNode?.elevation_m ?? 0) + (l.setting_m ?? 0) : Infinity;
          option = { tag: -1, cost: 0, headloss: hl, floor: -Infinity, cap };
        } else {
          option = { tag: -1, cost: 0, headloss: 0, floor: -Infinity, cap: -Infinity };
        }
        return { link: l.id, child, options: [option] };
      };
      const treeChildren = new Map<string, TreeEdge[]>();
      for (const [v, list] of children)
        treeChildren.set(
          v,
          list.map((c) => edgeOf(c.link, c.child)),
        );
      const sol = solveTree({ rootHead, rootEdge: edgeOf(rootLink, first), children: treeChildren, required });
      exact = exact && sol.exact;
      if (problem) return { kind: 'tree', pipes, method: 'exact dynamic programming', exact, feasible: false, note: problem };
      if (!sol.feasible) {
        return {
          kind: 'tree',
          pipes,
          method: 'exact dynamic programming',
          exact,
          feasible: false,
          note: `no combination works: the region needs ${Math.round(sol.minimumRootHead * 100) / 100} m of head at ${root.node}, which supplies ${Math.round(rootHead * 100) / 100} m`,
        };
      }
      for (const id of pipes) {
        const c = lists.get(id)?.[sol.picks.get(id) ?? -1];
        if (c) {
          choices.set(id, c);
          doc.links[linkIndex.get(id) as number] = applyCandidate(pipeOf(id), c);
        }
      }
      const solved = solve(doc, { omega });
      const check = designChecks(doc, solved, checkSettings, only, statics);
      let raised = false;
      for (const [id, q] of flows) {
        const got = Math.abs(solved.links[id]?.flow_m3s ?? 0);
        if (got > q * (1 + 1e-6) + 1e-12) {
          flows.set(id, got);
          raised = true;
        }
      }
      if (check.failures.length === 0 || !raised) {
        const note =
          check.failures.length === 0
            ? `flows fixed by the demands (${pipes.length} pipes, ${order.length} tees and outlets); largest frontier ${sol.largestFrontier}${round > 0 ? `; sized again at the flows the solve drew (round ${round + 1})` : ''}`
            : `the solve of the sized design still fails: ${check.failures.map((f) => f.message).join('; ')}`;
        return { kind: 'tree', pipes, method: 'exact dynamic programming', exact: exact && round === 0, feasible: check.failures.length === 0, note };
      }
    }
    return {
      kind: 'tree',
      pipes,
      method: 'exact dynamic programming',
      exact: false,
      feasible: false,
      note: 'the sized design still fails after re-sizing at the solved flows three times',
    };
  }

  function sizeLooped(region: Region, pipes: string[]): RegionReport {
    const only = new Set([...region.nodes, ...region.links]);
    const lists = pipes.map((id) => prune(filterByRating(pipeOf(id))));
    pipes.forEach((id, i) => allowed.set(id, lists[i]));
    const empty = pipes.find((_, i) => lists[i].length === 0);
    if (empty)
      return {
        kind: 'looped',
        pipes,
        method: 'heuristic local search',
        exact: false,
        feasible: false,
        note: `${empty}: no catalogue pipe meets its rating check`,
      };
    const base = pipes.map((id) => pipeOf(id));
    const apply = (x: Int32Array): void => {
      pipes.forEach((id, i) => {
        doc.links[linkIndex.get(id) as number] = applyCandidate(base[i], lists[i][x[i]]);
      });
    };
    const feasible = (x: Int32Array): boolean => {
      apply(x);
      return designChecks(doc, solve(doc, { omega }), checkSettings, only, statics).failures.length === 0;
    };
    const costs = lists.map((list, i) => list.map((c) => c.price_per_m * base[i].length_m));
    const res = localSearch(costs, feasible, { maxEvaluations: options.maxEvaluations, seed: options.seed });
    apply(res.choice);
    pipes.forEach((id, i) => choices.set(id, lists[i][res.choice[i]]));
    return {
      kind: 'looped',
      pipes,
      method: 'heuristic local search',
      exact: false,
      feasible: res.feasible,
      note: res.feasible
        ? `looped: flows move with the sizes, so each design is solved; iterated local search (${res.evaluations} solves, ${res.kicks} restarts) finds a good design, not a proven least cost`
        : 'even the largest pipes in the catalogue do not meet every requirement (pressure, velocity, rating and surge)',
      evaluations: res.evaluations,
    };
  }

  const result = solve(doc, { omega });
  const check = designChecks(doc, result, checkSettings, undefined, statics);
  const chosen: PipeChoice[] = [];
  let cost = 0;
  let largestCost = 0;
  for (const [id, c] of choices) {
    const p = input.links[linkIndex.get(id) as number] as PipeLink;
    const list = allowed.get(id) ?? [];
    const largest = list[list.length - 1];
    cost += c.price_per_m * p.length_m;
    largestCost += (largest?.price_per_m ?? 0) * p.length_m;
    chosen.push({
      pipe: id,
      key: c.key,
      label: c.label,
      diameter_m: c.diameter_m,
      length_m: p.length_m,
      price_per_m: c.price_per_m,
      cost: c.price_per_m * p.length_m,
      was: describe(p),
    });
  }
  const feasible = reports.every((r) => r.feasible) && check.failures.length === 0;
  const document: NetworkDocument = {
    ...doc,
    links: doc.links.map((l, k) => (l.kind === 'pipe' && (input.links[k] as PipeLink).cover_m === undefined ? withoutCover(l) : l)),
  };
  return { feasible, document, cost, largestCost, choices: chosen, skipped, regions: reports, check, settings };
}

/** A sized pipe as the designer left it: without the project cover the search wrote onto it. */
function withoutCover(pipe: PipeLink): PipeLink {
  const { cover_m: _cover, ...rest } = pipe;
  return rest;
}
