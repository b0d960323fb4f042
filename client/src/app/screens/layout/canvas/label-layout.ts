import Konva from 'konva';
import type { NetworkLink, NetworkNode } from '../../../../../../engine/network-document';
import { linkPoints } from '../editor/document-store';
import { distance, Point } from '../editor/geometry';
import { around, aroundBox, besideLine, Box, LabelRequest, lineBoxes, Placement, placeLabels, POINT_SIDES, Side, symbolBox } from '../editor/label-placement';
import type { Viewport } from '../editor/viewport';
import { NODE_KINDS } from '../kinds';
import type { BankView } from './bank-headers';
import { FONT, LABEL, SYMBOL_HALF, textWidth } from './draw';
import { SIZE_FONT, TAG_FONT, TAG_PAD } from './result-overlay';
import type { SceneViews } from './views';

const NAME_FONT = 11;
const NAME_H = 13;
/** Space between a badge and the name beside it, px. */
const INLINE_GAP = 4;
/** Links shorter than this on screen show no mid-line symbol or size. */
const MIN_MARKED_LINK_PX = 30;

/**
 * Places names, state badges, bank badges and pipe sizes (`label-placement.ts`): selected
 * elements first, then by the kind's label rank (outlets, tanks and sources, tees), pipe
 * sizes last. Each label keeps clear of every symbol, state mark and mid-line symbol, of
 * the reserved screen areas (legend, scale bar) and of labels already placed; one that fits
 * nowhere is hidden (hover shows it).
 */
export class LabelLayout {
  /** Placed labels by element id (and `bank:<id>` for bank badges), from the last placement. */
  placed = new Map<string, Placement>();
  /** Viewport scale and origin at the last placement. */
  placedAt = { scale: 0, x: 0, y: 0 };
  readonly bankBadges = new Konva.Group({ listening: false });
  /** Screen boxes the canvas must keep clear of labels (legend, scale bar), from the screen. */
  reserved: () => Box[] = () => [];
  /** Extra obstacles (markers drawn by other features), from the canvas. */
  extraObstacles: () => Box[] = () => [];

  constructor(
    private readonly views: SceneViews,
    private readonly vp: Viewport,
  ) {}

  /** While a pan drag is in progress the labels ride along with their elements. */
  followPan(): void {
    this.bankBadges.position({ x: this.vp.originX - this.placedAt.x, y: this.vp.originY - this.placedAt.y });
  }

  layout(nodes: NetworkNode[], links: NetworkLink[], byId: Map<string, NetworkNode>, selection: ReadonlySet<string>, banks: Map<string, BankView>): void {
    const vp = this.vp;
    this.placedAt = { scale: vp.scale, x: vp.originX, y: vp.originY };
    this.bankBadges.position({ x: 0, y: 0 });
    const margin = 60;
    const onScreen = (p: Point) => p.x > -margin && p.y > -margin && p.x < vp.width + margin && p.y < vp.height + margin;
    const obstacles: Box[] = [...this.reserved(), ...this.extraObstacles()];
    const requests: LabelRequest[] = [];
    const screenOf = new Map<string, Point>();
    const inCrowdedBank = new Set([...banks.values()].filter((b) => b.crowded).flatMap((b) => b.tanks.map((t) => t.id)));

    for (const n of nodes) {
      const v = this.views.nodes.get(n.id);
      if (!v) continue;
      const p = vp.toScreen({ x: n.x_m ?? 0, y: n.y_m ?? 0 });
      screenOf.set(n.id, p);
      if (!onScreen(p)) continue;
      const r = (v.tag !== null ? SYMBOL_HALF + 5 : SYMBOL_HALF + 1) * v.scale;
      obstacles.push(symbolBox(p, r));
      const nameW = textWidth(n.name || n.id, NAME_FONT);
      const variants: { w: number; h: number }[] = [];
      const tagW = v.tag ? textWidth(v.tagText, TAG_FONT, true) + 2 * TAG_PAD : 0;
      const tagH = TAG_FONT + 2 * TAG_PAD;
      // At whole-site zoom a plain junction gives up its name (hover and the results list have it),
      // so every outlet, tank and source keeps both its state and its name on a crowded plan.
      const quietJunction = n.kind === 'tee' && !v.tag && v.scale < 1;
      const showName = (!inCrowdedBank.has(n.id) && !quietJunction) || selection.has(n.id);
      if (v.tag && showName) variants.push({ w: Math.max(tagW, nameW), h: tagH + NAME_H });
      // Then the badge and the name on one line, then the badge alone.
      if (v.tag && showName) variants.push({ w: tagW + INLINE_GAP + nameW, h: tagH });
      if (v.tag) variants.push({ w: tagW, h: tagH });
      else if (showName) variants.push({ w: nameW, h: NAME_H });
      if (!variants.length) continue;
      const sides: readonly Side[] = v.tag ? POINT_SIDES : ['below', 'right', 'left', 'above', 'below-right', 'below-left', 'above-right', 'above-left'];
      requests.push({ id: n.id, priority: selection.has(n.id) ? 0 : v.urgent ? 0.5 : NODE_KINDS[n.kind].labelRank, candidates: around(p, r, variants, sides) });
    }
    for (const [bank, b] of banks) {
      const w = textWidth(b.text, 10) + 8;
      obstacles.push(b.header);
      // A crowded bank's badge stands in for its tanks' names; otherwise it comes after the tees.
      requests.push({
        id: 'bank:' + bank,
        priority: b.crowded ? 1.5 : 3.5,
        candidates: aroundBox(b.tankBox, { w, h: 15 }, ['below', 'left', 'right', 'above', 'below-left', 'below-right', 'above-left', 'above-right']),
      });
    }
    const lines: Box[] = [];
    for (const l of links) {
      const v = this.views.links.get(l.id);
      if (!v) continue;
      const mid = v.mid.position();
      if (!onScreen(mid)) continue;
      const pts = linkPoints(l, byId).map((q) => vp.toScreen(q));
      lines.push(...lineBoxes(pts));
      // Mid-line symbols and sizes only where the line is long enough on screen to hold them.
      const roomy = polylineScreenLength(pts) >= MIN_MARKED_LINK_PX;
      v.mid.visible(roomy);
      if (!roomy) {
        v.note?.visible(false);
        continue;
      }
      if (v.mid.hasChildren()) obstacles.push(symbolBox(mid, 13));
      if (!v.note) continue;
      const seg = segmentAtMiddle(pts);
      if (!seg) continue;
      const size = { w: textWidth(v.noteText, SIZE_FONT) + 2, h: 12 };
      requests.push({ id: l.id, priority: selection.has(l.id) ? 0 : 4, candidates: besideLine(seg[0], seg[1], size) });
    }
    this.placed = placeLabels(requests, obstacles, { x: 2, y: 2, w: vp.width - 4, h: vp.height - 4 }, 2, lines);
    this.apply(nodes, links, screenOf, banks);
  }

  /** Move each label to its placed box (relative to its element) or hide it. */
  private apply(nodes: NetworkNode[], links: NetworkLink[], screenOf: Map<string, Point>, banks: Map<string, BankView>): void {
    for (const n of nodes) {
      const v = this.views.nodes.get(n.id);
      const p = screenOf.get(n.id);
      if (!v || !p) continue;
      const at = this.placed.get(n.id);
      const tagH = TAG_FONT + 2 * TAG_PAD;
      const tagW = v.tag ? textWidth(v.tagText, TAG_FONT, true) + 2 * TAG_PAD : 0;
      const inline = !!at && !!v.tag && at.box.h <= tagH + 1 && at.box.w > tagW + 1;
      const withName = !!at && ((at.variant === 0 && (!v.tag || at.box.h > tagH + 1)) || inline);
      v.label.visible(withName);
      v.tag?.visible(!!at && !!v.tag);
      if (!at) continue;
      const { box, side } = at;
      const align = side.endsWith('left') ? 'right' : side.endsWith('right') ? 'left' : 'center';
      let y = box.y - p.y;
      if (inline && v.tag) {
        // Badge first, name after it on the same line (the name's box starts past the badge).
        v.tag.position({ x: box.x - p.x, y });
        v.label.position({ x: box.x + tagW + INLINE_GAP - p.x, y: y + (tagH - NAME_H) / 2 + 1 });
        v.label.width(box.w - tagW - INLINE_GAP);
        v.label.align('left');
        continue;
      }
      if (v.tag) {
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
      const v = this.views.links.get(l.id);
      if (!v?.note) continue;
      const at = this.placed.get(l.id);
      v.note.visible(!!at);
      if (!at) continue;
      const mid = v.mid.position();
      v.note.position({ x: at.box.x - mid.x + 1, y: at.box.y - mid.y + 1 });
    }
    this.bankBadges.destroyChildren();
    for (const [bank, b] of banks) {
      const at = this.placed.get('bank:' + bank);
      if (!at) continue;
      this.bankBadges.add(
        new Konva.Label({ x: at.box.x, y: at.box.y, listening: false }).add(
          new Konva.Tag({ fill: '#eef4f8', stroke: LABEL, strokeWidth: 1, cornerRadius: 7, listening: false }),
          new Konva.Text({ text: b.text, padding: 2.5, fontFamily: FONT, fontSize: 10, fill: LABEL, listening: false, width: at.box.w, align: 'center' }),
        ),
      );
    }
  }
}

function polylineScreenLength(pts: Point[]): number {
  let total = 0;
  for (let i = 1; i < pts.length; i++) total += distance(pts[i - 1], pts[i]);
  return total;
}

/** The screen segment holding the middle of a polyline (where the size is written). */
function segmentAtMiddle(pts: Point[]): [Point, Point] | null {
  const total = polylineScreenLength(pts);
  let walked = 0;
  for (let i = 1; i < pts.length; i++) {
    const len = distance(pts[i - 1], pts[i]);
    if (walked + len >= total / 2 && len > 0) return [pts[i - 1], pts[i]];
    walked += len;
  }
  return null;
}
