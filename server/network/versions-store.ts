/**
 * The immutable version history of a project's network: every save inserts one row (the document,
 * its results, who, when and a one-line summary of what changed) inside the save's transaction.
 * Listing, reading one version, comparing two, and the frozen-version rule live here too.
 */
import { and, asc, desc, eq } from 'drizzle-orm';
import { alias } from 'drizzle-orm/pg-core';
import type { NetworkDocument, SteadyResult } from '../../engine';
import { compareOutlets, diffVersions, summariseDiff } from '../../engine/review/version-diff';
import { networkVersions, users } from '../../drizzle/schema';
import type { DbOrTx } from '../db';
import { ApiError } from '../errors';
import { versionChange } from './version-change';
import type { StoredVersion, VersionComparison, VersionStatus, VersionSummary } from '../../shared/versions-api';

export type { StoredVersion, VersionComparison, VersionStatus, VersionSummary };

/**
 * Records version `version` of a project. `change` is the one-line summary against the document it
 * replaces, computed off the request thread (the engine pool, with the save's solve), or a reader
 * of that document (null for the first version) when the pool could not.
 */
export async function recordVersion(
  tx: DbOrTx,
  v: {
    projectId: string;
    version: number;
    document: NetworkDocument;
    results: SteadyResult | null;
    userId: string;
    change: string | (() => Promise<NetworkDocument | null>);
    restoredFrom?: number;
    at: Date;
  },
): Promise<void> {
  const change = typeof v.change === 'string' ? v.change : versionChange(await v.change(), v.document);
  const summary = v.restoredFrom ? `restored version ${v.restoredFrom}: ${change}` : change;
  await tx.insert(networkVersions).values({
    projectId: v.projectId,
    version: v.version,
    document: v.document,
    results: v.results,
    summary,
    restoredFrom: v.restoredFrom ?? null,
    createdAt: v.at,
    createdBy: v.userId,
  });
}

const creator = alias(users, 'creator');
const decider = alias(users, 'decider');

const summaryColumns = {
  version: networkVersions.version,
  summary: networkVersions.summary,
  createdAt: networkVersions.createdAt,
  createdBy: creator.name,
  restoredFrom: networkVersions.restoredFrom,
  status: networkVersions.status,
  statusAt: networkVersions.statusAt,
  statusBy: decider.name,
  statusNote: networkVersions.statusNote,
};

type SummaryRow = {
  version: number;
  summary: string;
  createdAt: Date;
  createdBy: string | null;
  restoredFrom: number | null;
  status: VersionStatus;
  statusAt: Date | null;
  statusBy: string | null;
  statusNote: string;
};

function toSummary(r: SummaryRow): VersionSummary {
  return { ...r, createdAt: r.createdAt.toISOString(), statusAt: r.statusAt?.toISOString() ?? null };
}

/** Every version of a project, newest first, without documents. */
export async function listVersions(db: DbOrTx, projectId: string): Promise<VersionSummary[]> {
  const rows = await db
    .select(summaryColumns)
    .from(networkVersions)
    .leftJoin(creator, eq(creator.id, networkVersions.createdBy))
    .leftJoin(decider, eq(decider.id, networkVersions.statusBy))
    .where(eq(networkVersions.projectId, projectId))
    .orderBy(desc(networkVersions.version));
  return rows.map(toSummary);
}

/** One version with its document and results; 404 naming the version when there is none. */
export async function loadVersion(db: DbOrTx, projectId: string, version: number): Promise<StoredVersion> {
  const [row] = await db
    .select({ ...summaryColumns, document: networkVersions.document, results: networkVersions.results })
    .from(networkVersions)
    .leftJoin(creator, eq(creator.id, networkVersions.createdBy))
    .leftJoin(decider, eq(decider.id, networkVersions.statusBy))
    .where(and(eq(networkVersions.projectId, projectId), eq(networkVersions.version, version)));
  if (!row)
    throw new ApiError('not-found', `Version ${version} of this project does not exist`, { fields: [{ path: 'version', message: `no version ${version}` }] });
  const { document, results, ...rest } = row;
  // jsonb reads back as unknown: these columns are written only by recordVersion, with the types above.
  return { ...toSummary(rest), document: document as NetworkDocument, results: results as SteadyResult | null };
}

/** The newest version number of a project (0 when none is kept). */
export async function latestVersion(db: DbOrTx, projectId: string): Promise<number> {
  const [row] = await db
    .select({ version: networkVersions.version })
    .from(networkVersions)
    .where(eq(networkVersions.projectId, projectId))
    .orderBy(desc(networkVersions.version))
    .limit(1);
  return row?.version ?? 0;
}

/** Elements added, removed and changed field by field from `from` to `to`, and every outlet before and after. */
export async function compareVersions(db: DbOrTx, projectId: string, from: number, to: number): Promise<VersionComparison> {
  const a = await loadVersion(db, projectId, from);
  const b = await loadVersion(db, projectId, to);
  const diff = diffVersions(a.document, b.document);
  const { document: da, results: ra, ...sa } = a;
  const { document: db2, results: rb, ...sb } = b;
  return {
    from: sa,
    to: sb,
    diff,
    summary: summariseDiff(diff),
    outlets: compareOutlets(da, ra, db2, rb),
  };
}

/** Oldest first: the versions in a given state (the review tab's "awaiting review" list). */
export async function versionsInState(db: DbOrTx, projectId: string, status: VersionStatus): Promise<number[]> {
  const rows = await db
    .select({ version: networkVersions.version })
    .from(networkVersions)
    .where(and(eq(networkVersions.projectId, projectId), eq(networkVersions.status, status)))
    .orderBy(asc(networkVersions.version));
  return rows.map((r) => r.version);
}
