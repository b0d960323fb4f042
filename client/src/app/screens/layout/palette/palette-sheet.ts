import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { MAT_BOTTOM_SHEET_DATA, MatBottomSheetRef } from '@angular/material/bottom-sheet';
import type { NodeKind } from '../../../../../../engine/network-document';
import { PaletteItem, PaletteSymbol } from './palette-symbol';

/**
 * A phone's element palette: a bottom sheet listing what can be placed, each with what it is for.
 * Tapping one closes the sheet with that kind (the place tool then waits for a tap on the site).
 */
@Component({
  selector: 'rn-palette-sheet',
  imports: [PaletteSymbol],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 class="title" id="palette-sheet-title">Add to the plan</h2>
    <ul class="items" aria-labelledby="palette-sheet-title" data-testid="palette-sheet">
      @for (p of items; track p.kind) {
        <li>
          <button type="button" class="item" (click)="choose(p.kind)" [attr.data-testid]="'sheet-' + p.testid">
            <rn-palette-symbol [shapes]="p.shapes" [size]="36" />
            <span class="words"
              ><strong>{{ p.label }}</strong
              ><span>{{ p.purpose }}</span></span
            >
          </button>
        </li>
      }
    </ul>
    <p class="hint">Then tap the site where it goes. Pipes, pumps and valves: the tools along the top, from one element to the next.</p>
  `,
  styles: `
    :host {
      display: block;
      padding: 4px 0 8px;
    }
    .title {
      font: var(--mat-sys-title-medium);
      margin: 4px 8px 8px;
    }
    .items {
      list-style: none;
      margin: 0;
      padding: 0;
    }
    .item {
      display: flex;
      align-items: center;
      gap: 14px;
      width: 100%;
      min-height: 56px;
      padding: 8px;
      border: 0;
      border-radius: 12px;
      background: none;
      color: inherit;
      font: inherit;
      text-align: left;
      cursor: pointer;
    }
    .item:hover,
    .item:focus-visible {
      background: var(--mat-sys-surface-container-high);
      outline: none;
    }
    .words {
      display: flex;
      flex-direction: column;
      gap: 2px;
      min-width: 0;
    }
    .words strong {
      font: var(--mat-sys-title-small);
    }
    .words span {
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
    }
    .hint {
      font: var(--mat-sys-body-small);
      color: var(--mat-sys-on-surface-variant);
      margin: 8px 8px 0;
    }
  `,
})
export class PaletteSheet {
  private readonly ref = inject<MatBottomSheetRef<PaletteSheet, NodeKind>>(MatBottomSheetRef);
  protected readonly items = inject<PaletteItem[]>(MAT_BOTTOM_SHEET_DATA);

  protected choose(kind: NodeKind): void {
    this.ref.dismiss(kind);
  }
}
