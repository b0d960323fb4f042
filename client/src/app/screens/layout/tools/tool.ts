import type { LinkKind, NodeKind } from '../../../../../../engine/network-document';
import type { Backdrop } from '../editor/calibration';
import type { DocumentStore } from '../editor/document-store';
import type { Point, Rect } from '../editor/geometry';

/** Tool ids: the standard ones (tools/index.ts) and any a feature registers. */
export type ToolId = 'select' | 'place' | 'link' | 'pan' | 'calibrate' | 'backdrop' | (string & {});

/** One pointer event, already converted: world metres (y up) and screen CSS px (y down). */
export interface PointerInput {
  world: Point;
  screen: Point;
  /** 0 primary, 1 middle, 2 secondary. */
  button: number;
  shift: boolean;
  /** Ctrl on Windows/Linux, Cmd on macOS. */
  mod: boolean;
}

/**
 * A tool is a small state machine driven by the editor: `enter` when chosen, pointer handlers
 * while active, `cancel` on Escape (rolls back whatever the gesture changed), `exit` when left.
 */
export interface Tool {
  readonly id: ToolId;
  /** Current state name, for tests and the status line ("idle", "dragging"…). */
  readonly state: string;
  enter(): void;
  exit(): void;
  down(p: PointerInput): void;
  move(p: PointerInput): void;
  up(p: PointerInput): void;
  /** Escape: abandon the gesture in progress; returns false if there was none. */
  cancel(): boolean;
  /** Keys the tool understands (Backspace removes the last bend point…); true when handled. */
  key?(key: string): boolean;
}

/** Transient drawing aids the canvas shows on its UI layer (never part of the document). */
export interface Preview {
  marquee?: Rect;
  rubberBand?: Point[];
  ghost?: { kind: NodeKind; at: Point };
  calibration?: [Point, Point];
}

/** A bend point of a link: the link id and the index in its `vertices`. */
export interface VertexRef {
  link: string;
  index: number;
}

/**
 * What a tool may ask of the editor. Tools know this interface only (never the Editor class),
 * so the editor and its tools do not import each other.
 */
export interface ToolHost {
  readonly store: DocumentStore;
  readonly readOnly: boolean;
  readonly selection: ReadonlySet<string>;
  isSelected(id: string): boolean;
  select(ids: Iterable<string>): void;
  toggleSelected(id: string): void;
  selectedNodeIds(): string[];
  elementsInRect(r: Rect): string[];
  hitTest(screen: Point): string | null;
  vertexAt(screen: Point): VertexRef | null;
  segmentHandleAt(screen: Point): { link: string; segment: number } | null;
  insertVertex(linkId: string, at: Point, segment?: number): number | null;
  selectVertex(ref: VertexRef | null): void;
  snap(p: Point): Point;
  panBy(dx: number, dy: number): void;
  setTool(id: ToolId, option?: string): void;
  setPreview(p: Preview): void;
  setHover(id: string | null): void;
  setDragging(ids: string[]): void;
  flash(message: string): void;
  placeNode(kind: NodeKind, at: Point): string | null;
  addLink(kind: LinkKind, from: string, to: string, vertices?: [number, number][]): string;
  backdrop(): Backdrop | null;
  requestCalibration(a: Point, b: Point): void;
}

/** Makes a tool for a host; `option` is the tool's variant (a node kind to place, a link kind to draw). */
export type ToolFactory = (host: ToolHost, option?: string) => Tool;

/** The tools an editor can switch to, by id. */
export type ToolRegistry = Readonly<Record<string, ToolFactory>>;
