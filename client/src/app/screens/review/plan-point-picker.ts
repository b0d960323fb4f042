import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import type { NetworkDocument } from '../../../../../engine/network-document';

export interface PlanPoint {
  x_m: number;
  y_m: number;
}
interface Pin extends PlanPoint {
  id: string;
}

/**
 * The version's site plan for pinning a comment to a point: pipes and elements drawn from the
 * document's x_m / y_m and bend points (y up on the site, so the drawing flips it), the open
 * plan-point comments as pins, and the point being placed. A click or a tap places the point in
 * site metres (the SVG's own coordinates), the same point the Layout shows as a pin.
 */
@Component({
  selector: 'rn-plan-point-picker',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (view(); as v) {
      <!-- Enter pins the centre of the plan for keyboard use; a comment without a point stays the other path. -->
      <svg
        [attr.viewBox]="v.box"
        preserveAspectRatio="xMidYMid meet"
        role="img"
        tabindex="0"
        data-testid="plan-point-picker"
        [attr.aria-label]="
          'Plan of the design: click or tap where the comment belongs' +
          (point() ? '; pinned at ' + point()!.x_m.toFixed(1) + ', ' + point()!.y_m.toFixed(1) + ' m' : '')
        "
        (click)="place($event)"
        (keydown.enter)="placeCentre()"
      >
        @for (l of v.lines; track l.id) {
          <polyline [attr.points]="l.points" [attr.stroke-width]="v.thin" />
        }
        @for (n of v.nodes; track n.id) {
          <circle [attr.cx]="n.x" [attr.cy]="n.y" [attr.r]="v.thin * 2" class="rn-node" />
        }
        @for (p of v.pins; track p.id) {
          <path [attr.d]="pinPath(p.x_m, -p.y_m, v.pin)" class="rn-pin-open" [attr.data-pin]="p.id" />
        }
        @if (point(); as p) {
          <path [attr.d]="pinPath(p.x_m, -p.y_m, v.pin)" class="rn-pin-new" data-testid="plan-point-new" />
        }
      </svg>
    } @else {
      <p class="rn-muted">This version has no plan positions to pin to.</p>
    }
  `,
  styles: `
    :host {
      display: block;
    }
    svg {
      width: 100%;
      height: 240px;
      display: block;
      background: var(--mat-sys-surface-container-low, #f3f4f1);
      border-radius: 8px;
      cursor: crosshair;
      touch-action: manipulation;
    }
    polyline {
      fill: none;
      stroke: #8a918a;
      stroke-linecap: round;
      stroke-linejoin: round;
    }
    .rn-node {
      fill: #5f6368;
    }
    .rn-pin-open {
      fill: #c26a00;
      stroke: #fff;
      stroke-width: 0;
      opacity: 0.85;
    }
    .rn-pin-new {
      fill: #1d4f7a;
    }
    @media (max-width: 600px) {
      svg {
        height: 200px;
      }
    }
  `,
})
export class PlanPointPicker {
  readonly document = input<NetworkDocument | null>(null);
  /** Open comments pinned to plan points (shown so a reviewer sees what is already said there). */
  readonly pins = input<Pin[]>([]);
  readonly point = input<PlanPoint | null>(null);
  readonly picked = output<PlanPoint>();

  protected readonly view = computed(() => {
    const doc = this.document();
    if (!doc) return null;
    const at = new Map(
      doc.nodes.filter((n) => n.x_m !== undefined && n.y_m !== undefined).map((n) => [n.id, [n.x_m as number, n.y_m as number] as [number, number]]),
    );
    if (at.size === 0) return null;
    const pts = [...at.values(), ...this.pins().map((p): [number, number] => [p.x_m, p.y_m])];
    const xs = pts.map((p) => p[0]);
    const ys = pts.map((p) => p[1]);
    const minX = Math.min(...xs);
    const maxX = Math.max(...xs);
    const minY = Math.min(...ys);
    const maxY = Math.max(...ys);
    const span = Math.max(maxX - minX, maxY - minY, 1);
    const pad = span * 0.06;
    const lines = doc.links.flatMap((l) => {
      const a = at.get(l.from);
      const b = at.get(l.to);
      if (!a || !b) return [];
      return [{ id: l.id, points: [a, ...(l.vertices ?? []), b].map(([x, y]) => `${x.toFixed(2)},${(-y).toFixed(2)}`).join(' ') }];
    });
    const nodes = [...at].map(([id, [x, y]]) => ({ id, x, y: -y }));
    return {
      box: `${minX - pad} ${-maxY - pad} ${maxX - minX + 2 * pad} ${maxY - minY + 2 * pad}`,
      lines,
      nodes,
      pins: this.pins(),
      thin: span / 250,
      pin: span / 28,
    };
  });

  /** A map-pin outline whose tip is at (x, y), `size` tall, in drawing units. */
  protected pinPath(x: number, y: number, size: number): string {
    const r = size * 0.32;
    const cy = y - size + r;
    return `M ${x} ${y} L ${x - r * 0.9} ${cy + r * 0.45} A ${r} ${r} 0 1 1 ${x + r * 0.9} ${cy + r * 0.45} Z`;
  }

  /** Keyboard: Enter pins the plan's centre; a click then moves it. */
  protected placeCentre(): void {
    const v = this.view();
    if (!v) return;
    const [x, y, w, h] = v.box.split(' ').map(Number);
    this.picked.emit({ x_m: Math.round((x + w / 2) * 100) / 100, y_m: Math.round(-(y + h / 2) * 100) / 100 });
  }

  protected place(event: MouseEvent): void {
    const svg = event.currentTarget as SVGSVGElement;
    const m = svg.getScreenCTM();
    if (!m) return;
    const p = new DOMPoint(event.clientX, event.clientY).matrixTransform(m.inverse());
    this.picked.emit({ x_m: Math.round(p.x * 100) / 100, y_m: Math.round(-p.y * 100) / 100 });
  }
}
