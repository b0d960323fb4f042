/**
 * What the network and budget routes answer over HTTP (server/API.md), kept once: the server's
 * stores return these shapes and the client's services read them. Types only.
 */
import type { NetworkDocument, SteadyResult } from '../engine';
import type { BudgetDocument, BudgetPlan, LayoutDifference } from '../engine/budget';

/** GET /api/projects/:id/network (and a stale save's 409 `current`). */
export interface StoredNetwork {
  version: number;
  /** Migrated to the current schema; a stored document that no longer migrates is sent as stored. */
  document: NetworkDocument;
  results: SteadyResult | null;
  updatedAt: string | null;
  /** Name of the user who saved last. */
  updatedBy: string | null;
}

/** What a network save answers (PUT network, restore, a budget save that changed the network): no megabytes of results echoed back. */
export interface NetworkSaveSummary {
  version: number;
  updatedAt: string;
  /** null when the save-time solve failed (the document is stored all the same). */
  solved: { converged: boolean; iterations: number; warnings: number } | null;
}

/** GET /api/projects/:id/budget (and a stale save's 409 `current`). */
export interface StoredBudget {
  version: number;
  document: BudgetDocument;
  updatedAt: string | null;
  updatedBy: string | null;
  /** The plan against the project's current network (null when the network cannot be planned with). */
  plan: BudgetPlan | null;
  /** The network version the plan was computed against. */
  networkVersion: number;
  /** Budget-driven outlets whose network flow differs from the budget's (edited on the Layout): held, not overwritten. */
  held: LayoutDifference[];
}

/** PUT /api/projects/:id/budget. */
export interface SaveBudgetResult {
  version: number;
  updatedAt: string;
  plan: BudgetPlan | null;
  /** The network save the budget caused (null when no outlet flow changed). */
  network: NetworkSaveSummary | null;
  networkVersion: number;
  /** Outlets whose Layout-edited flow was kept because the save did not name them in applyOutlets. */
  held: LayoutDifference[];
}
