import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import type { NodeKind } from '../../../../../../engine/network-document';
import { NODE_KINDS, ShapeSpec } from '../kinds';

/** One element the palette offers: its kind, its name, and the plan symbol drawn small. */
export interface PaletteItem {
  kind: NodeKind;
  label: string;
  testid: string;
  shapes: ShapeSpec[];
  purpose: string;
}

/** What each palette kind is for, in the farm's words (the bottom sheet shows it under the name). */
const PURPOSE: Partial<Record<NodeKind, string>> = {
  source: 'Where the water comes from: spring box, creek intake, well',
  tank: 'Storage on high ground that feeds the lines by gravity',
  tee: 'Where a line branches or bends',
  outlet: 'Where water is used: trough, tap, hydrant, drip zone',
};

/** The palette's items, in the order a line is usually built (source first, outlets last). */
export function paletteItems(kinds: NodeKind[] = ['source', 'tank', 'tee', 'outlet']): PaletteItem[] {
  return kinds.map((kind) => {
    const def = NODE_KINDS[kind];
    return { kind, label: def.label, testid: 'palette-' + kind, shapes: def.symbol(def.create('p', 0, 0)), purpose: PURPOSE[kind] ?? '' };
  });
}

/** An element's plan symbol as inline SVG (the same shapes the canvas draws), for the palette and its sheet. */
@Component({
  selector: 'rn-palette-symbol',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <svg viewBox="-16 -16 32 32" [attr.width]="size()" [attr.height]="size()" aria-hidden="true">
      @for (s of shapes(); track $index) {
        @switch (s.t) {
          @case ('circle') {
            <circle
              [attr.cx]="s.x ?? 0"
              [attr.cy]="s.y ?? 0"
              [attr.r]="s.r"
              [attr.fill]="s.fill ?? 'none'"
              [attr.stroke]="s.stroke ?? 'none'"
              [attr.stroke-width]="s.sw ?? 0"
            />
          }
          @case ('rect') {
            <rect
              [attr.x]="s.x"
              [attr.y]="s.y"
              [attr.width]="s.w"
              [attr.height]="s.h"
              [attr.rx]="s.corner ?? 0"
              [attr.fill]="s.fill ?? 'none'"
              [attr.stroke]="s.stroke ?? 'none'"
              [attr.stroke-width]="s.sw ?? 0"
            />
          }
          @case ('poly') {
            @if (s.closed) {
              <polygon
                [attr.points]="s.points.join(',')"
                [attr.fill]="s.fill ?? 'none'"
                [attr.stroke]="s.stroke ?? 'none'"
                [attr.stroke-width]="s.sw ?? 0"
                stroke-linejoin="round"
              />
            } @else {
              <polyline
                [attr.points]="s.points.join(',')"
                fill="none"
                [attr.stroke]="s.stroke ?? 'none'"
                [attr.stroke-width]="s.sw ?? 0"
                stroke-linecap="round"
              />
            }
          }
        }
      }
    </svg>
  `,
  styles: `
    :host {
      display: inline-flex;
      flex: none;
    }
  `,
})
export class PaletteSymbol {
  readonly shapes = input.required<ShapeSpec[]>();
  readonly size = input(32);
}
