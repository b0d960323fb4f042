import { minimumDegreeOrder } from './minimum-degree';
import { nestedDissectionOrder } from './nested-dissection';

/** Matrices larger than this are ordered by nested dissection, smaller ones by minimum degree. */
export const MINIMUM_DEGREE_MAX_ORDER = 2000;

/**
 * Sparse LDLᵀ factorisation of a symmetric positive-definite matrix, up-looking by rows with
 * the elimination tree, after T. A. Davis (2005), "Algorithm 849: A concise sparse Cholesky
 * factorization package", ACM TOMS 31(4):587–591. The symbolic phase (fill-reducing ordering:
 * minimum degree for small matrices, nested dissection for large ones; elimination tree, column counts) is computed once per sparsity pattern; `factor()` and
 * `solve()` then reuse it with new values and allocate nothing.
 *
 * Usage: build the pattern once (symmetric, both triangles, diagonal included), write values into
 * `values` at the positions given by `position(i, j)`, then `factor()` and `solve(b, x)`.
 *
 * @example
 * const ldl = new SparseLdl(2, [[0, 1]]);          // 2×2 with one off-diagonal pair
 * ldl.values[ldl.position(0, 0)] = 4; ldl.values[ldl.position(1, 1)] = 3;
 * ldl.values[ldl.position(0, 1)] = ldl.values[ldl.position(1, 0)] = 1;
 * ldl.factor(); const x = new Float64Array(2); ldl.solve(Float64Array.from([1, 2]), x);
 */
export class SparseLdl {
  /** Matrix order. */
  readonly n: number;
  /** CSC column pointers of the full symmetric pattern. */
  readonly colPtr: Int32Array;
  /** CSC row indices (sorted within each column). */
  readonly rowIdx: Int32Array;
  /** Values aligned with rowIdx; the caller fills them before factor(). */
  readonly values: Float64Array;
  /** Fill-reducing permutation: perm[k] = original index of pivot k; pinv is its inverse. */
  readonly perm: Int32Array;
  readonly pinv: Int32Array;
  /** Elimination tree (parent of each pivot, −1 at roots), in permuted order. */
  readonly parent: Int32Array;
  /** Column pointers of L: column j holds lp[j+1] − lp[j] entries below the diagonal. */
  readonly lp: Int32Array;
  private readonly lnz: Int32Array;
  /** Row indices and values of L, allocated on the first factor() (a supernodal factorisation
   * that only borrows this pattern never needs them). */
  private li: Int32Array = new Int32Array(0);
  private lx: Float64Array = new Float64Array(0);
  private readonly d: Float64Array;
  private readonly y: Float64Array;
  private readonly pattern: Int32Array;
  private readonly flag: Int32Array;
  private readonly work: Float64Array;

  /**
   * @param n order of the matrix
   * @param offDiagonal list of unordered pairs [i, j] (i ≠ j) that may be non-zero; duplicates allowed
   * @param structureOf an existing factorisation of the same pattern whose (read-only) symbolic
   *   analysis is shared instead of recomputed; `n` and `offDiagonal` are then ignored
   */
  constructor(n: number, offDiagonal: ArrayLike<readonly [number, number]> | { i: Int32Array; j: Int32Array }, structureOf?: SparseLdl) {
    if (structureOf) {
      n = structureOf.n;
      this.n = n;
      this.colPtr = structureOf.colPtr;
      this.rowIdx = structureOf.rowIdx;
      this.perm = structureOf.perm;
      this.pinv = structureOf.pinv;
      this.parent = structureOf.parent;
      this.lp = structureOf.lp;
      this.values = new Float64Array(this.rowIdx.length);
      this.lnz = new Int32Array(n);
      this.flag = new Int32Array(n);
      this.d = new Float64Array(n);
      this.y = new Float64Array(n);
      this.pattern = new Int32Array(n);
      this.work = new Float64Array(n);
      return;
    }
    this.n = n;
    const pi: Int32Array = 'i' in offDiagonal ? offDiagonal.i : Int32Array.from(Array.from(offDiagonal as ArrayLike<readonly [number, number]>, (p) => p[0]));
    const pj: Int32Array = 'j' in offDiagonal ? offDiagonal.j : Int32Array.from(Array.from(offDiagonal as ArrayLike<readonly [number, number]>, (p) => p[1]));
    // adjacency (deduplicated) in CSR
    const count = new Int32Array(n + 1);
    for (let e = 0; e < pi.length; e++) {
      count[pi[e] + 1]++;
      count[pj[e] + 1]++;
    }
    for (let v = 0; v < n; v++) count[v + 1] += count[v];
    const raw = new Int32Array(count[n]);
    const fill = count.slice(0, n);
    for (let e = 0; e < pi.length; e++) {
      raw[fill[pi[e]]++] = pj[e];
      raw[fill[pj[e]]++] = pi[e];
    }
    const adjPtr = new Int32Array(n + 1);
    const adjTmp = new Int32Array(raw.length);
    let nnzAdj = 0;
    for (let v = 0; v < n; v++) {
      const seg = raw.subarray(count[v], count[v + 1]).sort();
      for (let a = 0; a < seg.length; a++) if (a === 0 || seg[a] !== seg[a - 1]) adjTmp[nnzAdj++] = seg[a];
      adjPtr[v + 1] = nnzAdj;
    }
    const adjIdx = adjTmp.slice(0, nnzAdj);
    // full symmetric CSC with diagonal: column v = sorted(adj(v) ∪ {v})
    this.colPtr = new Int32Array(n + 1);
    this.rowIdx = new Int32Array(nnzAdj + n);
    let p = 0;
    for (let v = 0; v < n; v++) {
      let inserted = false;
      for (let a = adjPtr[v]; a < adjPtr[v + 1]; a++) {
        if (!inserted && adjIdx[a] > v) {
          this.rowIdx[p++] = v;
          inserted = true;
        }
        this.rowIdx[p++] = adjIdx[a];
      }
      if (!inserted) this.rowIdx[p++] = v;
      this.colPtr[v + 1] = p;
    }
    this.values = new Float64Array(p);
    const order = n > MINIMUM_DEGREE_MAX_ORDER ? nestedDissectionOrder(n, adjPtr, adjIdx) : minimumDegreeOrder(n, adjPtr, adjIdx);
    this.parent = new Int32Array(n);
    this.lnz = new Int32Array(n);
    this.flag = new Int32Array(n);
    this.lp = new Int32Array(n + 1);
    this.pinv = new Int32Array(n);
    // postorder the elimination tree (same fill, but chains become consecutive: supernodes)
    this.perm = order;
    this.symbolic();
    const post = postorder(this.parent);
    this.perm = new Int32Array(n);
    for (let k = 0; k < n; k++) this.perm[k] = order[post[k]];
    this.symbolic();
    this.d = new Float64Array(n);
    this.y = new Float64Array(n);
    this.pattern = new Int32Array(n);
    this.work = new Float64Array(n);
  }

  /** Elimination tree and column counts of L for the current permutation (ldl_symbolic). */
  private symbolic(): void {
    const { n, perm, pinv, parent, lnz, flag, colPtr, rowIdx, lp } = this;
    for (let k = 0; k < n; k++) pinv[perm[k]] = k;
    for (let k = 0; k < n; k++) {
      parent[k] = -1;
      flag[k] = k;
      lnz[k] = 0;
      const kk = perm[k];
      for (let q = colPtr[kk]; q < colPtr[kk + 1]; q++) {
        let i = pinv[rowIdx[q]];
        if (i < k) {
          for (; flag[i] !== k; i = parent[i]) {
            if (parent[i] === -1) parent[i] = k;
            lnz[i]++;
            flag[i] = k;
          }
        }
      }
    }
    for (let k = 0; k < n; k++) lp[k + 1] = lp[k] + lnz[k];
  }

  /** Number of non-zeros below the diagonal of L (fill included). */
  get factorNonZeros(): number {
    return this.lp[this.n];
  }

  /** Index into `values` of entry (i, j); -1 when outside the pattern. */
  position(i: number, j: number): number {
    let lo = this.colPtr[j];
    let hi = this.colPtr[j + 1] - 1;
    while (lo <= hi) {
      const mid = (lo + hi) >> 1;
      const r = this.rowIdx[mid];
      if (r === i) return mid;
      if (r < i) lo = mid + 1;
      else hi = mid - 1;
    }
    return -1;
  }

  /**
   * Numeric factorisation (ldl_numeric). Returns n on success, or the pivot index k (in permuted
   * order) where D[k] was zero or not finite.
   */
  factor(): number {
    if (this.li.length !== this.lp[this.n]) {
      this.li = new Int32Array(this.lp[this.n]);
      this.lx = new Float64Array(this.lp[this.n]);
    }
    const { n, colPtr, rowIdx, values, perm, pinv, parent, lp, lnz, li, lx, d, y, pattern, flag } = this;
    for (let k = 0; k < n; k++) {
      y[k] = 0;
      let top = n;
      flag[k] = k;
      lnz[k] = 0;
      const kk = perm[k];
      for (let q = colPtr[kk]; q < colPtr[kk + 1]; q++) {
        let i = pinv[rowIdx[q]];
        if (i <= k) {
          y[i] += values[q];
          let len = 0;
          for (; flag[i] !== k; i = parent[i]) {
            pattern[len++] = i;
            flag[i] = k;
          }
          while (len > 0) pattern[--top] = pattern[--len];
        }
      }
      let dk = y[k];
      y[k] = 0;
      for (; top < n; top++) {
        const i = pattern[top];
        const yi = y[i];
        y[i] = 0;
        const p2 = lp[i] + lnz[i];
        for (let q = lp[i]; q < p2; q++) y[li[q]] -= lx[q] * yi;
        const lki = yi / d[i];
        dk -= lki * yi;
        li[p2] = k;
        lx[p2] = lki;
        lnz[i]++;
      }
      d[k] = dk;
      if (!(dk !== 0 && Number.isFinite(dk))) return k;
    }
    return n;
  }

  /** Solve A·x = b with the current factorisation (b and x may be the same array). */
  solve(b: ArrayLike<number>, x: Float64Array): void {
    const { n, perm, lp, li, lx, d, work } = this;
    for (let k = 0; k < n; k++) work[k] = b[perm[k]];
    for (let j = 0; j < n; j++) {
      const wj = work[j];
      for (let q = lp[j]; q < lp[j + 1]; q++) work[li[q]] -= lx[q] * wj;
    }
    for (let j = 0; j < n; j++) work[j] /= d[j];
    for (let j = n - 1; j >= 0; j--) {
      let wj = work[j];
      for (let q = lp[j]; q < lp[j + 1]; q++) wj -= lx[q] * work[li[q]];
      work[j] = wj;
    }
    for (let k = 0; k < n; k++) x[perm[k]] = work[k];
  }
}

/** Postorder of a forest given by parent pointers (children visited in increasing order). */
function postorder(parent: Int32Array): Int32Array {
  const n = parent.length;
  const head = new Int32Array(n).fill(-1);
  const next = new Int32Array(n);
  for (let j = n - 1; j >= 0; j--) {
    const p = parent[j];
    if (p >= 0) {
      next[j] = head[p];
      head[p] = j;
    }
  }
  const post = new Int32Array(n);
  const stack = new Int32Array(n);
  let k = 0;
  for (let root = 0; root < n; root++) {
    if (parent[root] !== -1) continue;
    let top = 0;
    stack[0] = root;
    while (top >= 0) {
      const v = stack[top];
      const child = head[v];
      if (child === -1) {
        top--;
        post[k++] = v;
      } else {
        head[v] = next[child];
        stack[++top] = child;
      }
    }
  }
  return post;
}
