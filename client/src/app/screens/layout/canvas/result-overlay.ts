import Konva from 'konva';
import type { NetworkLink, NetworkNode } from '../../../../../../engine/network-document';
import type { ServiceStates } from '../../../../../../engine/service-state';
import { BadgeTone, nodeBadge, pipeSizeText, workStroke } from '../editor/plan-words';
import { LINK_KINDS } from '../kinds';
import { badge, FONT } from './draw';
import type { OverlayInput, SceneViews } from './views';

export const TAG_FONT = 11;
export const TAG_PAD = 3;
export const SIZE_FONT = 10;

/** Ink of each badge tone: fill, border, text. Fine is quiet; only trouble is loud. */
export const TONES: Record<BadgeTone, { fill: string; stroke: string; text: string; dash?: number[] }> = {
  ok: { fill: '#f1f7f2', stroke: '#3f7d4e', text: '#1f4d29' },
  close: { fill: '#fff5dc', stroke: '#8a6100', text: '#5c4100' },
  short: { fill: '#b3261e', stroke: '#7a1712', text: '#ffffff' },
  'near-rating': { fill: '#fbeef8', stroke: '#7b2266', text: '#6b1d5c', dash: [3, 2] },
  'over-rating': { fill: '#6b1d5c', stroke: '#4a1040', text: '#ffffff' },
  tank: { fill: '#eef4f8', stroke: '#5b7486', text: '#24323d' },
  unset: { fill: '#ffffff', stroke: '#1769c2', text: '#0f4c8a', dash: [3, 2] },
  quiet: { fill: '#ffffff', stroke: '#9aa6b0', text: '#24323d' },
};

/** The mark on the symbol itself (bottom right), so an outlet's state reads even where its badge has no room. */
function stateMark(tone: BadgeTone): Konva.Shape[] {
  const t = TONES[tone];
  const at = { x: 11, y: 11 };
  const disc = new Konva.Circle({ ...at, radius: 5.5, fill: t.fill, stroke: t.stroke, strokeWidth: 1.5, listening: false });
  const glyph =
    tone === 'ok'
      ? new Konva.Line({
          points: [at.x - 2.6, at.y, at.x - 0.6, at.y + 2, at.x + 2.8, at.y - 2],
          stroke: t.text,
          strokeWidth: 1.6,
          lineCap: 'round',
          lineJoin: 'round',
          listening: false,
        })
      : tone === 'close'
        ? new Konva.Line({ points: [at.x - 2.6, at.y, at.x + 2.6, at.y], stroke: t.text, strokeWidth: 1.8, lineCap: 'round', listening: false })
        : new Konva.Text({
            x: at.x - 4,
            y: at.y - 4.5,
            width: 8,
            align: 'center',
            text: '!',
            fontFamily: FONT,
            fontStyle: 'bold',
            fontSize: 9,
            fill: t.text,
            listening: false,
          });
  return [disc, glyph];
}

/**
 * The results drawn over the plan: each element's badge in the farm's words (plan-words.ts), a
 * state mark on outlet symbols, pipes drawn as wide as they work hard with their size beside them,
 * and a warning badge on warned elements. No colour ramp, no arrows: the plan answers "is each
 * outlet OK, close or short?" directly. Keeps what each element shows so a new solve touches
 * only what changed.
 */
export class ResultOverlay {
  private readonly keys = new Map<string, string>();

  constructor(private readonly views: SceneViews) {}

  forget(id: string): void {
    this.keys.delete(id);
  }

  /** Refresh badges, marks and line widths; returns whether any element's overlay changed. */
  draw(nodes: NetworkNode[], links: NetworkLink[], input: OverlayInput): boolean {
    let changed = false;
    for (const n of nodes) changed = this.drawNode(n, input) || changed;
    for (const l of links) changed = this.drawLink(l, input) || changed;
    return changed;
  }

  private drawNode(n: NetworkNode, { service, units, warnings, show }: OverlayInput): boolean {
    const v = this.views.nodes.get(n.id);
    if (!v) return false;
    const b = show || n.elevation_source === 'unset' ? nodeBadge(n, service?.nodes[n.id], units) : null;
    const warned = show && !!warnings.get(n.id)?.length;
    const key = `${b?.text ?? ''}|${b?.tone ?? ''}|${warned}`;
    const before = this.keys.get(n.id);
    if (before === key) return false;
    this.keys.set(n.id, key);
    // Same tone, new numbers (most solves): retext in place; the tag keeps its place until the
    // labels are placed again (next frame).
    v.urgent = !!b && (b.tone === 'short' || b.tone === 'near-rating' || b.tone === 'over-rating');
    if (b && v.tag && before?.split('|')[1] === b.tone && before.endsWith(`|${warned}`)) {
      v.tag.getText().text(b.text);
      v.tagText = b.text;
      return true;
    }
    v.marks.destroyChildren();
    const was = v.tag ? { x: v.tag.x(), y: v.tag.y(), visible: v.tag.visible() } : { x: 16, y: -22, visible: false };
    v.tag?.destroy();
    v.tag = null;
    v.tagText = b?.text ?? '';
    if (b) {
      const t = TONES[b.tone];
      v.tag = new Konva.Label({ ...was, listening: false }).add(
        new Konva.Tag({ fill: t.fill, stroke: t.stroke, strokeWidth: 1.2, dash: t.dash, cornerRadius: 8, listening: false }),
        new Konva.Text({ text: b.text, padding: TAG_PAD, fontFamily: FONT, fontSize: TAG_FONT, fontStyle: 'bold', fill: t.text, listening: false }),
      );
      v.overlay.add(v.tag);
      if (n.kind === 'outlet' || b.tone === 'near-rating' || b.tone === 'over-rating' || b.tone === 'short') v.marks.add(...stateMark(b.tone));
    }
    if (warned) v.marks.add(...badge(-15, -17));
    return true;
  }

  private drawLink(l: NetworkLink, { service, units, warnings, show }: OverlayInput): boolean {
    const v = this.views.links.get(l.id);
    if (!v) return false;
    const s = show ? service?.links[l.id] : undefined;
    const isPipe = LINK_KINDS[l.kind].showsVelocity;
    const stroke = isPipe && s ? workStroke(s.work) : null;
    const size = isPipe && show ? pipeSizeText(l, units) : '';
    const warned = show && !!warnings.get(l.id)?.length;
    const key = `${s?.work ?? ''}|${size}|${warned}`;
    if (this.keys.get(l.id) === key) return false;
    this.keys.set(l.id, key);
    const def = LINK_KINDS[l.kind].stroke;
    v.line.strokeWidth(stroke?.width ?? def.widthPx);
    v.line.dash(stroke?.dash ?? def.dash ?? []);
    v.hatch.visible(!!stroke?.hatch);
    v.hatch.strokeWidth(Math.max(1, (stroke?.width ?? 2) - 3.5));
    const wasNote = v.note ? { x: v.note.x(), y: v.note.y(), visible: v.note.visible() } : { x: 0, y: 0, visible: false };
    v.overlay.destroyChildren();
    v.note = null;
    v.noteText = size;
    if (size) {
      // Placed beside the line by the label layout, or hidden when the pipe is short on screen.
      v.note = new Konva.Text({ text: size, fontFamily: FONT, fontSize: SIZE_FONT, fill: '#3d4b55', listening: false, ...wasNote });
      v.overlay.add(v.note);
    }
    if (warned) v.overlay.add(...badge(10, -20));
    return true;
  }
}

export type { ServiceStates };
