import type { Point } from '../editor/geometry';
import type { PointerInput, Tool, ToolHost } from './tool';

/**
 * Calibrate the scale: click two points whose real distance is known; the editor then asks for
 * that distance (`ed.requestCalibration`) and rescales the plan. States: first → second → asking.
 */
export class CalibrateTool implements Tool {
  readonly id = 'calibrate' as const;
  state: 'first' | 'second' | 'asking' = 'first';
  private a: Point | null = null;

  constructor(private readonly ed: ToolHost) {}

  enter(): void {
    this.state = 'first';
    this.a = null;
  }

  exit(): void {
    this.ed.setPreview({});
  }

  down(p: PointerInput): void {
    if (p.button !== 0 || this.state === 'asking') return;
    if (this.state === 'first') {
      this.a = p.world;
      this.state = 'second';
      this.ed.setPreview({ calibration: [p.world, p.world] });
      return;
    }
    if (this.a) {
      this.ed.setPreview({ calibration: [this.a, p.world] });
      this.state = 'asking';
      this.ed.requestCalibration(this.a, p.world);
    }
  }

  move(p: PointerInput): void {
    if (this.state === 'second' && this.a) this.ed.setPreview({ calibration: [this.a, p.world] });
  }

  up(): void {
    /* clicks act on press */
  }

  cancel(): boolean {
    this.ed.setPreview({});
    this.ed.setTool('select');
    return true;
  }
}
