/**
 * The numeric half of ../../supernodal-cholesky.ts (same algorithm, same order of supernodes and
 * columns), written in AssemblyScript and compiled to WebAssembly with 128-bit SIMD (two doubles
 * per instruction in the dense column products): compiled before its first call, it runs near
 * full speed at once, where the JavaScript kernel runs interpreted until V8 has optimised it.
 * Every array lives in the instance's linear memory at byte offsets set once by `setup`
 * (../supernodal-kernel.ts lays them out). Build: `npm run build:wasm` writes
 * ../supernodal-kernel-binary.ts; a spec checks that file matches this source.
 * Not TypeScript: `load<f64>`, `v128`, `f64x2` are AssemblyScript built-ins (excluded from tsc and eslint).
 */

let ns: i32 = 0;
let nScatter: i32 = 0;
let pFirst: usize = 0;
let pRowPtr: usize = 0;
let pRows: usize = 0;
let pBlockPtr: usize = 0;
let pSuperOf: usize = 0;
let pRelative: usize = 0;
let pHead: usize = 0;
let pNext: usize = 0;
let pPosition: usize = 0;
let pMap: usize = 0;
let pUpdate: usize = 0;
let half: i32 = 0;
let pBlock: usize = 0;
let pValues: usize = 0;
let pScatterFrom: usize = 0;
let pScatterTo: usize = 0;
let pWork: usize = 0;
let pPerm: usize = 0;
let nCols: i32 = 0;

function ri(p: usize, i: i32): i32 {
  return load<i32>(p + ((<usize>i) << 2));
}
function wi(p: usize, i: i32, v: i32): void {
  store<i32>(p + ((<usize>i) << 2), v);
}
function rf(p: usize, i: i32): f64 {
  return load<f64>(p + ((<usize>i) << 3));
}
function wf(p: usize, i: i32, v: f64): void {
  store<f64>(p + ((<usize>i) << 3), v);
}

export function setup(
  n_: i32,
  ns_: i32,
  nScatter_: i32,
  first: usize,
  rowPtr: usize,
  rows: usize,
  blockPtr: usize,
  superOf: usize,
  relative: usize,
  head: usize,
  next: usize,
  position: usize,
  map: usize,
  update: usize,
  half_: i32,
  block: usize,
  values: usize,
  scatterFrom: usize,
  scatterTo: usize,
  work: usize,
  perm: usize,
): void {
  nCols = n_;
  ns = ns_;
  nScatter = nScatter_;
  pFirst = first;
  pRowPtr = rowPtr;
  pRows = rows;
  pBlockPtr = blockPtr;
  pSuperOf = superOf;
  pRelative = relative;
  pHead = head;
  pNext = next;
  pPosition = position;
  pMap = map;
  pUpdate = update;
  half = half_;
  pBlock = block;
  pValues = values;
  pScatterFrom = scatterFrom;
  pScatterTo = scatterTo;
  pWork = work;
  pPerm = perm;
}

// out[o + i] -= sum_k L[i,k] L[j,k], rows j..rows-1, width columns from start (stride apart)
function subtractProducts(start: i32, stride: i32, width: i32, j: i32, rows: i32, out: usize, o: i32): void {
  let k = 0;
  let a = start;
  for (; k + 2 <= width; k += 2, a += 2 * stride) {
    const a1 = a + stride;
    const l0 = rf(pBlock, a + j);
    const l1 = rf(pBlock, a1 + j);
    const v0 = f64x2.splat(l0);
    const v1 = f64x2.splat(l1);
    let i = j;
    const pa = pBlock + ((<usize>a) << 3);
    const pa1 = pBlock + ((<usize>a1) << 3);
    const po = out + ((<usize>o) << 3);
    for (; i + 2 <= rows; i += 2) {
      const off = (<usize>i) << 3;
      const acc = f64x2.add(f64x2.mul(v128.load(pa + off), v0), f64x2.mul(v128.load(pa1 + off), v1));
      v128.store(po + off, f64x2.sub(v128.load(po + off), acc));
    }
    if (i < rows) wf(out, o + i, rf(out, o + i) - (rf(pBlock, a + i) * l0 + rf(pBlock, a1 + i) * l1));
  }
  if (k < width) {
    const l0 = rf(pBlock, a + j);
    for (let i = j; i < rows; i++) wf(out, o + i, rf(out, o + i) - rf(pBlock, a + i) * l0);
  }
}

function subtractProductsPair(start: i32, stride: i32, width: i32, j: i32, rows: i32, out: usize, o0: i32, o1: i32): void {
  const j1 = j + 1;
  let k = 0;
  let a = start;
  const po0 = out + ((<usize>o0) << 3);
  const po1 = out + ((<usize>o1) << 3);
  // four source columns per pass: each pair of target entries loaded and stored once per four
  for (; k + 4 <= width; k += 4, a += 4 * stride) {
    const a1 = a + stride;
    const a2 = a1 + stride;
    const a3 = a2 + stride;
    const l0 = f64x2.splat(rf(pBlock, a + j));
    const l1 = f64x2.splat(rf(pBlock, a1 + j));
    const l2 = f64x2.splat(rf(pBlock, a2 + j));
    const l3 = f64x2.splat(rf(pBlock, a3 + j));
    const u0 = f64x2.splat(rf(pBlock, a + j1));
    const u1 = f64x2.splat(rf(pBlock, a1 + j1));
    const u2 = f64x2.splat(rf(pBlock, a2 + j1));
    const u3 = f64x2.splat(rf(pBlock, a3 + j1));
    const pa = pBlock + ((<usize>a) << 3);
    const pa1 = pBlock + ((<usize>a1) << 3);
    const pa2 = pBlock + ((<usize>a2) << 3);
    const pa3 = pBlock + ((<usize>a3) << 3);
    let i = j;
    for (; i + 2 <= rows; i += 2) {
      const off = (<usize>i) << 3;
      const x0 = v128.load(pa + off);
      const x1 = v128.load(pa1 + off);
      const x2 = v128.load(pa2 + off);
      const x3 = v128.load(pa3 + off);
      const s0 = f64x2.add(f64x2.add(f64x2.mul(x0, l0), f64x2.mul(x1, l1)), f64x2.add(f64x2.mul(x2, l2), f64x2.mul(x3, l3)));
      const s1 = f64x2.add(f64x2.add(f64x2.mul(x0, u0), f64x2.mul(x1, u1)), f64x2.add(f64x2.mul(x2, u2), f64x2.mul(x3, u3)));
      v128.store(po0 + off, f64x2.sub(v128.load(po0 + off), s0));
      v128.store(po1 + off, f64x2.sub(v128.load(po1 + off), s1));
    }
    if (i < rows) {
      const x0 = rf(pBlock, a + i);
      const x1 = rf(pBlock, a1 + i);
      const x2 = rf(pBlock, a2 + i);
      const x3 = rf(pBlock, a3 + i);
      wf(out, o0 + i, rf(out, o0 + i) - (x0 * rf(pBlock, a + j) + x1 * rf(pBlock, a1 + j) + (x2 * rf(pBlock, a2 + j) + x3 * rf(pBlock, a3 + j))));
      wf(out, o1 + i, rf(out, o1 + i) - (x0 * rf(pBlock, a + j1) + x1 * rf(pBlock, a1 + j1) + (x2 * rf(pBlock, a2 + j1) + x3 * rf(pBlock, a3 + j1))));
    }
  }
  for (; k + 2 <= width; k += 2, a += 2 * stride) {
    const a1 = a + stride;
    const l0 = f64x2.splat(rf(pBlock, a + j));
    const l1 = f64x2.splat(rf(pBlock, a1 + j));
    const u0 = f64x2.splat(rf(pBlock, a + j1));
    const u1 = f64x2.splat(rf(pBlock, a1 + j1));
    const pa = pBlock + ((<usize>a) << 3);
    const pa1 = pBlock + ((<usize>a1) << 3);
    let i = j;
    for (; i + 2 <= rows; i += 2) {
      const off = (<usize>i) << 3;
      const x0 = v128.load(pa + off);
      const x1 = v128.load(pa1 + off);
      v128.store(po0 + off, f64x2.sub(v128.load(po0 + off), f64x2.add(f64x2.mul(x0, l0), f64x2.mul(x1, l1))));
      v128.store(po1 + off, f64x2.sub(v128.load(po1 + off), f64x2.add(f64x2.mul(x0, u0), f64x2.mul(x1, u1))));
    }
    if (i < rows) {
      const x0 = rf(pBlock, a + i);
      const x1 = rf(pBlock, a1 + i);
      wf(out, o0 + i, rf(out, o0 + i) - (x0 * rf(pBlock, a + j) + x1 * rf(pBlock, a1 + j)));
      wf(out, o1 + i, rf(out, o1 + i) - (x0 * rf(pBlock, a + j1) + x1 * rf(pBlock, a1 + j1)));
    }
  }
  if (k < width) {
    const l0 = rf(pBlock, a + j);
    const u0 = rf(pBlock, a + j1);
    for (let i = j; i < rows; i++) {
      const x0 = rf(pBlock, a + i);
      wf(out, o0 + i, rf(out, o0 + i) - x0 * l0);
      wf(out, o1 + i, rf(out, o1 + i) - x0 * u0);
    }
  }
}

/** block[col + i] *= factor for rows i = from … to−1, two at a time. */
function scale(col: i32, from: i32, to: i32, factor: f64): void {
  const v = f64x2.splat(factor);
  const pc = pBlock + ((<usize>col) << 3);
  let i = from;
  for (; i + 2 <= to; i += 2) {
    const off = (<usize>i) << 3;
    v128.store(pc + off, f64x2.mul(v128.load(pc + off), v));
  }
  if (i < to) wf(pBlock, col + i, rf(pBlock, col + i) * factor);
}

/** block[target + i] −= block[source + i]·factor for rows i = from … to−1, two at a time. */
function subtractMultiple(target: i32, source: i32, from: i32, to: i32, factor: f64): void {
  const v = f64x2.splat(factor);
  const pt = pBlock + ((<usize>target) << 3);
  const ps = pBlock + ((<usize>source) << 3);
  let i = from;
  for (; i + 2 <= to; i += 2) {
    const off = (<usize>i) << 3;
    v128.store(pt + off, f64x2.sub(v128.load(pt + off), f64x2.mul(v128.load(ps + off), v)));
  }
  if (i < to) wf(pBlock, target + i, rf(pBlock, target + i) - rf(pBlock, source + i) * factor);
}

function factorSupernode(s: i32): i32 {
  const f = ri(pFirst, s);
  const wdt = ri(pFirst, s + 1) - f;
  const r0 = ri(pRowPtr, s);
  const m = ri(pRowPtr, s + 1) - r0;
  const b0 = ri(pBlockPtr, s);
  for (let q = 0; q < m; q++) wi(pRelative, ri(pRows, r0 + q), q);
  let d = ri(pHead, s);
  while (d >= 0) {
    const nextD = ri(pNext, d);
    const dr0 = ri(pRowPtr, d);
    const dm = ri(pRowPtr, d + 1) - dr0;
    const dw = ri(pFirst, d + 1) - ri(pFirst, d);
    const db0 = ri(pBlockPtr, d);
    const p1 = ri(pPosition, d);
    let p2 = p1;
    const last = f + wdt - 1;
    while (p2 < dm && ri(pRows, dr0 + p2) <= last) p2++;
    const um = dm - p1;
    const uw = p2 - p1;
    const rel0 = ri(pRelative, ri(pRows, dr0 + p1));
    const contiguous = ri(pRelative, ri(pRows, dr0 + dm - 1)) - rel0 == um - 1;
    if (!contiguous) for (let ii = 0; ii < um; ii++) wi(pMap, ii, ri(pRelative, ri(pRows, dr0 + p1 + ii)));
    const c0 = db0 + p1;
    let jj = 0;
    for (; jj + 1 < uw; jj += 2) {
      const base = b0 + (ri(pRows, dr0 + p1 + jj) - f) * m;
      const base1 = b0 + (ri(pRows, dr0 + p1 + jj + 1) - f) * m;
      if (contiguous) subtractProductsPair(c0, dm, dw, jj, um, pBlock, base + rel0, base1 + rel0);
      else {
        memory.fill(pUpdate + ((<usize>jj) << 3), 0, (<usize>(um - jj)) << 3);
        memory.fill(pUpdate + ((<usize>(half + jj)) << 3), 0, (<usize>(um - jj)) << 3);
        subtractProductsPair(c0, dm, dw, jj, um, pUpdate, 0, half);
        for (let ii = jj; ii < um; ii++) {
          const t = base + ri(pMap, ii);
          wf(pBlock, t, rf(pBlock, t) + rf(pUpdate, ii));
        }
        for (let ii = jj + 1; ii < um; ii++) {
          const t = base1 + ri(pMap, ii);
          wf(pBlock, t, rf(pBlock, t) + rf(pUpdate, half + ii));
        }
      }
    }
    if (jj < uw) {
      const base = b0 + (ri(pRows, dr0 + p1 + jj) - f) * m;
      if (contiguous) subtractProducts(c0, dm, dw, jj, um, pBlock, base + rel0);
      else {
        memory.fill(pUpdate + ((<usize>jj) << 3), 0, (<usize>(um - jj)) << 3);
        subtractProducts(c0, dm, dw, jj, um, pUpdate, 0);
        for (let ii = jj; ii < um; ii++) {
          const t = base + ri(pMap, ii);
          wf(pBlock, t, rf(pBlock, t) + rf(pUpdate, ii));
        }
      }
    }
    wi(pPosition, d, p2);
    if (p2 < dm) {
      const t = ri(pSuperOf, ri(pRows, dr0 + p2));
      wi(pNext, d, ri(pHead, t));
      wi(pHead, t, d);
    }
    d = nextD;
  }
  for (let c = 0; c < wdt; c += 2) {
    const cb = b0 + c * m;
    const pair = c + 1 < wdt;
    const cb1 = cb + m;
    if (c > 0) {
      if (pair) subtractProductsPair(b0, m, c, c, m, pBlock, cb, cb1);
      else subtractProducts(b0, m, c, c, m, pBlock, cb);
    }
    const diag = rf(pBlock, cb + c);
    if (!(diag > 0) || !isFinite(diag)) return f + c;
    const lcc = Math.sqrt(diag);
    wf(pBlock, cb + c, lcc);
    const inv = 1 / lcc;
    scale(cb, c + 1, m, inv);
    if (!pair) break;
    const l = rf(pBlock, cb + c + 1);
    subtractMultiple(cb1, cb, c + 1, m, l);
    const diag1 = rf(pBlock, cb1 + c + 1);
    if (!(diag1 > 0) || !isFinite(diag1)) return f + c + 1;
    const l11 = Math.sqrt(diag1);
    wf(pBlock, cb1 + c + 1, l11);
    const inv1 = 1 / l11;
    scale(cb1, c + 2, m, inv1);
  }
  if (wdt < m) {
    wi(pPosition, s, wdt);
    const t = ri(pSuperOf, ri(pRows, r0 + wdt));
    wi(pNext, s, ri(pHead, t));
    wi(pHead, t, s);
  }
  return -1;
}

export function factor(): i32 {
  for (let s = 0; s < ns; s++) wi(pHead, s, -1);
  const nnzL = ri(pBlockPtr, ns);
  memory.fill(pBlock, 0, (<usize>nnzL) << 3);
  for (let e = 0; e < nScatter; e++) {
    const t = ri(pScatterTo, e);
    wf(pBlock, t, rf(pBlock, t) + rf(pValues, ri(pScatterFrom, e)));
  }
  for (let s = 0; s < ns; s++) {
    const failed = factorSupernode(s);
    if (failed >= 0) return failed;
  }
  return nCols;
}

// solve A x = b in place on `pIo` (b in, x out), through the permutation
export function solve(pIo: usize): void {
  const below = pUpdate;
  for (let k = 0; k < nCols; k++) wf(pWork, k, rf(pIo, ri(pPerm, k)));
  for (let s = 0; s < ns; s++) {
    const f = ri(pFirst, s);
    const wdt = ri(pFirst, s + 1) - f;
    const r0 = ri(pRowPtr, s);
    const m = ri(pRowPtr, s + 1) - r0;
    const b0 = ri(pBlockPtr, s);
    for (let i = wdt; i < m; i++) wf(below, i, 0);
    for (let c = 0; c < wdt; c++) {
      const cb = b0 + c * m;
      const xc = rf(pWork, f + c) / rf(pBlock, cb + c);
      wf(pWork, f + c, xc);
      for (let i = c + 1; i < wdt; i++) wf(pWork, f + i, rf(pWork, f + i) - rf(pBlock, cb + i) * xc);
      const vx = f64x2.splat(xc);
      let i = wdt;
      const pb = pBlock + ((<usize>cb) << 3);
      for (; i + 2 <= m; i += 2) {
        const off = (<usize>i) << 3;
        v128.store(below + off, f64x2.add(v128.load(below + off), f64x2.mul(v128.load(pb + off), vx)));
      }
      if (i < m) wf(below, i, rf(below, i) + rf(pBlock, cb + i) * xc);
    }
    for (let i = wdt; i < m; i++) {
      const t = ri(pRows, r0 + i);
      wf(pWork, t, rf(pWork, t) - rf(below, i));
    }
  }
  for (let s = ns - 1; s >= 0; s--) {
    const f = ri(pFirst, s);
    const wdt = ri(pFirst, s + 1) - f;
    const r0 = ri(pRowPtr, s);
    const m = ri(pRowPtr, s + 1) - r0;
    const b0 = ri(pBlockPtr, s);
    for (let i = wdt; i < m; i++) wf(below, i, rf(pWork, ri(pRows, r0 + i)));
    for (let c = wdt - 1; c >= 0; c--) {
      const cb = b0 + c * m;
      let xc = rf(pWork, f + c);
      for (let i = c + 1; i < wdt; i++) xc -= rf(pBlock, cb + i) * rf(pWork, f + i);
      let acc = f64x2.splat(0);
      let i = wdt;
      const pb = pBlock + ((<usize>cb) << 3);
      for (; i + 2 <= m; i += 2) {
        const off = (<usize>i) << 3;
        acc = f64x2.add(acc, f64x2.mul(v128.load(pb + off), v128.load(below + off)));
      }
      xc -= f64x2.extract_lane(acc, 0) + f64x2.extract_lane(acc, 1);
      if (i < m) xc -= rf(pBlock, cb + i) * rf(below, i);
      wf(pWork, f + c, xc / rf(pBlock, cb + c));
    }
  }
  for (let k = 0; k < nCols; k++) wf(pIo, ri(pPerm, k), rf(pWork, k));
}
