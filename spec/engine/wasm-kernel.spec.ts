import { expect } from 'chai';
import { spawnSync } from 'node:child_process';
import { GradientSolver } from '../../engine/gradient-solver';
import { compileNetwork } from '../../engine/network-model';
import { SparseLdl } from '../../engine/sparse-ldl';
import { steadyState } from '../../engine/steady';
import { SupernodalCholesky } from '../../engine/supernodal-cholesky';
import { useWasmKernel, wasmKernelAvailable } from '../../engine/wasm/supernodal-kernel';
import { loopedGrid } from '../../bench/looped-grid';

/** A long grid's weighted Laplacian plus a small diagonal, weights over eight decades (as 1/g of pipes). */
function unevenGrid(nx: number, ny: number, seed: number): SparseLdl {
  const random = (): number => {
    seed = (seed * 1103515245 + 12345) % 2147483648;
    return seed / 2147483648;
  };
  const n = nx * ny;
  const pairs: [number, number][] = [];
  for (let y = 0; y < ny; y++)
    for (let x = 0; x < nx; x++) {
      const v = y * nx + x;
      if (x + 1 < nx) pairs.push([v, v + 1]);
      if (y + 1 < ny) pairs.push([v, v + nx]);
    }
  const ldl = new SparseLdl(n, pairs);
  const diagonal = new Float64Array(n).map(() => 1e-3 * random());
  for (const [i, j] of pairs) {
    const w = Math.exp(8 * random() - 4);
    ldl.values[ldl.position(i, j)] -= w;
    ldl.values[ldl.position(j, i)] -= w;
    diagonal[i] += w;
    diagonal[j] += w;
  }
  for (let v = 0; v < n; v++) ldl.values[ldl.position(v, v)] = diagonal[v];
  return ldl;
}

/** Solution of A·x = b with the supernodal factorisation, the WebAssembly kernel on or off. */
function supernodalSolve(ldl: SparseLdl, wasm: boolean, b: Float64Array): { x: Float64Array; result: number } {
  const before = useWasmKernel(wasm);
  try {
    const chol = new SupernodalCholesky(ldl);
    const result = chol.factor();
    const x = new Float64Array(ldl.n);
    if (result === ldl.n) chol.solve(b, x);
    return { x, result };
  } finally {
    useWasmKernel(before);
  }
}

describe('the WebAssembly supernodal kernel (engine/wasm)', () => {
  it('the committed binary is a fresh compile of engine/wasm/assembly/supernodal-kernel.ts', function () {
    this.timeout(60_000);
    const run = spawnSync(process.execPath, ['scripts/build-wasm.mjs', '--check'], { encoding: 'utf8' });
    expect(run.stderr + run.stdout).to.match(/matches/);
    expect(run.status).to.equal(0);
  });

  it('compiles and runs under Node (so the solver here uses it)', () => {
    expect(wasmKernelAvailable()).to.equal(true);
  });

  it('gives the JavaScript kernel’s solution on long grids with uneven weights (same algorithm, sums in another order)', () => {
    // computed (C): the two kernels factor one matrix; only the rounding of the dense sums differs
    for (const [nx, ny] of [
      [17, 90],
      [40, 60],
      [5, 400],
    ]) {
      const ldl = unevenGrid(nx, ny, nx * 31 + ny);
      const b = Float64Array.from({ length: ldl.n }, (_, i) => Math.sin(3 * i));
      const js = supernodalSolve(ldl, false, b);
      const wasm = supernodalSolve(ldl, true, b);
      expect(wasm.result).to.equal(ldl.n);
      expect(js.result).to.equal(ldl.n);
      const scale = Math.max(...Array.from(js.x, Math.abs));
      for (let i = 0; i < ldl.n; i++) expect(wasm.x[i]).to.be.closeTo(js.x[i], 1e-10 * scale);
    }
  });

  it('reports the same failing column as the JavaScript kernel for a matrix that is not positive definite', () => {
    const ldl = unevenGrid(30, 40, 5);
    const middle = 600;
    ldl.values[ldl.position(middle, middle)] = -1; // one negative pivot partway through
    const b = new Float64Array(ldl.n).fill(1);
    const js = supernodalSolve(ldl, false, b);
    const wasm = supernodalSolve(ldl, true, b);
    expect(js.result).to.be.below(ldl.n);
    expect(wasm.result).to.equal(js.result);
  });

  it('keeps every factor right when more factorisations are alive than it has memories (the older ones solve in JavaScript)', () => {
    const b = (n: number): Float64Array => Float64Array.from({ length: n }, (_, i) => Math.cos(i));
    const matrices = [0, 1, 2, 3, 4, 5, 6].map((k) => unevenGrid(20 + k, 60, 100 + k));
    const chols = matrices.map((ldl) => new SupernodalCholesky(ldl));
    for (const chol of chols) expect(chol.factor()).to.equal(chol.n);
    // solve in reverse, then again in order: every one against a fresh JavaScript-only solution
    for (const k of [6, 5, 4, 3, 2, 1, 0, 0, 1, 2, 3, 4, 5, 6]) {
      const x = new Float64Array(matrices[k].n);
      chols[k].solve(b(matrices[k].n), x);
      const reference = supernodalSolve(matrices[k], false, b(matrices[k].n)).x;
      const scale = Math.max(...Array.from(reference, Math.abs));
      for (let i = 0; i < x.length; i++) expect(x[i]).to.be.closeTo(reference[i], 1e-10 * scale);
    }
  });

  it('a network solve gives the same heads and flows with either kernel', () => {
    const model = compileNetwork(loopedGrid(40, 30));
    const run = (wasm: boolean): GradientSolver => {
      const before = useWasmKernel(wasm);
      try {
        const solver = new GradientSolver(model);
        expect(solver.solve(steadyState(solver)).converged).to.equal(true);
        return solver;
      } finally {
        useWasmKernel(before);
      }
    };
    const js = run(false);
    const wasm = run(true);
    for (let i = 0; i < model.nodeCount; i++) expect(wasm.head[i]).to.be.closeTo(js.head[i], 1e-8);
    for (let k = 0; k < model.linkCount; k++) expect(wasm.flow[k]).to.be.closeTo(js.flow[k], 1e-9 + 1e-6 * Math.abs(js.flow[k]));
  });
});
