import type { NetworkDocument, PipeLink } from '../network-document';
import { FITTINGS, type FittingKind, purchaseUnit } from '../pipe-catalogue';
import type { CountedFitting } from './fittings';

/**
 * A pipe's minor-loss K derived from the fittings the takeoff counted on it, instead of a typed
 * K: each fitting's K from ../pipe-catalogue FITTINGS (common handbook values as tabulated in Crane
 * Technical Paper 410, M): elbows at its bends, a tee through the branch where it leaves a tee
 * as a branch, a reducer where it is the smaller side, a tank adapter (entrance) where it leaves
 * a tank, and its couplings (joints between coils or sticks). Tee runs and valves are not added:
 * valves carry their own minor_loss, and the run K of a tee is small beside the branch.
 *
 * @example minorLossAllowance(doc, takeoff(doc).fittings, 0.05)['L-TR4'].k
 */

export interface Allowance {
  k: number;
  parts: { fitting: FittingKind; count: number; k: number }[];
}

export function minorLossAllowance(doc: NetworkDocument, fittings: CountedFitting[], waste_fraction = 0.05): Record<string, Allowance> {
  const out: Record<string, Allowance> = {};
  const addPart = (pipe: string, fitting: FittingKind, k: number, count = 1): void => {
    const a = (out[pipe] ??= { k: 0, parts: [] });
    const part = a.parts.find((p) => p.fitting === fitting && p.k === k);
    if (part) part.count += count;
    else a.parts.push({ fitting, count, k });
    a.k = Math.round((a.k + k * count) * 1e6) / 1e6;
  };
  for (const l of doc.links) if (l.kind === 'pipe') out[l.id] = { k: 0, parts: [] };
  for (const f of fittings) {
    if (!f.pipe || !out[f.pipe]) continue;
    const spec = FITTINGS[f.kind];
    if (f.kind === 'tee') {
      if (f.branch) addPart(f.pipe, 'tee', spec.kBranch ?? spec.k);
      continue;
    }
    if (f.kind === 'elbow-90' || f.kind === 'elbow-45' || f.kind === 'reducer' || f.kind === 'tank-adapter') addPart(f.pipe, f.kind, spec.k);
  }
  for (const l of doc.links) {
    if (l.kind !== 'pipe' || !l.series || !l.nominal) continue;
    const unit = purchaseUnit(l.series, l.nominal);
    if (unit.joint !== 'coupling') continue;
    const joints = Math.ceil((l.length_m * (1 + waste_fraction)) / unit.length_m - 1e-9) - 1;
    if (joints > 0) addPart(l.id, 'coupling', FITTINGS.coupling.k, joints);
  }
  return out;
}

/** The document with each pipe's minor_loss replaced by its counted allowance (pipes not listed keep theirs). */
export function applyMinorLossAllowance(doc: NetworkDocument, allowance: Record<string, Allowance>): NetworkDocument {
  return { ...doc, links: doc.links.map((l) => (l.kind === 'pipe' && allowance[l.id] ? { ...(l as PipeLink), minor_loss: allowance[l.id].k } : l)) };
}
