import type { SparseLdl } from './sparse-ldl';
import { WasmSupernodal, type KernelStructure } from './wasm/supernodal-kernel';

/**
 * Supernodal left-looking sparse Cholesky factorisation A = L·Lᵀ for large symmetric
 * positive-definite systems: columns of L with nested structure are grouped into supernodes stored
 * as dense blocks, so most of the work runs in dense inner loops (Ng & Peyton 1993, "Block sparse
 * Cholesky algorithms on advanced uniprocessor computers", SIAM J. Sci. Comput. 14:1034–1056;
 * the descendant linked lists as in Chen, Davis, Hager & Rajamanickam 2008, CHOLMOD, ACM TOMS 35(3)).
 * It reuses the pattern, fill-reducing ordering and elimination tree of a SparseLdl (./sparse-ldl),
 * whose `values` it reads; the symbolic work is done once in the constructor. The numeric work
 * runs in the WebAssembly kernel of ./wasm where it is available (same algorithm, two doubles per
 * instruction, fast from its first call), else in the JavaScript below.
 *
 * @example
 * const pattern = new SparseLdl(n, pairs);      // fill pattern.values
 * const chol = new SupernodalCholesky(pattern);
 * chol.factor(); chol.solve(b, x);
 */
/** Widest supernode, columns. */
const MAX_SUPERNODE_WIDTH = 64;
/** Share of explicit zeros a relaxed supernode may hold. */
const RELAX_ZEROS_FRACTION = 0.3;

export class SupernodalCholesky {
  readonly n: number;
  /** Number of supernodes. */
  readonly supernodes: number;
  private readonly pattern: SparseLdl;
  private readonly first: Int32Array; // first column of each supernode (length ns+1)
  private readonly rowPtr: Int32Array; // row lists of supernodes
  private readonly rows: Int32Array;
  private readonly blockPtr: Int32Array; // dense block offsets
  /** Dense blocks, allocated on the first factor() (a structure template never needs them). */
  private block: Float64Array = new Float64Array(0);
  private readonly superOf: Int32Array; // supernode of each column
  private readonly relative: Int32Array;
  private readonly head: Int32Array;
  private readonly next: Int32Array;
  private readonly position: Int32Array;
  private readonly update: Float64Array;
  /** Positions in the target block of a descendant's rows (one update at a time). */
  private readonly map: Int32Array;
  private readonly work: Float64Array;
  /** Where each lower-triangle entry of A goes: values[scatterFrom[e]] adds to block[scatterTo[e]]. */
  private readonly scatterFrom: Int32Array;
  private readonly scatterTo: Int32Array;
  /** What the WebAssembly kernel reads (one object per structure, shared like the structure). */
  private readonly kernelStructure: KernelStructure;
  /** The WebAssembly kernel (null: not available; undefined: not tried yet). */
  private wasm: WasmSupernodal | null | undefined;
  /** Whether the current factor is in the kernel (else in `block`). */
  private factoredInWasm = false;

  /**
   * @param pattern the simplicial factorisation whose pattern, ordering and values are used
   * @param structureOf an existing supernodal factorisation of the same pattern and ordering whose
   *   (read-only) supernode structure is shared instead of recomputed
   */
  constructor(pattern: SparseLdl, structureOf?: SupernodalCholesky) {
    this.pattern = pattern;
    const n = pattern.n;
    this.n = n;
    if (structureOf) {
      this.supernodes = structureOf.supernodes;
      this.first = structureOf.first;
      this.rowPtr = structureOf.rowPtr;
      this.rows = structureOf.rows;
      this.blockPtr = structureOf.blockPtr;
      this.superOf = structureOf.superOf;
      this.relative = new Int32Array(n);
      this.head = new Int32Array(this.supernodes);
      this.next = new Int32Array(this.supernodes);
      this.position = new Int32Array(this.supernodes);
      this.update = new Float64Array(structureOf.update.length);
      this.map = new Int32Array(structureOf.map.length);
      this.work = new Float64Array(n);
      this.scatterFrom = structureOf.scatterFrom;
      this.scatterTo = structureOf.scatterTo;
      this.kernelStructure = structureOf.kernelStructure;
      return;
    }
    const { parent, lp, colPtr, rowIdx, perm, pinv } = pattern;
    const count = (j: number): number => lp[j + 1] - lp[j];
    // relaxed supernodes: column j joins the supernode of j−1 when j is j−1's parent (then
    // L_{j−1} ⊆ {j} ∪ L_j, an elimination-tree property), allowing a few explicit zeros
    const starts: number[] = [];
    let zeros = 0;
    for (let j = 0; j < n; j++) {
      const s0 = starts.length > 0 ? starts[starts.length - 1] : 0;
      const width = j - s0;
      const extra = j > 0 ? (count(j) + 1 - count(j - 1)) * width : 0;
      const joins =
        j > 0 &&
        parent[j - 1] === j &&
        width < MAX_SUPERNODE_WIDTH &&
        (extra === 0 || zeros + extra <= Math.max(RELAX_ZEROS_FRACTION * (width + 1) * (count(j) + width + 1), 64));
      if (joins) zeros += extra;
      else {
        starts.push(j);
        zeros = 0;
      }
    }
    starts.push(n);
    const ns = starts.length - 1;
    this.supernodes = ns;
    this.first = Int32Array.from(starts);
    this.superOf = new Int32Array(n);
    for (let s = 0; s < ns; s++) for (let j = starts[s]; j < starts[s + 1]; j++) this.superOf[j] = s;
    // row structure of each supernode: rows of its columns in A (permuted, ≥ first) ∪ rows of child supernodes beyond their columns
    this.rowPtr = new Int32Array(ns + 1);
    for (let s = 0; s < ns; s++) this.rowPtr[s + 1] = this.rowPtr[s] + (starts[s + 1] - starts[s]) + count(starts[s + 1] - 1);
    this.rows = new Int32Array(this.rowPtr[ns]);
    const mark = new Int32Array(n).fill(-1);
    const children: number[][] = Array.from({ length: ns }, () => []);
    for (let s = 0; s < ns; s++) {
      const last = starts[s + 1] - 1;
      const p = parent[last];
      if (p >= 0) children[this.superOf[p]].push(s);
    }
    for (let s = 0; s < ns; s++) {
      const f = starts[s];
      const l = starts[s + 1] - 1;
      let w = this.rowPtr[s];
      for (let j = f; j <= l; j++) {
        mark[j] = s;
        this.rows[w++] = j;
      }
      for (let j = f; j <= l; j++) {
        const col = perm[j];
        for (let q = colPtr[col]; q < colPtr[col + 1]; q++) {
          const i = pinv[rowIdx[q]];
          if (i > l && mark[i] !== s) {
            mark[i] = s;
            this.rows[w++] = i;
          }
        }
      }
      for (const c of children[s]) {
        for (let q = this.rowPtr[c] + (starts[c + 1] - starts[c]); q < this.rowPtr[c + 1]; q++) {
          const i = this.rows[q];
          if (i > l && mark[i] !== s) {
            mark[i] = s;
            this.rows[w++] = i;
          }
        }
      }
      if (w !== this.rowPtr[s + 1]) throw new Error(`supernodal structure mismatch at ${s}`);
      this.rows.subarray(this.rowPtr[s] + (l - f + 1), w).sort();
    }
    this.blockPtr = new Int32Array(ns + 1);
    let maxRows = 0;
    let maxUpdate = 0;
    for (let s = 0; s < ns; s++) {
      const m = this.rowPtr[s + 1] - this.rowPtr[s];
      const wdt = starts[s + 1] - starts[s];
      this.blockPtr[s + 1] = this.blockPtr[s] + m * wdt;
      maxRows = Math.max(maxRows, m);
      maxUpdate = Math.max(maxUpdate, m);
    }
    this.relative = new Int32Array(n);
    // the scatter of A into the blocks, worked out once: entries of the permuted lower triangle
    // in supernode and column order, so factor() adds them in one sequential pass
    const scatterFrom: number[] = [];
    const scatterTo: number[] = [];
    for (let s = 0; s < ns; s++) {
      const f = starts[s];
      const r0 = this.rowPtr[s];
      const m = this.rowPtr[s + 1] - r0;
      for (let q = 0; q < m; q++) this.relative[this.rows[r0 + q]] = q;
      for (let c = 0; c < starts[s + 1] - f; c++) {
        const col = perm[f + c];
        for (let q = colPtr[col]; q < colPtr[col + 1]; q++) {
          const i = pinv[rowIdx[q]];
          if (i >= f + c) {
            scatterFrom.push(q);
            scatterTo.push(this.blockPtr[s] + c * m + this.relative[i]);
          }
        }
      }
    }
    this.scatterFrom = Int32Array.from(scatterFrom);
    this.scatterTo = Int32Array.from(scatterTo);
    this.head = new Int32Array(ns);
    this.next = new Int32Array(ns);
    this.position = new Int32Array(ns);
    this.update = new Float64Array(2 * Math.max(maxUpdate, 1)); // two columns (subtractProductsPair)
    this.map = new Int32Array(this.update.length >> 1);
    this.work = new Float64Array(n);
    this.kernelStructure = {
      n,
      supernodes: ns,
      first: this.first,
      rowPtr: this.rowPtr,
      rows: this.rows,
      blockPtr: this.blockPtr,
      superOf: this.superOf,
      scatterFrom: this.scatterFrom,
      scatterTo: this.scatterTo,
      perm: pattern.perm,
      valueCount: pattern.values.length,
      updateLength: this.update.length,
    };
  }

  /** Stored entries of L (dense blocks, including the diagonal). */
  get factorNonZeros(): number {
    return this.blockPtr[this.supernodes];
  }

  /** Numeric factorisation from pattern.values; returns n on success or the failing column. */
  factor(): number {
    if (this.wasm === undefined)
      this.wasm = WasmSupernodal.create(this.kernelStructure, (block) => {
        this.block = block;
        this.factoredInWasm = false;
      });
    if (this.wasm) {
      const result = this.wasm.factor(this.pattern.values);
      this.factoredInWasm = result >= 0;
      if (result >= 0) return result;
    }
    this.factoredInWasm = false;
    if (this.block.length !== this.blockPtr[this.supernodes]) this.block = new Float64Array(this.blockPtr[this.supernodes]);
    const { n, block, head } = this;
    const { values } = this.pattern;
    const { scatterFrom, scatterTo } = this;
    const ns = this.supernodes;
    head.fill(-1);
    // A's lower triangle into the blocks (see scatterFrom)
    block.fill(0);
    for (let e = 0; e < scatterFrom.length; e++) block[scatterTo[e]] += values[scatterFrom[e]];
    // one supernode per call: a small method is optimised after a few calls, where one long loop
    // in a fresh process runs interpreted until it is compiled on stack replacement
    for (let s = 0; s < ns; s++) {
      const failed = this.factorSupernode(s);
      if (failed >= 0) return failed;
    }
    return n;
  }

  /** Supernode s of factor(): the updates from its descendants, then its own dense block; −1 or the failing column. */
  private factorSupernode(s: number): number {
    const { first, rowPtr, rows, blockPtr, block, superOf, relative, head, next, position, update, map } = this;
    const half = update.length >> 1;
    const f = first[s];
    const wdt = first[s + 1] - f;
    const r0 = rowPtr[s];
    const m = rowPtr[s + 1] - r0;
    const b0 = blockPtr[s];
    for (let q = 0; q < m; q++) relative[rows[r0 + q]] = q;
    // updates from descendants whose next rows fall in this supernode's columns
    let d = head[s];
    while (d >= 0) {
      const nextD = next[d];
      const dr0 = rowPtr[d];
      const dm = rowPtr[d + 1] - dr0;
      const dw = first[d + 1] - first[d];
      const db0 = blockPtr[d];
      const p1 = position[d];
      let p2 = p1;
      const last = f + wdt - 1;
      while (p2 < dm && rows[dr0 + p2] <= last) p2++;
      const um = dm - p1; // rows to update
      const uw = p2 - p1; // columns of s touched
      // block(rows, cols of s) −= L_d[p1:dm, :] · L_d[p1:p2, :]ᵀ, two target columns per pass
      // over d's columns (subtractProductsPair). Where d's rows are s's rows shifted (common in a
      // postordered tree) the target columns are contiguous and updated in place; otherwise d's
      // rows are mapped to s's once and each pair of columns is formed in `update`, then scattered
      const rel0 = relative[rows[dr0 + p1]];
      const contiguous = relative[rows[dr0 + dm - 1]] - rel0 === um - 1;
      if (!contiguous) for (let ii = 0; ii < um; ii++) map[ii] = relative[rows[dr0 + p1 + ii]];
      const c0 = db0 + p1;
      let jj = 0;
      for (; jj + 1 < uw; jj += 2) {
        const base = b0 + (rows[dr0 + p1 + jj] - f) * m;
        const base1 = b0 + (rows[dr0 + p1 + jj + 1] - f) * m;
        if (contiguous) subtractProductsPair(block, c0, dm, dw, jj, um, block, base + rel0, base1 + rel0);
        else {
          for (let ii = jj; ii < um; ii++) {
            update[ii] = 0;
            update[half + ii] = 0;
          }
          subtractProductsPair(block, c0, dm, dw, jj, um, update, 0, half);
          for (let ii = jj; ii < um; ii++) block[base + map[ii]] += update[ii];
          for (let ii = jj + 1; ii < um; ii++) block[base1 + map[ii]] += update[half + ii];
        }
      }
      if (jj < uw) {
        const base = b0 + (rows[dr0 + p1 + jj] - f) * m;
        if (contiguous) subtractProducts(block, c0, dm, dw, jj, um, block, base + rel0);
        else {
          for (let ii = jj; ii < um; ii++) update[ii] = 0;
          subtractProducts(block, c0, dm, dw, jj, um, update, 0);
          for (let ii = jj; ii < um; ii++) block[base + map[ii]] += update[ii];
        }
      }
      // move d on to the supernode of its next row
      position[d] = p2;
      if (p2 < dm) {
        const t = superOf[rows[dr0 + p2]];
        next[d] = head[t];
        head[t] = d;
      }
      d = nextD;
    }
    // dense Cholesky of the diagonal block and triangular solve of the rows below, left-looking
    // two columns at a time: the products of the earlier columns off both (subtractProductsPair),
    // then column c is finished and its own term is taken off column c + 1
    for (let c = 0; c < wdt; c += 2) {
      const cb = b0 + c * m;
      const pair = c + 1 < wdt;
      const cb1 = cb + m;
      if (c > 0) {
        if (pair) subtractProductsPair(block, b0, m, c, c, m, block, cb, cb1);
        else subtractProducts(block, b0, m, c, c, m, block, cb);
      }
      const diag = block[cb + c];
      if (!(diag > 0) || !Number.isFinite(diag)) return f + c;
      const lcc = Math.sqrt(diag);
      block[cb + c] = lcc;
      const inv = 1 / lcc;
      for (let i = c + 1; i < m; i++) block[cb + i] *= inv;
      if (!pair) break;
      const l = block[cb + c + 1];
      for (let i = c + 1; i < m; i++) block[cb1 + i] -= block[cb + i] * l;
      const diag1 = block[cb1 + c + 1];
      if (!(diag1 > 0) || !Number.isFinite(diag1)) return f + c + 1;
      const l11 = Math.sqrt(diag1);
      block[cb1 + c + 1] = l11;
      const inv1 = 1 / l11;
      for (let i = c + 2; i < m; i++) block[cb1 + i] *= inv1;
    }
    if (wdt < m) {
      position[s] = wdt;
      const t = superOf[rows[r0 + wdt]];
      next[s] = head[t];
      head[t] = s;
    }
    return -1;
  }

  /** Solve A·x = b with the current factorisation (b and x may be the same array). */
  solve(b: ArrayLike<number>, x: Float64Array): void {
    if (this.factoredInWasm && this.wasm?.solve(b, x)) return;
    const { n, first, rowPtr, rows, blockPtr, block, work } = this;
    // rows below a supernode's columns are gathered into (and scattered from) a dense buffer once
    // per supernode instead of being addressed through `rows` once per column
    const below = this.update;
    const { perm } = this.pattern;
    const ns = this.supernodes;
    for (let k = 0; k < n; k++) work[k] = b[perm[k]];
    for (let s = 0; s < ns; s++) {
      const f = first[s];
      const wdt = first[s + 1] - f;
      const r0 = rowPtr[s];
      const m = rowPtr[s + 1] - r0;
      const b0 = blockPtr[s];
      for (let i = wdt; i < m; i++) below[i] = 0;
      for (let c = 0; c < wdt; c++) {
        const cb = b0 + c * m;
        const xc = (work[f + c] /= block[cb + c]);
        for (let i = c + 1; i < wdt; i++) work[f + i] -= block[cb + i] * xc;
        for (let i = wdt; i < m; i++) below[i] += block[cb + i] * xc;
      }
      for (let i = wdt; i < m; i++) work[rows[r0 + i]] -= below[i];
    }
    for (let s = ns - 1; s >= 0; s--) {
      const f = first[s];
      const wdt = first[s + 1] - f;
      const r0 = rowPtr[s];
      const m = rowPtr[s + 1] - r0;
      const b0 = blockPtr[s];
      for (let i = wdt; i < m; i++) below[i] = work[rows[r0 + i]];
      for (let c = wdt - 1; c >= 0; c--) {
        const cb = b0 + c * m;
        let xc = work[f + c];
        for (let i = c + 1; i < wdt; i++) xc -= block[cb + i] * work[f + i];
        for (let i = wdt; i < m; i++) xc -= block[cb + i] * below[i];
        work[f + c] = xc / block[cb + c];
      }
    }
    for (let k = 0; k < n; k++) x[perm[k]] = work[k];
  }
}

/**
 * out[o + i] −= Σ_k L[i, k]·L[j, k] for rows i = j … rows−1 over `width` columns of a dense
 * column-major block (column k of the rows in question starts at `start + k·stride`). Four
 * columns are taken per pass so each entry of `out` is loaded and stored once per four columns
 * instead of once per column: the small supernodes of a long grid are mostly 5–40 columns wide,
 * where those loads and stores, not the multiplications, set the pace. `out` is the target block
 * itself where the target rows are contiguous, else a buffer that is scattered afterwards.
 */
function subtractProducts(block: Float64Array, start: number, stride: number, width: number, j: number, rows: number, out: Float64Array, o: number): void {
  let k = 0;
  let a = start;
  for (; k + 4 <= width; k += 4, a += 4 * stride) {
    const a1 = a + stride;
    const a2 = a1 + stride;
    const a3 = a2 + stride;
    const l0 = block[a + j];
    const l1 = block[a1 + j];
    const l2 = block[a2 + j];
    const l3 = block[a3 + j];
    for (let i = j; i < rows; i++) out[o + i] -= block[a + i] * l0 + block[a1 + i] * l1 + block[a2 + i] * l2 + block[a3 + i] * l3;
  }
  for (; k + 2 <= width; k += 2, a += 2 * stride) {
    const a1 = a + stride;
    const l0 = block[a + j];
    const l1 = block[a1 + j];
    for (let i = j; i < rows; i++) out[o + i] -= block[a + i] * l0 + block[a1 + i] * l1;
  }
  if (k < width) {
    const l0 = block[a + j];
    for (let i = j; i < rows; i++) out[o + i] -= block[a + i] * l0;
  }
}

/**
 * subtractProducts for two target columns at once, j (into out[o0 + i]) and j + 1 (into
 * out[o1 + i]), rows from j: each source entry loaded serves both. The entry at row j of the
 * second column lies above its diagonal, where nothing is read.
 */
function subtractProductsPair(
  block: Float64Array,
  start: number,
  stride: number,
  width: number,
  j: number,
  rows: number,
  out: Float64Array,
  o0: number,
  o1: number,
): void {
  const j1 = j + 1;
  let k = 0;
  let a = start;
  for (; k + 4 <= width; k += 4, a += 4 * stride) {
    const a1 = a + stride;
    const a2 = a1 + stride;
    const a3 = a2 + stride;
    const l0 = block[a + j];
    const l1 = block[a1 + j];
    const l2 = block[a2 + j];
    const l3 = block[a3 + j];
    const u0 = block[a + j1];
    const u1 = block[a1 + j1];
    const u2 = block[a2 + j1];
    const u3 = block[a3 + j1];
    for (let i = j; i < rows; i++) {
      const x0 = block[a + i];
      const x1 = block[a1 + i];
      const x2 = block[a2 + i];
      const x3 = block[a3 + i];
      out[o0 + i] -= x0 * l0 + x1 * l1 + x2 * l2 + x3 * l3;
      out[o1 + i] -= x0 * u0 + x1 * u1 + x2 * u2 + x3 * u3;
    }
  }
  for (; k < width; k++, a += stride) {
    const l0 = block[a + j];
    const u0 = block[a + j1];
    for (let i = j; i < rows; i++) {
      const x0 = block[a + i];
      out[o0 + i] -= x0 * l0;
      out[o1 + i] -= x0 * u0;
    }
  }
}
