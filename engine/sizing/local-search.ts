/**
 * Heuristic least-cost search for looped regions, where flows shift with every size change and no
 * exact method is within reach here. Iterated local search over the discrete choices, with a full
 * hydraulic solve as the feasibility test of every design it looks at:
 *  1. start from the largest choice on every pipe (if that fails, nothing in the catalogue works);
 *  2. descent: take the single-pipe change that saves most and stays feasible, until none does;
 *  3. pair moves: among changes of two pipes at once (one larger, one smaller) that cost less, the
 *     cheapest feasible one, then back to 2 (only while the pair list stays under 400,000 entries);
 *  4. kick: move two to four random pipes of the current design up to three sizes either way,
 *     enlarge random pipes until it works again, repeat 2–3; move on from the new local optimum
 *     when it costs at most 3 % more than the current one (back to the best every 20 idle kicks),
 *     keep the best; stop after `maxEvaluations` solves or `patience` kicks without a gain.
 * The result is a local optimum under these moves: good designs, no proof of the least cost.
 * Deterministic for a given seed (a small xorshift generator), so runs can be repeated.
 *
 * @example
 * localSearch([[1, 2, 5], [1, 3]], (x) => x[0] + x[1] >= 2, {}).cost // 4 (choices 1 and 1)
 */

export interface SearchOptions {
  /** Budget of feasibility tests (default 40,000). */
  maxEvaluations?: number;
  /** Kicks without improvement before stopping (default 60). */
  patience?: number;
  seed?: number;
}

export interface SearchResult {
  feasible: boolean;
  /** Chosen option index per variable. */
  choice: Int32Array;
  cost: number;
  evaluations: number;
  kicks: number;
}

/**
 * @param costs costs[i][j]: cost of option j for variable i; options ordered from smallest to largest pipe
 * @param feasible the hydraulic test of a whole design
 */
export function localSearch(costs: number[][], feasible: (x: Int32Array) => boolean, options: SearchOptions): SearchResult {
  const n = costs.length;
  const maxEval = options.maxEvaluations ?? 40000;
  const patience = options.patience ?? 60;
  let seed = (options.seed ?? 0x9e3779b9) >>> 0 || 1;
  const rand = (): number => {
    seed ^= seed << 13;
    seed >>>= 0;
    seed ^= seed >>> 17;
    seed ^= seed << 5;
    seed >>>= 0;
    return seed / 4294967296;
  };
  const memo = new Map<string, boolean>();
  let evaluations = 0;
  const test = (x: Int32Array): boolean => {
    const key = x.join(',');
    const hit = memo.get(key);
    if (hit !== undefined) return hit;
    evaluations++;
    const ok = feasible(x);
    memo.set(key, ok);
    return ok;
  };
  const costOf = (x: Int32Array): number => {
    let c = 0;
    for (let i = 0; i < n; i++) c += costs[i][x[i]];
    return c;
  };
  const start = Int32Array.from(costs, (c) => c.length - 1);
  if (!test(start)) return { feasible: false, choice: start, cost: costOf(start), evaluations, kicks: 0 };

  let work = 0;
  for (let i = 0; i < n; i++) for (let k = i + 1; k < n; k++) work += costs[i].length * costs[k].length;
  const pairMoves = work <= 400000;
  const descend = (x: Int32Array): void => {
    for (;;) {
      if (evaluations >= maxEval) return;
      // single moves, largest saving first
      const singles: [number, number, number][] = [];
      for (let i = 0; i < n; i++)
        for (let j = 0; j < costs[i].length; j++) {
          const d = costs[i][j] - costs[i][x[i]];
          if (d < -1e-9) singles.push([d, i, j]);
        }
      singles.sort((a, b) => a[0] - b[0]);
      let moved = false;
      for (const [, i, j] of singles) {
        if (evaluations >= maxEval) return;
        const old = x[i];
        x[i] = j;
        if (test(x)) {
          moved = true;
          break;
        }
        x[i] = old;
      }
      if (moved) continue;
      // pair moves, cheapest result first (skipped on large problems: the list grows as n²·m²)
      if (!pairMoves) return;
      const pairs: [number, number, number, number, number][] = [];
      for (let i = 0; i < n; i++)
        for (let k = i + 1; k < n; k++) {
          const base = costs[i][x[i]] + costs[k][x[k]];
          for (let a = 0; a < costs[i].length; a++)
            for (let b = 0; b < costs[k].length; b++) {
              // one larger, one smaller: making both smaller cannot work when neither alone did (pressures
              // fall as any pipe shrinks in a network fed from one head)
              if (a > x[i] === b > x[k] || a === x[i] || b === x[k]) continue;
              const d = costs[i][a] + costs[k][b] - base;
              if (d < -1e-9) pairs.push([d, i, a, k, b]);
            }
        }
      pairs.sort((p, q) => p[0] - q[0]);
      for (const [, i, a, k, b] of pairs) {
        if (evaluations >= maxEval) return;
        const oi = x[i];
        const ok = x[k];
        x[i] = a;
        x[k] = b;
        if (test(x)) {
          moved = true;
          break;
        }
        x[i] = oi;
        x[k] = ok;
      }
      if (!moved) return;
    }
  };

  const best = Int32Array.from(start);
  descend(best);
  let bestCost = costOf(best);
  const current = Int32Array.from(best);
  let currentCost = bestCost;
  let kicks = 0;
  let idle = 0;
  while (evaluations < maxEval && idle < patience && n > 0) {
    kicks++;
    const x = Int32Array.from(current);
    const count = 2 + Math.floor(rand() * Math.min(3, n));
    for (let c = 0; c < count; c++) {
      const i = Math.floor(rand() * n);
      x[i] = Math.max(0, Math.min(costs[i].length - 1, x[i] + Math.floor(rand() * 7) - 3));
    }
    // repair: enlarge random pipes one size at a time until the design works again
    for (let step = 0; step < 4 * n && !test(x) && evaluations < maxEval; step++) {
      const i = Math.floor(rand() * n);
      if (x[i] < costs[i].length - 1) x[i]++;
    }
    if (!test(x)) {
      idle++;
      continue;
    }
    descend(x);
    const c = costOf(x);
    if (c < bestCost - 1e-9) {
      best.set(x);
      bestCost = c;
      idle = 0;
    } else idle++;
    // walk on from a local optimum up to 3 % dearer than the current one, so the search can leave a basin
    if (c <= currentCost * 1.03) {
      current.set(x);
      currentCost = c;
    }
    if (idle > 0 && idle % 20 === 0) {
      current.set(best);
      currentCost = bestCost;
    }
  }
  return { feasible: true, choice: best, cost: bestCost, evaluations, kicks };
}
