import Konva from 'konva';
import type { ShapeSpec } from '../kinds';

/** The plan's type and ink, shared by every canvas layer. */
export const FONT = 'IBM Plex Sans, sans-serif';
export const SELECT = '#1769c2';
export const LABEL = '#24323d';
export const WARN = '#b3261e';
/** Half the designed symbol size, px. */
export const SYMBOL_HALF = 12;

/** Width of a text in px, measured once per font and string. */
const measured = new Map<string, number>();
let measureCtx: CanvasRenderingContext2D | null = null;
export function textWidth(text: string, size: number, bold = false): number {
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

/** A small round warning badge ("!") centred at x, y. */
export function badge(x: number, y: number): Konva.Shape[] {
  return [
    new Konva.Circle({ x, y, radius: 7, fill: WARN, stroke: '#ffffff', strokeWidth: 1.5, listening: false }),
    new Konva.Text({
      x: x - 7,
      y: y - 6,
      width: 14,
      align: 'center',
      text: '!',
      fontFamily: FONT,
      fontStyle: 'bold',
      fontSize: 11,
      fill: '#ffffff',
      listening: false,
    }),
  ];
}
