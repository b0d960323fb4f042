import Konva from 'konva';
import type { NetworkLink, NetworkNode } from '../../../../../../engine/network-document';
import { pressureState, pressureText } from '../../../../../../engine/profile/pressure-state';
import { formatQuantity } from '../../../../../../engine/units';
import { marginColour } from '../editor/colour-scale';
import { LINK_KINDS, NODE_KINDS } from '../kinds';
import { badge, FONT, LABEL, SELECT } from './draw';
import type { OverlayInput, SceneViews } from './views';

/** Pressure ring radius at full symbol size, px (5 px stroke). */
export const RING_R = 17;
export const TAG_FONT = 11;
export const TAG_PAD = 3;
export const SPEED_FONT = 10;

/**
 * The results drawn over the plan: a ring in the margin colour and a pressure tag on each node
 * whose kind shows pressure, a flow arrow and velocity on links, a badge on warned elements.
 * Keeps what each element shows so a new solve touches only what changed.
 */
export class ResultOverlay {
  /** What each element's overlay shows now, to skip unchanged ones. */
  private readonly keys = new Map<string, string>();

  constructor(private readonly views: SceneViews) {}

  forget(id: string): void {
    this.keys.delete(id);
  }

  /** Refresh result labels, arrows and badges; returns whether any element's overlay changed. */
  draw(nodes: NetworkNode[], links: NetworkLink[], input: OverlayInput): boolean {
    let changed = false;
    for (const n of nodes) changed = this.drawNode(n, input) || changed;
    for (const l of links) changed = this.drawLink(l, input) || changed;
    return changed;
  }

  private drawNode(n: NetworkNode, { results, units, warnings, show }: OverlayInput): boolean {
    const v = this.views.nodes.get(n.id);
    if (!v) return false;
    const def = NODE_KINDS[n.kind];
    const r = results?.nodes[n.id];
    const w = warnings.get(n.id);
    const hasPressure = show && r && def.showsPressure;
    const min = def.requiredPressure_m?.(n) ?? 0;
    // no honest number for a cut-off node or a column that separates: words instead (engine/profile/pressure-state)
    const supplied = !results?.warnings.some((x) => x.code === 'disconnected' && x.element === n.id);
    const text = hasPressure ? pressureText(r.pressure_m, supplied, (p) => formatQuantity('pressure', p, units)) : '';
    const colour = hasPressure ? (supplied && pressureState(r.pressure_m, true) !== 'below-vacuum' ? marginColour(r.pressure_m - min) : '#8a8f94') : '';
    // Rebuild only what changed: most solves move few labels.
    const warned = show && !!w?.length;
    const key = `${text}|${colour}|${warned}`;
    const before = this.keys.get(n.id);
    if (before === key) return false;
    this.keys.set(n.id, key);
    // Same marks, new numbers (most solves): recolour the ring and retext the tag in place.
    if (hasPressure && v.tag && before?.endsWith(`|${warned}`) && before.split('|')[0]) {
      (v.marks.findOne('.ring') as Konva.Circle | undefined)?.stroke(colour);
      v.tag.getTag().stroke(colour);
      v.tag.getText().text(text);
      v.tagText = text;
      return true;
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
    if (warned) v.marks.add(...badge(-15, -17));
    return true;
  }

  private drawLink(l: NetworkLink, { results, units, warnings, show }: OverlayInput): boolean {
    const v = this.views.links.get(l.id);
    if (!v) return false;
    const r = results?.links[l.id];
    const w = warnings.get(l.id);
    const flows = show && r && Math.abs(r.flow_m3s) > 1e-9;
    const angle = flows ? v.mid.rotation() + (r.flow_m3s < 0 ? 180 : 0) : 0;
    const speed = flows && LINK_KINDS[l.kind].showsVelocity ? formatQuantity('velocity', Math.abs(r.velocity_ms), units) : '';
    const warned = show && !!w?.length;
    const key = `${flows}|${angle.toFixed(1)}|${speed}|${warned}`;
    const before = this.keys.get(l.id);
    if (before === key) return false;
    this.keys.set(l.id, key);
    // Same arrow, new speed: retext in place.
    const [bf, ba, bs, bw] = before?.split('|') ?? [];
    if (speed && v.speed && bs && bf === String(flows) && ba === angle.toFixed(1) && bw === String(warned)) {
      v.speed.text(speed);
      v.speedText = speed;
      return true;
    }
    const wasSpeed = v.speed ? { x: v.speed.x(), y: v.speed.y(), visible: v.speed.visible() } : { x: 0, y: 0, visible: false };
    v.overlay.destroyChildren();
    v.speed = null;
    v.speedText = speed;
    v.arrowAt = null;
    if (flows) {
      // Beside the mid-line symbol when there is one, else on the line's middle.
      const offset = v.mid.hasChildren() ? 18 : 0;
      const rad = (angle * Math.PI) / 180;
      const arrow = new Konva.Line({
        name: 'arrow', points: [-6, -5, 4, 0, -6, 5], closed: true, fill: SELECT, listening: false, perfectDrawEnabled: false,
        x: Math.cos(rad) * offset, y: Math.sin(rad) * offset, rotation: angle,
      });
      v.overlay.add(arrow);
      v.arrowAt = { x: arrow.x(), y: arrow.y() };
      if (speed) {
        // Placed beside the line by the label layout, or hidden when the pipe is short on screen.
        v.speed = new Konva.Text({ text: speed, fontFamily: FONT, fontSize: SPEED_FONT, fill: SELECT, listening: false, ...wasSpeed });
        v.overlay.add(v.speed);
      }
    }
    if (warned) v.overlay.add(...badge(10, -20));
    return true;
  }
}
