import type { LinkKind, NetworkDocument, NetworkLink, NetworkNode, NodeKind } from '../../../../../../engine/network-document';
import type { UnitSystem } from '../../../../../../engine/units';
import { isNodeKind, LINK_KINDS, nextId, NODE_KINDS } from '../kinds';
import { BackdropTool } from '../tools/backdrop-tool';
import { CalibrateTool } from '../tools/calibrate-tool';
import { LinkTool } from '../tools/link-tool';
import { PanTool } from '../tools/pan-tool';
import { PlaceTool } from '../tools/place-tool';
import { SelectTool } from '../tools/select-tool';
import type { PointerInput, Tool, ToolId } from '../tools/tool';
import { DocumentStore, linkPoints } from './document-store';
import { boundsOf, distance, Point, polylineMidpoint, projectOnPolyline, projectOnSegment, Rect, rectContains, snapPoint } from './geometry';
import { nearestDistances, symbolScale } from './symbol-size';
import { nearestSurveyPoint, SurveyPoint } from './survey';
import { Insets, Viewport } from './viewport';

/** Transient drawing aids the canvas shows on its overlay layer (never part of the document). */
export interface Preview {
  marquee?: Rect;
  rubberBand?: Point[];
  ghost?: { kind: NodeKind; at: Point };
  calibration?: [Point, Point];
}

export type EditorChange = 'document' | 'selection' | 'view' | 'preview' | 'tool' | 'hover' | 'message';

/** Link hit tolerance, CSS px either side of the line. */
const LINK_HIT_PX = 6;
/** Bend and add-bend handles answer within this many CSS px. */
const HANDLE_HIT_PX = 7;
/** A segment shorter than this on screen offers no add-bend handle at its middle. */
const MIN_SEGMENT_FOR_HANDLE_PX = 36;

/** A bend point of a link: the link id and the index in its `vertices`. */
export interface VertexRef { link: string; index: number }

/** Keyboard shortcuts, shown by the help dialog and handled by `handleKey`. */
export const SHORTCUTS: { keys: string; action: string }[] = [
  { keys: 'V', action: 'Select tool' },
  { keys: 'H', action: 'Pan tool (or hold Space, or drag with the middle button)' },
  { keys: 'P', action: 'Draw a pipe' },
  { keys: 'U', action: 'Draw a pump' },
  { keys: 'L', action: 'Draw a valve' },
  { keys: 'F', action: 'Fit the network in view' },
  { keys: 'G', action: 'Grid snapping on/off' },
  { keys: 'Delete / Backspace', action: 'Delete the selection (or the chosen bend point)' },
  { keys: 'Double-click a line', action: 'Add a bend point there' },
  { keys: 'Double-click a bend', action: 'Remove that bend point' },
  { keys: 'Ctrl/⌘ C, Ctrl/⌘ V', action: 'Copy, paste (new ids)' },
  { keys: 'Ctrl/⌘ A', action: 'Select everything' },
  { keys: 'Ctrl/⌘ S', action: 'Save now' },
  { keys: 'Ctrl/⌘ Z', action: 'Undo' },
  { keys: 'Shift Ctrl/⌘ Z, Ctrl Y', action: 'Redo' },
  { keys: 'Esc', action: 'Cancel the drawing or gesture; clear the selection' },
  { keys: 'Wheel', action: 'Zoom at the cursor' },
  { keys: '?', action: 'This help' },
];

/**
 * The Layout editor without any browser: the document store, selection, viewport, grid and the
 * active tool. The canvas view and the Angular screen feed it pointer and key input and listen
 * for changes; tests drive it the same way.
 */
export class Editor {
  readonly store: DocumentStore;
  readonly viewport: Viewport;
  private selected = new Set<string>();
  private tool: Tool;
  private panOverride: PanTool | null = null;
  private listeners = new Set<(what: EditorChange) => void>();
  private clipboard: { nodes: NetworkNode[]; links: NetworkLink[] } | null = null;
  private pasteCount = 0;
  preview: Preview = {};
  hover: string | null = null;
  /** Node ids being dragged (the view lifts them to the drag layer). */
  dragging: string[] = [];
  grid = { step_m: 1, snap: true };
  /** Screen room kept free when fitting (labels, legend and scale bar), CSS px. */
  fitInsets: Insets = { top: 40, right: 84, bottom: 88, left: 56 };
  /** The bend point chosen by a click on its handle (Delete removes it), or null. */
  selectedVertex: VertexRef | null = null;
  /** True from a fit until the view or the document changes: a canvas resize then fits again. */
  private keepFitted = false;
  private spacingOf: NetworkNode[] | null = null;
  private spacing = new Map<string, number>();
  readOnly = false;
  /** The project's unit system: new elements get round defaults in it (kinds/*.ts `*_DEFAULTS`). */
  units: UnitSystem = 'si';
  message = '';
  spaceHeld = false;
  /** Called by the calibrate tool with the two clicked points; the screen asks for the distance. */
  onCalibrationRequest: ((a: Point, b: Point) => void) | null = null;

  constructor(doc?: NetworkDocument, width = 800, height = 600) {
    this.store = new DocumentStore(doc);
    this.viewport = new Viewport(width, height);
    this.tool = new SelectTool(this);
    this.store.subscribe(() => {
      this.keepFitted = false;
      this.pruneSelection();
      this.emit('document');
    });
  }

  // ---- change notification ----
  subscribe(fn: (what: EditorChange) => void): () => void {
    this.listeners.add(fn);
    return () => this.listeners.delete(fn);
  }

  private emit(what: EditorChange): void {
    for (const fn of this.listeners) fn(what);
  }

  // ---- tools ----
  get activeTool(): Tool {
    return this.panOverride ?? this.tool;
  }

  setTool(id: ToolId, option?: NodeKind | LinkKind): void {
    if (this.readOnly && id !== 'select' && id !== 'pan') return;
    this.tool.exit();
    this.tool =
      id === 'place' ? new PlaceTool(this, (option as NodeKind) ?? 'tee')
      : id === 'link' ? new LinkTool(this, (option as LinkKind) ?? 'pipe')
      : id === 'pan' ? new PanTool(this)
      : id === 'calibrate' ? new CalibrateTool(this)
      : id === 'backdrop' ? new BackdropTool(this)
      : new SelectTool(this);
    this.tool.enter();
    this.emit('tool');
  }

  pointerDown(p: PointerInput): void {
    if (p.button === 1 || (this.spaceHeld && p.button === 0)) {
      this.panOverride = new PanTool(this);
      this.panOverride.down(p);
      return;
    }
    this.tool.down(p);
  }

  pointerMove(p: PointerInput): void {
    this.activeTool.move(p);
  }

  pointerUp(p: PointerInput): void {
    if (this.panOverride) {
      this.panOverride.up();
      this.panOverride = null;
      return;
    }
    this.tool.up(p);
  }

  /**
   * Keyboard input (key as in KeyboardEvent.key). Returns true when handled so the caller can
   * prevent the browser default.
   */
  handleKey(key: string, mods: { mod: boolean; shift: boolean }): boolean {
    const k = key.length === 1 ? key.toLowerCase() : key;
    if (mods.mod) {
      if (k === 'z' && !mods.shift) return this.undo(), true;
      if ((k === 'z' && mods.shift) || k === 'y') return this.redo(), true;
      if (k === 'c') return this.copy(), true;
      if (k === 'v') return this.paste(), true;
      if (k === 'a') return this.select([...this.store.doc.nodes.map((n) => n.id), ...this.store.doc.links.map((l) => l.id)]), true;
      return false;
    }
    if (this.tool.key?.(key)) return true;
    if (k === 'Escape') {
      if (!this.activeTool.cancel()) this.select([]);
      return true;
    }
    if (k === 'Delete' || k === 'Backspace') return this.deleteSelection(), true;
    if (k === 'v') return this.setTool('select'), true;
    if (k === 'h') return this.setTool('pan'), true;
    if (k === 'p') return this.setTool('link', 'pipe'), true;
    if (k === 'u') return this.setTool('link', 'pump'), true;
    if (k === 'l') return this.setTool('link', 'valve'), true;
    if (k === 'f') return this.fitToView(), true;
    if (k === 'g') return this.toggleSnap(), true;
    return false;
  }

  // ---- selection ----
  get selection(): ReadonlySet<string> {
    return this.selected;
  }

  isSelected(id: string): boolean {
    return this.selected.has(id);
  }

  select(ids: Iterable<string>): void {
    const next = new Set(ids);
    if (next.size === this.selected.size && [...next].every((id) => this.selected.has(id))) return;
    this.selected = next;
    this.selectedVertex = null;
    this.emit('selection');
  }

  toggleSelected(id: string): void {
    const next = new Set(this.selected);
    if (next.has(id)) next.delete(id);
    else next.add(id);
    this.selected = next;
    this.selectedVertex = null;
    this.emit('selection');
  }

  selectedNodeIds(): string[] {
    return this.store.doc.nodes.filter((n) => this.selected.has(n.id)).map((n) => n.id);
  }

  private pruneSelection(): void {
    const doc = this.store.doc;
    const v = this.selectedVertex;
    if (v && (this.store.link(v.link)?.vertices?.length ?? 0) <= v.index) this.selectedVertex = null;
    const alive = new Set([...doc.nodes.map((n) => n.id), ...doc.links.map((l) => l.id)]);
    const kept = [...this.selected].filter((id) => alive.has(id));
    if (kept.length !== this.selected.size) {
      this.selected = new Set(kept);
      this.emit('selection');
    }
  }

  // ---- hit testing (pure maths on the document; Konva shapes do not listen) ----
  /**
   * Scale (0.5…1) at which a node's symbol is drawn now: smaller at whole-site zoom and where
   * neighbours crowd it (`symbol-size.ts`). The canvas draws with it and hit testing uses it.
   */
  symbolScale(id: string): number {
    const nodes = this.store.doc.nodes;
    if (this.spacingOf !== nodes) {
      const d = nearestDistances(nodes.map((n) => ({ x: n.x_m ?? 0, y: n.y_m ?? 0 })));
      this.spacing = new Map(nodes.map((n, i) => [n.id, d[i]]));
      this.spacingOf = nodes;
    }
    return symbolScale((this.spacing.get(id) ?? Infinity) * this.viewport.scale, this.viewport.scale);
  }

  /** Topmost element under a screen point: nodes first (the nearest within its drawn symbol), then links. */
  hitTest(screen: Point): string | null {
    const doc = this.store.doc;
    let best: { id: string; d: number } | null = null;
    for (const n of doc.nodes) {
      const s = this.viewport.toScreen({ x: n.x_m ?? 0, y: n.y_m ?? 0 });
      const d = distance(s, screen);
      const r = Math.max(6, NODE_KINDS[n.kind].hitRadiusPx * this.symbolScale(n.id));
      if (d <= r && (!best || d < best.d)) best = { id: n.id, d };
    }
    if (best) return best.id;
    const world = this.viewport.toWorld(screen);
    const tol = this.viewport.metres(LINK_HIT_PX);
    const byId = new Map(doc.nodes.map((n) => [n.id, n]));
    for (const l of doc.links) {
      const d = projectOnPolyline(world, linkPoints(l, byId)).distance;
      if (d <= tol && (!best || d < best.d)) best = { id: l.id, d };
    }
    return best?.id ?? null;
  }

  /** A bend point of the single selected link under a screen point (within 7 px), or null. */
  vertexAt(screen: Point): VertexRef | null {
    const link = this.singleSelectedLink();
    const i = link?.vertices?.findIndex(([x, y]) => distance(this.viewport.toScreen({ x, y }), screen) <= HANDLE_HIT_PX) ?? -1;
    return link && i >= 0 ? { link: link.id, index: i } : null;
  }

  /**
   * Add-bend handles of the single selected link: the screen middle of each segment long enough
   * on screen to take one. `segment` i runs from drawn point i to i + 1 (0 is the start node).
   */
  segmentHandles(): { link: string; segment: number; screen: Point }[] {
    const link = this.singleSelectedLink();
    if (!link || this.readOnly) return [];
    const pts = linkPoints(link, this.store.doc).map((p) => this.viewport.toScreen(p));
    const out: { link: string; segment: number; screen: Point }[] = [];
    for (let i = 1; i < pts.length; i++) {
      if (distance(pts[i - 1], pts[i]) < MIN_SEGMENT_FOR_HANDLE_PX) continue;
      out.push({ link: link.id, segment: i - 1, screen: { x: (pts[i - 1].x + pts[i].x) / 2, y: (pts[i - 1].y + pts[i].y) / 2 } });
    }
    return out;
  }

  /** The add-bend handle under a screen point, or null. */
  segmentHandleAt(screen: Point): { link: string; segment: number } | null {
    const h = this.segmentHandles().find((s) => distance(s.screen, screen) <= HANDLE_HIT_PX);
    return h ? { link: h.link, segment: h.segment } : null;
  }

  private singleSelectedLink(): NetworkLink | undefined {
    return this.selected.size === 1 ? this.store.link([...this.selected][0]) : undefined;
  }

  // ---- bend points ----
  /**
   * Insert a bend point into a link at a world point: into `segment` when given, else into the
   * segment nearest the point. Returns its index in `vertices`, or null. Outside a gesture this
   * is one undo step; pipe lengths follow the drawing.
   */
  insertVertex(linkId: string, at: Point, segment?: number): number | null {
    const link = this.store.link(linkId);
    if (this.readOnly || !link) return null;
    const pts = linkPoints(link, this.store.doc);
    let seg = segment ?? 0;
    if (segment === undefined) {
      let best = Infinity;
      for (let i = 1; i < pts.length; i++) {
        const d = projectOnSegment(at, pts[i - 1], pts[i]).distance;
        if (d < best) {
          best = d;
          seg = i - 1;
        }
      }
    }
    const vertices = [...(link.vertices ?? [])];
    if (seg < 0 || seg > vertices.length) return null;
    vertices.splice(seg, 0, [at.x, at.y]);
    this.store.patchElement(link.id, { vertices });
    this.selectedVertex = { link: link.id, index: seg };
    return seg;
  }

  /** Remove a bend point (one undo step). */
  removeVertex(ref: VertexRef): boolean {
    const link = this.store.link(ref.link);
    if (this.readOnly || !link?.vertices || ref.index < 0 || ref.index >= link.vertices.length) return false;
    const vertices = link.vertices.filter((_, i) => i !== ref.index);
    this.selectedVertex = null;
    this.store.patchElement(link.id, { vertices });
    return true;
  }

  /** Choose a bend point of the selected link (Delete then removes it), or none. */
  selectVertex(ref: VertexRef | null): void {
    this.selectedVertex = ref;
    this.emit('preview');
  }

  /**
   * Double-click with the Select tool: on a bend handle of the selected link it removes that bend;
   * on a link (pipe, pump or valve line) it selects it and adds a bend point on the line there.
   * Returns true when something changed.
   */
  doubleClick(p: PointerInput): boolean {
    if (this.readOnly || this.activeTool.id !== 'select') return false;
    const vertex = this.vertexAt(p.screen);
    if (vertex) return this.removeVertex(vertex);
    const hit = this.hitTest(p.screen);
    const link = hit ? this.store.link(hit) : undefined;
    if (!link) return false;
    this.select([link.id]);
    const on = projectOnPolyline(p.world, linkPoints(link, this.store.doc)).point;
    const index = this.insertVertex(link.id, on);
    this.emit('preview');
    return index !== null;
  }

  /** Nodes inside a world rectangle, and links whose whole line is inside it. */
  elementsInRect(r: Rect): string[] {
    const doc = this.store.doc;
    const byId = new Map(doc.nodes.map((n) => [n.id, n]));
    const ids = doc.nodes.filter((n) => rectContains(r, { x: n.x_m ?? 0, y: n.y_m ?? 0 })).map((n) => n.id);
    for (const l of doc.links) if (linkPoints(l, byId).every((p) => rectContains(r, p))) ids.push(l.id);
    return ids;
  }

  // ---- view ----
  snap(p: Point): Point {
    return this.grid.snap ? snapPoint(p, this.grid.step_m) : p;
  }

  /** A pan drag is in progress (the canvas keeps labels where they are until it ends). */
  get panning(): boolean {
    const t = this.activeTool;
    return t.id === 'pan' && t.state === 'panning';
  }

  toggleSnap(): void {
    this.grid = { ...this.grid, snap: !this.grid.snap };
    this.emit('view');
  }

  panBy(dx: number, dy: number): void {
    this.keepFitted = false;
    this.viewport.panBy(dx, dy);
    this.emit('view');
  }

  zoomAt(screen: Point, factor: number): void {
    this.keepFitted = false;
    this.viewport.zoomAt(screen, factor);
    this.emit('view');
  }

  /**
   * The canvas changed size. A view still as fitted (no pan, zoom or edit since) is fitted again,
   * so a network opened while the page was still laying out ends up centred.
   */
  resize(width: number, height: number): void {
    const changed = width !== this.viewport.width || height !== this.viewport.height;
    this.viewport.resize(width, height);
    if (changed && this.keepFitted) this.fitToView();
    else this.emit('view');
  }

  /** Fit every node, bend point and the backdrop into view. */
  fitToView(): void {
    const doc = this.store.doc;
    const pts: Point[] = doc.nodes.map((n) => ({ x: n.x_m ?? 0, y: n.y_m ?? 0 }));
    for (const l of doc.links) for (const [x, y] of l.vertices ?? []) pts.push({ x, y });
    const b = this.backdropRect();
    if (b) pts.push({ x: b.x, y: b.y }, { x: b.x + b.width, y: b.y + b.height });
    const r = boundsOf(pts) ?? { x: -50, y: -50, width: 100, height: 100 };
    const pad = Math.max(r.width, r.height) < 20 ? 20 : 0;
    this.viewport.fit({ x: r.x - pad / 2, y: r.y - pad / 2, width: r.width + pad, height: r.height + pad }, this.fitInsets);
    this.keepFitted = true;
    this.emit('view');
  }

  /** Select an element and, when it lies outside the view, centre the view on it. */
  reveal(id: string): void {
    this.select([id]);
    const n = this.store.node(id);
    const l = n ? undefined : this.store.link(id);
    const pts = n ? [{ x: n.x_m ?? 0, y: n.y_m ?? 0 }] : l ? linkPoints(l, this.store.doc) : [];
    if (!pts.length) return;
    const c = pts.length === 1 ? pts[0] : polylineMidpoint(pts).point;
    const s = this.viewport.toScreen(c);
    const margin = 40;
    if (s.x < margin || s.y < margin || s.x > this.viewport.width - margin || s.y > this.viewport.height - margin) {
      this.panBy(this.viewport.width / 2 - s.x, this.viewport.height / 2 - s.y);
    }
  }

  setPreview(p: Preview): void {
    this.preview = p;
    this.emit('preview');
  }

  setHover(id: string | null): void {
    if (id === this.hover) return;
    this.hover = id;
    this.emit('hover');
  }

  setDragging(ids: string[]): void {
    this.dragging = ids;
    this.emit('preview');
  }

  flash(message: string): void {
    this.message = message;
    this.emit('message');
  }

  // ---- editing ----
  /** Place a node of `kind` at a world point (snapped); returns its id. One undo step. */
  placeNode(kind: NodeKind, at: Point): string | null {
    if (this.readOnly) return null;
    const def = NODE_KINDS[kind];
    const doc = this.store.doc;
    const id = nextId(def.prefix, doc.nodes.map((n) => n.id));
    const p = this.snap(at);
    const node = def.create(id, p.x, p.y, this.units);
    const z = this.groundElevationAt(p);
    if (z !== null) {
      const lift = z - node.elevation_m;
      node.elevation_m = z;
      if (node.kind === 'source') node.head_m += lift;
    }
    this.store.addNode(node);
    this.select([id]);
    return id;
  }

  /**
   * Best guess of the ground elevation at a point for a new element: the nearest survey point,
   * else the nearest existing node's elevation, else null (the kind's default).
   */
  groundElevationAt(p: Point): number | null {
    const survey = (this.store.doc.layout?.['survey'] as { points?: SurveyPoint[] } | undefined)?.points ?? [];
    const near = nearestSurveyPoint(survey, p);
    if (near) return near.point.elevation_m;
    let best: { z: number; d: number } | null = null;
    for (const n of this.store.doc.nodes) {
      const d = distance(p, { x: n.x_m ?? 0, y: n.y_m ?? 0 });
      if (!best || d < best.d) best = { z: n.elevation_m, d };
    }
    return best ? best.z : null;
  }

  /** Add a link between two nodes; returns its id. One undo step. */
  addLink(kind: LinkKind, from: string, to: string, vertices: [number, number][] = []): string {
    const def = LINK_KINDS[kind];
    const id = nextId(def.prefix, this.store.doc.links.map((l) => l.id));
    this.store.addLink(def.create(id, from, to, vertices, this.units));
    return id;
  }

  deleteSelection(): void {
    if (this.readOnly || this.selected.size === 0) return;
    if (this.selectedVertex && this.selected.has(this.selectedVertex.link)) {
      this.removeVertex(this.selectedVertex);
      return;
    }
    this.store.remove(this.selected);
    this.select([]);
  }

  undo(): void {
    if (this.readOnly) return;
    this.activeTool.cancel();
    this.store.undo();
  }

  redo(): void {
    if (this.readOnly) return;
    this.store.redo();
  }

  /** Copy the selected nodes and the links among them (links need both ends copied). */
  copy(): void {
    const doc = this.store.doc;
    const nodes = doc.nodes.filter((n) => this.selected.has(n.id));
    const ids = new Set(nodes.map((n) => n.id));
    const links = doc.links.filter((l) => ids.has(l.from) && ids.has(l.to));
    this.clipboard = structuredClone({ nodes, links });
    this.pasteCount = 0;
    this.flash(`Copied ${nodes.length + links.length} element(s)`);
  }

  /** Paste the clipboard offset down-right, with new ids; the pasted elements become the selection. */
  paste(): void {
    if (this.readOnly || !this.clipboard) return;
    this.pasteCount++;
    const offset = Math.max(this.grid.step_m, this.viewport.metres(24)) * this.pasteCount;
    const doc = this.store.doc;
    const nodeIds = doc.nodes.map((n) => n.id);
    const linkIds = doc.links.map((l) => l.id);
    const rename = new Map<string, string>();
    const nodes = this.clipboard.nodes.map((n) => {
      const id = nextId(NODE_KINDS[n.kind].prefix, nodeIds);
      nodeIds.push(id);
      rename.set(n.id, id);
      const name = n.name && n.name !== n.id ? n.name + ' copy' : id;
      return { ...structuredClone(n), id, name, x_m: (n.x_m ?? 0) + offset, y_m: (n.y_m ?? 0) - offset } as NetworkNode;
    });
    const links = this.clipboard.links.map((l) => {
      const id = nextId(LINK_KINDS[l.kind].prefix, linkIds);
      linkIds.push(id);
      const name = l.name && l.name !== l.id ? l.name + ' copy' : id;
      return {
        ...structuredClone(l), id, name, from: rename.get(l.from) ?? l.from, to: rename.get(l.to) ?? l.to,
        vertices: (l.vertices ?? []).map(([x, y]) => [x + offset, y - offset] as [number, number]),
      } as NetworkLink;
    });
    this.store.addMany(nodes, links);
    this.select([...nodes.map((n) => n.id), ...links.map((l) => l.id)]);
  }

  // ---- backdrop and scale ----
  backdrop(): Backdrop | null {
    const b = this.store.doc.layout?.['backdrop'];
    return b && typeof b === 'object' ? (b as Backdrop) : null;
  }

  backdropRect(): Rect | null {
    const b = this.backdrop();
    if (!b) return null;
    const w = b.width_px * b.m_per_px;
    const h = b.height_px * b.m_per_px;
    return { x: b.x_m, y: b.y_m - h, width: w, height: h };
  }

  requestCalibration(a: Point, b: Point): void {
    this.onCalibrationRequest?.(a, b);
  }

  /**
   * The two points are `distance_m` apart in reality: rescale the backdrop about point a so they
   * are, and with `network: true` the drawn network too (when it was drawn over the unscaled
   * backdrop). One undo step; drawn pipe lengths follow.
   */
  applyCalibration(a: Point, b: Point, distance_m: number, options: { network: boolean } = { network: true }): boolean {
    const drawn = distance(a, b);
    if (!(drawn > 0) || !(distance_m > 0) || this.readOnly) return false;
    const f = distance_m / drawn;
    const sc = (x: number, y: number): [number, number] => [a.x + (x - a.x) * f, a.y + (y - a.y) * f];
    this.store.begin('set scale');
    this.store.update('set scale', (d) => {
      const nodes = !options.network ? d.nodes : d.nodes.map((n) => {
        const [x, y] = sc(n.x_m ?? 0, n.y_m ?? 0);
        return { ...n, x_m: x, y_m: y };
      });
      const links = !options.network ? d.links : d.links.map((l) => (l.vertices?.length ? { ...l, vertices: l.vertices.map(([x, y]) => sc(x, y)) } : l));
      const layout = { ...(d.layout ?? {}) };
      const bd = layout['backdrop'] as Backdrop | undefined;
      const bb = sc(b.x, b.y);
      if (bd) {
        const [x, y] = sc(bd.x_m, bd.y_m);
        layout['backdrop'] = { ...bd, x_m: x, y_m: y, m_per_px: bd.m_per_px * f, scale: { a: [a.x, a.y], b: bb, distance_m } };
      }
      return { ...d, nodes, links, layout };
    });
    // Re-measure drawn pipe lengths at the new scale.
    const ids = this.store.doc.nodes.map((n) => n.id);
    this.store.moveNodes(ids, 0, 0);
    this.store.commit();
    this.setPreview({});
    this.setTool('select');
    return true;
  }

  cancelCalibration(): void {
    this.setPreview({});
    this.setTool('select');
  }

  /** Kind of an element id, or null. */
  kindOf(id: string): string | null {
    return this.store.node(id)?.kind ?? this.store.link(id)?.kind ?? null;
  }

  isNode(id: string): boolean {
    const k = this.kindOf(id);
    return k !== null && isNodeKind(k);
  }
}

/** The site backdrop image, placed in world metres (stored in doc.layout.backdrop). */
export interface Backdrop {
  fileId: string;
  opacity: number;
  /** World position of the image's top-left corner, m. */
  x_m: number;
  y_m: number;
  m_per_px: number;
  width_px: number;
  height_px: number;
  /** The two points and the distance typed when calibrating. */
  scale?: { a: [number, number]; b: [number, number]; distance_m: number };
}
