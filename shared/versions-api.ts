/**
 * The network's version history as the API sends it (server/API.md "Versions"): one wire type for
 * server/network/versions-store.ts and the Review screen. Types, and the status list the database
 * column's enum is built from (drizzle/schema.ts), so the two cannot drift apart.
 */
import type { NetworkDocument, SteadyResult } from '../engine';
import type { OutletComparison, VersionDiff } from '../engine/review/version-diff';

/** Sign-off states: draft → submitted → approved | returned (a returned version may be submitted again). */
export const VERSION_STATUSES = ['draft', 'submitted', 'approved', 'returned'] as const;
export type VersionStatus = (typeof VERSION_STATUSES)[number];

export interface VersionSummary {
  version: number;
  summary: string;
  createdAt: string;
  createdBy: string | null;
  restoredFrom: number | null;
  status: VersionStatus;
  statusAt: string | null;
  statusBy: string | null;
  statusNote: string;
}

export interface StoredVersion extends VersionSummary {
  document: NetworkDocument;
  /** The save-time solve, as stored (null when that solve failed). */
  results: SteadyResult | null;
}

export interface VersionComparison {
  from: VersionSummary;
  to: VersionSummary;
  diff: VersionDiff;
  summary: string;
  outlets: OutletComparison[];
}
