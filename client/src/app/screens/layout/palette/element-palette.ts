import { BreakpointObserver } from '@angular/cdk/layout';
import { CdkDrag, CdkDragEnd } from '@angular/cdk/drag-drop';
import { ChangeDetectionStrategy, Component, inject, input, output, signal } from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { MatBottomSheet } from '@angular/material/bottom-sheet';
import { MatButtonModule } from '@angular/material/button';
import { MatTooltipModule } from '@angular/material/tooltip';
import { map } from 'rxjs';
import type { NodeKind } from '../../../../../../engine/network-document';
import { PaletteSheet } from './palette-sheet';
import { PaletteItem, PaletteSymbol } from './palette-symbol';

/** The phone layout's width (layout-phone.scss uses the same edge). */
export const PHONE_QUERY = '(max-width: 699.98px)';

/**
 * The Layout's element palette. Wide screens: a column beside the canvas whose items are dragged onto
 * the site (or clicked, then the site clicked). A phone: one "Add" button under the canvas that opens
 * a bottom sheet of the same items; the chosen one is placed by tapping the site.
 */
@Component({
  selector: 'rn-element-palette',
  imports: [CdkDrag, MatButtonModule, MatTooltipModule, PaletteSymbol],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (phone()) {
      <div class="bar" role="group" aria-label="Elements">
        <button mat-stroked-button type="button" class="add" (click)="openSheet()" data-testid="palette-open">
          <span class="plus" aria-hidden="true">+</span> Add an element
        </button>
        @if (placing() && lastChosen(); as label) {
          <span class="placing" role="status" data-testid="palette-placing">Tap the site to place the {{ label }}</span>
        }
      </div>
    } @else {
      <aside class="column" aria-label="Elements">
        <h2>Elements</h2>
        @for (p of items(); track p.kind) {
          <button
            type="button"
            class="palette-item"
            cdkDrag
            (cdkDragEnded)="dropped.emit({ end: $event, kind: p.kind })"
            (click)="chosen.emit(p.kind)"
            [attr.data-testid]="p.testid"
            [matTooltip]="'Drag onto the site, or click then click the site'"
            matTooltipPosition="right"
          >
            <rn-palette-symbol [shapes]="p.shapes" />
            <span>{{ p.label }}</span>
          </button>
        }
        <p class="palette-hint">Pipes, pumps and valves: choose the tool above, click the start element, click for bends, click the end element.</p>
      </aside>
    }
  `,
  styleUrl: './element-palette.scss',
})
export class ElementPalette {
  private readonly sheet = inject(MatBottomSheet);

  readonly items = input.required<PaletteItem[]>();
  /** True while the place tool waits for the site to be clicked or tapped. */
  readonly placing = input(false);
  /** A palette item dragged and dropped (the screen checks the drop lies on the canvas). */
  readonly dropped = output<{ end: CdkDragEnd; kind: NodeKind }>();
  /** A palette item chosen by click, keyboard or the phone's sheet: arm the place tool. */
  readonly chosen = output<NodeKind>();

  protected readonly phone = toSignal(
    inject(BreakpointObserver)
      .observe(PHONE_QUERY)
      .pipe(map((s) => s.matches)),
    { initialValue: false },
  );
  protected readonly lastChosen = signal('');

  protected openSheet(): void {
    const ref = this.sheet.open<PaletteSheet, PaletteItem[], NodeKind>(PaletteSheet, { data: this.items(), ariaLabel: 'Add an element' });
    ref.afterDismissed().subscribe((kind) => {
      if (!kind) return;
      this.lastChosen.set(
        this.items()
          .find((p) => p.kind === kind)
          ?.label.toLowerCase() ?? kind,
      );
      this.chosen.emit(kind);
    });
  }
}
