import { ChangeDetectionStrategy, Component, effect, inject, input, signal, untracked } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';
import { firstValueFrom } from 'rxjs';
import type { UnitSystem } from '../../../../../engine/units';
import { QuantityPipe } from '../../shared/quantity.pipe';
import { ReviewApi, type VersionComparison, type VersionSummary } from './review-api.service';

/** Compare two versions: elements added, removed and changed field by field; each outlet before and after. */
@Component({
  selector: 'rn-compare-panel',
  imports: [FormsModule, MatFormFieldModule, MatSelectModule, QuantityPipe],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <mat-form-field appearance="outline" subscriptSizing="dynamic">
      <mat-label>Compare version {{ version() }} with</mat-label>
      <mat-select [ngModel]="other()" (ngModelChange)="other.set($event)" data-testid="compare-with">
        @for (v of versions(); track v.version) {
          @if (v.version !== version()) {
            <mat-option [value]="v.version">version {{ v.version }} · {{ v.summary }}</mat-option>
          }
        }
      </mat-select>
    </mat-form-field>
    @if (result(); as c) {
      <p data-testid="compare-summary">
        <strong>From version {{ c.from.version }} to {{ c.to.version }}:</strong> {{ c.summary }}
      </p>
      @if (c.diff.changed.length) {
        <ul class="rn-small">
          @for (e of c.diff.changed; track e.id) {
            <li>
              <strong>{{ e.id }}</strong>:
              @for (f of e.fields; track f.field) {
                <span>{{ f.field }} {{ show(f.before) }} → {{ show(f.after) }}; </span>
              }
            </li>
          }
        </ul>
      }
      <div class="rn-checklist-scroll">
        <table class="rn-plain-table" data-testid="compare-outlets">
          <thead>
            <tr>
              <th>Outlet</th>
              <th class="rn-num">Pressure before</th>
              <th class="rn-num">after</th>
              <th class="rn-num">Flow before</th>
              <th class="rn-num">after</th>
            </tr>
          </thead>
          <tbody>
            @for (o of c.outlets; track o.id) {
              <tr [class.rn-changed]="(o.pressureChange_m ?? 0) !== 0">
                <td>
                  {{ o.id }} <span class="rn-muted">{{ o.name }}</span>
                </td>
                <td class="rn-num">{{ o.before?.pressure_m | quantity: 'pressure' : units() }}</td>
                <td class="rn-num">{{ o.after?.pressure_m | quantity: 'pressure' : units() }}</td>
                <td class="rn-num">{{ o.before?.flow_m3s | quantity: 'flow' : units() }}</td>
                <td class="rn-num">{{ o.after?.flow_m3s | quantity: 'flow' : units() }}</td>
              </tr>
            }
          </tbody>
        </table>
      </div>
    }
  `,
  styleUrl: './review-screen.scss',
})
export class ComparePanel {
  private readonly api = inject(ReviewApi);
  readonly projectId = input.required<string>();
  readonly version = input.required<number>();
  readonly versions = input.required<VersionSummary[]>();
  readonly units = input<UnitSystem>('us');
  readonly other = signal<number | null>(null);
  readonly result = signal<VersionComparison | null>(null);

  constructor() {
    effect(() => {
      const other = this.other();
      const version = this.version();
      const id = this.projectId();
      untracked(() => {
        this.result.set(null);
        if (other !== null) void firstValueFrom(this.api.compare(id, other, version)).then((r) => this.result.set(r));
      });
    });
  }

  show(v: unknown): string {
    if (v === null || v === undefined) return '—';
    if (typeof v === 'number') return String(Math.round(v * 10000) / 10000);
    const text = typeof v === 'string' ? v : JSON.stringify(v);
    return text.length > 40 ? `${text.slice(0, 39)}…` : text;
  }
}
