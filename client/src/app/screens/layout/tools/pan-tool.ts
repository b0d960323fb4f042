import type { Point } from '../editor/geometry';
import type { PointerInput, Tool, ToolHost } from './tool';

/** Pan: drag anywhere to move the view. Also used for space+drag and middle-button drags. */
export class PanTool implements Tool {
  readonly id = 'pan' as const;
  state: 'idle' | 'panning' = 'idle';
  private last: Point | null = null;

  constructor(private readonly ed: ToolHost) {}

  enter(): void {
    this.state = 'idle';
  }

  exit(): void {
    this.cancel();
  }

  down(p: PointerInput): void {
    this.state = 'panning';
    this.last = p.screen;
  }

  move(p: PointerInput): void {
    if (this.state !== 'panning' || !this.last) return;
    this.ed.panBy(p.screen.x - this.last.x, p.screen.y - this.last.y);
    this.last = p.screen;
  }

  up(): void {
    const was = this.state;
    this.state = 'idle';
    this.last = null;
    // The canvas holds labels still while a pan is in progress; let it place them again now.
    if (was === 'panning') this.ed.panBy(0, 0);
  }

  cancel(): boolean {
    const had = this.state === 'panning';
    this.up();
    return had;
  }
}
