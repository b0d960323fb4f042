import type { LinkKind } from '../../../../../../engine/network-document';
import type { Point } from '../editor/geometry';
import type { PointerInput, Tool, ToolHost } from './tool';

/**
 * Draw a pipe, pump or valve: click a start element, click empty space for bend points, click an
 * end element. States: idle → drawing → (link added, back to idle). Escape abandons the line;
 * Backspace drops the last bend point. Nothing enters the document until the end is clicked, so
 * the whole line is one undo step.
 */
export class LinkTool implements Tool {
  readonly id = 'link' as const;
  state: 'idle' | 'drawing' = 'idle';
  private from: string | null = null;
  private vertices: Point[] = [];
  private cursor: Point | null = null;

  constructor(
    private readonly ed: ToolHost,
    readonly kind: LinkKind,
  ) {}

  enter(): void {
    this.reset();
  }

  exit(): void {
    this.reset();
  }

  down(p: PointerInput): void {
    if (p.button !== 0) return;
    const hit = this.ed.hitTest(p.screen);
    const node = hit ? this.ed.store.node(hit) : undefined;
    if (this.state === 'idle') {
      if (!node) {
        this.ed.flash('Start a ' + this.kind + ' on an element');
        return;
      }
      this.from = node.id;
      this.state = 'drawing';
      this.cursor = p.world;
      this.showPreview();
      return;
    }
    if (node && node.id !== this.from && this.from) {
      const id = this.ed.addLink(
        this.kind,
        this.from,
        node.id,
        this.vertices.map((v) => [v.x, v.y] as [number, number]),
      );
      this.ed.select([id]);
      this.reset();
      return;
    }
    if (node && node.id === this.from) return;
    this.vertices.push(this.ed.snap(p.world));
    this.showPreview();
  }

  move(p: PointerInput): void {
    if (this.state !== 'drawing') {
      this.ed.setHover(this.ed.hitTest(p.screen));
      return;
    }
    this.cursor = this.ed.snap(p.world);
    this.showPreview();
  }

  up(): void {
    /* clicks act on press */
  }

  cancel(): boolean {
    if (this.state === 'idle') {
      this.ed.setTool('select');
      return true;
    }
    this.reset();
    return true;
  }

  key(key: string): boolean {
    if (key === 'Backspace' && this.state === 'drawing' && this.vertices.length) {
      this.vertices.pop();
      this.showPreview();
      return true;
    }
    return false;
  }

  private showPreview(): void {
    const start = this.from ? this.ed.store.node(this.from) : undefined;
    if (!start) return;
    const pts: Point[] = [{ x: start.x_m ?? 0, y: start.y_m ?? 0 }, ...this.vertices];
    if (this.cursor) pts.push(this.cursor);
    this.ed.setPreview({ rubberBand: pts });
  }

  private reset(): void {
    this.state = 'idle';
    this.from = null;
    this.vertices = [];
    this.cursor = null;
    this.ed.setPreview({});
  }
}
