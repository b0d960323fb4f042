import type { NetworkDocument, NetworkLink, NetworkNode } from '../../../../../../engine/network-document';

type Element = NetworkNode | NetworkLink;

/** What one side did to the elements, by element (name or id for display). */
export interface ElementChanges {
  changed: Element[];
  added: Element[];
  removed: Element[];
  /** Anything outside the element lists (title, head-loss model, patterns, backdrop, survey). */
  other: boolean;
}

/** JSON text with object keys sorted, so key order never counts as a change. */
function canonical(v: unknown): string {
  return JSON.stringify(v, (_k, val: unknown) =>
    val && typeof val === 'object' && !Array.isArray(val)
      ? Object.fromEntries(Object.entries(val as Record<string, unknown>).filter(([, x]) => x !== undefined).sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)))
      : val,
  );
}

function byId(doc: NetworkDocument): Map<string, Element> {
  const m = new Map<string, Element>();
  for (const e of [...doc.nodes, ...doc.links]) m.set(e.id, e);
  return m;
}

/** Elements changed, added and removed going from `from` to `to`, compared by id. */
export function diffDocuments(from: NetworkDocument, to: NetworkDocument): ElementChanges {
  const a = byId(from);
  const b = byId(to);
  const out: ElementChanges = { changed: [], added: [], removed: [], other: false };
  for (const [id, e] of b) {
    const old = a.get(id);
    if (!old) out.added.push(e);
    else if (old !== e && canonical(old) !== canonical(e)) out.changed.push(e);
  }
  for (const [id, e] of a) if (!b.has(id)) out.removed.push(e);
  const rest = (d: NetworkDocument) => canonical({ ...d, nodes: undefined, links: undefined });
  out.other = rest(from) !== rest(to);
  return out;
}

export function isEmpty(c: ElementChanges): boolean {
  return !c.changed.length && !c.added.length && !c.removed.length && !c.other;
}

/** "2 elements changed (Upper tee, P4), 1 added (East trough)"; names listed up to `maxNames` per group. */
export function describeChanges(c: ElementChanges, maxNames = 3): string {
  const names = (list: Element[]) => {
    const shown = list.slice(0, maxNames).map((e) => e.name || e.id);
    return ` (${shown.join(', ')}${list.length > maxNames ? `, +${list.length - maxNames} more` : ''})`;
  };
  const parts: string[] = [];
  const groups: [Element[], string][] = [[c.changed, 'changed'], [c.added, 'added'], [c.removed, 'removed']];
  for (const [list, verb] of groups) {
    if (!list.length) continue;
    const noun = parts.length ? '' : list.length === 1 ? ' element' : ' elements';
    parts.push(`${list.length}${noun} ${verb}${names(list)}`);
  }
  if (c.other) parts.push(parts.length ? 'network settings changed' : 'network settings changed (title, backdrop, survey or patterns)');
  return parts.length ? parts.join(', ') : 'no changes';
}

/**
 * The conflict dialog's summary. With `base` (the version both sides started from) each side's
 * own changes are listed; without it, how their copy differs from yours.
 */
export function conflictSummary(base: NetworkDocument | null, mine: NetworkDocument, theirs: NetworkDocument): string {
  if (!base) return `Their copy compared with yours: ${describeChanges(diffDocuments(mine, theirs))}.`;
  return `Theirs: ${describeChanges(diffDocuments(base, theirs))}; yours: ${describeChanges(diffDocuments(base, mine))}.`;
}
