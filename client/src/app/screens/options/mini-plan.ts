import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { NetworkDocument } from '../../../../../engine';

interface Line {
  id: string;
  points: string;
  changed: boolean;
}

/**
 * A small site plan of one design: every pipe as a thin grey line, the pipes that differ from the
 * current design thick in the accent colour, moved tanks ringed. Geometry comes from the
 * document's x_m/y_m and bend points (y up on the site, so the drawing flips it).
 */
@Component({
  selector: 'rn-mini-plan',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (view(); as v) {
      <svg [attr.viewBox]="v.box" role="img" [attr.aria-label]="label()" preserveAspectRatio="xMidYMid meet">
        @for (l of v.lines; track l.id) {
          <polyline [attr.points]="l.points" [class.rn-changed]="l.changed" [attr.data-pipe]="l.id" [attr.stroke-width]="l.changed ? v.thick : v.thin" />
        }
        @for (n of v.moved; track n.id) {
          <circle [attr.cx]="n.x" [attr.cy]="n.y" [attr.r]="v.thick * 2.2" class="rn-moved" />
        }
      </svg>
    } @else {
      <p class="rn-muted">No plan positions.</p>
    }
  `,
  styles: `
    :host {
      display: block;
    }
    svg {
      width: 100%;
      height: 120px;
      display: block;
      background: var(--mat-sys-surface-container-low);
      border-radius: 8px;
    }
    polyline {
      fill: none;
      stroke: var(--mat-sys-outline);
      stroke-linecap: round;
      stroke-linejoin: round;
    }
    polyline.rn-changed {
      stroke: var(--mat-sys-tertiary);
    }
    .rn-moved {
      fill: none;
      stroke: var(--mat-sys-tertiary);
      stroke-width: 3;
    }
  `,
})
export class MiniPlan {
  readonly document = input<NetworkDocument | null>(null);
  readonly changedPipes = input<string[]>([]);
  readonly movedNodes = input<string[]>([]);
  readonly label = input('Plan of the design');

  protected readonly view = computed(() => {
    const doc = this.document();
    if (!doc) return null;
    const at = new Map(
      doc.nodes.filter((n) => n.x_m !== undefined && n.y_m !== undefined).map((n) => [n.id, [n.x_m as number, n.y_m as number] as [number, number]]),
    );
    if (at.size === 0) return null;
    const xs = [...at.values()].map((p) => p[0]);
    const ys = [...at.values()].map((p) => p[1]);
    const minX = Math.min(...xs);
    const maxX = Math.max(...xs);
    const minY = Math.min(...ys);
    const maxY = Math.max(...ys);
    const span = Math.max(maxX - minX, maxY - minY, 1);
    const pad = span * 0.05;
    const changed = new Set(this.changedPipes());
    const lines: Line[] = [];
    for (const l of doc.links) {
      const a = at.get(l.from);
      const b = at.get(l.to);
      if (!a || !b) continue;
      const pts = [a, ...(l.vertices ?? []), b].map(([x, y]) => `${x.toFixed(1)},${(-y).toFixed(1)}`).join(' ');
      lines.push({ id: l.id, points: pts, changed: l.kind === 'pipe' && changed.has(l.id) });
    }
    lines.sort((p, q) => Number(p.changed) - Number(q.changed));
    const moved = this.movedNodes()
      .map((id) => ({ id, p: at.get(id) }))
      .filter((m) => m.p)
      .map((m) => ({ id: m.id, x: m.p![0], y: -m.p![1] }));
    return { box: `${minX - pad} ${-maxY - pad} ${maxX - minX + 2 * pad} ${maxY - minY + 2 * pad}`, lines, moved, thin: span / 160, thick: span / 55 };
  });
}
