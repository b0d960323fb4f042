// Over 400 lines: the one facade tools and the screen talk to; each job it delegates to has its own file.
import type { LinkKind, NetworkDocument, NodeKind } from '../../../../../../engine/network-document';
import type { UnitSystem } from '../../../../../../engine/units';
import { isNodeKind, LINK_KINDS, nextId, NODE_KINDS } from '../kinds';
import type { PointerInput, Preview, Tool, ToolHost, ToolId, ToolRegistry, VertexRef } from '../tools/tool';
import { withBend, withoutBend } from './bends';
import { Backdrop, backdropOf, backdropRect, calibratedDocument } from './calibration';
import { Clipboard } from './clipboard';
import { DocumentStore, linkPoints } from './document-store';
import { elementAnchor, fitRect } from './fitting';
import { Point, projectOnPolyline, Rect, snapPoint } from './geometry';
import { HitTester, SegmentHandle } from './hit-test';
import { handleEditorKey } from './keys';
import { risingMain } from './rising-main';
import { groundElevationAt, groundGuess, surveySnap } from './survey';
import { Insets, Viewport } from './viewport';
import { countOf } from '../../../shared/count';

export type { Backdrop } from './calibration';
export { SHORTCUTS } from './keys';
export type { Preview, VertexRef } from '../tools/tool';

export type EditorChange = 'document' | 'selection' | 'view' | 'preview' | 'tool' | 'hover' | 'message';

/** Stands in until a select tool is registered (an editor built with no tools does nothing). */
const IDLE_TOOL: Tool = { id: 'select', state: 'idle', enter() {}, exit() {}, down() {}, move() {}, up() {}, cancel: () => false };

/**
 * The Layout editor without any browser: the document store, selection, viewport, grid and the
 * active tool, with change notification. The jobs live beside it (hit-test.ts, keys.ts, bends.ts,
 * fitting.ts, clipboard.ts, calibration.ts); tools come from the registry it is given
 * (create-editor.ts) and see it only as a `ToolHost`. The canvas view and the Angular screen feed
 * it pointer and key input and listen for changes; tests drive it the same way.
 */
export class Editor implements ToolHost {
  readonly store: DocumentStore;
  readonly viewport: Viewport;
  private readonly hits: HitTester;
  private readonly clipboard = new Clipboard();
  private selected = new Set<string>();
  private current: Tool = IDLE_TOOL;
  private panOverride: Tool | null = null;
  private listeners = new Set<(what: EditorChange) => void>();
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
  readOnly = false;
  /** The project's unit system: new elements get round defaults in it (kinds/*.ts `*_DEFAULTS`). */
  units: UnitSystem = 'si';
  message = '';
  spaceHeld = false;
  /** Called by the calibrate tool with the two clicked points; the screen asks for the distance. */
  onCalibrationRequest: ((a: Point, b: Point) => void) | null = null;

  constructor(
    private readonly tools: ToolRegistry,
    doc?: NetworkDocument,
    width = 800,
    height = 600,
  ) {
    this.store = new DocumentStore(doc);
    this.viewport = new Viewport(width, height);
    this.hits = new HitTester(() => this.store.doc, this.viewport);
    this.current = tools['select']?.(this) ?? IDLE_TOOL;
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

  // ---- tools and pointer input ----
  /** The chosen tool (not a temporary pan). */
  get tool(): Tool {
    return this.current;
  }

  get activeTool(): Tool {
    return this.panOverride ?? this.current;
  }

  setTool(id: ToolId, option?: NodeKind | LinkKind | string): void {
    if (this.readOnly && id !== 'select' && id !== 'pan') return;
    const make = this.tools[id] ?? this.tools['select'];
    this.current.exit();
    this.current = make?.(this, option) ?? IDLE_TOOL;
    this.current.enter();
    this.emit('tool');
  }

  pointerDown(p: PointerInput): void {
    const pan = this.tools['pan'];
    if (pan && (p.button === 1 || (this.spaceHeld && p.button === 0))) {
      this.panOverride = pan(this);
      this.panOverride.down(p);
      return;
    }
    this.current.down(p);
  }

  pointerMove(p: PointerInput): void {
    this.activeTool.move(p);
  }

  pointerUp(p: PointerInput): void {
    if (this.panOverride) {
      this.panOverride.up(p);
      this.panOverride = null;
      return;
    }
    this.current.up(p);
  }

  /** Keyboard input (key as in KeyboardEvent.key); true when handled (keys.ts). */
  handleKey(key: string, mods: { mod: boolean; shift: boolean }): boolean {
    return handleEditorKey(this, key, mods);
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

  selectAll(): void {
    this.select([...this.store.doc.nodes.map((n) => n.id), ...this.store.doc.links.map((l) => l.id)]);
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

  // ---- hit testing (hit-test.ts) ----
  symbolScale(id: string): number {
    return this.hits.symbolScale(id);
  }

  hitTest(screen: Point): string | null {
    return this.hits.hitTest(screen);
  }

  /** A bend point of the single selected link under a screen point, or null. */
  vertexAt(screen: Point): VertexRef | null {
    return this.hits.vertexAt(this.singleSelectedLink(), screen);
  }

  /** Add-bend handles of the single selected link (none when read-only). */
  segmentHandles(): SegmentHandle[] {
    return this.readOnly ? [] : this.hits.segmentHandles(this.singleSelectedLink());
  }

  segmentHandleAt(screen: Point): { link: string; segment: number } | null {
    return this.readOnly ? null : this.hits.segmentHandleAt(this.singleSelectedLink(), screen);
  }

  elementsInRect(r: Rect): string[] {
    return this.hits.elementsInRect(r);
  }

  private singleSelectedLink() {
    return this.selected.size === 1 ? this.store.link([...this.selected][0]) : undefined;
  }

  // ---- bend points (bends.ts) ----
  /** Insert a bend into a link (see `withBend`); its index, or null. One undo step outside a gesture. */
  insertVertex(linkId: string, at: Point, segment?: number): number | null {
    const link = this.store.link(linkId);
    const next = this.readOnly || !link ? null : withBend(this.store, link, at, segment);
    if (!next) return null;
    this.store.patchElement(linkId, { vertices: next.vertices });
    this.selectedVertex = { link: linkId, index: next.index };
    return next.index;
  }

  /** Remove a bend point (one undo step). */
  removeVertex(ref: VertexRef): boolean {
    const vertices = this.readOnly ? null : withoutBend(this.store.link(ref.link), ref);
    if (!vertices) return false;
    this.selectedVertex = null;
    this.store.patchElement(ref.link, { vertices });
    return true;
  }

  /** Choose a bend point of the selected link (Delete then removes it), or none. */
  selectVertex(ref: VertexRef | null): void {
    this.selectedVertex = ref;
    this.emit('preview');
  }

  /**
   * Double-click with the Select tool: on a bend handle of the selected link it removes that bend;
   * on a line it selects the line and adds a bend there. True when something changed.
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

  // ---- view ----
  /** Snap a point: onto a survey point within 10 px, else to the grid when snapping is on. */
  snap(p: Point): Point {
    const s = surveySnap(this.store.doc, p, this.viewport.metres(1));
    if (s) return { x: s.x_m, y: s.y_m };
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

  /** Fit every node, bend point and the backdrop into view (fitting.ts). */
  fitToView(): void {
    this.viewport.fit(fitRect(this.store.doc, this.backdropRect()), this.fitInsets);
    this.keepFitted = true;
    this.emit('view');
  }

  /** Select an element and, when it lies outside the view, centre the view on it. */
  reveal(id: string): void {
    this.select([id]);
    const c = elementAnchor(this.store.doc, id);
    if (!c) return;
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
    const id = nextId(
      def.prefix,
      doc.nodes.map((n) => n.id),
    );
    const p = this.snap(at);
    const node = def.create(id, p.x, p.y, this.units);
    // The elevation is guessed (survey, nearest element) and marked so, or left unset and asked for.
    const guess = groundGuess(doc, p);
    if (guess.z !== null) {
      const lift = guess.z - node.elevation_m;
      node.elevation_m = guess.z;
      if (node.kind === 'source') node.head_m += lift;
    }
    Object.assign(node, { elevation_source: guess.source, ...(guess.from ? { elevation_from: guess.from } : {}) });
    this.store.addNode(node);
    this.select([id]);
    const name = node.name || id;
    this.flash(
      guess.source === 'unset'
        ? `What is the ground elevation at ${name}? Type it in Elevation: pressures show once every elevation is set.`
        : guess.source === 'survey'
          ? `${name}: elevation from survey point ${guess.from ?? ''} — check it.`
          : `${name}: elevation copied from ${guess.from} — type the real one if the ground differs.`,
    );
    return id;
  }

  /** Best guess of the ground elevation for a new element at a point (survey.ts `groundElevationAt`). */
  groundElevationAt(p: Point): number | null {
    return groundElevationAt(this.store.doc, p);
  }

  /**
   * Add a link between two nodes; returns its id. One undo step. A pump drawn from a source
   * becomes the pump at the source and a rising main: a real pipe (with friction, along the drawn
   * line) from a pump-outlet tee to the end (rising-main.ts).
   */
  addLink(kind: LinkKind, from: string, to: string, vertices: [number, number][] = []): string {
    const def = LINK_KINDS[kind];
    const id = nextId(
      def.prefix,
      this.store.doc.links.map((l) => l.id),
    );
    const link = def.create(id, from, to, vertices, this.units);
    const main = kind === 'pump' ? risingMain(this.store.doc, link, this.units) : null;
    if (main) this.store.update('add pump and rising main', (d) => main.apply(d));
    else this.store.addLink(link);
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

  // ---- clipboard (clipboard.ts) ----
  copy(): void {
    const n = this.clipboard.copy(this.store.doc, this.selected);
    this.flash(`Copied ${countOf(n, 'element')}`);
  }

  /** Paste offset down-right, with new ids; the pasted elements become the selection. */
  paste(): void {
    if (this.readOnly) return;
    const pasted = this.clipboard.paste(this.store.doc, Math.max(this.grid.step_m, this.viewport.metres(24)));
    if (!pasted) return;
    this.store.addMany(pasted.nodes, pasted.links);
    this.select([...pasted.nodes.map((n) => n.id), ...pasted.links.map((l) => l.id)]);
  }

  // ---- backdrop and scale (calibration.ts) ----
  backdrop(): Backdrop | null {
    return backdropOf(this.store.doc);
  }

  backdropRect(): Rect | null {
    return backdropRect(this.backdrop());
  }

  requestCalibration(a: Point, b: Point): void {
    this.onCalibrationRequest?.(a, b);
  }

  /**
   * The two points are `distance_m` apart in reality: rescale the backdrop about point a so they
   * are, and with `network: true` the drawn network too. One undo step; drawn pipe lengths follow.
   */
  applyCalibration(a: Point, b: Point, distance_m: number, options: { network: boolean } = { network: true }): boolean {
    const next = this.readOnly ? null : calibratedDocument(this.store.doc, a, b, distance_m, options.network);
    if (!next) return false;
    this.store.begin('set scale');
    this.store.update('set scale', () => next);
    // Re-measure drawn pipe lengths at the new scale.
    this.store.moveNodes(
      this.store.doc.nodes.map((n) => n.id),
      0,
      0,
    );
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
