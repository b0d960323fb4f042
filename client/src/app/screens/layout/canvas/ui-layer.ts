import Konva from 'konva';
import type { NetworkNode } from '../../../../../../engine/network-document';
import { formatQuantity, UnitSystem } from '../../../../../../engine/units';
import type { Editor } from '../editor/editor';
import type { Point } from '../editor/geometry';
import type { Placement } from '../editor/label-placement';
import type { SurveyPoint } from '../editor/survey';
import { NODE_KINDS } from '../kinds';
import { drawShapes, FONT, LABEL, SELECT, SYMBOL_HALF } from './draw';
import type { SceneViews } from './views';

const SURVEY = '#6a4c93';
const CALIBRATE = '#c2410c';

/**
 * The top layer, redrawn on every render: survey crosses, the hover ring and card, bend and
 * add-bend handles of the selected line, and the tools' previews (marquee, rubber band, ghost,
 * calibration line).
 */
export class UiLayer {
  constructor(
    readonly layer: Konva.Layer,
    private readonly editor: Editor,
    private readonly views: SceneViews,
  ) {}

  draw(byId: Map<string, NetworkNode>, survey: SurveyPoint[], units: UnitSystem, placed: ReadonlyMap<string, Placement>): void {
    this.layer.destroyChildren();
    const ed = this.editor;
    const vp = ed.viewport;
    const pv = ed.preview;
    const add = (...s: Konva.Shape[] | Konva.Group[]) => this.layer.add(...(s as Konva.Shape[]));
    for (const s of survey) {
      const p = vp.toScreen({ x: s.x_m, y: s.y_m });
      if (p.x < -20 || p.y < -20 || p.x > vp.width + 20 || p.y > vp.height + 20) continue;
      add(
        new Konva.Line({
          points: [p.x - 4, p.y - 4, p.x + 4, p.y + 4, p.x, p.y, p.x + 4, p.y - 4, p.x - 4, p.y + 4],
          stroke: SURVEY,
          strokeWidth: 1.5,
          listening: false,
        }),
      );
      // The point's name (when the survey gave one) from farm zoom, its elevation when closer.
      const words = [vp.scale > 0.8 ? s.label : '', vp.scale > 2 ? formatQuantity('elevation', s.elevation_m, units) : ''].filter(Boolean).join(' · ');
      if (words) add(new Konva.Text({ x: p.x + 5, y: p.y - 12, text: words, fontSize: 9, fontFamily: FONT, fill: SURVEY, listening: false }));
    }
    const hovered = ed.hover ? byId.get(ed.hover) : undefined;
    if (hovered) {
      const p = vp.toScreen({ x: hovered.x_m ?? 0, y: hovered.y_m ?? 0 });
      const k = ed.symbolScale(hovered.id);
      if (!ed.isSelected(hovered.id)) add(new Konva.Circle({ x: p.x, y: p.y, radius: 20 * k, stroke: SELECT, strokeWidth: 1, opacity: 0.6, listening: false }));
      this.hoverCard(hovered, p, k, placed);
    }
    if (ed.selection.size === 1 && !ed.readOnly) {
      for (const h of ed.segmentHandles()) {
        const { x, y } = h.screen;
        add(new Konva.Circle({ x, y, radius: 4.5, fill: '#ffffff', stroke: SELECT, strokeWidth: 1.2, opacity: 0.9, listening: false }));
        add(new Konva.Line({ points: [x - 2.5, y, x + 2.5, y, x, y, x, y - 2.5, x, y + 2.5], stroke: SELECT, strokeWidth: 1.2, listening: false }));
      }
      const link = ed.store.link([...ed.selection][0]);
      (link?.vertices ?? []).forEach(([x, y], i) => {
        const p = vp.toScreen({ x, y });
        const chosen = ed.selectedVertex?.link === link?.id && ed.selectedVertex?.index === i;
        add(
          new Konva.Rect({
            x: p.x - 4.5,
            y: p.y - 4.5,
            width: 9,
            height: 9,
            fill: chosen ? SELECT : '#ffffff',
            stroke: SELECT,
            strokeWidth: 1.5,
            listening: false,
          }),
        );
      });
    }
    if (pv.marquee) {
      const a = vp.toScreen({ x: pv.marquee.x, y: pv.marquee.y + pv.marquee.height });
      add(
        new Konva.Rect({
          x: a.x,
          y: a.y,
          width: pv.marquee.width * vp.scale,
          height: pv.marquee.height * vp.scale,
          fill: 'rgba(23,105,194,0.08)',
          stroke: SELECT,
          strokeWidth: 1,
          dash: [4, 3],
          listening: false,
        }),
      );
    }
    if (pv.rubberBand) {
      const pts = pv.rubberBand.map((p) => vp.toScreen(p));
      add(new Konva.Line({ points: pts.flatMap((p) => [p.x, p.y]), stroke: SELECT, strokeWidth: 2, dash: [6, 4], listening: false }));
      for (const p of pts.slice(1, -1)) add(new Konva.Rect({ x: p.x - 3, y: p.y - 3, width: 6, height: 6, fill: SELECT, listening: false }));
    }
    if (pv.ghost) {
      const p = vp.toScreen(pv.ghost.at);
      const def = NODE_KINDS[pv.ghost.kind];
      const g = new Konva.Group({ x: p.x, y: p.y, opacity: 0.5, listening: false });
      g.add(...drawShapes(def.symbol(def.create('ghost', 0, 0))));
      this.layer.add(g);
    }
    if (pv.calibration) {
      const [a, b] = pv.calibration.map((p) => vp.toScreen(p));
      add(new Konva.Line({ points: [a.x, a.y, b.x, b.y], stroke: CALIBRATE, strokeWidth: 2, dash: [6, 4], listening: false }));
      for (const p of [a, b]) add(new Konva.Circle({ x: p.x, y: p.y, radius: 5, stroke: CALIBRATE, strokeWidth: 2, listening: false }));
    }
  }

  /** A small card with the name and state of a hovered node whose labels are not all shown. */
  private hoverCard(n: NetworkNode, p: Point, k: number, placed: ReadonlyMap<string, Placement>): void {
    const v = this.views.nodes.get(n.id);
    if (!v) return;
    const at = placed.get(n.id);
    const full = at && at.variant === 0 && v.label.visible();
    if (full || this.editor.dragging.length) return;
    const text = v.tagText ? `${n.name || n.id}\n${v.tagText}` : n.name || n.id;
    const r = (SYMBOL_HALF + 6) * k;
    const card = new Konva.Label({ x: p.x + r + 4, y: p.y - r, listening: false });
    card.add(
      new Konva.Tag({
        fill: '#ffffff',
        stroke: '#9aa6b0',
        strokeWidth: 1,
        cornerRadius: 4,
        shadowColor: 'rgba(0,0,0,0.18)',
        shadowBlur: 6,
        shadowOffsetY: 2,
        listening: false,
      }),
      new Konva.Text({ text, padding: 5, lineHeight: 1.3, fontFamily: FONT, fontSize: 11, fill: LABEL, listening: false }),
    );
    const vp = this.editor.viewport;
    if (card.x() + card.width() > vp.width - 4) card.x(p.x - r - 4 - card.width());
    if (card.y() < 4) card.y(4);
    this.layer.add(card);
  }
}
