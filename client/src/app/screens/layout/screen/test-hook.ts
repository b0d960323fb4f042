import type { NetworkDocument } from '../../../../../../engine/network-document';
import type { Editor } from '../editor/editor';
import type { Placement } from '../editor/label-placement';
import type { PlanMarker, PlanMarkers } from '../canvas/markers';

/**
 * The browser tests' window onto the Layout (`window.__runnelEditor`). This file is loaded only
 * when a test page asks for it (`window.__runnelTestHooks`, set by spec/e2e/harness.ts before the
 * app starts): it is a lazy chunk that production pages never fetch.
 */
export interface RunnelEditorHook {
  getDocument(): NetworkDocument;
  getSelection(): string[];
  lastSolveMs(): number;
  /** ms between animation frames while a pointer is down on the canvas (last 600). */
  frameTimes(): number[];
  /** Page (client) coordinates of a site point, for driving the canvas with a real mouse. */
  worldToClient(x_m: number, y_m: number): { x: number; y: number };
  /** Labels shown on the canvas now (element id, or bank:<id>), as page (client) boxes, with the content variant placed (0 fullest). */
  labelBoxes(): { id: string; x: number; y: number; w: number; h: number; variant: number }[];
  /** Markers on the plan now (review pins, profile findings): id, kind and where (an element or a site point). */
  planMarkers(): { id: string; kind: string; at: PlanMarker['at'] }[];
}

declare global {
  interface Window {
    __runnelEditor?: RunnelEditorHook;
    __runnelTestHooks?: boolean;
  }
}

export interface HookSource {
  editor: Editor;
  canvas: HTMLElement;
  lastSolveMs(): number;
  placedLabels(): ReadonlyMap<string, Placement>;
  markers: PlanMarkers;
}

/** Install the hook; returns the uninstall. */
export function installTestHook(src: HookSource): () => void {
  const frames: number[] = [];
  let loop = 0;
  let last = 0;
  let pointerDown = false;
  const tick = (t: number) => {
    frames.push(t - last);
    if (frames.length > 600) frames.splice(0, frames.length - 600);
    last = t;
    if (pointerDown) loop = requestAnimationFrame(tick);
  };
  const down = () => {
    pointerDown = true;
    cancelAnimationFrame(loop);
    last = performance.now();
    loop = requestAnimationFrame(tick);
  };
  const up = () => (pointerDown = false);
  src.canvas.addEventListener('pointerdown', down);
  window.addEventListener('pointerup', up);
  window.addEventListener('pointercancel', up);
  const client = () => src.canvas.getBoundingClientRect();
  window.__runnelEditor = {
    getDocument: () => structuredClone(src.editor.store.doc),
    getSelection: () => [...src.editor.selection],
    lastSolveMs: () => src.lastSolveMs(),
    frameTimes: () => [...frames],
    worldToClient: (x_m, y_m) => {
      const r = client();
      const p = src.editor.viewport.toScreen({ x: x_m, y: y_m });
      return { x: r.left + p.x, y: r.top + p.y };
    },
    labelBoxes: () => {
      const r = client();
      return [...src.placedLabels().values()].map((p) => ({ id: p.id, x: r.left + p.box.x, y: r.top + p.box.y, w: p.box.w, h: p.box.h, variant: p.variant }));
    },
    planMarkers: () => src.markers.all().map((m) => ({ id: m.id, kind: m.kind, at: structuredClone(m.at) })),
  };
  return () => {
    cancelAnimationFrame(loop);
    src.canvas.removeEventListener('pointerdown', down);
    window.removeEventListener('pointerup', up);
    window.removeEventListener('pointercancel', up);
    delete window.__runnelEditor;
  };
}
