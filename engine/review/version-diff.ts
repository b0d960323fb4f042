/**
 * Comparing two saved versions of a network document: elements added, removed and changed field by
 * field (compared by id, key order ignored), the one-line summary a save records, and each outlet's
 * pressure and delivered flow before and after from the two versions' steady results. Pure; SI.
 *
 * @example
 * const diff = diffVersions(before, after);
 * summariseDiff(diff) // "changed P4 (diameter_m); added O7"
 */
import type { NetworkDocument, NetworkLink, NetworkNode } from '../network-document';

type Element = NetworkNode | NetworkLink;

export interface FieldChange {
  field: string;
  before: unknown;
  after: unknown;
}
export interface ElementRef {
  id: string;
  kind: string;
  name?: string;
}
export interface ChangedElement extends ElementRef {
  fields: FieldChange[];
}

export interface VersionDiff {
  added: ElementRef[];
  removed: ElementRef[];
  changed: ChangedElement[];
  /** Document-level fields other than nodes and links (title, headloss, patterns, layout). */
  settings: FieldChange[];
}

/** Editor-only fields: a change to these alone is summarised as "moved". */
const PLACEMENT_FIELDS = new Set(['x_m', 'y_m', 'vertices']);

/** JSON text with object keys sorted and undefined dropped, so key order never counts as a change. */
export function canonicalJson(v: unknown): string {
  return (
    JSON.stringify(v, (_k, val: unknown) =>
      val && typeof val === 'object' && !Array.isArray(val)
        ? Object.fromEntries(
            Object.entries(val as Record<string, unknown>)
              .filter(([, x]) => x !== undefined)
              .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0)),
          )
        : val,
    ) ?? 'undefined'
  );
}

function ref(e: Element): ElementRef {
  return e.name ? { id: e.id, kind: e.kind, name: e.name } : { id: e.id, kind: e.kind };
}

function fieldChanges(a: Record<string, unknown>, b: Record<string, unknown>, skip: ReadonlySet<string> = new Set()): FieldChange[] {
  const keys = [...new Set([...Object.keys(a), ...Object.keys(b)])].filter((k) => !skip.has(k)).sort();
  const out: FieldChange[] = [];
  for (const k of keys) {
    if (canonicalJson(a[k]) !== canonicalJson(b[k])) out.push({ field: k, before: a[k] ?? null, after: b[k] ?? null });
  }
  return out;
}

function byId(doc: NetworkDocument): Map<string, Element> {
  const m = new Map<string, Element>();
  for (const e of [...(doc.nodes ?? []), ...(doc.links ?? [])]) m.set(e.id, e);
  return m;
}

/** Elements added, removed and changed (field by field) going from `before` to `after`. */
export function diffVersions(before: NetworkDocument, after: NetworkDocument): VersionDiff {
  const a = byId(before);
  const b = byId(after);
  const out: VersionDiff = { added: [], removed: [], changed: [], settings: [] };
  for (const [id, e] of b) {
    const old = a.get(id);
    if (!old) {
      out.added.push(ref(e));
      continue;
    }
    const fields = fieldChanges(old as unknown as Record<string, unknown>, e as unknown as Record<string, unknown>);
    if (fields.length) out.changed.push({ ...ref(e), fields });
  }
  for (const [id, e] of a) if (!b.has(id)) out.removed.push(ref(e));
  out.settings = fieldChanges(before as unknown as Record<string, unknown>, after as unknown as Record<string, unknown>, new Set(['nodes', 'links']));
  return out;
}

export function isEmptyDiff(d: VersionDiff): boolean {
  return !d.added.length && !d.removed.length && !d.changed.length && !d.settings.length;
}

/**
 * One line for the version list: "changed P4 (diameter_m), T1 (level_m); added O7; moved J2".
 * Ids are listed up to `maxIds` per group, then "+n more"; the line is capped at 200 characters.
 */
export function summariseDiff(d: VersionDiff, maxIds = 4): string {
  const list = (items: string[]) => items.slice(0, maxIds).join(', ') + (items.length > maxIds ? `, +${items.length - maxIds} more` : '');
  const moved = d.changed.filter((c) => c.fields.every((f) => PLACEMENT_FIELDS.has(f.field)));
  const edited = d.changed.filter((c) => !moved.includes(c));
  const parts: string[] = [];
  if (edited.length) {
    parts.push(
      `changed ${list(
        edited.map(
          (c) =>
            `${c.id} (${c.fields
              .filter((f) => !PLACEMENT_FIELDS.has(f.field))
              .map((f) => f.field)
              .join(', ')})`,
        ),
      )}`,
    );
  }
  if (d.added.length) parts.push(`added ${list(d.added.map((e) => e.id))}`);
  if (d.removed.length) parts.push(`removed ${list(d.removed.map((e) => e.id))}`);
  if (moved.length) parts.push(`moved ${list(moved.map((e) => e.id))}`);
  if (d.settings.length) parts.push(`settings (${d.settings.map((f) => f.field).join(', ')})`);
  const line = parts.length ? parts.join('; ') : 'no changes';
  return line.length > 200 ? `${line.slice(0, 199)}…` : line;
}

/** What the comparison needs from a steady result (engine SteadyResult fits). */
export interface OutletResults {
  nodes: Record<string, { pressure_m: number; demand_m3s: number }>;
}

export interface OutletComparison {
  id: string;
  name?: string;
  /** null when the outlet is missing from that version or the version has no results. */
  before: { pressure_m: number; flow_m3s: number } | null;
  after: { pressure_m: number; flow_m3s: number } | null;
  pressureChange_m: number | null;
  flowChange_m3s: number | null;
}

/** Each outlet of either version with its pressure and delivered flow before and after. */
export function compareOutlets(
  before: NetworkDocument,
  beforeResults: OutletResults | null,
  after: NetworkDocument,
  afterResults: OutletResults | null,
): OutletComparison[] {
  const outlets = new Map<string, NetworkNode>();
  for (const n of [...(before.nodes ?? []), ...(after.nodes ?? [])]) if (n.kind === 'outlet') outlets.set(n.id, n);
  const read = (doc: NetworkDocument, r: OutletResults | null, id: string) => {
    if (!r || !doc.nodes.some((n) => n.id === id)) return null;
    const v = r.nodes[id];
    return v ? { pressure_m: v.pressure_m, flow_m3s: v.demand_m3s } : null;
  };
  return [...outlets.values()]
    .map((n) => {
      const b = read(before, beforeResults, n.id);
      const a = read(after, afterResults, n.id);
      return {
        id: n.id,
        ...(n.name ? { name: n.name } : {}),
        before: b,
        after: a,
        pressureChange_m: a && b ? a.pressure_m - b.pressure_m : null,
        flowChange_m3s: a && b ? a.flow_m3s - b.flow_m3s : null,
      };
    })
    .sort((x, y) => x.id.localeCompare(y.id));
}
