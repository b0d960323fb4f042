import type { DocumentLayout, LengthSource, NetworkDocument, NetworkLink, NetworkNode } from '../../../../../../engine/network-document';
import { emptyDocument } from '../../../../../../engine/network-document';
import { Point, polylineLength } from './geometry';

export { emptyDocument, type LengthSource };

interface HistoryEntry {
  before: NetworkDocument;
  after: NetworkDocument;
  label: string;
}

/**
 * The single source of truth for the Layout editor: an immutable NetworkDocument replaced on each
 * change (unchanged nodes and links keep their object identity, so views can skip them), with
 * undo/redo from snapshots.
 *
 * Gestures: `begin()` marks the document; changes made until `commit()` become ONE undo step;
 * `rollback()` returns to the mark. A change outside a gesture is a step of its own.
 * Solver results never live here.
 *
 * @example
 * const s = new DocumentStore(doc);
 * s.begin('move'); s.moveNodes(['T1'], 5, 0); s.commit();
 * s.undo(); // T1 back where it was
 */
export class DocumentStore {
  private current: NetworkDocument;
  private mark: NetworkDocument | null = null;
  private markLabel = '';
  private readonly undoStack: HistoryEntry[] = [];
  private readonly redoStack: HistoryEntry[] = [];
  private readonly listeners = new Set<(doc: NetworkDocument) => void>();
  /** Increments on every change (edits, undo, redo, replace). */
  revision = 0;
  static readonly HISTORY_LIMIT = 200;

  constructor(doc: NetworkDocument = emptyDocument()) {
    this.current = doc;
  }

  get doc(): NetworkDocument {
    return this.current;
  }

  get inGesture(): boolean {
    return this.mark !== null;
  }

  canUndo(): boolean {
    return this.undoStack.length > 0;
  }

  canRedo(): boolean {
    return this.redoStack.length > 0;
  }

  subscribe(fn: (doc: NetworkDocument) => void): () => void {
    this.listeners.add(fn);
    return () => this.listeners.delete(fn);
  }

  /** Replace the whole document (load, reload, import) and forget the history. */
  replace(doc: NetworkDocument): void {
    this.mark = null;
    this.undoStack.length = 0;
    this.redoStack.length = 0;
    this.set(doc);
  }

  begin(label = 'edit'): void {
    if (this.mark) this.commit();
    this.mark = this.current;
    this.markLabel = label;
  }

  commit(): void {
    const before = this.mark;
    this.mark = null;
    if (before && before !== this.current) this.push({ before, after: this.current, label: this.markLabel });
  }

  rollback(): void {
    const before = this.mark;
    this.mark = null;
    if (before && before !== this.current) this.set(before);
  }

  undo(): boolean {
    if (this.mark) this.commit();
    const entry = this.undoStack.pop();
    if (!entry) return false;
    this.redoStack.push(entry);
    this.set(entry.before);
    return true;
  }

  redo(): boolean {
    const entry = this.redoStack.pop();
    if (!entry) return false;
    this.undoStack.push(entry);
    this.set(entry.after);
    return true;
  }

  /** Apply a pure update; outside a gesture it is one undo step. */
  update(label: string, fn: (doc: NetworkDocument) => NetworkDocument): void {
    const next = fn(this.current);
    if (next === this.current) return;
    if (this.mark) {
      this.set(next);
    } else {
      // Record the step first so listeners already see it as undoable.
      this.push({ before: this.current, after: next, label });
      this.set(next);
    }
  }

  node(id: string): NetworkNode | undefined {
    return this.current.nodes.find((n) => n.id === id);
  }

  link(id: string): NetworkLink | undefined {
    return this.current.links.find((l) => l.id === id);
  }

  addNode(node: NetworkNode): void {
    this.update('add ' + node.kind, (d) => ({ ...d, nodes: [...d.nodes, node] }));
  }

  addLink(link: NetworkLink): void {
    this.update('add ' + link.kind, (d) => ({ ...d, links: [...d.links, withDrawnLength(link, d)] }));
  }

  /** Add several nodes and links at once (paste, import of a fragment). */
  addMany(nodes: NetworkNode[], links: NetworkLink[]): void {
    this.update('paste', (d) => ({ ...d, nodes: [...d.nodes, ...nodes], links: [...d.links, ...links] }));
  }

  /** Merge a patch into a node or link; `undefined` values remove the field. */
  patchElement(id: string, patch: Record<string, unknown>): void {
    this.update('edit ' + id, (d) => {
      const ni = d.nodes.findIndex((n) => n.id === id);
      if (ni >= 0) {
        const nodes = d.nodes.slice();
        nodes[ni] = applyPatch(nodes[ni], patch);
        // Moving a node changes the drawn lengths of attached pipes.
        return 'x_m' in patch || 'y_m' in patch ? refreshLengths({ ...d, nodes }, new Set([id])) : { ...d, nodes };
      }
      const li = d.links.findIndex((l) => l.id === id);
      if (li < 0) return d;
      const links = d.links.slice();
      const patched = applyPatch(links[li], patch);
      links[li] = 'vertices' in patch || 'length_source' in patch ? withDrawnLength(patched, d) : patched;
      return { ...d, links };
    });
  }

  /** Patch editor-only layout data (backdrop, survey points, view). */
  patchLayout(patch: Partial<DocumentLayout>): void {
    this.update('layout', (d) => ({ ...d, layout: { ...(d.layout ?? {}), ...patch } }));
  }

  /**
   * Move nodes by (dx, dy) metres from the positions they had in `from` (the document at the
   * start of the drag), so repeated calls during one drag never accumulate rounding. Vertices
   * of links whose both ends move go along; drawn pipe lengths are re-measured.
   */
  moveNodes(ids: Iterable<string>, dx: number, dy: number, from: NetworkDocument = this.current, snap?: (p: Point) => Point): void {
    const moving = new Set(ids);
    this.update('move', (d) => {
      const origin = new Map(from.nodes.map((n) => [n.id, n]));
      const nodes = d.nodes.map((n) => {
        if (!moving.has(n.id)) return n;
        const o = origin.get(n.id) ?? n;
        let p = { x: (o.x_m ?? 0) + dx, y: (o.y_m ?? 0) + dy };
        if (snap) p = snap(p);
        return p.x === n.x_m && p.y === n.y_m ? n : { ...n, x_m: p.x, y_m: p.y };
      });
      const originLinks = new Map(from.links.map((l) => [l.id, l]));
      const links = d.links.map((l) => {
        if (!(moving.has(l.from) && moving.has(l.to)) || !l.vertices?.length) return l;
        const o = originLinks.get(l.id) ?? l;
        return { ...l, vertices: (o.vertices ?? []).map(([x, y]) => [x + dx, y + dy] as [number, number]) };
      });
      return refreshLengths({ ...d, nodes, links }, moving);
    });
  }

  /** Remove elements; links attached to a removed node go with it. Returns the removed ids. */
  remove(ids: Iterable<string>): string[] {
    const gone = new Set(ids);
    const removed: string[] = [];
    this.update('delete', (d) => {
      const nodes = d.nodes.filter((n) => {
        if (gone.has(n.id)) {
          removed.push(n.id);
          return false;
        }
        return true;
      });
      const links = d.links.filter((l) => {
        if (gone.has(l.id) || gone.has(l.from) || gone.has(l.to)) {
          removed.push(l.id);
          return false;
        }
        return true;
      });
      return removed.length ? { ...d, nodes, links } : d;
    });
    return removed;
  }

  private push(entry: HistoryEntry): void {
    this.undoStack.push(entry);
    if (this.undoStack.length > DocumentStore.HISTORY_LIMIT) this.undoStack.shift();
    this.redoStack.length = 0;
  }

  private set(doc: NetworkDocument): void {
    this.current = doc;
    this.revision++;
    for (const fn of this.listeners) fn(doc);
  }
}

function applyPatch<T extends object>(target: T, patch: Record<string, unknown>): T {
  const next = { ...target } as Record<string, unknown>;
  for (const [k, v] of Object.entries(patch)) {
    if (v === undefined) delete next[k];
    else next[k] = v;
  }
  return next as T;
}

/** World points of a link: from node, bend points, to node. */
export function linkPoints(link: NetworkLink, nodesById: Map<string, NetworkNode> | NetworkDocument): Point[] {
  const map = nodesById instanceof Map ? nodesById : new Map(nodesById.nodes.map((n) => [n.id, n]));
  const a = map.get(link.from);
  const b = map.get(link.to);
  const pts: Point[] = [];
  if (a) pts.push({ x: a.x_m ?? 0, y: a.y_m ?? 0 });
  for (const [x, y] of link.vertices ?? []) pts.push({ x, y });
  if (b) pts.push({ x: b.x_m ?? 0, y: b.y_m ?? 0 });
  return pts;
}

/** How a pipe's length was decided; absent means measured from the drawing. */
export function lengthSource(link: NetworkLink): LengthSource {
  return (link.kind === 'pipe' && link.length_source) || 'drawing';
}

/** A pipe whose length follows the drawing gets its measured length (at least 0.1 m). */
export function withDrawnLength(link: NetworkLink, nodes: NetworkDocument | Map<string, NetworkNode>): NetworkLink {
  if (link.kind !== 'pipe' || lengthSource(link) !== 'drawing') return link;
  const measured = Math.max(0.1, Math.round(polylineLength(linkPoints(link, nodes)) * 100) / 100);
  return measured === link.length_m ? link : { ...link, length_m: measured };
}

function refreshLengths(doc: NetworkDocument, moved: Set<string>): NetworkDocument {
  const byId = new Map(doc.nodes.map((n) => [n.id, n]));
  let changed = false;
  const links = doc.links.map((l) => {
    if (!moved.has(l.from) && !moved.has(l.to)) return l;
    const next = withDrawnLength(l, byId);
    if (next !== l) changed = true;
    return next;
  });
  return changed ? { ...doc, links } : doc;
}

/**
 * Documents from elsewhere (the server, an import) carry pipe lengths that may not follow the
 * drawing (a surveyed or paced length). A pipe without a length flag whose length differs from
 * its drawn length by more than 1 % (and 0.5 m) is marked typed, so moving its ends never
 * silently changes it.
 */
export function markTypedLengths(doc: NetworkDocument): NetworkDocument {
  const byId = new Map(doc.nodes.map((n) => [n.id, n]));
  let changed = false;
  const links = doc.links.map((l) => {
    if (l.kind !== 'pipe' || l.length_source !== undefined) return l;
    const drawn = polylineLength(linkPoints(l, byId));
    if (Math.abs(drawn - l.length_m) <= Math.max(0.5, 0.01 * l.length_m)) return l;
    changed = true;
    return { ...l, length_source: 'typed' as const };
  });
  return changed ? { ...doc, links } : doc;
}
