import Konva from 'konva';
import type { NetworkDocument } from '../../../../../../engine/network-document';
import { Crossing, lineCrossings } from '../editor/crossings';
import type { Viewport } from '../editor/viewport';
import { LABEL } from './draw';
import type { SceneViews } from './views';

const PAPER = '#fbfcfd';

/**
 * Crossing marks: where two lines cross without joining, the line underneath is broken and the
 * line over it bridges the gap, so a rising main running across the
 * gravity network never reads as a tee. Recomputed when the drawing changes (not while dragging).
 */
export class CrossingMarks {
  readonly group = new Konva.Group({ listening: false });
  private crossings: Crossing[] = [];
  private of: NetworkDocument['links'] | null = null;
  private ofNodes: NetworkDocument['nodes'] | null = null;

  constructor(private readonly vp: Viewport, private readonly views: SceneViews) {}

  draw(doc: NetworkDocument, dragging: boolean): void {
    this.group.destroyChildren();
    if (dragging) return;
    if (doc.links !== this.of || doc.nodes !== this.ofNodes) {
      this.crossings = lineCrossings(doc);
      this.of = doc.links;
      this.ofNodes = doc.nodes;
    }
    for (const c of this.crossings) {
      const p = this.vp.toScreen(c.at);
      if (p.x < -20 || p.y < -20 || p.x > this.vp.width + 20 || p.y > this.vp.height + 20) continue;
      const overW = this.views.links.get(c.over)?.line.strokeWidth() ?? 2.5;
      const underW = this.views.links.get(c.under)?.line.strokeWidth() ?? 2.5;
      // Screen y runs down: angles flip sign.
      const gap = 4 + overW;
      const u = { x: Math.cos(-c.underAngle), y: Math.sin(-c.underAngle) };
      const o = { x: Math.cos(-c.overAngle), y: Math.sin(-c.overAngle) };
      this.group.add(new Konva.Line({ points: [p.x - u.x * gap, p.y - u.y * gap, p.x + u.x * gap, p.y + u.y * gap], stroke: PAPER, strokeWidth: underW + 3, listening: false }));
      const half = gap + 2;
      this.group.add(new Konva.Line({ points: [p.x - o.x * half, p.y - o.y * half, p.x + o.x * half, p.y + o.y * half], stroke: LABEL, strokeWidth: overW, lineCap: 'butt', listening: false }));
    }
  }
}
