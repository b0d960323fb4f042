import type { Editor } from '../editor/editor';

/** A finger that moves further than this (CSS px) on a view-only plan pans instead of tapping. */
const PAN_SLOP_PX = 8;

/**
 * Touch on the canvas (phones and tablets): two fingers pan and pinch-zoom for everyone (a tool's
 * gesture under way is cancelled, as Esc would); on a view-only plan one finger also pans once it
 * has moved, while a tap still selects. Listeners run in the capture phase and keep the pointer
 * events they use from the editor's own input (canvas-input.ts). Mouse and pen are untouched.
 * Returns the detach.
 */
export function attachTouchGestures(el: HTMLElement, editor: Editor): () => void {
  const fingers = new Map<number, { x: number; y: number }>();
  let gesture: { cx: number; cy: number; d: number } | null = null;
  let startOne: { x: number; y: number } | null = null;

  const at = (e: PointerEvent) => {
    const r = el.getBoundingClientRect();
    return { x: e.clientX - r.left, y: e.clientY - r.top };
  };
  const measure = () => {
    const pts = [...fingers.values()];
    const cx = pts.reduce((s, p) => s + p.x, 0) / pts.length;
    const cy = pts.reduce((s, p) => s + p.y, 0) / pts.length;
    const d = pts.length >= 2 ? Math.hypot(pts[0].x - pts[1].x, pts[0].y - pts[1].y) : 0;
    return { cx, cy, d };
  };
  const take = (e: PointerEvent) => {
    e.stopImmediatePropagation();
    e.preventDefault();
  };

  const down = (e: PointerEvent) => {
    if (e.pointerType !== 'touch') return;
    fingers.set(e.pointerId, at(e));
    if (fingers.size === 1) {
      startOne = at(e);
      return;
    }
    // A second finger: whatever the first started (a marquee, a drag) is abandoned.
    editor.activeTool.cancel();
    gesture = measure();
    take(e);
  };
  const move = (e: PointerEvent) => {
    if (e.pointerType !== 'touch' || !fingers.has(e.pointerId)) return;
    fingers.set(e.pointerId, at(e));
    if (!gesture && fingers.size === 1 && editor.readOnly && startOne) {
      const p = at(e);
      if (Math.hypot(p.x - startOne.x, p.y - startOne.y) > PAN_SLOP_PX) {
        editor.activeTool.cancel();
        gesture = { cx: startOne.x, cy: startOne.y, d: 0 };
      }
    }
    if (!gesture) return;
    const m = measure();
    editor.panBy(m.cx - gesture.cx, m.cy - gesture.cy);
    if (fingers.size >= 2 && gesture.d > 0 && m.d > 0) editor.zoomAt({ x: m.cx, y: m.cy }, m.d / gesture.d);
    gesture = m;
    take(e);
  };
  const up = (e: PointerEvent) => {
    if (e.pointerType !== 'touch' || !fingers.has(e.pointerId)) return;
    fingers.delete(e.pointerId);
    if (!gesture) return;
    take(e);
    if (el.hasPointerCapture(e.pointerId)) el.releasePointerCapture(e.pointerId);
    gesture = fingers.size > 0 ? measure() : null;
    startOne = null;
  };

  const listeners: [string, EventListener][] = [
    ['pointerdown', down as EventListener],
    ['pointermove', move as EventListener],
    ['pointerup', up as EventListener],
    ['pointercancel', up as EventListener],
  ];
  for (const [type, fn] of listeners) el.addEventListener(type, fn, { capture: true });
  return () => {
    for (const [type, fn] of listeners) el.removeEventListener(type, fn, { capture: true });
  };
}
