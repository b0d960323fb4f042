/**
 * Fill-reducing ordering for sparse symmetric matrices: minimum degree on the explicit
 * elimination graph (Tinney & Walker 1967, "scheme 2"; George & Liu 1989, Computer Solution of
 * Large Sparse Positive Definite Systems, ch. 5), with a lazy binary heap for the degree queue.
 * The graph is given as CSR adjacency without the diagonal.
 *
 * @param n number of vertices
 * @param adjPtr CSR row pointers (length n+1)
 * @param adjIdx CSR column indices
 * @returns perm: perm[k] = vertex eliminated k-th (Int32Array of length n)
 * @example
 * // path 0-1-2: the ends go first
 * minimumDegreeOrder(3, Int32Array.from([0,1,3,4]), Int32Array.from([1,0,2,1])) // [0, 2, 1] or similar
 */
export function minimumDegreeOrder(n: number, adjPtr: Int32Array, adjIdx: Int32Array): Int32Array {
  const adj: Int32Array[] = new Array(n);
  const len = new Int32Array(n);
  for (let v = 0; v < n; v++) {
    const a = adjIdx.slice(adjPtr[v], adjPtr[v + 1]);
    adj[v] = a.length > 0 ? a : new Int32Array(2);
    len[v] = adjPtr[v + 1] - adjPtr[v];
  }
  const eliminated = new Uint8Array(n);
  const mark = new Int32Array(n).fill(-1);
  const perm = new Int32Array(n);
  // lazy heap of (degree, vertex), packed as degree * n + vertex in a Float64 heap
  let heap = new Float64Array(Math.max(16, n * 2));
  let heapSize = 0;
  const push = (key: number): void => {
    if (heapSize === heap.length) {
      const h = new Float64Array(heap.length * 2);
      h.set(heap);
      heap = h;
    }
    let i = heapSize++;
    while (i > 0) {
      const p = (i - 1) >> 1;
      if (heap[p] <= key) break;
      heap[i] = heap[p];
      i = p;
    }
    heap[i] = key;
  };
  const pop = (): number => {
    const top = heap[0];
    const last = heap[--heapSize];
    let i = 0;
    for (;;) {
      let c = 2 * i + 1;
      if (c >= heapSize) break;
      if (c + 1 < heapSize && heap[c + 1] < heap[c]) c++;
      if (heap[c] >= last) break;
      heap[i] = heap[c];
      i = c;
    }
    heap[i] = last;
    return top;
  };
  for (let v = 0; v < n; v++) push(len[v] * n + v);

  let k = 0;
  while (k < n) {
    const key = pop();
    const v = key % n;
    const d = (key - v) / n;
    if (eliminated[v] || d !== len[v]) continue; // stale entry
    eliminated[v] = 1;
    perm[k++] = v;
    const av = adj[v];
    const lv = len[v];
    // neighbours of v form a clique after elimination
    for (let a = 0; a < lv; a++) mark[av[a]] = v;
    for (let a = 0; a < lv; a++) {
      const u = av[a];
      let au = adj[u];
      let lu = len[u];
      // remove v from adj(u), and note which of v's neighbours u already has
      let w = 0;
      const stamp = -2 - v; // distinct from any vertex id and from -1
      for (let b = 0; b < lu; b++) {
        const x = au[b];
        if (x === v) continue;
        au[w++] = x;
        if (mark[x] === v) mark[x] = stamp; // already adjacent
      }
      lu = w;
      // add the missing neighbours of v (other than u)
      let need = 0;
      for (let c = 0; c < lv; c++) {
        const x = av[c];
        if (x !== u && mark[x] === v) need++;
      }
      if (lu + need > au.length) {
        const grown = new Int32Array(Math.max(au.length * 2, lu + need));
        grown.set(au.subarray(0, lu));
        au = grown;
        adj[u] = au;
      }
      for (let c = 0; c < lv; c++) {
        const x = av[c];
        if (x !== u && mark[x] === v) au[lu++] = x;
      }
      // restore marks for the next neighbour
      for (let c = 0; c < lv; c++) mark[av[c]] = v;
      len[u] = lu;
      push(lu * n + u);
    }
    adj[v] = new Int32Array(0);
    len[v] = 0;
  }
  return perm;
}
