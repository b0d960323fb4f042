import type { NodeKind } from '../../../../../../engine/network-document';
import type { PointerInput, Tool, ToolHost } from './tool';

/**
 * Place: a ghost of the element follows the pointer (snapped); a click places it and selects it.
 * Shift-click keeps the tool for another; otherwise the editor returns to Select.
 */
export class PlaceTool implements Tool {
  readonly id = 'place' as const;
  state = 'aiming' as const;

  constructor(
    private readonly ed: ToolHost,
    readonly kind: NodeKind,
  ) {}

  enter(): void {
    this.state = 'aiming';
  }

  exit(): void {
    this.ed.setPreview({});
  }

  down(p: PointerInput): void {
    if (p.button !== 0) return;
    this.ed.placeNode(this.kind, p.world);
    if (!p.shift) this.ed.setTool('select');
  }

  move(p: PointerInput): void {
    this.ed.setPreview({ ghost: { kind: this.kind, at: this.ed.snap(p.world) } });
  }

  up(): void {
    /* placing happens on press */
  }

  cancel(): boolean {
    this.ed.setTool('select');
    return true;
  }
}
