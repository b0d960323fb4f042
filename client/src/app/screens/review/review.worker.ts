/// <reference lib="webworker" />
/**
 * The review's engine work off the main thread: the checklist of a version and the single-failure
 * what-ifs. Messages in: { seq, task: 'checklist' | 'what-ifs', doc, budget?, cover_m? }; out: { seq, result, ms } or { seq, error }.
 * With the project's water budget the storage and trough checks use its worst month and herds; with
 * the project's default cover (Profile tab) the HGL and lowest-point checks use it for pipes without their own.
 */
import { z } from 'zod';
import { normaliseDocument } from '../../../../../engine/steady';
import { validateDocument } from '../../../../../engine/validate';
import type { NetworkDocument } from '../../../../../engine/network-document';
import { reviewChecklist } from '../../../../../engine/review/checklist';
import { supplyFromBudget, type SupplyInputs } from '../../../../../engine/review/supply-checks';
import { planBudget } from '../../../../../engine/budget/plan';
import { whatIfs } from '../../../../../engine/review/what-ifs';

// The page's CSP forbids eval: tell zod (the document schema) not to try compiling its checks.
z.config({ jitless: true });

addEventListener('message', (event: MessageEvent<{ seq: number; task: 'checklist' | 'what-ifs'; doc: unknown; budget?: unknown; cover_m?: number | null }>) => {
  const { seq, task, doc, budget, cover_m } = event.data;
  const t0 = performance.now();
  try {
    const invalid = validateDocument(doc);
    if (invalid.length) throw new Error(invalid[0].message);
    const network = normaliseDocument(doc as NetworkDocument);
    const result = task === 'checklist' ? reviewChecklist(network, { supply: budgetSupply(budget, network), cover_m }) : whatIfs(network);
    postMessage({ seq, result, ms: performance.now() - t0 });
  } catch (e) {
    postMessage({ seq, error: e instanceof Error ? e.message : String(e), ms: performance.now() - t0 });
  }
});

/** Supply inputs from the budget, or none when there is no budget or it does not plan (the checks then estimate from flows). */
function budgetSupply(budget: unknown, network: NetworkDocument): SupplyInputs | undefined {
  if (budget === undefined || budget === null) return undefined;
  try {
    return supplyFromBudget(planBudget(budget, network), network);
  } catch {
    return undefined;
  }
}
