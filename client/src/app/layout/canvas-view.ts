import Konva from 'konva';
import type { NetworkLink, NetworkNode, TankNode } from '../../../../engine/network-document';
import type { SteadyResult } from '../../../../engine/index';
import { formatQuantity, fromDisplay, toDisplay, unitLabel, UnitSystem } from '../../../../engine/units';
import { marginColour } from './editor/colour-scale';
import { linkPoints } from './editor/document-store';
import type { Backdrop, Editor, EditorChange } from './editor/editor';
import { niceStep, polylineMidpoint } from './editor/geometry';
import type { SurveyPoint } from './editor/survey';
import { LINK_KINDS, NODE_KINDS, ShapeSpec } from './kinds';

const FONT = 'IBM Plex Sans, sans-serif';
const SELECT = '#1769c2';
const LABEL = '#24323d';
const WARN = '#b3261e';

/** What the results overlay needs besides the document. */
export interface OverlayInput {
  results: SteadyResult | null;
  units: UnitSystem;
  warnings: Map<string, string[]>;
  show: boolean;
}

interface NodeView { rec: NetworkNode; group: Konva.Group; symbol: Konva.Group; halo: Konva.Rect; label: Konva.Text; overlay: Konva.Group }
interface LinkView { rec: NetworkLink; from: NetworkNode | undefined; to: NetworkNode | undefined; group: Konva.Group; line: Konva.Line; halo: Konva.Line; mid: Konva.Group; overlay: Konva.Group }

/** Build Konva shapes from a kind's plain symbol description; nothing listens (hit tests are ours). */
export function drawShapes(specs: ShapeSpec[]): Konva.Shape[] {
  return specs.map((s) => {
    const common = { listening: false, perfectDrawEnabled: false, fill: s.fill, stroke: s.stroke, strokeWidth: s.sw ?? 0 };
    if (s.t === 'circle') return new Konva.Circle({ ...common, x: s.x ?? 0, y: s.y ?? 0, radius: s.r });
    if (s.t === 'rect') return new Konva.Rect({ ...common, x: s.x, y: s.y, width: s.w, height: s.h, cornerRadius: s.corner ?? 0 });
    return new Konva.Line({ ...common, points: s.points, closed: s.closed ?? false, lineCap: 'round', lineJoin: 'round' });
  });
}

/**
 * The Konva view of the editor: derived from the document on every change, never the truth.
 * Layers: backdrop, grid, links (with tank-bank headers), nodes, results overlay, a drag layer
 * that holds whatever is being dragged (so the rest stays still), and a UI layer for marquee,
 * rubber band, ghost and survey marks. Unchanged records keep their shapes (identity check).
 */
export class CanvasView {
  readonly stage: Konva.Stage;
  /** Backdrop image and grid. */
  private readonly baseLayer = new Konva.Layer({ listening: false });
  /** Links (under) and nodes (over), as two groups of one layer. */
  private readonly contentLayer = new Konva.Layer({ listening: false });
  private readonly linkLayer = new Konva.Group({ listening: false });
  private readonly nodeLayer = new Konva.Group({ listening: false });
  private readonly overlayLayer = new Konva.Layer({ listening: false });
  private readonly dragLayer = new Konva.Layer({ listening: false });
  private readonly uiLayer = new Konva.Layer({ listening: false });
  private readonly nodes = new Map<string, NodeView>();
  private readonly links = new Map<string, LinkView>();
  private readonly headers = new Konva.Group({ listening: false });
  private readonly backdropGroup = new Konva.Group({ listening: false });
  private headerKey = '';
  private detail = true;
  private labelledNodes: NetworkNode[] | null = null;
  private labelledSelection: ReadonlySet<string> | null = null;
  /** What each element's overlay shows now, to skip unchanged ones. */
  private readonly overlayKeys = new Map<string, string>();
  private backdropImage: Konva.Image | null = null;
  private backdropUrl = '';
  private shownBackdrop: Backdrop | null = null;
  private viewVersion = 0;
  private renderedView = -1;
  private selectionShown = new Set<string>();
  private overlay: OverlayInput = { results: null, units: 'us', warnings: new Map(), show: true };
  private overlayDirty = true;
  private lifted = new Set<string>();
  private survey: SurveyPoint[] = [];
  private readonly unsubscribe: () => void;
  private frame = 0;

  constructor(container: HTMLDivElement, private readonly editor: Editor, private readonly backdropSrc: (fileId: string) => string) {
    this.stage = new Konva.Stage({ container, width: container.clientWidth || 800, height: container.clientHeight || 600, listening: false });
    for (const l of [this.baseLayer, this.contentLayer, this.overlayLayer, this.dragLayer, this.uiLayer]) this.stage.add(l);
    this.contentLayer.add(this.linkLayer, this.nodeLayer);
    this.linkLayer.add(this.headers);
    this.baseLayer.add(this.backdropGroup);
    this.baseLayer.add(new Konva.Shape({ listening: false, perfectDrawEnabled: false, sceneFunc: (ctx) => this.drawGrid(ctx) }));
    editor.resize(this.stage.width(), this.stage.height());
    this.unsubscribe = editor.subscribe((what) => this.changed(what));
  }

  dispose(): void {
    this.unsubscribe();
    cancelAnimationFrame(this.frame);
    this.stage.destroy();
  }

  resize(width: number, height: number): void {
    this.stage.size({ width, height });
    this.editor.resize(width, height);
  }

  setOverlay(o: OverlayInput): void {
    this.overlay = o;
    this.overlayDirty = true;
    this.schedule();
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
    const vp = ed.viewport;
    const selection = ed.selection;
    const dragging = new Set(ed.dragging);
    // Level of detail: when elements are packed tighter than about 56 px apart, names and
    // numbers are hidden (rings, arrows and badges stay) until the designer zooms in.
    const visible = vp.visibleWorld();
    const inView = doc.nodes.filter((n) => (n.x_m ?? 0) >= visible.x && (n.x_m ?? 0) <= visible.x + visible.width && (n.y_m ?? 0) >= visible.y && (n.y_m ?? 0) <= visible.y + visible.height).length;
    const detail = inView * 56 * 56 < vp.width * vp.height;
    const detailChanged = detail !== this.detail;
    if (detailChanged) {
      this.detail = detail;
      this.overlayDirty = true;
    }

    // Nodes
    const seen = new Set<string>();
    const byId = new Map<string, NetworkNode>();
    for (const n of doc.nodes) {
      seen.add(n.id);
      byId.set(n.id, n);
      let v = this.nodes.get(n.id);
      const selected = selection.has(n.id);
      if (!v) {
        v = this.createNode(n);
        this.nodes.set(n.id, v);
      } else if (v.rec !== n) {
        if (symbolChanged(v.rec, n)) this.rebuildSymbol(v, n);
        v.label.text(n.name || n.id);
        v.rec = n;
      } else if (!viewChanged && !detailChanged && this.selectionShown.has(n.id) === selected && !dragging.has(n.id) && !this.lifted.has(n.id)) continue;
      const s = vp.toScreen({ x: n.x_m ?? 0, y: n.y_m ?? 0 });
      v.group.position(s);
      v.overlay.position(s);
      v.halo.visible(selected);
      this.place(v.group, v.overlay, n.id, dragging.has(n.id), this.nodeLayer, dirty);
    }
    if ((viewChanged || detailChanged || doc.nodes !== this.labelledNodes || selection !== this.labelledSelection) && dragging.size === 0) {
      this.declutterNames(doc.nodes, detail, selection);
      dirty.add(this.contentLayer);
    }
    for (const [id, v] of this.nodes) if (!seen.has(id)) { v.group.destroy(); v.overlay.destroy(); this.nodes.delete(id); this.overlayKeys.delete(id); dirty.add(this.contentLayer); }

    // Links
    const seenLinks = new Set<string>();
    for (const l of doc.links) {
      seenLinks.add(l.id);
      const a = byId.get(l.from);
      const b = byId.get(l.to);
      const selected = selection.has(l.id);
      let v = this.links.get(l.id);
      const moving = dragging.has(l.from) || dragging.has(l.to);
      if (!v) {
        v = this.createLink(l);
        this.links.set(l.id, v);
      } else if (v.rec === l && v.from === a && v.to === b && !viewChanged && this.selectionShown.has(l.id) === selected && !moving && !this.lifted.has(l.id)) continue;
      if (v.rec !== l && v.rec.kind === l.kind) {
        v.mid.destroyChildren();
        v.mid.add(...drawShapes(LINK_KINDS[l.kind].midSymbol(l)));
      }
      v.rec = l;
      v.from = a;
      v.to = b;
      const pts = linkPoints(l, byId).map((p) => vp.toScreen(p));
      const flat = pts.flatMap((p) => [p.x, p.y]);
      v.line.points(flat);
      v.halo.points(flat);
      v.halo.visible(selected);
      const mid = polylineMidpoint(pts);
      v.mid.position(mid.point);
      v.mid.rotation((mid.angle * 180) / Math.PI);
      v.overlay.position(mid.point);
      this.place(v.group, v.overlay, l.id, moving, this.linkLayer, dirty);
    }
    for (const [id, v] of this.links) if (!seenLinks.has(id)) { v.group.destroy(); v.overlay.destroy(); this.links.delete(id); this.overlayKeys.delete(id); dirty.add(this.contentLayer); }

    this.selectionShown = new Set(selection);
    this.drawHeaders(doc.nodes, viewChanged, dirty);
    if (this.overlayDirty && this.drawOverlay(doc.nodes, doc.links)) dirty.add(this.overlayLayer);
    this.overlayDirty = false;
    if (viewChanged) {
      dirty.add(this.baseLayer);
      dirty.add(this.overlayLayer);
    }
    this.drawBackdrop(ed.backdrop(), viewChanged, dirty);
    this.drawUi(byId);
    dirty.add(this.uiLayer);
    this.renderedView = this.viewVersion;
    for (const layer of dirty) layer.batchDraw();
  }

  /**
   * Name labels, placed greedily (tanks and sources first, then outlets, then tees): a name is
   * hidden when an already shown name sits within 34 px, unless its element is selected.
   */
  private declutterNames(nodes: NetworkNode[], detail: boolean, selection: ReadonlySet<string>): void {
    this.labelledNodes = nodes;
    this.labelledSelection = selection;
    const rank: Record<string, number> = { tank: 0, source: 0, outlet: 1, tee: 2 };
    const order = [...nodes].sort((a, b) => Number(selection.has(b.id)) - Number(selection.has(a.id)) || rank[a.kind] - rank[b.kind]);
    const cell = 34;
    const shown = new Map<string, { x: number; y: number }[]>();
    for (const n of order) {
      const v = this.nodes.get(n.id);
      if (!v) continue;
      const p = this.editor.viewport.toScreen({ x: n.x_m ?? 0, y: n.y_m ?? 0 });
      const cx = Math.floor(p.x / cell);
      const cy = Math.floor(p.y / cell);
      let free = true;
      for (let i = -1; i <= 1 && free; i++) {
        for (let j = -1; j <= 1 && free; j++) {
          for (const q of shown.get(`${cx + i},${cy + j}`) ?? []) if (Math.hypot(q.x - p.x, q.y - p.y) < cell) free = false;
        }
      }
      const visible = selection.has(n.id) || (detail && free);
      v.label.visible(visible);
      if (visible) shown.set(`${cx},${cy}`, [...(shown.get(`${cx},${cy}`) ?? []), p]);
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
    const halo = new Konva.Rect({ x: -19, y: -19, width: 38, height: 38, cornerRadius: 8, stroke: SELECT, strokeWidth: 2.5, dash: [5, 3], visible: false, listening: false, perfectDrawEnabled: false });
    const symbol = new Konva.Group({ listening: false });
    const label = new Konva.Text({ text: n.name || n.id, x: -60, y: 19, width: 120, align: 'center', fontFamily: FONT, fontSize: 11, fill: LABEL, listening: false, perfectDrawEnabled: false });
    group.add(halo, symbol, label);
    const overlay = new Konva.Group({ listening: false });
    this.overlayLayer.add(overlay);
    this.nodeLayer.add(group);
    const v: NodeView = { rec: n, group, symbol, halo, label, overlay };
    this.rebuildSymbol(v, n);
    return v;
  }

  private rebuildSymbol(v: NodeView, n: NetworkNode): void {
    v.symbol.clearCache();
    v.symbol.destroyChildren();
    v.symbol.add(...drawShapes(NODE_KINDS[n.kind].symbol(n)));
    v.symbol.cache({ x: -20, y: -20, width: 40, height: 40, pixelRatio: window.devicePixelRatio || 1 });
  }

  private createLink(l: NetworkLink): LinkView {
    const def = LINK_KINDS[l.kind];
    const group = new Konva.Group({ listening: false });
    const halo = new Konva.Line({ stroke: SELECT, strokeWidth: 9, opacity: 0.35, lineCap: 'round', lineJoin: 'round', visible: false, listening: false, perfectDrawEnabled: false });
    const line = new Konva.Line({ stroke: def.stroke.colour, strokeWidth: def.stroke.widthPx, dash: def.stroke.dash, lineCap: 'round', lineJoin: 'round', listening: false, perfectDrawEnabled: false });
    const mid = new Konva.Group({ listening: false });
    mid.add(...drawShapes(def.midSymbol(l)));
    group.add(halo, line, mid);
    const overlay = new Konva.Group({ listening: false });
    this.overlayLayer.add(overlay);
    this.linkLayer.add(group);
    return { rec: l, from: undefined, to: undefined, group, line, halo, mid, overlay };
  }

  /** Tank banks: a header pipe along the tanks' bases joins tanks sharing a bank id. */
  private drawHeaders(nodes: NetworkNode[], viewChanged: boolean, dirty: Set<Konva.Layer>): void {
    const banks = new Map<string, TankNode[]>();
    for (const n of nodes) if (n.kind === 'tank' && n.bank) banks.set(n.bank, [...(banks.get(n.bank) ?? []), n]);
    const key = [...banks].map(([b, ts]) => b + ':' + ts.map((t) => `${t.x_m},${t.y_m}`).join(';')).join('|');
    if (key === this.headerKey && !viewChanged) return;
    this.headerKey = key;
    this.headers.destroyChildren();
    for (const [bank, tanks] of banks) {
      if (tanks.length < 2) continue;
      const pts = tanks.map((t) => this.editor.viewport.toScreen({ x: t.x_m ?? 0, y: t.y_m ?? 0 })).sort((p, q) => p.x - q.x || p.y - q.y);
      const flat = pts.flatMap((p) => [p.x, p.y + 16]);
      this.headers.add(new Konva.Line({ points: flat, stroke: LABEL, strokeWidth: 7, lineCap: 'round', lineJoin: 'round', listening: false, perfectDrawEnabled: false }));
      this.headers.add(new Konva.Line({ points: flat, stroke: '#cfe6f3', strokeWidth: 3.5, lineCap: 'round', lineJoin: 'round', listening: false, perfectDrawEnabled: false }));
      for (const p of pts) this.headers.add(new Konva.Line({ points: [p.x, p.y + 13, p.x, p.y + 16], stroke: LABEL, strokeWidth: 3, listening: false }));
      const first = pts[0];
      this.headers.add(new Konva.Text({ text: 'bank ' + bank, x: first.x - 70, y: first.y + 11, width: 50, align: 'right', fontFamily: FONT, fontSize: 10, fill: LABEL, listening: false }));
    }
    dirty.add(this.contentLayer);
  }

  /** Refresh result labels, arrows and badges; returns whether any element's overlay changed. */
  private drawOverlay(nodes: NetworkNode[], links: NetworkLink[]): boolean {
    const { results, units, warnings, show } = this.overlay;
    let changed = false;
    for (const n of nodes) {
      const v = this.nodes.get(n.id);
      if (!v) continue;
      const r = results?.nodes[n.id];
      const w = warnings.get(n.id);
      const hasPressure = show && r && (n.kind === 'outlet' || n.kind === 'tee');
      const min = n.kind === 'outlet' ? (n.min_pressure_m ?? 0) : 0;
      const text = hasPressure ? formatQuantity('pressure', r.pressure_m, units) : '';
      const colour = hasPressure ? marginColour(r.pressure_m - min) : '';
      // Rebuild only what changed: most solves move few labels.
      const key = `${text}|${colour}|${show && !!w?.length}|${this.detail}`;
      if (this.overlayKeys.get(n.id) === key) continue;
      this.overlayKeys.set(n.id, key);
      changed ||= !this.lifted.has(n.id);
      v.overlay.destroyChildren();
      if (hasPressure) {
        v.overlay.add(new Konva.Circle({ radius: 17, stroke: colour, strokeWidth: 5, listening: false, perfectDrawEnabled: false }));
        if (this.detail) v.overlay.add(new Konva.Label({ x: 19, y: -22, listening: false }).add(
          new Konva.Tag({ fill: '#ffffff', stroke: colour, strokeWidth: 1.5, cornerRadius: 3, listening: false }),
          new Konva.Text({ text, padding: 3, fontFamily: FONT, fontSize: 11, fontStyle: 'bold', fill: LABEL, listening: false }),
        ));
      }
      if (show && w?.length) v.overlay.add(...badge(-15, -17));
    }
    for (const l of links) {
      const v = this.links.get(l.id);
      if (!v) continue;
      const r = results?.links[l.id];
      const w = warnings.get(l.id);
      const flows = show && r && Math.abs(r.flow_m3s) > 1e-9;
      const angle = flows ? v.mid.rotation() + (r.flow_m3s < 0 ? 180 : 0) : 0;
      const speed = flows && l.kind === 'pipe' ? formatQuantity('velocity', Math.abs(r.velocity_ms), units) : '';
      const key = `${flows}|${angle.toFixed(1)}|${speed}|${show && !!w?.length}|${this.detail}`;
      if (this.overlayKeys.get(l.id) === key) continue;
      this.overlayKeys.set(l.id, key);
      changed ||= !this.lifted.has(l.id);
      v.overlay.destroyChildren();
      if (flows) {
        const offset = l.kind === 'pipe' ? 0 : 18;
        const rad = (angle * Math.PI) / 180;
        const arrow = new Konva.Line({
          points: [-6, -5, 4, 0, -6, 5], closed: true, fill: SELECT, listening: false, perfectDrawEnabled: false,
          x: Math.cos(rad) * offset, y: Math.sin(rad) * offset, rotation: angle,
        });
        v.overlay.add(arrow);
        if (speed && this.detail) {
          // Beside the line, on the side below or right of it, so the text never sits on the stroke.
          const normal = v.mid.rotation() * (Math.PI / 180) + Math.PI / 2;
          const side = Math.sin(normal) >= 0 ? 1 : -1;
          const nx = Math.cos(normal) * 12 * side;
          const ny = Math.sin(normal) * 12 * side;
          v.overlay.add(new Konva.Text({ text: speed, x: nx + (nx < 0 ? -46 : 2), y: ny - 5, width: 44, align: nx < 0 ? 'right' : 'left', fontFamily: FONT, fontSize: 10, fill: SELECT, listening: false }));
        }
      }
      if (show && w?.length) v.overlay.add(...badge(10, -20));
    }
    return changed;
  }

  private drawBackdrop(b: Backdrop | null, viewChanged: boolean, dirty: Set<Konva.Layer>): void {
    if (!b) {
      if (this.backdropImage) {
        this.backdropImage.destroy();
        this.backdropImage = null;
        this.backdropUrl = '';
        dirty.add(this.baseLayer);
      }
      return;
    }
    const url = this.backdropSrc(b.fileId);
    if (url !== this.backdropUrl) {
      this.backdropUrl = url;
      this.backdropImage?.destroy();
      const img = new Image();
      const node = new Konva.Image({ image: undefined, listening: false });
      this.backdropImage = node;
      this.backdropGroup.add(node);
      img.onload = () => {
        node.image(img);
        this.viewVersion++;
        this.schedule();
      };
      img.src = url;
    }
    const node = this.backdropImage;
    if (!node) return;
    const p = this.editor.viewport.toScreen({ x: b.x_m, y: b.y_m });
    const k = b.m_per_px * this.editor.viewport.scale;
    node.position(p);
    node.size({ width: b.width_px * k, height: b.height_px * k });
    node.opacity(b.opacity);
    if (viewChanged || b !== this.shownBackdrop) dirty.add(this.baseLayer);
    this.shownBackdrop = b;
  }

  private drawGrid(ctx: Konva.Context): void {
    const vp = this.editor.viewport;
    let step = this.editor.grid.step_m;
    while (step * vp.scale < 14) step *= step * vp.scale < 3 ? 10 : 5;
    const major = step * 5;
    const w = vp.visibleWorld();
    const draw = (s: number, colour: string) => {
      ctx.beginPath();
      for (let x = Math.ceil(w.x / s) * s; x <= w.x + w.width; x += s) {
        const sx = Math.round(vp.toScreen({ x, y: 0 }).x) + 0.5;
        ctx.moveTo(sx, 0);
        ctx.lineTo(sx, vp.height);
      }
      for (let y = Math.ceil(w.y / s) * s; y <= w.y + w.height; y += s) {
        const sy = Math.round(vp.toScreen({ x: 0, y }).y) + 0.5;
        ctx.moveTo(0, sy);
        ctx.lineTo(vp.width, sy);
      }
      ctx.strokeStyle = colour;
      ctx.lineWidth = 1;
      ctx.stroke();
    };
    draw(step, '#eef1f4');
    draw(major, '#dde3e8');
  }

  private drawUi(byId: Map<string, NetworkNode>): void {
    this.uiLayer.destroyChildren();
    const ed = this.editor;
    const vp = ed.viewport;
    const pv = ed.preview;
    for (const s of this.survey) {
      const p = vp.toScreen({ x: s.x_m, y: s.y_m });
      if (p.x < -20 || p.y < -20 || p.x > vp.width + 20 || p.y > vp.height + 20) continue;
      this.uiLayer.add(new Konva.Line({ points: [p.x - 4, p.y - 4, p.x + 4, p.y + 4, p.x, p.y, p.x + 4, p.y - 4, p.x - 4, p.y + 4], stroke: '#6a4c93', strokeWidth: 1.5, listening: false }));
      if (vp.scale > 2) this.uiLayer.add(new Konva.Text({ x: p.x + 5, y: p.y - 12, text: formatQuantity('elevation', s.elevation_m, this.overlay.units), fontSize: 9, fontFamily: FONT, fill: '#6a4c93', listening: false }));
    }
    if (ed.hover && !ed.isSelected(ed.hover)) {
      const n = byId.get(ed.hover);
      if (n) {
        const p = vp.toScreen({ x: n.x_m ?? 0, y: n.y_m ?? 0 });
        this.uiLayer.add(new Konva.Circle({ x: p.x, y: p.y, radius: 20, stroke: SELECT, strokeWidth: 1, opacity: 0.6, listening: false }));
      }
    }
    if (ed.selection.size === 1 && !ed.readOnly) {
      const link = ed.store.link([...ed.selection][0]);
      for (const [x, y] of link?.vertices ?? []) {
        const p = vp.toScreen({ x, y });
        this.uiLayer.add(new Konva.Rect({ x: p.x - 4, y: p.y - 4, width: 8, height: 8, fill: '#ffffff', stroke: SELECT, strokeWidth: 1.5, listening: false }));
      }
    }
    if (pv.marquee) {
      const a = vp.toScreen({ x: pv.marquee.x, y: pv.marquee.y + pv.marquee.height });
      this.uiLayer.add(new Konva.Rect({ x: a.x, y: a.y, width: pv.marquee.width * vp.scale, height: pv.marquee.height * vp.scale, fill: 'rgba(23,105,194,0.08)', stroke: SELECT, strokeWidth: 1, dash: [4, 3], listening: false }));
    }
    if (pv.rubberBand) {
      const pts = pv.rubberBand.map((p) => vp.toScreen(p));
      this.uiLayer.add(new Konva.Line({ points: pts.flatMap((p) => [p.x, p.y]), stroke: SELECT, strokeWidth: 2, dash: [6, 4], listening: false }));
      for (const p of pts.slice(1, -1)) this.uiLayer.add(new Konva.Rect({ x: p.x - 3, y: p.y - 3, width: 6, height: 6, fill: SELECT, listening: false }));
    }
    if (pv.ghost) {
      const p = vp.toScreen(pv.ghost.at);
      const def = NODE_KINDS[pv.ghost.kind];
      const g = new Konva.Group({ x: p.x, y: p.y, opacity: 0.5, listening: false });
      g.add(...drawShapes(def.symbol(def.create('ghost', 0, 0))));
      this.uiLayer.add(g);
    }
    if (pv.calibration) {
      const [a, b] = pv.calibration.map((p) => vp.toScreen(p));
      this.uiLayer.add(new Konva.Line({ points: [a.x, a.y, b.x, b.y], stroke: '#c2410c', strokeWidth: 2, dash: [6, 4], listening: false }));
      for (const p of [a, b]) this.uiLayer.add(new Konva.Circle({ x: p.x, y: p.y, radius: 5, stroke: '#c2410c', strokeWidth: 2, listening: false }));
    }
  }
}

function badge(x: number, y: number): Konva.Shape[] {
  return [
    new Konva.Circle({ x, y, radius: 7, fill: WARN, stroke: '#ffffff', strokeWidth: 1.5, listening: false }),
    new Konva.Text({ x: x - 7, y: y - 6, width: 14, align: 'center', text: '!', fontFamily: FONT, fontStyle: 'bold', fontSize: 11, fill: '#ffffff', listening: false }),
  ];
}

/** Whether a record change alters its symbol (kind-dependent fields), not just its position. */
function symbolChanged(a: NetworkNode, b: NetworkNode): boolean {
  if (a.kind !== b.kind) return true;
  if (a.kind === 'outlet' && b.kind === 'outlet') return a.outlet_type !== b.outlet_type;
  if (a.kind === 'tank' && b.kind === 'tank') return a.level_m !== b.level_m || a.max_level_m !== b.max_level_m;
  return false;
}

/** Length of the scale bar (about 140 px at most) and its label, in the project's units. */
export function scaleBar(metresPerPx: number, units: UnitSystem): { px: number; text: string } {
  const nice = niceStep(toDisplay('length', metresPerPx * 140, units));
  return { px: fromDisplay('length', nice, units) / metresPerPx, text: `${nice} ${unitLabel('length', units)}` };
}
