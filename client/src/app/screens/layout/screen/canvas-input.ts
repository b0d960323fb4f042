import type { Editor } from '../editor/editor';
import type { Point } from '../editor/geometry';
import type { PointerInput } from '../tools/tool';

/** What the pointer plumbing reports back to the screen. */
export interface CanvasInputHooks {
  /** A gesture ended (pointer up, double-click edit): hand the committed document to the panels. */
  committed(): void;
  /** A marker from another feature under the pointer takes the click (canvas/markers.ts). */
  markerAt(screen: Point): { onClick?: () => void } | null;
  resized(width: number, height: number): void;
}

/**
 * Feeds the canvas element's pointer, wheel and double-click events to the editor as
 * `PointerInput` (screen px and site metres), and its size to the view. Returns the detach.
 */
export function attachCanvasInput(el: HTMLElement, editor: Editor, hooks: CanvasInputHooks): () => void {
  const toInput = (e: PointerEvent | MouseEvent): PointerInput => {
    const r = el.getBoundingClientRect();
    const screen = { x: e.clientX - r.left, y: e.clientY - r.top };
    return { screen, world: editor.viewport.toWorld(screen), button: e.button, shift: e.shiftKey, mod: e.ctrlKey || e.metaKey };
  };
  let marker = false;
  const down = (e: PointerEvent) => {
    el.focus({ preventScroll: true });
    const p = toInput(e);
    const m = e.button === 0 ? hooks.markerAt(p.screen) : null;
    if (m?.onClick) {
      marker = true;
      m.onClick();
      return;
    }
    el.setPointerCapture(e.pointerId);
    if (e.button === 1) e.preventDefault();
    editor.pointerDown(p);
  };
  const move = (e: PointerEvent) => {
    if (!marker) editor.pointerMove(toInput(e));
  };
  const up = (e: PointerEvent) => {
    if (marker) {
      marker = false;
      return;
    }
    if (el.hasPointerCapture(e.pointerId)) el.releasePointerCapture(e.pointerId);
    editor.pointerUp(toInput(e));
    hooks.committed();
  };
  const wheel = (e: WheelEvent) => {
    e.preventDefault();
    const r = el.getBoundingClientRect();
    editor.zoomAt({ x: e.clientX - r.left, y: e.clientY - r.top }, Math.exp(-e.deltaY * (e.deltaMode === 1 ? 0.05 : 0.0015)));
  };
  const dbl = (e: MouseEvent) => {
    if (e.button === 0 && editor.doubleClick(toInput(e))) hooks.committed();
  };
  const noMenu = (e: Event) => e.preventDefault();
  const listeners: [string, EventListener, AddEventListenerOptions?][] = [
    ['pointerdown', down as EventListener],
    ['pointermove', move as EventListener],
    ['pointerup', up as EventListener],
    ['pointercancel', up as EventListener],
    ['wheel', wheel as EventListener, { passive: false }],
    ['dblclick', dbl as EventListener],
    ['contextmenu', noMenu],
  ];
  for (const [type, fn, opts] of listeners) el.addEventListener(type, fn, opts);
  const ro = new ResizeObserver(() => hooks.resized(el.clientWidth, el.clientHeight));
  ro.observe(el);
  return () => {
    ro.disconnect();
    for (const [type, fn] of listeners) el.removeEventListener(type, fn);
  };
}

/** True when a key event is meant for a form field or an open menu, not the canvas. */
export function isTyping(target: EventTarget | null): boolean {
  const el = target as HTMLElement | null;
  if (!el || !el.tagName) return false;
  return el.isContentEditable || ['INPUT', 'TEXTAREA', 'SELECT'].includes(el.tagName) || !!el.closest('mat-select, [role="listbox"], .cdk-overlay-container');
}
