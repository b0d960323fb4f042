import { solve, type SteadyOptions, type SteadyResult } from './steady';

/**
 * Re-solving a document that is being edited (the Layout's live results): each solve starts Newton
 * from the last converged answer (`solve(doc, { start })`, matched by element id, so an edit that
 * adds or removes elements is fine), which after a small edit takes 1–4 iterations instead of the
 * 8–10 of a cold start on a large looped network. The stopping rule is the same, so the answer is
 * the one a cold solve gives, to its tolerances. A warm start that does not converge (a start far
 * from the new answer) is dropped and the document solved afresh: a warm start never turns a
 * network that converges into one that does not.
 *
 * @example
 * const live = new LiveSolver();
 * live.solve(doc);        // cold
 * live.solve(editedDoc);  // from the answer above
 */
export class LiveSolver {
  private last: SteadyResult | null = null;

  /** Solve `doc` (untrusted, validated by solve) from the last converged answer when there is one. */
  solve(doc: unknown, options: Omit<SteadyOptions, 'start'> = {}): SteadyResult {
    if (this.last) {
      const warm = solve(doc, { ...options, start: this.last });
      if (warm.converged) {
        this.last = warm;
        return warm;
      }
      // an invalid or unsolvable document answers the same from any start
      if (warm.warnings.some((w) => w.code === 'invalid' || w.code === 'no-fixed-head')) return warm;
    }
    const cold = solve(doc, options);
    this.last = cold.converged ? cold : null;
    return cold;
  }

  /** Start the next solve cold (another project opened). */
  forget(): void {
    this.last = null;
  }
}
