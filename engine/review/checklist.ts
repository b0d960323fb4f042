/**
 * The review checklist of a network document: outlet, pipe, profile, storage-and-supply and safety
 * rows, each naming its rule and source (./rules) with pass / caution / fail. Pure and synchronous;
 * the server, the browser worker and `npm run -s review -- doc.json` call the same function.
 *
 * @example
 * const list = reviewChecklist(hillSmallholding);
 * list.counts // { pass, caution, fail }
 * failingCheckCount(optionDocument) // the Options screen's column
 */
import type { NetworkDocument } from '../network-document';
import { withProjectCover } from '../checks';
import { outletChecks } from './outlet-checks';
import { pipeChecks } from './pipe-checks';
import { profileChecks } from './profile-checks';
import { reviewContext } from './review-context';
import { safetyChecks } from './safety-checks';
import { supplyChecks, type SupplyInputs } from './supply-checks';
import type { Checklist, CheckRow, CheckStatus } from './types';

export interface ChecklistOptions {
  /** From the water budget, when the project has one (see ./supply-checks). */
  supply?: SupplyInputs;
  /** The project's default cover over pipes without their own, m (Profile tab; ../checks withProjectCover). */
  cover_m?: number | null;
}

/** Every check of a validated document (validate first: the checks trust the types). */
export function reviewChecklist(doc: NetworkDocument, options: ChecklistOptions = {}): Checklist {
  const ctx = reviewContext(withProjectCover(doc, options.cover_m));
  const rows: CheckRow[] = [...outletChecks(ctx), ...pipeChecks(ctx), ...profileChecks(ctx), ...supplyChecks(ctx, options.supply), ...safetyChecks(ctx)];
  const counts: Record<CheckStatus, number> = { pass: 0, caution: 0, fail: 0 };
  for (const r of rows) counts[r.status]++;
  return { rows, counts, solved: ctx.solved };
}

/** How many checks fail for a document: what the Options screen shows per pipe-size option. */
export function failingCheckCount(doc: NetworkDocument, options: ChecklistOptions = {}): number {
  return reviewChecklist(doc, options).counts.fail;
}
