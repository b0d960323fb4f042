/**
 * The engine work the server runs off the request thread, by name: each entry is a plain function
 * of structured-cloneable arguments (documents, options) returning a cloneable result. Add a line
 * here to make an engine function callable through `runEngine` (./pool.ts); ./worker.ts runs them.
 */
import { parseDocument, SCHEMA_VERSION, solve, type DocumentProblem, type NetworkDocument, type SteadyOptions, type SteadyResult } from '../../engine';
import { equalisationTime } from '../../engine/equalise';
import { reviewChecklist, whatIfs } from '../../engine/review';
import { versionChange } from '../network/version-change';
import { simulate } from '../../engine/simulate';
import { sizeNetwork } from '../../engine/sizing/size-network';
import { takeoff } from '../../engine/takeoff';

/** What a save needs: the schema check (migrating an older version), the solve and the version history's line, in one trip. */
export type CheckedSolve =
  | { ok: false; problems: DocumentProblem[] }
  /**
   * `migrated` is set only when the document was of an older version (else the caller's copy is current);
   * `change` is the one-line summary against the previous document, when it was given.
   */
  | { ok: true; migrated?: NetworkDocument; results: SteadyResult; change?: string };

/** `previousJson`: the document this save replaces as stored JSON text (a string crosses to the worker cheaply), null for a first save. */
function checkAndSolve(raw: unknown, options?: SteadyOptions, previousJson?: string | null): CheckedSolve {
  const parsed = parseDocument(raw);
  if (!parsed.ok) return { ok: false, problems: parsed.problems };
  const change =
    previousJson === undefined ? undefined : versionChange(previousJson === null ? null : (JSON.parse(previousJson) as NetworkDocument), parsed.doc);
  return {
    ok: true,
    ...(parsed.from !== SCHEMA_VERSION ? { migrated: parsed.doc } : {}),
    results: solve(parsed.doc, options),
    ...(change === undefined ? {} : { change }),
  };
}

export const ENGINE_TASKS = { checkAndSolve, solve, simulate, equalisationTime, reviewChecklist, whatIfs, sizeNetwork, takeoff };

export type EngineTask = keyof typeof ENGINE_TASKS;
/** The function a task runs. */
export type EngineFn<K extends EngineTask> = (typeof ENGINE_TASKS)[K];
