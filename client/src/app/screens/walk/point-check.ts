/**
 * Whether a point may be recorded now, and with what elevation. Pure, so every refusal is tested
 * (client/src/app/screens/walk/point-check.spec.ts). A refusal never clears the form.
 */
import { formatQuantity, type UnitSystem } from '../../../../../engine/units';
import type { Fix } from './walk-types';

export interface PointDraft {
  label: string;
  /** Typed elevation in metres (from a hand level or altimeter), or null. Typed wins over the fix. */
  typedElevation_m: number | null;
}

export type PointCheck =
  | { ok: true; elevation_m: number; elevation_source: 'fix' | 'typed'; poor_fix: boolean }
  | { ok: false; message: string; /** true when "record anyway" may override (a poor fix). */ overridable: boolean };

export function checkPoint(draft: PointDraft, fix: Fix | null, limit_m: number, units: UnitSystem, recordPoorFix = false): PointCheck {
  if (!draft.label.trim()) return { ok: false, message: 'Give the point a label (e.g. "Trough 3").', overridable: false };
  if (!fix) {
    return draft.typedElevation_m === null
      ? {
          ok: false,
          message: 'No position fix and no typed elevation: wait for the phone to find its place, and type the elevation if the fix gives none.',
          overridable: false,
        }
      : {
          ok: false,
          message: 'No position fix yet: a point needs a place. Wait for the fix (step into the open, away from trees and buildings).',
          overridable: false,
        };
  }
  const poor = fix.accuracy_m > limit_m;
  if (poor && !recordPoorFix) {
    return {
      ok: false,
      message: `The fix is good to ±${formatQuantity('length', fix.accuracy_m, units)}, worse than the ${formatQuantity('length', limit_m, units)} limit. Wait for a better fix, or record it anyway marked as poor.`,
      overridable: true,
    };
  }
  if (draft.typedElevation_m !== null) return { ok: true, elevation_m: draft.typedElevation_m, elevation_source: 'typed', poor_fix: poor };
  if (fix.altitude_m === null) {
    return { ok: false, message: 'This fix carries no elevation: type the elevation (from a hand level, altimeter or the plan).', overridable: false };
  }
  return { ok: true, elevation_m: fix.altitude_m, elevation_source: 'fix', poor_fix: poor };
}
