import type { NetworkDocument } from '../../../../../../engine/network-document';
import { distance, Point, rectFromCorners } from '../editor/geometry';
import type { PointerInput, Tool, ToolHost } from './tool';

/** Pixels the pointer must travel before a press becomes a drag. */
const DRAG_THRESHOLD_PX = 3;

/**
 * Select: click (shift toggles), marquee on empty space, drag selected nodes (with their link
 * ends) snapping the grabbed node to the grid, drag a bend point of the selected link (a click
 * on it chooses it for Delete), or drag the handle at a segment's middle to add a bend there.
 * Adding and moving a bend is one undo step. Double-clicks go to `Editor.doubleClick`.
 * States: idle → pressing → dragging, idle → marquee, idle → bending.
 */
export class SelectTool implements Tool {
  readonly id = 'select' as const;
  state: 'idle' | 'pressing' | 'dragging' | 'marquee' | 'bending' = 'idle';
  private bend: { link: string; index: number } | null = null;
  private bendMoved = false;
  private start: PointerInput | null = null;
  private grabbed: string | null = null;
  private dragFrom: NetworkDocument | null = null;
  private baseSelection: string[] = [];

  constructor(private readonly ed: ToolHost) {}

  enter(): void {
    this.state = 'idle';
  }

  exit(): void {
    this.cancel();
  }

  down(p: PointerInput): void {
    if (p.button !== 0) return;
    const hit = this.ed.hitTest(p.screen);
    this.start = p;
    const vertex = this.ed.readOnly ? null : this.ed.vertexAt(p.screen);
    if (vertex) {
      this.bend = vertex;
      this.bendMoved = false;
      this.state = 'bending';
      this.ed.store.begin('move bend');
      this.ed.selectVertex(vertex);
      return;
    }
    const handle = this.ed.readOnly ? null : this.ed.segmentHandleAt(p.screen);
    if (handle) {
      this.ed.store.begin('add bend');
      const index = this.ed.insertVertex(handle.link, p.world, handle.segment);
      if (index === null) {
        this.ed.store.rollback();
      } else {
        this.bend = { link: handle.link, index };
        this.bendMoved = false;
        this.state = 'bending';
        this.ed.selectVertex(this.bend);
        return;
      }
    }
    if (hit) {
      if (p.shift) this.ed.toggleSelected(hit);
      else if (!this.ed.isSelected(hit)) this.ed.select([hit]);
      this.grabbed = this.ed.store.node(hit) ? hit : null;
      this.state = 'pressing';
    } else {
      this.baseSelection = p.shift ? [...this.ed.selection] : [];
      if (!p.shift) this.ed.select([]);
      this.state = 'marquee';
      this.ed.setPreview({ marquee: rectFromCorners(p.world, p.world) });
    }
  }

  move(p: PointerInput): void {
    const start = this.start;
    if (!start) {
      this.ed.setHover(this.ed.hitTest(p.screen));
      return;
    }
    if (this.state === 'pressing') {
      if (distance(p.screen, start.screen) < DRAG_THRESHOLD_PX) return;
      if (this.ed.readOnly || !this.grabbed || !this.ed.isSelected(this.grabbed)) return;
      this.state = 'dragging';
      this.dragFrom = this.ed.store.doc;
      this.ed.store.begin('move');
      this.ed.setDragging(this.ed.selectedNodeIds());
    }
    if (this.state === 'bending' && this.bend) {
      if (!this.bendMoved && distance(p.screen, start.screen) < DRAG_THRESHOLD_PX) return;
      this.bendMoved = true;
      const link = this.ed.store.link(this.bend.link);
      if (!link?.vertices) return;
      const at = this.ed.snap(p.world);
      const vertices = link.vertices.map((v, i) => (i === this.bend!.index ? ([at.x, at.y] as [number, number]) : v));
      this.ed.store.patchElement(link.id, { vertices });
      return;
    }
    if (this.state === 'dragging' && this.dragFrom && this.grabbed) {
      const anchor = this.dragFrom.nodes.find((n) => n.id === this.grabbed);
      const ax = anchor?.x_m ?? 0;
      const ay = anchor?.y_m ?? 0;
      const target: Point = this.ed.snap({ x: ax + p.world.x - start.world.x, y: ay + p.world.y - start.world.y });
      this.ed.store.moveNodes(this.ed.selectedNodeIds(), target.x - ax, target.y - ay, this.dragFrom);
    } else if (this.state === 'marquee') {
      const rect = rectFromCorners(start.world, p.world);
      this.ed.setPreview({ marquee: rect });
      this.ed.select([...new Set([...this.baseSelection, ...this.ed.elementsInRect(rect)])]);
    }
  }

  up(_p: PointerInput): void {
    if (this.state === 'bending') this.ed.store.commit();
    if (this.state === 'dragging') {
      this.ed.store.commit();
      this.ed.setDragging([]);
    }
    if (this.state === 'marquee') this.ed.setPreview({});
    this.reset();
  }

  cancel(): boolean {
    const had = this.state !== 'idle';
    if (this.state === 'bending') this.ed.store.rollback();
    if (this.state === 'dragging') {
      this.ed.store.rollback();
      this.ed.setDragging([]);
    }
    if (this.state === 'marquee') {
      this.ed.setPreview({});
      this.ed.select(this.baseSelection);
    }
    this.reset();
    return had;
  }

  private reset(): void {
    this.state = 'idle';
    this.start = null;
    this.grabbed = null;
    this.dragFrom = null;
    this.baseSelection = [];
    this.bend = null;
  }
}
