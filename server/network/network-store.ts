/**
 * Loading and saving a project's network document with an optimistic version: a save names the
 * version it started from and succeeds only if that is still the stored one. The server solves the
 * document with the engine and stores the results beside it.
 */
import { and, eq, sql } from 'drizzle-orm';
import { emptyDocument, migrateDocument, parseDocument, type NetworkDocument, type SteadyResult } from '../../engine';
import { networks, users } from '../../drizzle/schema';
import { audit } from '../audit';
import type { Db, DbOrTx } from '../db';
import { EngineTimeout, runEngine } from '../engine-pool/pool';
import type { CheckedSolve } from '../engine-pool/tasks';
import type { NetworkSaveSummary, StoredNetwork } from '../../shared/network-api';
import { ApiError, issuePath } from '../errors';
import { recordVersion } from './versions-store';

export async function loadNetwork(db: DbOrTx, projectId: string): Promise<StoredNetwork> {
  const [row] = await db
    .select({
      version: networks.version,
      document: networks.document,
      results: networks.results,
      updatedAt: networks.updatedAt,
      userName: users.name,
    })
    .from(networks)
    .leftJoin(users, eq(users.id, networks.updatedBy))
    .where(eq(networks.projectId, projectId));
  if (!row) return { version: 0, document: emptyDocument(), results: null, updatedAt: null, updatedBy: null };
  // A design saved under an older version of the format opens as the current version.
  const migrated = migrateDocument(row.document);
  return {
    version: row.version,
    document: (migrated.ok ? migrated.doc : row.document) as NetworkDocument,
    results: row.results as SteadyResult | null,
    updatedAt: row.updatedAt.toISOString(),
    updatedBy: row.userName ?? null,
  };
}

export interface SaveRequest {
  projectId: string;
  teamId: string;
  user: { id: string; email: string };
  /** The version the client loaded (0 when nothing was saved yet). */
  expectedVersion: number;
  document: unknown;
  log?: (line: string) => void;
  /** Set when the document is an earlier version being restored (recorded in the version history). */
  restoredFrom?: number;
  /** Time limit of the save-time check and solve, ms (default SAVE_SOLVE_TIMEOUT_MS). */
  solveTimeout_ms?: number;
}

/** A save-time solve running longer than this is stopped; the save goes through with a result saying so. */
export const SAVE_SOLVE_TIMEOUT_MS = 10_000;

export interface SaveResult {
  version: number;
  results: SteadyResult | null;
  updatedAt: string;
}

/** What a save answers over HTTP: no megabytes of results echoed back (GET …/network has them). */
export function saveSummary(saved: SaveResult): NetworkSaveSummary {
  const r = saved.results;
  return {
    version: saved.version,
    updatedAt: saved.updatedAt,
    solved: r ? { converged: r.converged, iterations: r.iterations, warnings: r.warnings.length } : null,
  };
}

/**
 * Validates (the engine's schema, migrating an older version) and solves in the engine pool, off
 * the request thread, then stores. Throws 400 naming element and field when the document is
 * malformed, 409 with the stored network when `expectedVersion` is stale.
 */
export async function saveNetwork(db: Db, request: SaveRequest): Promise<SaveResult> {
  // The document this save replaces, as stored text, for the version history's one-line summary (worked
  // out in the engine pool with the solve: a diff of two large networks is too slow for the request thread).
  // Read before the transaction: if another save lands in between, this one's update fails as stale anyway.
  const [previous] =
    request.expectedVersion === 0
      ? []
      : await db
          .select({ json: sql<string>`${networks.document}::text` })
          .from(networks)
          .where(and(eq(networks.projectId, request.projectId), eq(networks.version, request.expectedVersion)));
  const checked = await checkAndSolve(request.document, previous?.json ?? null, request.solveTimeout_ms ?? SAVE_SOLVE_TIMEOUT_MS, request.log);
  if (!checked.ok) {
    const fields = checked.problems.map((p) => ({
      path: issuePath(['document', ...p.path]),
      ...(p.element ? { element: p.element } : {}),
      message: p.message,
    }));
    throw new ApiError('validation', `The network document has ${fields.length} problem${fields.length === 1 ? '' : 's'}: ${fields[0].message}`, { fields });
  }
  const document = checked.migrated ?? (request.document as NetworkDocument);
  const results = checked.results;
  const now = new Date();
  const saved = await db.transaction(async (tx) => {
    const written =
      request.expectedVersion === 0
        ? await tx
            .insert(networks)
            .values({ projectId: request.projectId, version: 1, document, results, updatedAt: now, updatedBy: request.user.id })
            .onConflictDoNothing({ target: networks.projectId })
            .returning({ version: networks.version })
        : await tx
            .update(networks)
            .set({ version: request.expectedVersion + 1, document, results, updatedAt: now, updatedBy: request.user.id })
            .where(and(eq(networks.projectId, request.projectId), eq(networks.version, request.expectedVersion)))
            .returning({ version: networks.version });
    if (written.length === 0) return null;
    await recordVersion(tx, {
      projectId: request.projectId,
      version: written[0].version,
      document,
      results,
      userId: request.user.id,
      change: checked.change ?? (async () => (previous ? (JSON.parse(previous.json) as NetworkDocument) : null)),
      restoredFrom: request.restoredFrom,
      at: now,
    });
    await audit(tx, {
      teamId: request.teamId,
      user: request.user,
      action: 'network.save',
      target: request.projectId,
      detail: {
        version: written[0].version,
        nodes: document.nodes.length,
        links: document.links.length,
        ...(request.restoredFrom ? { restoredFrom: request.restoredFrom } : {}),
      },
    });
    return written[0].version;
  });
  if (saved === null) {
    const current = await loadNetwork(db, request.projectId);
    throw new ApiError(
      'conflict',
      `The network was saved by ${current.updatedBy ?? 'someone else'} since you loaded version ${request.expectedVersion} (now version ${current.version}); your changes were not saved`,
      {},
      { current },
    );
  }
  return { version: saved, results, updatedAt: now.toISOString() };
}

/**
 * The schema check and the solve, in a worker thread. The engine must never lose a save: past the
 * time limit the result says the solve was stopped; if the worker fails, the results are null
 * (logged). Either way the document is then checked here, so nothing invalid is stored.
 */
async function checkAndSolve(
  raw: unknown,
  previousJson: string | null,
  timeout_ms: number,
  log?: (line: string) => void,
): Promise<CheckedSolve | { ok: true; migrated: NetworkDocument; results: SteadyResult | null; change?: undefined }> {
  try {
    return await runEngine('checkAndSolve', [raw, undefined, previousJson], { timeout_ms });
  } catch (err) {
    log?.(`save-time solve failed: ${err instanceof Error ? (err.stack ?? err.message) : String(err)}`);
    const parsed = parseDocument(raw);
    if (!parsed.ok) return { ok: false, problems: parsed.problems };
    const stopped: SteadyResult = {
      converged: false,
      iterations: 0,
      nodes: {},
      links: {},
      warnings: [{ code: 'not-converged', element: null, message: `network: the server stopped the solve after ${timeout_ms / 1000} s` }],
    };
    return { ok: true, migrated: parsed.doc, results: err instanceof EngineTimeout ? stopped : null };
  }
}
