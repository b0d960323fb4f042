import Konva from 'konva';
import type { NetworkDocument } from '../../../../../../engine/network-document';
import { Crossing, lineCrossings, nodesUnderLines, PassOver } from '../editor/crossings';
import type { Viewport } from '../editor/viewport';
import { LABEL } from './draw';
import type { SceneViews } from './views';

const PAPER = '#fbfcfd';
/** A node this close to a line (screen px) looks joined to it. */
const HOP_PX = 12;

/**
 * Crossing marks: where two lines cross without joining, the line underneath is broken and the
 * line over it bridges the gap, so a rising main running across the
 * gravity network never reads as a tee. Recomputed when the drawing changes (not while dragging).
 */
export class CrossingMarks {
  readonly group = new Konva.Group({ listening: false });
  /** Hops over nodes a line passes without joining, drawn above the node symbols. */
  readonly hops = new Konva.Group({ listening: false });
  private crossings: Crossing[] = [];
  private passes: PassOver[] = [];
  private passesFor: { links: NetworkDocument['links']; nodes: NetworkDocument['nodes']; scale: number } | null = null;
  private of: NetworkDocument['links'] | null = null;
  private ofNodes: NetworkDocument['nodes'] | null = null;

  constructor(
    private readonly vp: Viewport,
    private readonly views: SceneViews,
  ) {}

  draw(doc: NetworkDocument, dragging: boolean): void {
    this.group.destroyChildren();
    this.hops.destroyChildren();
    if (dragging) return;
    this.drawHops(doc);
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
      this.group.add(
        new Konva.Line({
          points: [p.x - u.x * gap, p.y - u.y * gap, p.x + u.x * gap, p.y + u.y * gap],
          stroke: PAPER,
          strokeWidth: underW + 3,
          listening: false,
        }),
      );
      const half = gap + 2;
      this.group.add(
        new Konva.Line({
          points: [p.x - o.x * half, p.y - o.y * half, p.x + o.x * half, p.y + o.y * half],
          stroke: LABEL,
          strokeWidth: overW,
          lineCap: 'butt',
          listening: false,
        }),
      );
    }
  }

  /**
   * A line over a node it does not join (the rising main over a tee) jumps it: the straight run
   * across the symbol is papered over under the symbol and the line arcs over it, so the node
   * never reads as a tee on that line.
   */
  private drawHops(doc: NetworkDocument): void {
    const f = this.passesFor;
    if (!f || f.links !== doc.links || f.nodes !== doc.nodes || f.scale !== this.vp.scale) {
      this.passes = nodesUnderLines(doc, HOP_PX / this.vp.scale);
      this.passesFor = { links: doc.links, nodes: doc.nodes, scale: this.vp.scale };
    }
    for (const c of this.passes) {
      const p = this.vp.toScreen(c.at);
      if (p.x < -40 || p.y < -40 || p.x > this.vp.width + 40 || p.y > this.vp.height + 40) continue;
      const line = this.views.links.get(c.link)?.line;
      const w = line?.strokeWidth() ?? 2.5;
      const ink = (line?.stroke() as string | undefined) ?? LABEL;
      const symbol = 10 * (this.views.nodes.get(c.node)?.scale ?? 1);
      // Only where the symbol really sits on the line: small symbols at a crowded zoom clear it.
      if (c.distance_m * this.vp.scale > symbol + w / 2) continue;
      const r = symbol + 2;
      const u = { x: Math.cos(-c.angle), y: Math.sin(-c.angle) };
      // The arc bulges to the upper side of the line on screen.
      const n = u.x >= 0 ? { x: u.y, y: -u.x } : { x: -u.y, y: u.x };
      const a = { x: p.x - u.x * r, y: p.y - u.y * r };
      const b = { x: p.x + u.x * r, y: p.y + u.y * r };
      // Under the symbols: the symbol stays whole, the line no longer runs into it.
      this.group.add(new Konva.Line({ points: [a.x, a.y, b.x, b.y], stroke: PAPER, strokeWidth: w + 2, listening: false }));
      this.hops.add(
        new Konva.Shape({
          listening: false,
          stroke: ink,
          strokeWidth: w,
          lineCap: 'round',
          sceneFunc: (ctx, shape) => {
            ctx.beginPath();
            ctx.moveTo(a.x, a.y);
            // Control points at 4/3 r: a near-semicircle of height r over the symbol.
            ctx.bezierCurveTo(a.x + n.x * r * 1.33, a.y + n.y * r * 1.33, b.x + n.x * r * 1.33, b.y + n.y * r * 1.33, b.x, b.y);
            ctx.strokeShape(shape);
          },
        }),
      );
    }
  }
}
