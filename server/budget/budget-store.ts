/**
 * Loading and saving a project's water budget with an optimistic version (409 on a stale save),
 * and carrying its outlet design flows into the network: when a save changes a budget-driven
 * outlet's flow, the network is saved again through the network's own save path (a new network
 * version with its own results). Links and "not from budget" marks live in the budget document,
 * so the network schema is unchanged. A flow edited on the Layout is never overwritten unless the
 * save names that outlet in `applyOutlets`; otherwise it is held and reported (`held`).
 */
import { and, eq } from 'drizzle-orm';
import type { NetworkDocument } from '../../engine';
import type { SaveBudgetResult, StoredBudget } from '../../shared/network-api';
import { applyBudget, budgetChangesNetwork, emptyBudget, layoutDifferences, planBudget, type BudgetDocument, type BudgetPlan } from '../../engine/budget';
import { budgets, users } from '../../drizzle/schema';
import { audit } from '../audit';
import type { Db, DbOrTx } from '../db';
import { ApiError } from '../errors';
import { loadNetwork, saveNetwork, saveSummary } from '../network/network-store';
import { budgetErrors } from './budget-shape';

async function loadRow(db: DbOrTx, projectId: string): Promise<Omit<StoredBudget, 'plan' | 'networkVersion' | 'held'>> {
  const [row] = await db
    .select({ version: budgets.version, document: budgets.document, updatedAt: budgets.updatedAt, userName: users.name })
    .from(budgets)
    .leftJoin(users, eq(users.id, budgets.updatedBy))
    .where(eq(budgets.projectId, projectId));
  if (!row) return { version: 0, document: emptyBudget(), updatedAt: null, updatedBy: null };
  return { version: row.version, document: row.document as BudgetDocument, updatedAt: row.updatedAt.toISOString(), updatedBy: row.userName ?? null };
}

/** The stored budget (an empty one at version 0) with its plan against the current network. */
export async function loadBudget(db: DbOrTx, projectId: string): Promise<StoredBudget> {
  const row = await loadRow(db, projectId);
  const network = await loadNetwork(db, projectId);
  const plan = planOrNull(row.document, network.document);
  const held = plan && network.version > 0 ? layoutDifferences(network.document as NetworkDocument, row.document, plan) : [];
  return { ...row, plan, networkVersion: network.version, held };
}

function planOrNull(budget: BudgetDocument, network: unknown): BudgetPlan | null {
  try {
    return planBudget(budget, network);
  } catch {
    return null;
  }
}

export interface SaveBudgetRequest {
  projectId: string;
  /** Shown in the audit log (the log names projects, not ids). */
  projectName: string;
  teamId: string;
  user: { id: string; email: string };
  expectedVersion: number;
  document: unknown;
  /** Outlets whose Layout-edited flow is to be replaced by the budget's (the designer's choice per outlet). */
  applyOutlets?: string[];
  log?: (line: string) => void;
}

/** Validates, stores (409 when stale), then carries the outlet flows into the network. */
export async function saveBudget(db: Db, request: SaveBudgetRequest): Promise<SaveBudgetResult> {
  const problems = budgetErrors(request.document);
  if (problems.length) {
    throw new ApiError('validation', `The water budget has ${problems.length} problem${problems.length === 1 ? '' : 's'}: ${problems[0].message}`, {
      fields: problems,
    });
  }
  const document = request.document as BudgetDocument;
  // the budget this save replaces (read before the write; a save between fails the write with 409)
  const before = await loadRow(db, request.projectId);
  const previous = request.expectedVersion > 0 && before.version === request.expectedVersion ? before.document : null;
  const now = new Date();
  const saved = await db.transaction(async (tx) => {
    const written =
      request.expectedVersion === 0
        ? await tx
            .insert(budgets)
            .values({ projectId: request.projectId, version: 1, document, updatedAt: now, updatedBy: request.user.id })
            .onConflictDoNothing({ target: budgets.projectId })
            .returning({ version: budgets.version })
        : await tx
            .update(budgets)
            .set({ version: request.expectedVersion + 1, document, updatedAt: now, updatedBy: request.user.id })
            .where(and(eq(budgets.projectId, request.projectId), eq(budgets.version, request.expectedVersion)))
            .returning({ version: budgets.version });
    if (written.length === 0) return null;
    await audit(tx, {
      teamId: request.teamId,
      user: request.user,
      action: 'budget.save',
      target: request.projectName,
      detail: {
        version: written[0].version,
        uses: document.uses.length,
        ...(request.applyOutlets?.length ? { layoutFlowsReplaced: request.applyOutlets.join(', ') } : {}),
      },
    });
    return written[0].version;
  });
  if (saved === null) {
    const current = await loadBudget(db, request.projectId);
    throw new ApiError(
      'conflict',
      `The water budget was saved by ${current.updatedBy ?? 'someone else'} since you loaded version ${request.expectedVersion} (now version ${current.version}); your changes were not saved`,
      {},
      { current },
    );
  }
  const carried = await carryIntoNetwork(db, request, document, previous);
  return { version: saved, updatedAt: now.toISOString(), ...carried };
}

/**
 * Writes the budget's outlet flows into the network when they differ from it. A network saved by
 * someone else in between (409) is re-read and tried once more; the budget itself is already saved.
 */
async function carryIntoNetwork(
  db: Db,
  request: SaveBudgetRequest,
  budget: BudgetDocument,
  previous: BudgetDocument | null,
): Promise<Pick<SaveBudgetResult, 'plan' | 'network' | 'networkVersion' | 'held'>> {
  const chosen = new Set(request.applyOutlets ?? []);
  for (let attempt = 0; attempt < 2; attempt++) {
    const stored = await loadNetwork(db, request.projectId);
    const network = stored.document as NetworkDocument;
    const plan = planOrNull(budget, network);
    const held = plan && stored.version > 0 ? layoutDifferences(network, previous, plan).filter((d) => !chosen.has(d.id)) : [];
    const hold = new Set(held.map((d) => d.id));
    if (!plan || stored.version === 0 || !budgetChangesNetwork(network, plan, hold)) {
      return { plan, network: null, networkVersion: stored.version, held };
    }
    try {
      const document = applyBudget(network, plan, hold);
      const saved = await saveNetwork(db, {
        projectId: request.projectId,
        teamId: request.teamId,
        user: request.user,
        expectedVersion: stored.version,
        document,
        log: request.log,
      });
      // the plan again, against the network as now saved (pump flow at the new lift)
      return { plan: planOrNull(budget, document), network: saveSummary(saved), networkVersion: saved.version, held };
    } catch (error) {
      if (!(error instanceof ApiError && error.code === 'conflict') || attempt === 1) throw error;
    }
  }
  throw new Error('unreachable');
}
