import type { NetworkDocument } from '../../../../../engine/network-document';
import type { SteadyResult } from '../../../../../engine/index';
import { formatQuantity, UnitSystem } from '../../../../../engine/units';

/**
 * Velocity above which a pipe is flagged, m/s. About 5 ft/s: a common trade guideline for
 * plastic water lines (limits surge and wear); not a code requirement.
 */
export const VELOCITY_LIMIT_MS = 1.5;

/**
 * Warning messages by element id for the canvas badges and the results list: the engine's own
 * warnings plus the limits the Layout screen points out (below minimum pressure, negative
 * pressure, pipe over its rating, high velocity), worded in the project's units.
 */
export function resultWarnings(doc: NetworkDocument, res: SteadyResult | null, units: UnitSystem): Map<string, string[]> {
  const out = new Map<string, string[]>();
  if (!res) return out;
  const add = (id: string, m: string) => out.set(id, [...(out.get(id) ?? []), m]);
  for (const w of res.warnings) if (w.element) add(w.element, w.message);
  for (const n of doc.nodes) {
    const r = res.nodes[n.id];
    if (!r) continue;
    if (r.pressure_m < -0.01 && n.kind !== 'source' && n.kind !== 'tank') {
      add(n.id, `Negative pressure (${formatQuantity('pressure', r.pressure_m, units)}): the line may draw air or not fill`);
    } else if (n.kind === 'outlet' && n.min_pressure_m !== undefined && r.pressure_m < n.min_pressure_m) {
      add(n.id, `Below minimum: ${formatQuantity('pressure', r.pressure_m, units)} < ${formatQuantity('pressure', n.min_pressure_m, units)}`);
    }
  }
  for (const l of doc.links) {
    const r = res.links[l.id];
    if (!r || l.kind !== 'pipe') continue;
    if (Math.abs(r.velocity_ms) > VELOCITY_LIMIT_MS) {
      add(l.id, `Velocity ${formatQuantity('velocity', Math.abs(r.velocity_ms), units)} is above ${formatQuantity('velocity', VELOCITY_LIMIT_MS, units)}`);
    }
    if (l.rating_m !== undefined) {
      const p = Math.max(res.nodes[l.from]?.pressure_m ?? -Infinity, res.nodes[l.to]?.pressure_m ?? -Infinity);
      if (p > l.rating_m) {
        add(l.id, `Pressure ${formatQuantity('pressure', p, units)} exceeds the pipe rating ${formatQuantity('pressure', l.rating_m, units)}: risk of bursting — use a higher class and follow local codes`);
      }
    }
  }
  return out;
}
