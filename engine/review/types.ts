/**
 * The review checklist's row: one rule applied to one element (or to the whole design), with its
 * verdict, the numbers behind it (SI, each with the quantity the screen converts) and the rule's source.
 */
import type { Quantity } from '../units';

export type CheckStatus = 'pass' | 'caution' | 'fail';
export type CheckGroup = 'outlets' | 'pipes' | 'profile' | 'storage' | 'safety';

/** A number and what it measures: a display quantity (engine/units.ts) or a plain ratio / count. */
export interface Amount {
  value: number;
  quantity: Quantity | 'percent' | 'days' | 'hours' | 'volume-per-day';
}

export interface CheckRow {
  /** `${rule}:${element}` (or the rule alone for design-wide checks); unique in a checklist. */
  key: string;
  group: CheckGroup;
  /** Rule id from ./rules (RULES). */
  rule: string;
  /** Short name of the check ("Velocity", "Surge on a sudden stop"). */
  title: string;
  /** The element the row is about; null for a design-wide check. */
  element: string | null;
  elementName?: string;
  status: CheckStatus;
  /** What was measured, the limit it is held to, and the margin (limit side positive = good). */
  measured?: Amount;
  limit?: Amount;
  margin?: Amount;
  /** Further numbers behind the verdict (wave speed, surge head, daily volumes). */
  detail?: { label: string; amount: Amount }[];
  /** Distance along a pipe from its `from` end where the finding is, m. */
  at_m?: number;
  /** One sentence on what the verdict means (no numbers in display units; the screen shows those). */
  note: string;
  /** The rule in words and its published source with the mark of REFERENCES.md (V, V2, C, M). */
  ruleText: string;
  source: string;
}

export interface Checklist {
  rows: CheckRow[];
  counts: Record<CheckStatus, number>;
  /** Whether the steady solve behind the checklist converged (when not, hydraulic rows are missing). */
  solved: boolean;
}
