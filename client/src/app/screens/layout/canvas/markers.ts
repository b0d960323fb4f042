import Konva from 'konva';
import type { NetworkDocument } from '../../../../../../engine/network-document';
import { elementAnchor } from '../editor/fitting';
import { distance, Point } from '../editor/geometry';
import type { Box } from '../editor/label-placement';
import type { Viewport } from '../editor/viewport';
import type { ShapeSpec } from '../kinds';
import { drawShapes, FONT, LABEL, textWidth } from './draw';

/**
 * A mark another feature draws over the plan (a comment pin, a profile finding, a field note).
 * Anchored to an element (its symbol, or a line's middle) or to a site point in metres.
 */
export interface PlanMarker {
  /** Unique within its source. */
  id: string;
  at: { element: string } | { point: Point };
  /** Appearance: a kind registered with `registerMarkerKind` ('pin', 'flag', 'dot' are built in). */
  kind: string;
  /** Short text shown beside the mark (a count, a word); kept clear of the plan's labels. */
  label?: string;
  /** Called when the mark is clicked or tapped; the click then goes no further. */
  onClick?: () => void;
}

/** How a marker kind looks: shapes around its anchor (px, y down; the anchor is 0,0). */
export interface MarkerKind {
  shapes(m: PlanMarker): ShapeSpec[];
  /** Radius around the anchor that answers a click, px. */
  hitRadiusPx: number;
}

const MARKER_KINDS = new Map<string, MarkerKind>([
  // A map pin whose tip sits on the anchor.
  [
    'pin',
    {
      hitRadiusPx: 10,
      shapes: () => [
        { t: 'poly', points: [0, 0, -6, -11, -6, -16, 0, -21, 6, -16, 6, -11], closed: true, fill: '#f2c14e', stroke: LABEL, sw: 1.5 },
        { t: 'circle', x: 0, y: -14, r: 2.5, fill: LABEL },
      ],
    },
  ],
  // A small pennant on a staff, for findings along a line.
  [
    'flag',
    {
      hitRadiusPx: 10,
      shapes: () => [
        { t: 'poly', points: [0, 0, 0, -20], stroke: LABEL, sw: 1.5 },
        { t: 'poly', points: [0, -20, 12, -16, 0, -12], closed: true, fill: '#e07a5f', stroke: LABEL, sw: 1.2 },
      ],
    },
  ],
  ['dot', { hitRadiusPx: 8, shapes: () => [{ t: 'circle', r: 5, fill: '#3d5a80', stroke: '#ffffff', sw: 1.5 }] }],
]);

/** Add (or replace) a marker appearance. */
export function registerMarkerKind(kind: string, def: MarkerKind): void {
  MARKER_KINDS.set(kind, def);
}

function kindOf(m: PlanMarker): MarkerKind {
  return MARKER_KINDS.get(m.kind) ?? MARKER_KINDS.get('dot')!;
}

/**
 * The markers every feature has put on the plan, by source ('comments', 'findings'…). The Layout
 * screen owns one (`LayoutScreen.markers`); a feature sets its list and clears it when it closes.
 */
export class PlanMarkers {
  private readonly bySource = new Map<string, readonly PlanMarker[]>();
  private readonly listeners = new Set<() => void>();

  set(source: string, markers: readonly PlanMarker[]): void {
    this.bySource.set(source, markers);
    for (const fn of this.listeners) fn();
  }

  clear(source: string): void {
    if (this.bySource.delete(source)) for (const fn of this.listeners) fn();
  }

  all(): PlanMarker[] {
    return [...this.bySource.values()].flat();
  }

  subscribe(fn: () => void): () => void {
    this.listeners.add(fn);
    return () => this.listeners.delete(fn);
  }
}

interface Drawn {
  marker: PlanMarker;
  at: Point;
  r: number;
  box: Box;
  label?: Box;
}

function overlaps(a: Box | undefined, b: Box): boolean {
  return !!a && a.x < b.x + b.w && b.x < a.x + a.w && a.y < b.y + b.h && b.y < a.y + a.h;
}

/**
 * Draws the markers on their own layer above the results. An element's markers sit at the
 * top-right of its symbol, side by side, so the symbol and its state stay readable.
 */
export class MarkerLayer {
  readonly layer = new Konva.Layer({ listening: false });
  private drawn: Drawn[] = [];

  constructor(
    private readonly markers: PlanMarkers,
    private readonly vp: Viewport,
  ) {}

  draw(doc: NetworkDocument, symbolScale: (id: string) => number): void {
    this.layer.destroyChildren();
    this.drawn = [];
    const perElement = new Map<string, number>();
    for (const m of this.markers.all()) {
      let at: Point | null;
      if ('element' in m.at) {
        const world = elementAnchor(doc, m.at.element);
        if (!world) continue;
        const s = this.vp.toScreen(world);
        const k = doc.nodes.some((n) => n.id === (m.at as { element: string }).element) ? symbolScale(m.at.element) : 0.6;
        const i = perElement.get(m.at.element) ?? 0;
        perElement.set(m.at.element, i + 1);
        at = { x: s.x + (12 + 14 * i) * k + 2, y: s.y - 12 * k };
      } else at = this.vp.toScreen(m.at.point);
      if (at.x < -30 || at.y < -30 || at.x > this.vp.width + 30 || at.y > this.vp.height + 30) continue;
      const def = kindOf(m);
      const g = new Konva.Group({ x: at.x, y: at.y, listening: false });
      g.add(...drawShapes(def.shapes(m)));
      let box: Box = { x: at.x - 8, y: at.y - 22, w: 16, h: 24 };
      if (m.label) {
        const w = textWidth(m.label, 10, true);
        // Marks at the same place keep their words apart: each label steps down past the ones drawn.
        let dy = 0;
        const labelBox = () => ({ x: at!.x + 8, y: at!.y - 20 + dy, w: w + 2, h: 12 });
        for (let i = 0; i < 6 && this.drawn.some((d) => overlaps(d.label, labelBox())); i++) dy += 12;
        g.add(new Konva.Text({ x: 8, y: -20 + dy, text: m.label, fontFamily: FONT, fontSize: 10, fontStyle: 'bold', fill: LABEL, listening: false }));
        const lb = labelBox();
        box = { x: box.x, y: Math.min(box.y, lb.y), w: lb.x + lb.w - box.x, h: Math.max(box.y + box.h, lb.y + lb.h) - Math.min(box.y, lb.y) };
        this.layer.add(g);
        this.drawn.push({ marker: m, at, r: def.hitRadiusPx, box, label: lb });
        continue;
      }
      this.layer.add(g);
      this.drawn.push({ marker: m, at, r: def.hitRadiusPx, box });
    }
  }

  /** Screen boxes the plan's labels keep clear of. */
  boxes(): Box[] {
    return this.drawn.map((d) => d.box);
  }

  /** The clickable marker under a screen point (the nearest), or null. */
  markerAt(screen: Point): PlanMarker | null {
    let best: { m: PlanMarker; d: number } | null = null;
    for (const d of this.drawn) {
      if (!d.marker.onClick) continue;
      const inBox = screen.x >= d.box.x && screen.x <= d.box.x + d.box.w && screen.y >= d.box.y && screen.y <= d.box.y + d.box.h;
      const dist = distance(screen, { x: d.at.x, y: d.at.y - 10 });
      if ((inBox || dist <= d.r) && (!best || dist < best.d)) best = { m: d.marker, d: dist };
    }
    return best?.m ?? null;
  }
}
