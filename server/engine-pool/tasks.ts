/**
 * The engine work the server runs off the request thread, by name: each entry is a plain function
 * of structured-cloneable arguments (documents, options) returning a cloneable result. Add a line
 * here to make an engine function callable through `runEngine` (./pool.ts); ./worker.ts runs them.
 */
import { parseDocument, SCHEMA_VERSION, solve, type DocumentProblem, type NetworkDocument, type SteadyOptions, type SteadyResult } from '../../engine';
import { equalisationTime } from '../../engine/equalise';
import { reviewChecklist, whatIfs } from '../../engine/review';
import { simulate } from '../../engine/simulate';
import { sizeNetwork } from '../../engine/sizing/size-network';
import { takeoff } from '../../engine/takeoff';

/** What a save needs: the schema check (migrating an older version) and the solve, in one trip. */
export type CheckedSolve =
  | { ok: false; problems: DocumentProblem[] }
  /** `migrated` is set only when the document was of an older version (else the caller's copy is current). */
  | { ok: true; migrated?: NetworkDocument; results: SteadyResult };

function checkAndSolve(raw: unknown, options?: SteadyOptions): CheckedSolve {
  const parsed = parseDocument(raw);
  if (!parsed.ok) return { ok: false, problems: parsed.problems };
  return { ok: true, ...(parsed.from !== SCHEMA_VERSION ? { migrated: parsed.doc } : {}), results: solve(parsed.doc, options) };
}

export const ENGINE_TASKS = { checkAndSolve, solve, simulate, equalisationTime, reviewChecklist, whatIfs, sizeNetwork, takeoff };

export type EngineTask = keyof typeof ENGINE_TASKS;
/** The function a task runs. */
export type EngineFn<K extends EngineTask> = (typeof ENGINE_TASKS)[K];
