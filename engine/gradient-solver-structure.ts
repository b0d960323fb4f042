import type { NetworkModel } from './network-model';
import { SparseLdl } from './sparse-ldl';
import { SupernodalCholesky } from './supernodal-cholesky';

/** Networks with at least this many unknown heads use the supernodal factorisation. */
export const SUPERNODAL_MIN_ORDER = 1000;

/**
 * The topology-only part of a solver: the matrix pattern with its fill-reducing ordering and
 * symbolic factorisation, and where each link writes into the matrix. It depends only on the
 * link endpoints and on which nodes are sources, so it is shared by solvers of networks with the
 * same layout (the browser re-solves after every edit of a size, demand or level): the ordering,
 * the costliest part of building a solver for a large network, is then done once per layout.
 * Everything in it is read-only after construction.
 */
export interface SolverStructure {
  nodeCount: number;
  source: Uint8Array;
  from: Int32Array;
  to: Int32Array;
  ldl: SparseLdl;
  chol: SupernodalCholesky | null;
  posFF: Int32Array;
  posTT: Int32Array;
  posFT: Int32Array;
  posTF: Int32Array;
  posDiag: Int32Array;
}

/** Layouts kept, most recently used first. */
const STRUCTURE_CACHE_SIZE = 4;
const structureCache: SolverStructure[] = [];
export const EMPTY_PAIRS = { i: new Int32Array(0), j: new Int32Array(0) };

/**
 * Forget the cached layouts (benchmarks use it to time a first solve; memory is otherwise bounded
 * by STRUCTURE_CACHE_SIZE layouts).
 * @example clearStructureCache(); solve(doc) // orders the matrix again
 */
export function clearStructureCache(): void {
  structureCache.length = 0;
}

function sameArray(a: ArrayLike<number>, b: ArrayLike<number>): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

/** The cached structure of this layout, or a new one (which then enters the cache). */
export function structureFor(model: NetworkModel, unknown: Int32Array, nu: number): SolverStructure {
  const n = model.nodeCount;
  const m = model.linkCount;
  const source = new Uint8Array(n);
  for (let i = 0; i < n; i++) if (unknown[i] < 0) source[i] = 1;
  for (let c = 0; c < structureCache.length; c++) {
    const entry = structureCache[c];
    if (entry.nodeCount === n && sameArray(entry.from, model.from) && sameArray(entry.to, model.to) && sameArray(entry.source, source)) {
      if (c > 0) {
        structureCache.splice(c, 1);
        structureCache.unshift(entry);
      }
      return entry;
    }
  }
  let pairs = 0;
  for (let k = 0; k < m; k++) {
    const a = unknown[model.from[k]];
    const b = unknown[model.to[k]];
    if (a >= 0 && b >= 0 && a !== b) pairs++;
  }
  const pi = new Int32Array(pairs);
  const pj = new Int32Array(pairs);
  for (let k = 0, e = 0; k < m; k++) {
    const a = unknown[model.from[k]];
    const b = unknown[model.to[k]];
    if (a >= 0 && b >= 0 && a !== b) {
      pi[e] = a;
      pj[e] = b;
      e++;
    }
  }
  const ldl = new SparseLdl(nu, { i: pi, j: pj });
  const chol = nu >= SUPERNODAL_MIN_ORDER ? new SupernodalCholesky(ldl) : null;
  const posFF = new Int32Array(m).fill(-1);
  const posTT = new Int32Array(m).fill(-1);
  const posFT = new Int32Array(m).fill(-1);
  const posTF = new Int32Array(m).fill(-1);
  for (let k = 0; k < m; k++) {
    const a = unknown[model.from[k]];
    const b = unknown[model.to[k]];
    if (a >= 0) posFF[k] = ldl.position(a, a);
    if (b >= 0) posTT[k] = ldl.position(b, b);
    if (a >= 0 && b >= 0 && a !== b) {
      posFT[k] = ldl.position(a, b);
      posTF[k] = ldl.position(b, a);
    }
  }
  const posDiag = new Int32Array(nu);
  for (let u = 0; u < nu; u++) posDiag[u] = ldl.position(u, u);
  const entry: SolverStructure = { nodeCount: n, source, from: model.from.slice(), to: model.to.slice(), ldl, chol, posFF, posTT, posFT, posTF, posDiag };
  structureCache.unshift(entry);
  if (structureCache.length > STRUCTURE_CACHE_SIZE) structureCache.length = STRUCTURE_CACHE_SIZE;
  return entry;
}
