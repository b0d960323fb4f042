/**
 * What pricing and comparing a design needs from the database: the team's prices, the project's
 * takeoff and estimate settings, its water budget (for storage days) and its default cover (Profile tab).
 */
import { eq } from 'drizzle-orm';
import {
  DEFAULT_ESTIMATE_SETTINGS,
  DEFAULT_OTHER,
  catalogueCandidate,
  type EstimateSettings,
  type SizingCandidate,
  type SummaryInputs,
  type TakeoffSettings,
} from '../../engine';
import { budgets, takeoffSettings } from '../../drizzle/schema';
import type { DbOrTx } from '../db';
import { priceMap } from '../prices/price-store';
import { loadProfileSettings } from '../profile/profile-settings-store';

export interface ProjectTakeoffSettings extends Required<Pick<TakeoffSettings, 'waste_fraction' | 'bendAngle_deg' | 'other'>>, Required<EstimateSettings> {}

export const DEFAULT_PROJECT_SETTINGS: ProjectTakeoffSettings = {
  waste_fraction: 0.05,
  bendAngle_deg: 30,
  other: DEFAULT_OTHER,
  ...DEFAULT_ESTIMATE_SETTINGS,
};

export async function loadTakeoffSettings(db: DbOrTx, projectId: string): Promise<ProjectTakeoffSettings> {
  const [row] = await db.select({ settings: takeoffSettings.settings }).from(takeoffSettings).where(eq(takeoffSettings.projectId, projectId));
  return { ...DEFAULT_PROJECT_SETTINGS, ...((row?.settings as Partial<ProjectTakeoffSettings> | undefined) ?? {}) };
}

export async function designInputs(db: DbOrTx, teamId: string, projectId: string): Promise<SummaryInputs & { settings: ProjectTakeoffSettings }> {
  const [prices, settings, budgetRows, profile] = await Promise.all([
    priceMap(db, teamId),
    loadTakeoffSettings(db, projectId),
    db.select({ document: budgets.document }).from(budgets).where(eq(budgets.projectId, projectId)),
    loadProfileSettings(db, projectId),
  ]);
  const budget = budgetRows[0]?.document as { uses?: unknown[] } | undefined;
  return {
    prices,
    settings,
    budget: budget && Array.isArray(budget.uses) && budget.uses.length > 0 ? budget : undefined,
    takeoffSettings: { waste_fraction: settings.waste_fraction, bendAngle_deg: settings.bendAngle_deg, other: settings.other },
    estimateSettings: settings,
    cover_m: profile.cover_m,
  };
}

/** Priced pipe items of the team's list as sizing candidates (codes `series/nominal` of the catalogue with a price). */
export function pipeCandidates(prices: Map<string, number | null>, headloss: 'hazen-williams' | 'darcy-weisbach'): SizingCandidate[] {
  const out: SizingCandidate[] = [];
  for (const [code, price] of prices) {
    if (price === null) continue;
    const slash = code.indexOf('/');
    if (slash < 0) continue;
    const c = catalogueCandidate(code.slice(0, slash), code.slice(slash + 1), price, headloss);
    if (c) out.push(c);
  }
  return out;
}
