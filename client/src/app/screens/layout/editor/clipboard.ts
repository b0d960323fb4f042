import type { NetworkDocument, NetworkLink, NetworkNode } from '../../../../../../engine/network-document';
import { LINK_KINDS, nextId, NODE_KINDS } from '../kinds';

/**
 * Copy and paste: the selected nodes and the links among them (a link needs both ends copied).
 * Each paste lands one step further down-right, with new ids and names marked "copy".
 */
export class Clipboard {
  private held: { nodes: NetworkNode[]; links: NetworkLink[] } | null = null;
  private pasteCount = 0;

  get empty(): boolean {
    return !this.held;
  }

  /** Copies and returns how many elements were taken. */
  copy(doc: NetworkDocument, selection: ReadonlySet<string>): number {
    const nodes = doc.nodes.filter((n) => selection.has(n.id));
    const ids = new Set(nodes.map((n) => n.id));
    const links = doc.links.filter((l) => ids.has(l.from) && ids.has(l.to));
    this.held = structuredClone({ nodes, links });
    this.pasteCount = 0;
    return nodes.length + links.length;
  }

  /** New records for the next paste into `doc`, moved by `step_m` times the paste count. */
  paste(doc: NetworkDocument, step_m: number): { nodes: NetworkNode[]; links: NetworkLink[] } | null {
    if (!this.held) return null;
    this.pasteCount++;
    const offset = step_m * this.pasteCount;
    const nodeIds = doc.nodes.map((n) => n.id);
    const linkIds = doc.links.map((l) => l.id);
    const rename = new Map<string, string>();
    const nodes = this.held.nodes.map((n) => {
      const id = nextId(NODE_KINDS[n.kind].prefix, nodeIds);
      nodeIds.push(id);
      rename.set(n.id, id);
      const name = n.name && n.name !== n.id ? n.name + ' copy' : id;
      return { ...structuredClone(n), id, name, x_m: (n.x_m ?? 0) + offset, y_m: (n.y_m ?? 0) - offset } as NetworkNode;
    });
    const links = this.held.links.map((l) => {
      const id = nextId(LINK_KINDS[l.kind].prefix, linkIds);
      linkIds.push(id);
      const name = l.name && l.name !== l.id ? l.name + ' copy' : id;
      return {
        ...structuredClone(l),
        id,
        name,
        from: rename.get(l.from) ?? l.from,
        to: rename.get(l.to) ?? l.to,
        vertices: (l.vertices ?? []).map(([x, y]) => [x + offset, y - offset] as [number, number]),
      } as NetworkLink;
    });
    return { nodes, links };
  }
}
