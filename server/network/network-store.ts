/**
 * Loading and saving a project's network document with an optimistic version: a save names the
 * version it started from and succeeds only if that is still the stored one. The server solves the
 * document with the engine and stores the results beside it.
 */
import { and, eq } from 'drizzle-orm';
import { emptyDocument, migrateDocument, parseDocument, solve, type NetworkDocument, type SteadyResult } from '../../engine';
import { networks, users } from '../../drizzle/schema';
import { audit } from '../audit';
import type { Db, DbOrTx } from '../db';
import { ApiError, issuePath } from '../errors';
import { recordVersion } from './versions-store';

export interface StoredNetwork {
  version: number;
  document: unknown;
  results: unknown;
  updatedAt: string | null;
  /** Name of the user who saved last. */
  updatedBy: string | null;
}

export async function loadNetwork(db: DbOrTx, projectId: string): Promise<StoredNetwork> {
  const [row] = await db.select({
    version: networks.version, document: networks.document, results: networks.results,
    updatedAt: networks.updatedAt, userName: users.name,
  }).from(networks).leftJoin(users, eq(users.id, networks.updatedBy)).where(eq(networks.projectId, projectId));
  if (!row) return { version: 0, document: emptyDocument(), results: null, updatedAt: null, updatedBy: null };
  // A design saved under an older version of the format opens as the current version.
  const migrated = migrateDocument(row.document);
  return {
    version: row.version, document: migrated.ok ? migrated.doc : row.document, results: row.results, updatedAt: row.updatedAt.toISOString(),
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
}

export interface SaveResult { version: number; results: SteadyResult | null; updatedAt: string }

/**
 * Validates (the engine's schema, migrating an older version), solves and stores. Throws 400 naming element and field when the
 * document is malformed, 409 with the stored network when `expectedVersion` is stale.
 */
export async function saveNetwork(db: Db, request: SaveRequest): Promise<SaveResult> {
  const parsed = parseDocument(request.document);
  if (!parsed.ok) {
    const fields = parsed.problems.map((p) => ({ path: issuePath(['document', ...p.path]), ...(p.element ? { element: p.element } : {}), message: p.message }));
    throw new ApiError('validation', `The network document has ${fields.length} problem${fields.length === 1 ? '' : 's'}: ${fields[0].message}`, { fields });
  }
  const document = parsed.doc;
  const results = solveSafely(document, request.log);
  const now = new Date();
  const saved = await db.transaction(async (tx) => {
    // The document this save replaces, for the version history's one-line summary.
    const [previous] = request.expectedVersion === 0 ? [] : await tx.select({ document: networks.document }).from(networks)
      .where(and(eq(networks.projectId, request.projectId), eq(networks.version, request.expectedVersion)));
    const written = request.expectedVersion === 0
      ? await tx.insert(networks).values({ projectId: request.projectId, version: 1, document, results, updatedAt: now, updatedBy: request.user.id })
        .onConflictDoNothing({ target: networks.projectId }).returning({ version: networks.version })
      : await tx.update(networks).set({ version: request.expectedVersion + 1, document, results, updatedAt: now, updatedBy: request.user.id })
        .where(and(eq(networks.projectId, request.projectId), eq(networks.version, request.expectedVersion)))
        .returning({ version: networks.version });
    if (written.length === 0) return null;
    await recordVersion(tx, {
      projectId: request.projectId, version: written[0].version, document, results, userId: request.user.id,
      previous: (previous?.document as NetworkDocument | undefined) ?? null, restoredFrom: request.restoredFrom, at: now,
    });
    await audit(tx, {
      teamId: request.teamId, user: request.user, action: 'network.save', target: request.projectId,
      detail: { version: written[0].version, nodes: document.nodes.length, links: document.links.length, ...(request.restoredFrom ? { restoredFrom: request.restoredFrom } : {}) },
    });
    return written[0].version;
  });
  if (saved === null) {
    const current = await loadNetwork(db, request.projectId);
    throw new ApiError('conflict',
      `The network was saved by ${current.updatedBy ?? 'someone else'} since you loaded version ${request.expectedVersion} (now version ${current.version}); your changes were not saved`,
      {}, { current });
  }
  return { version: saved, results, updatedAt: now.toISOString() };
}

/** The engine must never lose a save: a solver failure stores no results and is logged. */
function solveSafely(document: NetworkDocument, log?: (line: string) => void): SteadyResult | null {
  try {
    return solve(document);
  } catch (err) {
    log?.(`solve failed: ${err instanceof Error ? err.stack ?? err.message : String(err)}`);
    return null;
  }
}
