import { Component, input, output } from '@angular/core';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import type { LayoutDifference } from '../../../../../engine/budget';
import type { UnitSystem } from '../../../../../engine/units';
import { QuantityPipe } from '../../shared/quantity.pipe';

/** What the designer chose for one outlet whose Layout flow differs from the budget's. */
export type OutletChoice = 'layout' | 'budget';

export interface DifferenceRow {
  d: LayoutDifference;
  name: string;
  choice: OutletChoice | null;
}

/**
 * The outlets whose flow was changed on the Layout (or typed there before the budget was linked):
 * each shows both flows and asks, per outlet, to keep the Layout's flow (it becomes "not from
 * budget") or take the budget's. Until the designer picks, a save leaves the Layout's flow alone.
 */
@Component({
  selector: 'rn-layout-differences',
  imports: [MatButtonToggleModule, QuantityPipe],
  template: `
    <section class="rn-diff" role="region" aria-label="Layout flows that differ from the budget" data-testid="budget-differences">
      <h2>Layout flows that differ from the budget</h2>
      <p class="rn-small">
        These outlets' flows were changed on the Layout (or typed there before a use was linked). Saving never overwrites them on its own: choose for each. Left
        unchosen, the Layout's flow stays and you are asked again.
      </p>
      <ul>
        @for (r of rows(); track r.d.id) {
          <li data-testid="difference-row" [attr.data-outlet]="r.d.id">
            <div class="rn-diff-text">
              <strong>{{ r.name }}</strong>
              <span>Layout {{ r.d.network_m3s | quantity: 'flow' : units() }} · budget {{ r.d.budget_m3s | quantity: 'flow' : units() }}</span>
              <span class="rn-muted rn-small">{{
                r.d.reason === 'edited-on-layout' ? 'changed on the Layout since the budget set it' : 'typed on the Layout before this outlet was linked'
              }}</span>
            </div>
            @if (canEdit()) {
              <mat-button-toggle-group
                hideSingleSelectionIndicator
                [value]="r.choice"
                (change)="choose.emit({ id: r.d.id, choice: $event.value })"
                [attr.aria-label]="'Flow for ' + r.name"
                data-testid="difference-choice"
              >
                <mat-button-toggle value="layout" data-testid="difference-keep">Keep Layout flow</mat-button-toggle>
                <mat-button-toggle value="budget" data-testid="difference-budget">Use budget flow</mat-button-toggle>
              </mat-button-toggle-group>
            }
          </li>
        }
      </ul>
    </section>
  `,
  styles: `
    .rn-diff {
      border: 1px solid var(--mat-sys-tertiary);
      border-radius: 12px;
      padding: 4px 14px 10px;
      margin: 12px 0 0;
      background: var(--mat-sys-tertiary-container);
      color: var(--mat-sys-on-tertiary-container);
    }
    h2 {
      font: var(--mat-sys-title-small);
      margin: 10px 0 4px;
    }
    ul {
      list-style: none;
      margin: 0;
      padding: 0;
    }
    li {
      display: flex;
      flex-wrap: wrap;
      align-items: center;
      gap: 8px 16px;
      padding: 8px 0;
      border-top: 1px solid var(--mat-sys-outline-variant);
    }
    .rn-diff-text {
      display: flex;
      flex-direction: column;
      flex: 1 1 220px;
      min-width: 0;
    }
    .rn-small {
      font: var(--mat-sys-body-small);
      margin: 0 0 6px;
    }
    .rn-muted {
      opacity: 0.8;
    }
    mat-button-toggle-group {
      --mat-standard-button-toggle-height: 34px;
      font-size: 13px;
    }
  `,
})
export class LayoutDifferencesPanel {
  readonly rows = input.required<DifferenceRow[]>();
  readonly units = input.required<UnitSystem>();
  readonly canEdit = input(false);
  readonly choose = output<{ id: string; choice: OutletChoice }>();
}
