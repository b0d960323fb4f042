import Konva from 'konva';
import type { NetworkNode, TankNode } from '../../../../../../engine/network-document';
import type { Point } from '../editor/geometry';
import type { Box } from '../editor/label-placement';
import type { Viewport } from '../editor/viewport';
import { LABEL, SYMBOL_HALF } from './draw';

/** Tank banks narrower than this on screen get a bank badge in place of their tanks' names. */
const CROWDED_BANK_PX = 56;

/** Where symbols are on screen and how large (the Editor). */
export interface SymbolPlacement {
  readonly viewport: Viewport;
  symbolScale(id: string): number;
}

/** A bank as the label placement sees it: its header, the box around its tanks and its badge text. */
export interface BankView {
  tanks: TankNode[];
  header: Box;
  tankBox: Box;
  crowded: boolean;
  text: string;
}

/** Tanks grouped by bank id (banks of two or more). */
export function groupBanks(nodes: NetworkNode[]): { id: string; tanks: TankNode[] }[] {
  const banks = new Map<string, TankNode[]>();
  for (const n of nodes) if (n.kind === 'tank' && n.bank) banks.set(n.bank, [...(banks.get(n.bank) ?? []), n]);
  return [...banks].filter(([, ts]) => ts.length > 1).map(([id, tanks]) => ({ id, tanks }));
}

/**
 * Tank banks: a header pipe along the tanks' bases joins tanks sharing a bank id, drawn at
 * least across the end tanks' symbols so it shows even when the tanks nearly touch on screen
 * (a crowded bank also gets a "bank" badge from the label placement).
 */
export class BankHeaders {
  readonly group = new Konva.Group({ listening: false });
  private key = '';

  constructor(private readonly at: SymbolPlacement) {}

  /** Redraw the headers when a bank moved or the view changed; true when something was drawn. */
  draw(nodes: NetworkNode[], viewChanged: boolean): boolean {
    const banks = groupBanks(nodes);
    const key = banks.map((b) => b.id + ':' + b.tanks.map((t) => `${t.x_m},${t.y_m},${this.at.symbolScale(t.id)}`).join(';')).join('|');
    if (key === this.key && !viewChanged) return false;
    this.key = key;
    this.group.destroyChildren();
    for (const bank of banks) {
      const g = this.geometry(bank.tanks);
      const flat = [g.x0, g.y, ...g.pts.flatMap((p) => [p.x, g.y]), g.x1, g.y];
      this.group.add(
        new Konva.Line({ points: flat, stroke: LABEL, strokeWidth: 7, lineCap: 'round', lineJoin: 'round', listening: false, perfectDrawEnabled: false }),
      );
      this.group.add(
        new Konva.Line({ points: flat, stroke: '#cfe6f3', strokeWidth: 3.5, lineCap: 'round', lineJoin: 'round', listening: false, perfectDrawEnabled: false }),
      );
      for (const p of g.pts) this.group.add(new Konva.Line({ points: [p.x, g.y - 4, p.x, g.y], stroke: LABEL, strokeWidth: 3, listening: false }));
    }
    return true;
  }

  /** Tank banks, the screen box of their header and whether they are too narrow for the tanks' names. */
  banks(nodes: NetworkNode[]): Map<string, BankView> {
    const out = new Map<string, BankView>();
    for (const bank of groupBanks(nodes)) {
      const geo = this.geometry(bank.tanks);
      const top = Math.min(...geo.pts.map((p) => p.y)) - 15 * geo.k;
      const tankBox = { x: geo.x0, y: top, w: geo.x1 - geo.x0, h: geo.box.y + geo.box.h - top };
      out.set(bank.id, {
        tanks: bank.tanks,
        header: geo.box,
        tankBox,
        crowded: geo.span < CROWDED_BANK_PX,
        text: `${bank.id} bank · ${bank.tanks.length} tanks`,
      });
    }
    return out;
  }

  /** Where a bank's header runs on screen: under the tank bases, at least across both end symbols. */
  private geometry(tanks: TankNode[]): { pts: Point[]; k: number; y: number; x0: number; x1: number; span: number; box: Box } {
    const vp = this.at.viewport;
    const pts = tanks.map((t) => vp.toScreen({ x: t.x_m ?? 0, y: t.y_m ?? 0 })).sort((p, q) => p.x - q.x || p.y - q.y);
    const k = Math.min(...tanks.map((t) => this.at.symbolScale(t.id)));
    const y = Math.max(...pts.map((p) => p.y)) + 14 * k + 3;
    const x0 = pts[0].x - SYMBOL_HALF * k;
    const x1 = pts[pts.length - 1].x + SYMBOL_HALF * k;
    const span = Math.max(...pts.map((p) => p.x)) - Math.min(...pts.map((p) => p.x));
    return { pts, k, y, x0, x1, span, box: { x: x0 - 3, y: y - 4, w: x1 - x0 + 6, h: 8 } };
  }
}
