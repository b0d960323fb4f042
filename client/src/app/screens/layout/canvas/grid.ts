import type Konva from 'konva';
import type { Viewport } from '../editor/viewport';

/**
 * The site grid: minor lines every grid step (coarsened by 5 or 10 until they are at least 14 px
 * apart) and major lines every five.
 */
export function drawGrid(ctx: Konva.Context, vp: Viewport, step_m: number): void {
  let step = step_m;
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
