import { equalisationTime, type EqualiseResult } from '../equalise';
import type { NetworkDocument, TankNode } from '../network-document';
import type { TimeSeriesResult } from '../simulate';

/**
 * How long each tank bank takes to even out after a fill: the tank the fill pump delivers to (or
 * the bank's first) starts at its full level (the pump's stop level, else max), the others at the
 * lowest level the simulation reached, and ./equalise integrates the exchange through the headers
 * to within 1 cm. Tanks sharing a `bank` id form a bank; a bank of one tank is skipped.
 *
 * @example
 * bankEqualisation(doc, simulate(doc, { duration_s: 86400, step_s: 600 }))[0].result.time_s
 */

export interface BankEqualisation {
  bank: string;
  tanks: string[];
  /** The tank that starts full. */
  filled: string;
  result: EqualiseResult;
}

export const BANK_TOLERANCE_M = 0.01;

export function bankEqualisation(doc: NetworkDocument, sim: TimeSeriesResult): BankEqualisation[] {
  const banks = new Map<string, TankNode[]>();
  for (const n of doc.nodes) if (n.kind === 'tank' && n.bank) (banks.get(n.bank) ?? banks.set(n.bank, []).get(n.bank)!).push(n);
  const out: BankEqualisation[] = [];
  for (const [bank, tanks] of banks) {
    if (tanks.length < 2) continue;
    const ids = new Set(tanks.map((t) => t.id));
    const pump = doc.links.find((l) => l.kind === 'pump' && (ids.has(l.to) || (l.control && ids.has(l.control.tank))));
    const filled = tanks.find((t) => pump && t.id === pump.to) ?? tanks[0];
    const control = pump?.kind === 'pump' && pump.control && pump.control.tank === filled.id ? pump.control.stop_level_m : undefined;
    const full = Math.min(filled.max_level_m, control ?? filled.max_level_m);
    const start: NetworkDocument = {
      ...doc,
      nodes: doc.nodes.map((n) => {
        if (n.kind !== 'tank' || !ids.has(n.id)) return n;
        if (n.id === filled.id) return { ...n, level_m: full };
        return { ...n, level_m: sim.summary.tanks[n.id]?.lowest_level_m ?? n.min_level_m };
      }),
    };
    out.push({ bank, tanks: [...ids], filled: filled.id, result: equalisationTime(start, { tanks: [...ids], tolerance_m: BANK_TOLERANCE_M }) });
  }
  return out;
}
