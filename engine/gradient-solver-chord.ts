import type { SparseLdl } from './sparse-ldl';
import type { SupernodalCholesky } from './supernodal-cholesky';

/**
 * Chord steps of the gradient solver (./gradient-solver): when this iteration's matrix is close to
 * the one last factorised, the old factorisation corrects the heads instead of a new one (the
 * chord or simplified Newton method, e.g. Kelley 1995, "Iterative Methods for Linear and Nonlinear
 * Equations", SIAM, ch. 5; cited from memory). In the last iterations of a large solve only the
 * low-flow links still move their conductances, and by little.
 */

/** Largest change of a matrix entry, as a share of its column's diagonal, for which the last factorisation is used again. */
export const CHORD_LIMIT = 0.01;

/**
 * Whether the factorisation of `last` is close enough to `ldl.values` for a chord step: no entry
 * of a column has moved by more than CHORD_LIMIT of that column's diagonal (the perturbation,
 * scaled by the diagonal, then shrinks a chord step's error at least about tenfold; a status
 * change or a pinned node moves entries far more).
 * @param posDiag position of each column's diagonal entry in `values`
 */
export function factorStillServes(last: Float64Array, ldl: SparseLdl, posDiag: Int32Array): boolean {
  const { colPtr, values } = ldl;
  for (let j = 0; j < posDiag.length; j++) {
    const diagonal = last[posDiag[j]];
    const allowed = CHORD_LIMIT * (diagonal < 0 ? -diagonal : diagonal);
    for (let e = colPtr[j]; e < colPtr[j + 1]; e++) {
      const change = values[e] - last[e];
      if ((change < 0 ? -change : change) > allowed) return false;
    }
  }
  return true;
}

/**
 * One chord step: the residual of this iteration's system at the current heads, b − A·H (A and b
 * as assembled, exact), corrected by the old factorisation: H += A_old⁻¹·(b − A·H). Off by at most
 * about CHORD_LIMIT of the step, which the next iteration corrects; the stopping rule checks the
 * true equations either way.
 * @param unknownNode node of each unknown (column)
 */
export function chordStep(
  ldl: SparseLdl,
  chol: SupernodalCholesky,
  rhs: Float64Array,
  residual: Float64Array,
  x: Float64Array,
  head: Float64Array,
  unknownNode: Int32Array,
): void {
  const { colPtr, rowIdx, values } = ldl;
  const n = unknownNode.length;
  residual.set(rhs);
  for (let j = 0; j < n; j++) {
    const hj = head[unknownNode[j]];
    for (let e = colPtr[j]; e < colPtr[j + 1]; e++) residual[rowIdx[e]] -= values[e] * hj;
  }
  chol.solve(residual, x);
  for (let u = 0; u < n; u++) head[unknownNode[u]] += x[u];
}
