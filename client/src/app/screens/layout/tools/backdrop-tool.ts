import type { Point } from '../editor/geometry';
import type { PointerInput, Tool, ToolHost } from './tool';

/**
 * Move the site backdrop: drag anywhere to slide the image under the network (to line it up with
 * elements already drawn). One drag = one undo step; Escape during a drag puts it back.
 * States: idle → dragging.
 */
export class BackdropTool implements Tool {
  readonly id = 'backdrop' as const;
  state: 'idle' | 'dragging' = 'idle';
  private start: Point | null = null;
  private origin: { x_m: number; y_m: number } | null = null;

  constructor(private readonly ed: ToolHost) {}

  enter(): void {
    this.state = 'idle';
  }

  exit(): void {
    if (this.state === 'dragging') this.ed.store.rollback();
    this.reset();
  }

  down(p: PointerInput): void {
    const b = this.ed.backdrop();
    if (p.button !== 0 || !b) return;
    this.start = p.world;
    this.origin = { x_m: b.x_m, y_m: b.y_m };
    this.state = 'dragging';
    this.ed.store.begin('move backdrop');
  }

  move(p: PointerInput): void {
    const b = this.ed.backdrop();
    if (this.state !== 'dragging' || !this.start || !this.origin || !b) return;
    this.ed.store.patchLayout({
      backdrop: { ...b, x_m: this.origin.x_m + p.world.x - this.start.x, y_m: this.origin.y_m + p.world.y - this.start.y },
    });
  }

  up(): void {
    if (this.state === 'dragging') this.ed.store.commit();
    this.reset();
  }

  cancel(): boolean {
    if (this.state !== 'dragging') {
      this.ed.setTool('select');
      return true;
    }
    this.ed.store.rollback();
    this.reset();
    return true;
  }

  private reset(): void {
    this.state = 'idle';
    this.start = null;
    this.origin = null;
  }
}
