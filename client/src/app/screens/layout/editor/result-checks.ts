import type { NetworkDocument } from '../../../../../../engine/network-document';
import type { SteadyResult } from '../../../../../../engine/index';
import { formatQuantity, UnitSystem } from '../../../../../../engine/units';

/**
 * Warning messages by element id for the canvas badges and the results list. The engine decides
 * what is wrong (its warning codes); this only rewords the common ones in the project's units,
 * adding the usual caution where a fault can hurt someone. Other codes keep the engine's words.
 */
export function resultWarnings(doc: NetworkDocument, res: SteadyResult | null, units: UnitSystem): Map<string, string[]> {
  const out = new Map<string, string[]>();
  if (!res) return out;
  const nodes = new Map(doc.nodes.map((n) => [n.id, n]));
  const links = new Map(doc.links.map((l) => [l.id, l]));
  const p = (m: number) => formatQuantity('pressure', m, units);
  for (const w of res.warnings) {
    if (!w.element) continue;
    const nr = res.nodes[w.element];
    const lr = res.links[w.element];
    const node = nodes.get(w.element);
    const link = links.get(w.element);
    // Listed under the element's name, so the engine's leading "id:" goes; other ids become names.
    let text = namesForIds(w.message.replace(new RegExp(`^${escapeRe(w.element)}:\\s*`), ''), doc);
    if (w.code === 'below-minimum' && nr && node?.kind === 'outlet' && node.min_pressure_m !== undefined) {
      text = `Below minimum pressure: ${p(nr.pressure_m)} < ${p(node.min_pressure_m)}`;
    } else if (w.code === 'negative-pressure' && nr) {
      text = `Negative pressure (${p(nr.pressure_m)}): the line may draw air, siphon or not fill`;
    } else if (w.code === 'velocity-high' && lr) {
      text = `High velocity ${formatQuantity('velocity', Math.abs(lr.velocity_ms), units)}: surge and wear risk`;
    } else if (w.code === 'over-rating' && link?.kind === 'pipe' && link.rating_m !== undefined) {
      text = `Over the pipe's pressure rating (${p(link.rating_m)}): risk of bursting — use a higher class and follow local codes`;
    }
    out.set(w.element, [...(out.get(w.element) ?? []), text]);
  }
  return out;
}

/** Warnings about the whole document (not converged, no fixed head…), with element names for ids. */
export function documentWarnings(res: SteadyResult | null, doc?: NetworkDocument): string[] {
  return res ? res.warnings.filter((w) => !w.element).map((w) => (doc ? namesForIds(w.message, doc) : w.message)) : [];
}

/** Replace each element id standing alone in a message by the element's name (ids stay where no name is set). */
export function namesForIds(message: string, doc: NetworkDocument): string {
  const names = new Map<string, string>();
  for (const e of [...doc.nodes, ...doc.links]) if (e.name && e.name !== e.id) names.set(e.id, e.name);
  if (!names.size) return message;
  const ids = [...names.keys()].sort((a, b) => b.length - a.length).map(escapeRe);
  return message.replace(new RegExp(`(?<![\\w-])(${ids.join('|')})(?![\\w-])`, 'g'), (id) => names.get(id) ?? id);
}

function escapeRe(s: string): string {
  return s.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
}
