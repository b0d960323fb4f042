import Konva from 'konva';
import type { Backdrop } from '../editor/calibration';
import type { Viewport } from '../editor/viewport';

/** The site image under the plan: loaded once per file, placed and scaled with the view. */
export class BackdropLayer {
  readonly group = new Konva.Group({ listening: false });
  private image: Konva.Image | null = null;
  private url = '';
  private shown: Backdrop | null = null;

  /** `src` turns a file id into its URL; `loaded` asks for a redraw once the image arrives. */
  constructor(
    private readonly src: (fileId: string) => string,
    private readonly loaded: () => void,
  ) {}

  /** Place the backdrop for this view; true when the base layer needs drawing. */
  draw(b: Backdrop | null, vp: Viewport, viewChanged: boolean): boolean {
    if (!b) {
      if (!this.image) return false;
      this.image.destroy();
      this.image = null;
      this.url = '';
      return true;
    }
    const url = this.src(b.fileId);
    if (url !== this.url) {
      this.url = url;
      this.image?.destroy();
      const img = new Image();
      const node = new Konva.Image({ image: undefined, listening: false });
      this.image = node;
      this.group.add(node);
      img.onload = () => {
        node.image(img);
        this.loaded();
      };
      img.src = url;
    }
    const node = this.image;
    if (!node) return false;
    const p = vp.toScreen({ x: b.x_m, y: b.y_m });
    const k = b.m_per_px * vp.scale;
    node.position(p);
    node.size({ width: b.width_px * k, height: b.height_px * k });
    node.opacity(b.opacity);
    const changed = viewChanged || b !== this.shown;
    this.shown = b;
    return changed;
  }
}
