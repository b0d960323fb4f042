import Konva from 'konva';
import type { NetworkLink, NetworkNode } from '../../../../../../engine/network-document';
import { fromDisplay, toDisplay, unitLabel, UnitSystem } from '../../../../../../engine/units';
import { linkPoints } from '../editor/document-store';
import type { Editor, EditorChange } from '../editor/editor';
import { niceStep, Point, polylineMidpoint } from '../editor/geometry';
import type { Box, Placement } from '../editor/label-placement';
import type { SurveyPoint } from '../editor/survey';
import { LINK_KINDS, NODE_KINDS } from '../kinds';
import { BackdropLayer } from './backdrop-layer';
import { BankHeaders } from './bank-headers';
import { CrossingMarks } from './crossing-marks';
import { drawShapes, FONT, LABEL, SELECT } from './draw';
import { drawGrid } from './grid';
import { LabelLayout } from './label-layout';
import { MarkerLayer, PlanMarker, PlanMarkers } from './markers';
import { ResultOverlay } from './result-overlay';
import { UiLayer } from './ui-layer';
import type { LinkView, NodeView, OverlayInput, SceneViews } from './views';

export type { OverlayInput } from './views';

/**
 * The Konva view of the editor: derived from the document on every change, never the truth.
 * Layers: base (backdrop, grid), content (links with tank-bank headers, then nodes), results
 * overlay, markers from other features, a drag layer that holds whatever is being dragged (so the
 * rest stays still), and a UI layer for marquee, rubber band, ghost and survey marks. Unchanged
 * records keep their shapes (identity check). The decorating jobs live beside it: result-overlay,
 * label-layout, bank-headers, backdrop-layer, grid, ui-layer, markers.
 */
export class CanvasView {
  readonly stage: Konva.Stage;
  private readonly baseLayer = new Konva.Layer({ listening: false });
  /** Links (under) and nodes (over), as two groups of one layer. */
  private readonly contentLayer = new Konva.Layer({ listening: false });
  private readonly linkLayer = new Konva.Group({ listening: false });
  private readonly nodeLayer = new Konva.Group({ listening: false });
  private readonly overlayLayer = new Konva.Layer({ listening: false });
  private readonly dragLayer = new Konva.Layer({ listening: false });
  private readonly views: SceneViews = { nodes: new Map<string, NodeView>(), links: new Map<string, LinkView>() };
  private readonly headers: BankHeaders;
  private readonly crossings: CrossingMarks;
  private readonly backdrop: BackdropLayer;
  private readonly overlayMarks: ResultOverlay;
  private readonly labels: LabelLayout;
  private readonly ui: UiLayer;
  private readonly markerLayer: MarkerLayer;
  private labelledNodes: NetworkNode[] | null = null;
  private labelledLinks: NetworkLink[] | null = null;
  private labelledSelection: ReadonlySet<string> | null = null;
  private labelsDirty = true;
  private viewVersion = 0;
  private renderedView = -1;
  private selectionShown = new Set<string>();
  private overlay: OverlayInput = { results: null, service: null, units: 'us', warnings: new Map(), show: true };
  private overlayDirty = true;
  private lifted = new Set<string>();
  private survey: SurveyPoint[] = [];
  private readonly unsubscribe: (() => void)[] = [];
  private frame = 0;

  constructor(
    container: HTMLDivElement,
    private readonly editor: Editor,
    backdropSrc: (fileId: string) => string,
    markers = new PlanMarkers(),
  ) {
    this.stage = new Konva.Stage({ container, width: container.clientWidth || 800, height: container.clientHeight || 600, listening: false });
    this.headers = new BankHeaders(editor);
    this.crossings = new CrossingMarks(editor.viewport, this.views);
    this.backdrop = new BackdropLayer(backdropSrc, () => {
      this.viewVersion++;
      this.schedule();
    });
    this.overlayMarks = new ResultOverlay(this.views);
    this.labels = new LabelLayout(this.views, editor.viewport);
    this.markerLayer = new MarkerLayer(markers, editor.viewport);
    this.labels.extraObstacles = () => this.markerLayer.boxes();
    const uiLayer = new Konva.Layer({ listening: false });
    this.ui = new UiLayer(uiLayer, editor, this.views);
    for (const l of [this.baseLayer, this.contentLayer, this.overlayLayer, this.markerLayer.layer, this.dragLayer, uiLayer]) this.stage.add(l);
    this.contentLayer.add(this.linkLayer, this.nodeLayer);
    this.overlayLayer.add(this.labels.bankBadges);
    this.overlayLayer.add(this.crossings.hops);
    this.linkLayer.add(this.headers.group);
    // Crossing marks sit over every line and under every node symbol.
    this.nodeLayer.add(this.crossings.group);
    this.baseLayer.add(this.backdrop.group);
    this.baseLayer.add(
      new Konva.Shape({ listening: false, perfectDrawEnabled: false, sceneFunc: (ctx) => drawGrid(ctx, editor.viewport, editor.grid.step_m) }),
    );
    editor.resize(this.stage.width(), this.stage.height());
    this.unsubscribe.push(editor.subscribe((what) => this.changed(what)));
    this.unsubscribe.push(
      markers.subscribe(() => {
        this.labelsDirty = true;
        this.schedule();
      }),
    );
  }

  dispose(): void {
    for (const off of this.unsubscribe) off();
    cancelAnimationFrame(this.frame);
    this.stage.destroy();
  }

  resize(width: number, height: number): void {
    this.stage.size({ width, height });
    this.editor.resize(width, height);
  }

  setOverlay(o: OverlayInput): void {
    const was = this.overlay;
    if (was.results === o.results && was.service === o.service && was.units === o.units && was.warnings === o.warnings && was.show === o.show) return;
    this.overlay = o;
    this.overlayDirty = true;
    this.schedule();
  }

  /** Screen boxes (canvas px) that labels must avoid, such as the legend and the scale bar. */
  setReservedAreas(fn: () => Box[]): void {
    this.labels.reserved = fn;
    this.labelsDirty = true;
    this.schedule();
  }

  /** Labels placed by the last render, by element id (for tests and the hover card). */
  placedLabels(): ReadonlyMap<string, Placement> {
    return this.labels.placed;
  }

  /** The clickable marker under a canvas point, if any (the screen calls its onClick). */
  markerAt(screen: Point): PlanMarker | null {
    return this.markerLayer.markerAt(screen);
  }

  setSurvey(points: SurveyPoint[]): void {
    this.survey = points;
    this.schedule();
  }

  private changed(what: EditorChange): void {
    if (what === 'view') this.viewVersion++;
    if (what === 'document') this.overlayDirty = true;
    this.schedule();
  }

  /** Coalesce changes into one render per animation frame. */
  private schedule(): void {
    if (this.frame) return;
    this.frame = requestAnimationFrame(() => {
      this.frame = 0;
      this.render();
    });
  }

  /** Draw now (tests and the first paint). */
  render(): void {
    const ed = this.editor;
    const doc = ed.store.doc;
    const viewChanged = this.renderedView !== this.viewVersion;
    const dirty = new Set<Konva.Layer>();
    const byId = this.renderNodes(doc.nodes, viewChanged, dirty);
    this.renderLinks(doc.links, byId, viewChanged, dirty);
    const selection = ed.selection;
    this.selectionShown = new Set(selection);
    const overlayChanged = this.overlayDirty && this.overlayMarks.draw(doc.nodes, doc.links, this.overlay);
    if (overlayChanged) {
      // Line widths say how hard each pipe works: the content layer changes with the results.
      dirty.add(this.contentLayer);
      dirty.add(this.overlayLayer);
      this.labelsDirty = true;
    }
    this.overlayDirty = false;
    this.markerLayer.draw(doc, (id) => ed.symbolScale(id));
    // While a pan drag is in progress labels ride along with their elements (placing them again
    // on every frame of a large plan costs more than a frame); they are placed again when it ends.
    const panOnly = viewChanged && ed.panning && ed.viewport.scale === this.labels.placedAt.scale;
    if (panOnly) this.labels.followPan();
    const geometryChanged =
      (viewChanged && !panOnly) || doc.nodes !== this.labelledNodes || doc.links !== this.labelledLinks || selection !== this.labelledSelection;
    if ((this.labelsDirty || geometryChanged) && ed.dragging.length === 0) {
      if (overlayChanged && !geometryChanged) {
        // New results only: the badges and line widths (badges kept where they were) show this
        // frame; the labels are placed again on the next one, so states never wait for placement.
        this.schedule();
      } else {
        this.scaleSymbols(doc.nodes);
        this.labelledNodes = doc.nodes;
        this.labelledLinks = doc.links;
        this.labelledSelection = selection;
        this.labelsDirty = false;
        this.labels.layout(doc.nodes, doc.links, byId, selection, this.headers.banks(doc.nodes));
        dirty.add(this.contentLayer);
        dirty.add(this.overlayLayer);
      }
    }
    if (this.headers.draw(doc.nodes, viewChanged)) dirty.add(this.contentLayer);
    if (dirty.has(this.contentLayer) || dirty.has(this.dragLayer) || viewChanged) {
      this.crossings.draw(doc, ed.dragging.length > 0);
      dirty.add(this.overlayLayer);
    }
    if (viewChanged) {
      dirty.add(this.baseLayer);
      dirty.add(this.overlayLayer);
    }
    if (this.backdrop.draw(ed.backdrop(), ed.viewport, viewChanged)) dirty.add(this.baseLayer);
    this.ui.draw(byId, this.survey, this.overlay.units, this.labels.placed);
    dirty.add(this.ui.layer);
    dirty.add(this.markerLayer.layer);
    this.renderedView = this.viewVersion;
    // Drawn now, in this animation frame (batchDraw would wait for the next one).
    for (const layer of dirty) layer.draw();
  }

  private renderNodes(nodes: NetworkNode[], viewChanged: boolean, dirty: Set<Konva.Layer>): Map<string, NetworkNode> {
    const ed = this.editor;
    const dragging = new Set(ed.dragging);
    const seen = new Set<string>();
    const byId = new Map<string, NetworkNode>();
    for (const n of nodes) {
      seen.add(n.id);
      byId.set(n.id, n);
      let v = this.views.nodes.get(n.id);
      const selected = ed.selection.has(n.id);
      if (!v) {
        v = this.createNode(n);
        this.views.nodes.set(n.id, v);
      } else if (v.rec !== n) {
        if (v.rec.kind !== n.kind || v.symbolKey !== symbolKeyOf(n)) this.rebuildSymbol(v, n);
        v.label.text(n.name || n.id);
        v.rec = n;
      } else if (!viewChanged && this.selectionShown.has(n.id) === selected && !dragging.has(n.id) && !this.lifted.has(n.id)) continue;
      const s = ed.viewport.toScreen({ x: n.x_m ?? 0, y: n.y_m ?? 0 });
      v.group.position(s);
      v.overlay.position(s);
      v.halo.visible(selected);
      this.place(v.group, v.overlay, n.id, dragging.has(n.id), this.nodeLayer, dirty);
    }
    for (const [id, v] of this.views.nodes) if (!seen.has(id)) this.drop(this.views.nodes, id, v, dirty);
    return byId;
  }

  private renderLinks(links: NetworkLink[], byId: Map<string, NetworkNode>, viewChanged: boolean, dirty: Set<Konva.Layer>): void {
    const ed = this.editor;
    const dragging = new Set(ed.dragging);
    const seen = new Set<string>();
    for (const l of links) {
      seen.add(l.id);
      const a = byId.get(l.from);
      const b = byId.get(l.to);
      const selected = ed.selection.has(l.id);
      let v = this.views.links.get(l.id);
      const moving = dragging.has(l.from) || dragging.has(l.to);
      if (!v) {
        v = this.createLink(l);
        this.views.links.set(l.id, v);
      } else if (v.rec === l && v.from === a && v.to === b && !viewChanged && this.selectionShown.has(l.id) === selected && !moving && !this.lifted.has(l.id))
        continue;
      if (v.rec !== l && v.rec.kind === l.kind) {
        v.mid.destroyChildren();
        v.mid.add(...drawShapes(LINK_KINDS[l.kind].midSymbol(l)));
      }
      v.rec = l;
      v.from = a;
      v.to = b;
      const pts = linkPoints(l, byId).map((p) => ed.viewport.toScreen(p));
      const flat = pts.flatMap((p) => [p.x, p.y]);
      v.line.points(flat);
      v.hatch.points(flat);
      v.halo.points(flat);
      v.halo.visible(selected);
      const mid = polylineMidpoint(pts);
      v.mid.position(mid.point);
      v.mid.rotation((mid.angle * 180) / Math.PI);
      v.overlay.position(mid.point);
      this.place(v.group, v.overlay, l.id, moving, this.linkLayer, dirty);
    }
    for (const [id, v] of this.views.links) if (!seen.has(id)) this.drop(this.views.links, id, v, dirty);
  }

  private drop(map: Map<string, NodeView | LinkView>, id: string, v: NodeView | LinkView, dirty: Set<Konva.Layer>): void {
    v.group.destroy();
    v.overlay.destroy();
    map.delete(id);
    this.overlayMarks.forget(id);
    dirty.add(this.contentLayer);
  }

  /** Draw each node's symbol, halo and state marks at its crowding- and zoom-dependent scale. */
  private scaleSymbols(nodes: NetworkNode[]): void {
    for (const n of nodes) {
      const v = this.views.nodes.get(n.id);
      if (!v) continue;
      const k = this.editor.symbolScale(n.id);
      if (k === v.scale) continue;
      v.scale = k;
      v.symbol.scale({ x: k, y: k });
      // Konva scales a shape about its own position, so the halo's corner moves with k.
      v.halo.scale({ x: k, y: k });
      v.halo.position({ x: -19 * k, y: -19 * k });
      v.marks.scale({ x: k, y: k });
    }
  }

  /** Put an element's shapes on the drag layer while dragged, back on its own layer after. */
  private place(group: Konva.Group, overlay: Konva.Group, id: string, drag: boolean, home: Konva.Group, dirty: Set<Konva.Layer>): void {
    if (drag) {
      if (!this.lifted.has(id)) {
        group.moveTo(this.dragLayer);
        overlay.moveTo(this.dragLayer);
        this.lifted.add(id);
        dirty.add(this.contentLayer);
        dirty.add(this.overlayLayer);
      }
      dirty.add(this.dragLayer);
      return;
    }
    if (this.lifted.has(id)) {
      group.moveTo(home);
      overlay.moveTo(this.overlayLayer);
      this.lifted.delete(id);
      dirty.add(this.dragLayer);
      dirty.add(this.overlayLayer);
    }
    dirty.add(this.contentLayer);
  }

  private createNode(n: NetworkNode): NodeView {
    const group = new Konva.Group({ listening: false });
    const halo = new Konva.Rect({
      x: -19,
      y: -19,
      width: 38,
      height: 38,
      cornerRadius: 8,
      stroke: SELECT,
      strokeWidth: 2.5,
      dash: [5, 3],
      visible: false,
      listening: false,
      perfectDrawEnabled: false,
    });
    const symbol = new Konva.Group({ listening: false });
    const label = new Konva.Text({
      text: n.name || n.id,
      x: -60,
      y: 19,
      width: 120,
      align: 'center',
      wrap: 'none',
      fontFamily: FONT,
      fontSize: 11,
      fill: LABEL,
      listening: false,
      perfectDrawEnabled: false,
    });
    group.add(halo, symbol, label);
    const overlay = new Konva.Group({ listening: false });
    const marks = new Konva.Group({ listening: false });
    overlay.add(marks);
    this.overlayLayer.add(overlay);
    this.nodeLayer.add(group);
    const v: NodeView = { rec: n, group, symbol, halo, label, overlay, marks, tag: null, tagText: '', scale: 1, symbolKey: '', urgent: false };
    this.rebuildSymbol(v, n);
    return v;
  }

  private rebuildSymbol(v: NodeView, n: NetworkNode): void {
    v.symbolKey = symbolKeyOf(n);
    v.symbol.clearCache();
    v.symbol.destroyChildren();
    v.symbol.add(...drawShapes(NODE_KINDS[n.kind].symbol(n)));
    v.symbol.cache({ x: -20, y: -20, width: 40, height: 40, pixelRatio: window.devicePixelRatio || 1 });
  }

  private createLink(l: NetworkLink): LinkView {
    const def = LINK_KINDS[l.kind];
    const group = new Konva.Group({ listening: false });
    const halo = new Konva.Line({
      stroke: SELECT,
      strokeWidth: 9,
      opacity: 0.35,
      lineCap: 'round',
      lineJoin: 'round',
      visible: false,
      listening: false,
      perfectDrawEnabled: false,
    });
    const line = new Konva.Line({
      stroke: def.stroke.colour,
      strokeWidth: def.stroke.widthPx,
      dash: def.stroke.dash,
      lineCap: 'round',
      lineJoin: 'round',
      listening: false,
      perfectDrawEnabled: false,
    });
    const hatch = new Konva.Line({
      stroke: '#ffffff',
      strokeWidth: 2,
      dash: [5, 4],
      lineCap: 'butt',
      lineJoin: 'round',
      visible: false,
      listening: false,
      perfectDrawEnabled: false,
    });
    const mid = new Konva.Group({ listening: false });
    mid.add(...drawShapes(def.midSymbol(l)));
    group.add(halo, line, hatch, mid);
    const overlay = new Konva.Group({ listening: false });
    this.overlayLayer.add(overlay);
    this.linkLayer.add(group);
    return { rec: l, from: undefined, to: undefined, group, line, halo, hatch, mid, overlay, note: null, noteText: '' };
  }
}

/** The fields a node's symbol is drawn from (kinds/*.ts `symbolKey`). */
function symbolKeyOf(n: NetworkNode): string {
  return (NODE_KINDS[n.kind].symbolKey as ((x: NetworkNode) => string) | undefined)?.(n) ?? '';
}

/** Length of the scale bar (about 140 px at most) and its label, in the project's units. */
export function scaleBar(metresPerPx: number, units: UnitSystem): { px: number; text: string } {
  const nice = niceStep(toDisplay('length', metresPerPx * 140, units));
  return { px: fromDisplay('length', nice, units) / metresPerPx, text: `${nice} ${unitLabel('length', units)}` };
}
