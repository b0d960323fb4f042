import { planBudget } from '../budget/plan';
import { withProjectCover } from '../checks';
import type { NetworkDocument, PipeLink } from '../network-document';
import { failingCheckCount } from '../review/checklist';
import { designChecks } from '../sizing/verify';
import { solve, type SteadyResult } from '../steady';
import { estimate, type Estimate, type EstimateSettings } from '../takeoff/estimate';
import { takeoff, type Takeoff, type TakeoffSettings } from '../takeoff/takeoff';

/**
 * What the Options screen compares per design (the current one and each option): the lowest
 * outlet pressure and its margin over what the outlet needs, the worst velocity, the highest
 * static pressure against its pipe's rating, the failing review checks (../review
 * failingCheckCount), the days of storage in the peak month (../budget, when the project has a
 * water budget), the pipe cost and the total estimate (../takeoff at the team's prices).
 *
 * @example summariseDesign(hillSmallholding, { prices: new Map() }).lowestOutlet?.id
 */

export interface DesignSummary {
  lowestOutlet: { id: string; pressure_m: number; required_m: number; margin_m: number } | null;
  worstVelocity: { pipe: string; velocity_ms: number } | null;
  worstRating: { pipe: string; static_m: number; rating_m: number; share: number } | null;
  /** Review checks that fail (../review); null when they could not be run for this design. */
  failingChecks: number | null;
  /** Usable storage ÷ daily need in the peak month, days; null without a water budget. */
  storageDays: number | null;
  pipeCost: number;
  total: number;
  missingPrices: number;
}

export interface SummaryInputs {
  prices: Map<string, number | null>;
  takeoffSettings?: TakeoffSettings;
  estimateSettings?: Partial<EstimateSettings>;
  /** The project's water budget document (runnel.budget/1), if any. */
  budget?: unknown;
  /** The project's default cover over pipes without their own, m (Profile tab). */
  cover_m?: number | null;
}

export interface DesignEvaluation {
  summary: DesignSummary;
  steady: SteadyResult;
  takeoff: Takeoff;
  estimate: Estimate;
}

/** Solve, check, take off and price one design. */
export function evaluateDesign(drawn: NetworkDocument, inputs: SummaryInputs): DesignEvaluation {
  const doc = withProjectCover(drawn, inputs.cover_m);
  const steady = solve(doc);
  const check = designChecks(doc, steady, {});
  const lowest = check.outlets.reduce<DesignSummary['lowestOutlet']>(
    (m, o) => (!m || o.margin_m < m.margin_m ? { id: o.id, pressure_m: o.pressure_m, required_m: o.required_m, margin_m: o.margin_m } : m),
    null,
  );
  let failing: number | null;
  try {
    failing = failingCheckCount(doc, { cover_m: inputs.cover_m });
  } catch {
    failing = null;
  }
  let storageDays: number | null = null;
  if (inputs.budget) {
    try {
      const plan = planBudget(inputs.budget, doc);
      const peak = plan.verdicts?.find((v) => v.month === plan.peak_month) ?? null;
      storageDays = peak && Number.isFinite(peak.reserve_days) ? peak.reserve_days : null;
    } catch {
      storageDays = null;
    }
  }
  const t = takeoff(doc, inputs.takeoffSettings ?? {}, steady);
  const e = estimate(t, inputs.prices, inputs.estimateSettings ?? {});
  const pipeCost = Math.round(e.lines.filter((l) => l.group === 'pipe').reduce((s, l) => s + l.amount, 0) * 100) / 100;
  return {
    summary: {
      lowestOutlet: lowest,
      worstVelocity: check.worstVelocity,
      worstRating: check.worstRating,
      failingChecks: failing,
      storageDays,
      pipeCost,
      total: e.total,
      missingPrices: e.missing.length,
    },
    steady,
    takeoff: t,
    estimate: e,
  };
}

export function summariseDesign(doc: NetworkDocument, inputs: SummaryInputs): DesignSummary {
  return evaluateDesign(doc, inputs).summary;
}

/** Pipes whose size, class, material or length differ, and nodes whose elevation or tank levels differ, between two designs. */
export function designDifferences(base: NetworkDocument, other: NetworkDocument): { pipes: string[]; nodes: string[] } {
  const baseLinks = new Map(base.links.map((l) => [l.id, l]));
  const baseNodes = new Map(base.nodes.map((n) => [n.id, n]));
  const pipes: string[] = [];
  for (const l of other.links) {
    const b = baseLinks.get(l.id);
    if (l.kind !== 'pipe') continue;
    const p = b as PipeLink | undefined;
    if (!p || p.diameter_m !== l.diameter_m || p.series !== l.series || p.nominal !== l.nominal || p.length_m !== l.length_m || p.roughness !== l.roughness)
      pipes.push(l.id);
  }
  const nodes: string[] = [];
  for (const n of other.nodes) {
    const b = baseNodes.get(n.id);
    if (!b || b.elevation_m !== n.elevation_m || (n.kind === 'tank' && b.kind === 'tank' && (n.level_m !== b.level_m || n.max_level_m !== b.max_level_m)))
      nodes.push(n.id);
  }
  return { pipes, nodes };
}
