import Konva from 'konva';
import type { NetworkLink, NetworkNode, TankNode } from '../../../../../engine/network-document';
import type { SteadyResult } from '../../../../../engine/index';
import { formatQuantity, fromDisplay, toDisplay, unitLabel, UnitSystem } from '../../../../../engine/units';
import { marginColour } from './editor/colour-scale';
import { linkPoints } from './editor/document-store';
import type { Backdrop, Editor, EditorChange } from './editor/editor';
import { distance, niceStep, Point, polylineMidpoint } from './editor/geometry';
import { around, aroundBox, besideLine, Box, LabelRequest, lineBoxes, Placement, placeLabels, POINT_SIDES, Side, symbolBox } from './editor/label-placement';
import type { SurveyPoint } from './editor/survey';
import { LINK_KINDS, NODE_KINDS, ShapeSpec } from './kinds';

const FONT = 'IBM Plex Sans, sans-serif';
const SELECT = '#1769c2';
const LABEL = '#24323d';
const WARN = '#b3261e';
/** Half the designed symbol size, px. */
const SYMBOL_HALF = 12;
/** Pressure ring radius at full symbol size, px (5 px stroke). */
const RING_R = 17;
const NAME_FONT = 11;
const NAME_H = 13;
const TAG_FONT = 11;
const TAG_PAD = 3;
const SPEED_FONT = 10;
/** Tank banks narrower than this on screen get a bank badge in place of their tanks' names. */
const CROWDED_BANK_PX = 56;

/** What the results overlay needs besides the document. */
export interface OverlayInput {
  results: SteadyResult | null;
  units: UnitSystem;
  warnings: Map<string, string[]>;
  show: boolean;
}

interface NodeView {
  rec: NetworkNode; group: Konva.Group; symbol: Konva.Group; halo: Konva.Rect; label: Konva.Text; overlay: Konva.Group;
  /** Pressure ring and badge (scaled with the symbol) and the pressure tag (placed with the name). */
  marks: Konva.Group; tag: Konva.Label | null; tagText: string; scale: number;
}
interface LinkView {
  rec: NetworkLink; from: NetworkNode | undefined; to: NetworkNode | undefined; group: Konva.Group; line: Konva.Line; halo: Konva.Line; mid: Konva.Group; overlay: Konva.Group;
  speed: Konva.Text | null; speedText: string; arrowAt: Point | null;
}

/** Width of a text in px, measured once per font and string. */
const measured = new Map<string, number>();
let measureCtx: CanvasRenderingContext2D | null = null;
function textWidth(text: string, size: number, bold = false): number {
  const key = `${size}|${bold}|${text}`;
  let w = measured.get(key);
  if (w === undefined) {
    measureCtx ??= document.createElement('canvas').getContext('2d');
    if (measureCtx) {
      measureCtx.font = `${bold ? 'bold ' : ''}${size}px ${FONT}`;
      w = Math.ceil(measureCtx.measureText(text).width);
    } else {
      w = Math.ceil(text.length * size * 0.58);
    }
    if (measured.size > 5000) measured.clear();
    measured.set(key, w);
  }
  return w;
}

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
  private labelledNodes: NetworkNode[] | null = null;
  private labelledLinks: NetworkLink[] | null = null;
  private labelledSelection: ReadonlySet<string> | null = null;
  private labelsDirty = true;
  /** Viewport scale and origin at the last label placement. */
  private placedAt = { scale: 0, x: 0, y: 0 };
  /** Placed labels by element id (and `bank:<id>` for bank badges), from the last placement. */
  private placed = new Map<string, Placement>();
  private readonly bankBadges = new Konva.Group({ listening: false });
  /** Screen boxes the canvas must keep clear of labels (legend, scale bar), from the screen. */
  private reserved: () => Box[] = () => [];
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
    this.overlayLayer.add(this.bankBadges);
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
    const was = this.overlay;
    if (was.results === o.results && was.units === o.units && was.warnings === o.warnings && was.show === o.show) return;
    this.overlay = o;
    this.overlayDirty = true;
    this.schedule();
  }

  /** Screen boxes (canvas px) that labels must avoid, such as the legend and the scale bar. */
  setReservedAreas(fn: () => Box[]): void {
    this.reserved = fn;
    this.labelsDirty = true;
    this.schedule();
  }

  /** Labels placed by the last render, by element id (for tests and the hover card). */
  placedLabels(): ReadonlyMap<string, Placement> {
    return this.placed;
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
      } else if (!viewChanged && this.selectionShown.has(n.id) === selected && !dragging.has(n.id) && !this.lifted.has(n.id)) continue;
      const s = vp.toScreen({ x: n.x_m ?? 0, y: n.y_m ?? 0 });
      v.group.position(s);
      v.overlay.position(s);
      v.halo.visible(selected);
      this.place(v.group, v.overlay, n.id, dragging.has(n.id), this.nodeLayer, dirty);
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
    const overlayChanged = this.overlayDirty && this.drawOverlay(doc.nodes, doc.links);
    if (overlayChanged) {
      dirty.add(this.overlayLayer);
      this.labelsDirty = true;
    }
    this.overlayDirty = false;
    // While a pan drag is in progress labels ride along with their elements (placing them again
    // on every frame of a large plan costs more than a frame); they are placed again when it ends.
    const panOnly = viewChanged && ed.panning && vp.scale === this.placedAt.scale;
    if (panOnly) this.bankBadges.position({ x: vp.originX - this.placedAt.x, y: vp.originY - this.placedAt.y });
    const geometryChanged = (viewChanged && !panOnly) || doc.nodes !== this.labelledNodes || doc.links !== this.labelledLinks || selection !== this.labelledSelection;
    if ((this.labelsDirty || geometryChanged) && dragging.size === 0) {
      if (overlayChanged && !geometryChanged) {
        // New results only: the rings, arrows and tags (kept where they were) show this frame;
        // the labels are placed again on the next one, so colours never wait for placement.
        this.schedule();
      } else {
        this.scaleSymbols(doc.nodes);
        this.layoutLabels(doc.nodes, doc.links, byId, selection);
        dirty.add(this.contentLayer);
        dirty.add(this.overlayLayer);
      }
    }
    this.drawHeaders(doc.nodes, viewChanged, dirty);
    if (viewChanged) {
      dirty.add(this.baseLayer);
      dirty.add(this.overlayLayer);
    }
    this.drawBackdrop(ed.backdrop(), viewChanged, dirty);
    this.drawUi(byId);
    dirty.add(this.uiLayer);
    this.renderedView = this.viewVersion;
    // Drawn now, in this animation frame (batchDraw would wait for the next one).
    for (const layer of dirty) layer.draw();
  }

  /** Draw each node's symbol, halo and pressure ring at its crowding- and zoom-dependent scale. */
  private scaleSymbols(nodes: NetworkNode[]): void {
    for (const n of nodes) {
      const v = this.nodes.get(n.id);
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

  /**
   * Place names, pressure tags, bank badges and velocities (`label-placement.ts`): selected
   * elements first, then outlets, tanks and sources, tees, and pipe velocities last. Each label
   * keeps clear of every symbol, ring, mid-line symbol and arrow, of the legend and scale bar,
   * and of labels already placed; one that fits nowhere is hidden (hover shows it).
   */
  private layoutLabels(nodes: NetworkNode[], links: NetworkLink[], byId: Map<string, NetworkNode>, selection: ReadonlySet<string>): void {
    this.labelledNodes = nodes;
    this.labelledLinks = links;
    this.labelledSelection = selection;
    this.labelsDirty = false;
    const vp = this.editor.viewport;
    this.placedAt = { scale: vp.scale, x: vp.originX, y: vp.originY };
    this.bankBadges.position({ x: 0, y: 0 });
    const margin = 60;
    const onScreen = (p: Point) => p.x > -margin && p.y > -margin && p.x < vp.width + margin && p.y < vp.height + margin;
    const obstacles: Box[] = [...this.reserved()];
    const requests: LabelRequest[] = [];
    const rank: Record<string, number> = { outlet: 1, tank: 2, source: 2, tee: 3 };
    const screenOf = new Map<string, Point>();
    const banks = this.crowdedBanks(nodes);
    const inCrowdedBank = new Set([...banks.values()].filter((b) => b.crowded).flatMap((b) => b.tanks.map((t) => t.id)));

    for (const n of nodes) {
      const v = this.nodes.get(n.id);
      if (!v) continue;
      const p = vp.toScreen({ x: n.x_m ?? 0, y: n.y_m ?? 0 });
      screenOf.set(n.id, p);
      if (!onScreen(p)) continue;
      const ringed = v.tag !== null;
      const r = (ringed ? RING_R + 2.5 : SYMBOL_HALF + 1) * v.scale;
      obstacles.push(symbolBox(p, r));
      const name = n.name || n.id;
      const nameW = textWidth(name, NAME_FONT);
      const variants: { w: number; h: number }[] = [];
      const tagW = v.tag ? textWidth(v.tagText, TAG_FONT, true) + 2 * TAG_PAD : 0;
      const tagH = TAG_FONT + 2 * TAG_PAD;
      const showName = !inCrowdedBank.has(n.id) || selection.has(n.id);
      if (v.tag && showName) variants.push({ w: Math.max(tagW, nameW), h: tagH + NAME_H });
      if (v.tag) variants.push({ w: tagW, h: tagH });
      else if (showName) variants.push({ w: nameW, h: NAME_H });
      if (!variants.length) continue;
      const sides: readonly Side[] = v.tag ? POINT_SIDES : ['below', 'right', 'left', 'above', 'below-right', 'below-left', 'above-right', 'above-left'];
      requests.push({ id: n.id, priority: selection.has(n.id) ? 0 : rank[n.kind] ?? 3, candidates: around(p, r, variants, sides) });
    }
    for (const [bank, b] of banks) {
      const w = textWidth(b.text, 10) + 8;
      obstacles.push(b.header);
      // A crowded bank's badge stands in for its tanks' names; otherwise it comes after the tees.
      requests.push({ id: 'bank:' + bank, priority: b.crowded ? 1.5 : 3.5, candidates: aroundBox(b.tankBox, { w, h: 15 }, ['below', 'left', 'right', 'above', 'below-left', 'below-right', 'above-left', 'above-right']) });
    }
    const lines: Box[] = [];
    for (const l of links) {
      const v = this.links.get(l.id);
      if (!v) continue;
      const mid = v.mid.position();
      if (!onScreen(mid)) continue;
      const pts = linkPoints(l, byId).map((q) => vp.toScreen(q));
      lines.push(...lineBoxes(pts));
      // Mid-line symbols and arrows only where the line is long enough on screen to hold them.
      const roomy = polylineScreenLength(pts) >= MIN_MARKED_LINK_PX;
      v.mid.visible(roomy);
      const arrow = v.overlay.findOne('.arrow');
      arrow?.visible(roomy);
      if (!roomy) {
        v.speed?.visible(false);
        continue;
      }
      if (v.mid.hasChildren()) obstacles.push(symbolBox(mid, 11));
      if (v.arrowAt) obstacles.push(symbolBox({ x: mid.x + v.arrowAt.x, y: mid.y + v.arrowAt.y }, 6));
      if (!v.speed) continue;
      const seg = segmentAtMiddle(pts);
      if (!seg) continue;
      const size = { w: textWidth(v.speedText, SPEED_FONT) + 2, h: 12 };
      requests.push({ id: l.id, priority: selection.has(l.id) ? 0 : 4, candidates: besideLine(seg[0], seg[1], size) });
    }
    this.placed = placeLabels(requests, obstacles, { x: 2, y: 2, w: vp.width - 4, h: vp.height - 4 }, 2, lines);
    this.applyPlacements(nodes, links, screenOf, banks);
  }

  /** Move each label to its placed box (relative to its element) or hide it. */
  private applyPlacements(nodes: NetworkNode[], links: NetworkLink[], screenOf: Map<string, Point>, banks: Map<string, BankView>): void {
    for (const n of nodes) {
      const v = this.nodes.get(n.id);
      const p = screenOf.get(n.id);
      if (!v || !p) continue;
      const at = this.placed.get(n.id);
      const withName = !!at && (at.variant === 0 && (!v.tag || at.box.h > TAG_FONT + 2 * TAG_PAD + 1));
      v.label.visible(withName);
      v.tag?.visible(!!at && !!v.tag);
      if (!at) continue;
      const { box, side } = at;
      const align = side.endsWith('left') ? 'right' : side.endsWith('right') ? 'left' : 'center';
      let y = box.y - p.y;
      if (v.tag) {
        const tagW = textWidth(v.tagText, TAG_FONT, true) + 2 * TAG_PAD;
        const x = align === 'left' ? box.x : align === 'right' ? box.x + box.w - tagW : box.x + (box.w - tagW) / 2;
        v.tag.position({ x: x - p.x, y });
        y += TAG_FONT + 2 * TAG_PAD;
      }
      if (withName) {
        v.label.position({ x: box.x - p.x, y: y + 1 });
        v.label.width(box.w);
        v.label.align(align);
      }
    }
    for (const l of links) {
      const v = this.links.get(l.id);
      if (!v?.speed) continue;
      const at = this.placed.get(l.id);
      v.speed.visible(!!at);
      if (!at) continue;
      const mid = v.mid.position();
      v.speed.position({ x: at.box.x - mid.x + 1, y: at.box.y - mid.y + 1 });
    }
    this.bankBadges.destroyChildren();
    for (const [bank, b] of banks) {
      const at = this.placed.get('bank:' + bank);
      if (!at) continue;
      this.bankBadges.add(new Konva.Label({ x: at.box.x, y: at.box.y, listening: false }).add(
        new Konva.Tag({ fill: '#eef4f8', stroke: LABEL, strokeWidth: 1, cornerRadius: 7, listening: false }),
        new Konva.Text({ text: b.text, padding: 2.5, fontFamily: FONT, fontSize: 10, fill: LABEL, listening: false, width: at.box.w, align: 'center' }),
      ));
    }
  }

  /** Tank banks, the screen box of their header and whether they are too narrow for the tanks' names. */
  private crowdedBanks(nodes: NetworkNode[]): Map<string, BankView> {
    const out = new Map<string, BankView>();
    for (const bank of groupBanks(nodes)) {
      const geo = this.bankGeometry(bank.tanks);
      const top = Math.min(...geo.pts.map((p) => p.y)) - 15 * geo.k;
      const tankBox = { x: geo.x0, y: top, w: geo.x1 - geo.x0, h: geo.box.y + geo.box.h - top };
      out.set(bank.id, { tanks: bank.tanks, header: geo.box, tankBox, crowded: geo.span < CROWDED_BANK_PX, text: `${bank.id} bank · ${bank.tanks.length} tanks` });
    }
    return out;
  }

  /** Where a bank's header runs on screen: under the tank bases, at least across both end symbols. */
  private bankGeometry(tanks: TankNode[]): { pts: Point[]; k: number; y: number; x0: number; x1: number; span: number; box: Box } {
    const vp = this.editor.viewport;
    const pts = tanks.map((t) => vp.toScreen({ x: t.x_m ?? 0, y: t.y_m ?? 0 })).sort((p, q) => p.x - q.x || p.y - q.y);
    const k = Math.min(...tanks.map((t) => this.editor.symbolScale(t.id)));
    const y = Math.max(...pts.map((p) => p.y)) + 14 * k + 3;
    const x0 = pts[0].x - SYMBOL_HALF * k;
    const x1 = pts[pts.length - 1].x + SYMBOL_HALF * k;
    const span = Math.max(...pts.map((p) => p.x)) - Math.min(...pts.map((p) => p.x));
    return { pts, k, y, x0, x1, span, box: { x: x0 - 3, y: y - 4, w: x1 - x0 + 6, h: 8 } };
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
    const label = new Konva.Text({ text: n.name || n.id, x: -60, y: 19, width: 120, align: 'center', wrap: 'none', fontFamily: FONT, fontSize: NAME_FONT, fill: LABEL, listening: false, perfectDrawEnabled: false });
    group.add(halo, symbol, label);
    const overlay = new Konva.Group({ listening: false });
    const marks = new Konva.Group({ listening: false });
    overlay.add(marks);
    this.overlayLayer.add(overlay);
    this.nodeLayer.add(group);
    const v: NodeView = { rec: n, group, symbol, halo, label, overlay, marks, tag: null, tagText: '', scale: 1 };
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
    return { rec: l, from: undefined, to: undefined, group, line, halo, mid, overlay, speed: null, speedText: '', arrowAt: null };
  }

  /**
   * Tank banks: a header pipe along the tanks' bases joins tanks sharing a bank id, drawn at
   * least across the end tanks' symbols so it shows even when the tanks nearly touch on screen
   * (a crowded bank also gets a "bank" badge from the label placement).
   */
  private drawHeaders(nodes: NetworkNode[], viewChanged: boolean, dirty: Set<Konva.Layer>): void {
    const banks = groupBanks(nodes);
    const key = banks.map((b) => b.id + ':' + b.tanks.map((t) => `${t.x_m},${t.y_m},${this.editor.symbolScale(t.id)}`).join(';')).join('|');
    if (key === this.headerKey && !viewChanged) return;
    this.headerKey = key;
    this.headers.destroyChildren();
    for (const bank of banks) {
      const g = this.bankGeometry(bank.tanks);
      const flat = [g.x0, g.y, ...g.pts.flatMap((p) => [p.x, g.y]), g.x1, g.y];
      this.headers.add(new Konva.Line({ points: flat, stroke: LABEL, strokeWidth: 7, lineCap: 'round', lineJoin: 'round', listening: false, perfectDrawEnabled: false }));
      this.headers.add(new Konva.Line({ points: flat, stroke: '#cfe6f3', strokeWidth: 3.5, lineCap: 'round', lineJoin: 'round', listening: false, perfectDrawEnabled: false }));
      for (const p of g.pts) this.headers.add(new Konva.Line({ points: [p.x, g.y - 4, p.x, g.y], stroke: LABEL, strokeWidth: 3, listening: false }));
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
      const warned = show && !!w?.length;
      const key = `${text}|${colour}|${warned}`;
      const before = this.overlayKeys.get(n.id);
      if (before === key) continue;
      this.overlayKeys.set(n.id, key);
      changed = true;
      // Same marks, new numbers (most solves): recolour the ring and retext the tag in place.
      if (hasPressure && v.tag && before?.endsWith(`|${warned}`) && before.split('|')[0]) {
        (v.marks.findOne('.ring') as Konva.Circle | undefined)?.stroke(colour);
        v.tag.getTag().stroke(colour);
        v.tag.getText().text(text);
        v.tagText = text;
        continue;
      }
      v.marks.destroyChildren();
      // A new tag takes the old one's place until the labels are placed again (next frame).
      const was = v.tag ? { x: v.tag.x(), y: v.tag.y(), visible: v.tag.visible() } : { x: 19, y: -22, visible: false };
      v.tag?.destroy();
      v.tag = null;
      v.tagText = text;
      if (hasPressure) {
        v.marks.add(new Konva.Circle({ name: 'ring', radius: RING_R, stroke: colour, strokeWidth: 5, listening: false, perfectDrawEnabled: false }));
        v.tag = new Konva.Label({ ...was, listening: false }).add(
          new Konva.Tag({ fill: '#ffffff', stroke: colour, strokeWidth: 1.5, cornerRadius: 3, listening: false }),
          new Konva.Text({ text, padding: TAG_PAD, fontFamily: FONT, fontSize: TAG_FONT, fontStyle: 'bold', fill: LABEL, listening: false }),
        );
        v.overlay.add(v.tag);
      }
      if (show && w?.length) v.marks.add(...badge(-15, -17));
    }
    for (const l of links) {
      const v = this.links.get(l.id);
      if (!v) continue;
      const r = results?.links[l.id];
      const w = warnings.get(l.id);
      const flows = show && r && Math.abs(r.flow_m3s) > 1e-9;
      const angle = flows ? v.mid.rotation() + (r.flow_m3s < 0 ? 180 : 0) : 0;
      const speed = flows && l.kind === 'pipe' ? formatQuantity('velocity', Math.abs(r.velocity_ms), units) : '';
      const key = `${flows}|${angle.toFixed(1)}|${speed}|${show && !!w?.length}`;
      const before = this.overlayKeys.get(l.id);
      if (before === key) continue;
      this.overlayKeys.set(l.id, key);
      changed = true;
      // Same arrow, new speed: retext in place.
      const [bf, ba, bs, bw] = before?.split('|') ?? [];
      if (speed && v.speed && bs && bf === String(flows) && ba === angle.toFixed(1) && bw === String(show && !!w?.length)) {
        v.speed.text(speed);
        v.speedText = speed;
        continue;
      }
      const wasSpeed = v.speed ? { x: v.speed.x(), y: v.speed.y(), visible: v.speed.visible() } : { x: 0, y: 0, visible: false };
      v.overlay.destroyChildren();
      v.speed = null;
      v.speedText = speed;
      v.arrowAt = null;
      if (flows) {
        const offset = l.kind === 'pipe' ? 0 : 18;
        const rad = (angle * Math.PI) / 180;
        const arrow = new Konva.Line({
          name: 'arrow', points: [-6, -5, 4, 0, -6, 5], closed: true, fill: SELECT, listening: false, perfectDrawEnabled: false,
          x: Math.cos(rad) * offset, y: Math.sin(rad) * offset, rotation: angle,
        });
        v.overlay.add(arrow);
        v.arrowAt = { x: arrow.x(), y: arrow.y() };
        if (speed) {
          // Placed beside the line by layoutLabels, or hidden when the pipe is short on screen.
          v.speed = new Konva.Text({ text: speed, fontFamily: FONT, fontSize: SPEED_FONT, fill: SELECT, listening: false, ...wasSpeed });
          v.overlay.add(v.speed);
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

  /** A small card with the name and pressure of a hovered node whose labels are not all shown. */
  private hoverCard(n: NetworkNode, p: Point, k: number): void {
    const v = this.nodes.get(n.id);
    if (!v) return;
    const at = this.placed.get(n.id);
    const full = at && at.variant === 0 && v.label.visible();
    if (full || this.editor.dragging.length) return;
    const text = hoverLines(n.name || n.id, v.tagText);
    const r = (v.tag ? RING_R + 3 : SYMBOL_HALF + 2) * k;
    const card = new Konva.Label({ x: p.x + r + 4, y: p.y - r, listening: false });
    card.add(
      new Konva.Tag({ fill: '#ffffff', stroke: '#9aa6b0', strokeWidth: 1, cornerRadius: 4, shadowColor: 'rgba(0,0,0,0.18)', shadowBlur: 6, shadowOffsetY: 2, listening: false }),
      new Konva.Text({ text, padding: 5, lineHeight: 1.3, fontFamily: FONT, fontSize: 11, fill: LABEL, listening: false }),
    );
    const vp = this.editor.viewport;
    if (card.x() + card.width() > vp.width - 4) card.x(p.x - r - 4 - card.width());
    if (card.y() < 4) card.y(4);
    this.uiLayer.add(card);
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
    if (ed.hover) {
      const n = byId.get(ed.hover);
      if (n) {
        const p = vp.toScreen({ x: n.x_m ?? 0, y: n.y_m ?? 0 });
        const k = ed.symbolScale(n.id);
        if (!ed.isSelected(n.id)) this.uiLayer.add(new Konva.Circle({ x: p.x, y: p.y, radius: 20 * k, stroke: SELECT, strokeWidth: 1, opacity: 0.6, listening: false }));
        this.hoverCard(n, p, k);
      }
    }
    if (ed.selection.size === 1 && !ed.readOnly) {
      for (const h of ed.segmentHandles()) {
        this.uiLayer.add(new Konva.Circle({ x: h.screen.x, y: h.screen.y, radius: 4.5, fill: '#ffffff', stroke: SELECT, strokeWidth: 1.2, opacity: 0.9, listening: false }));
        this.uiLayer.add(new Konva.Line({ points: [h.screen.x - 2.5, h.screen.y, h.screen.x + 2.5, h.screen.y, h.screen.x, h.screen.y, h.screen.x, h.screen.y - 2.5, h.screen.x, h.screen.y + 2.5], stroke: SELECT, strokeWidth: 1.2, listening: false }));
      }
      const link = ed.store.link([...ed.selection][0]);
      (link?.vertices ?? []).forEach(([x, y], i) => {
        const p = vp.toScreen({ x, y });
        const chosen = ed.selectedVertex?.link === link?.id && ed.selectedVertex?.index === i;
        this.uiLayer.add(new Konva.Rect({ x: p.x - 4.5, y: p.y - 4.5, width: 9, height: 9, fill: chosen ? SELECT : '#ffffff', stroke: SELECT, strokeWidth: 1.5, listening: false }));
      });
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

/** Text of the hover card for a node whose labels were left off the plan: name, then pressure. */
function hoverLines(name: string, pressure: string): string {
  return pressure ? `${name}\n${pressure}` : name;
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

interface BankView { tanks: TankNode[]; header: Box; tankBox: Box; crowded: boolean; text: string }

/** Links shorter than this on screen show no mid-line symbol, arrow or velocity. */
const MIN_MARKED_LINK_PX = 30;

function polylineScreenLength(pts: Point[]): number {
  let total = 0;
  for (let i = 1; i < pts.length; i++) total += distance(pts[i - 1], pts[i]);
  return total;
}

/** Tanks grouped by bank id (banks of two or more). */
function groupBanks(nodes: NetworkNode[]): { id: string; tanks: TankNode[] }[] {
  const banks = new Map<string, TankNode[]>();
  for (const n of nodes) if (n.kind === 'tank' && n.bank) banks.set(n.bank, [...(banks.get(n.bank) ?? []), n]);
  return [...banks].filter(([, ts]) => ts.length > 1).map(([id, tanks]) => ({ id, tanks }));
}

/** The screen segment holding the middle of a polyline (where the flow arrow sits). */
function segmentAtMiddle(pts: Point[]): [Point, Point] | null {
  let total = 0;
  for (let i = 1; i < pts.length; i++) total += distance(pts[i - 1], pts[i]);
  let walked = 0;
  for (let i = 1; i < pts.length; i++) {
    const len = distance(pts[i - 1], pts[i]);
    if (walked + len >= total / 2 && len > 0) return [pts[i - 1], pts[i]];
    walked += len;
  }
  return null;
}
