import type { Point } from '../editor/geometry';

export type ToolId = 'select' | 'place' | 'link' | 'pan' | 'calibrate' | 'backdrop';

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
