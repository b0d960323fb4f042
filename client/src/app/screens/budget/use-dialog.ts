import { Component, afterNextRender, computed, inject, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import {
  ALL_MONTHS,
  DEFAULT_KEY_BY_KIND,
  DEFAULT_RATE_ROWS,
  DEFAULT_WINDOW_H,
  FIXTURES,
  MONTH_NAMES,
  validateBudget,
  type BudgetDocument,
  type BudgetUse,
  type DripRows,
  type FixtureKey,
  type UseKind,
} from '../../../../../engine/budget';
import { fromDisplay, toDisplay, unitLabel, type UnitSystem } from '../../../../../engine/units';
import { KIND_LABELS } from './budget-format';

export interface UseDialogData {
  use: BudgetUse | null;
  budget: BudgetDocument;
  outlets: { id: string; name: string }[];
  units: UnitSystem;
}

/**
 * Add or edit one water use: kind, the defaults row (or a typed rate), how many, season, the
 * outlets that serve it and their refill or watering window. Numbers are typed in the project's
 * units and stored SI; the engine's validateBudget names any bad field before the dialog closes.
 */
@Component({
  selector: 'rn-use-dialog',
  imports: [FormsModule, MatDialogModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatSelectModule, MatCheckboxModule],
  template: `
    <h2 mat-dialog-title>{{ data.use ? 'Edit water use' : 'Add a water use' }}</h2>
    <mat-dialog-content class="rn-use-form">
      <!-- the fields appear with the dialog's first render done (see \`ready\`) -->
      @if (ready()) {
        <mat-form-field>
          <mat-label>Name</mat-label>
          <input matInput [(ngModel)]="name" data-testid="use-name" required />
        </mat-form-field>
        <div class="rn-row">
          <mat-form-field>
            <mat-label>Kind</mat-label>
            <mat-select [ngModel]="kind()" (ngModelChange)="setKind($event)" data-testid="use-kind">
              @for (k of kinds; track k) {
                <mat-option [value]="k">{{ kindLabels[k] }}</mat-option>
              }
            </mat-select>
          </mat-form-field>
          <mat-form-field>
            <mat-label>Figure from</mat-label>
            <mat-select [(ngModel)]="rateKey" data-testid="use-rate-key">
              @for (r of rows(); track r.key) {
                <mat-option [value]="r.key">{{ r.label }}</mat-option>
              }
            </mat-select>
          </mat-form-field>
        </div>
        @if (kind() === 'garden' || kind() === 'tunnel') {
          <mat-checkbox [checked]="dripOn()" (change)="dripOn.set($event.checked)" data-testid="use-drip"
            >Laid as drip rows: flow from the rows, not area × depth</mat-checkbox
          >
          @if (dripOn()) {
            <div class="rn-row" data-testid="use-drip-rows">
              <mat-form-field
                ><mat-label>Rows</mat-label><input matInput type="number" min="1" step="1" [(ngModel)]="drip.rows" data-testid="drip-rows"
              /></mat-form-field>
              <mat-form-field
                ><mat-label>Row length ({{ label('length') }})</mat-label
                ><input matInput type="number" min="0" [(ngModel)]="drip.length" data-testid="drip-length"
              /></mat-form-field>
              <mat-form-field
                ><mat-label>Emitter spacing ({{ label('length') }})</mat-label
                ><input matInput type="number" min="0" [(ngModel)]="drip.spacing" data-testid="drip-spacing"
              /></mat-form-field>
              <mat-form-field
                ><mat-label>Emitter flow ({{ label('emitter-flow') }})</mat-label
                ><input matInput type="number" min="0" [(ngModel)]="drip.flow" data-testid="drip-flow"
              /></mat-form-field>
              <mat-form-field
                ><mat-label>Runs (h a day)</mat-label><input matInput type="number" min="0" max="24" [(ngModel)]="drip.run" data-testid="drip-run"
              /></mat-form-field>
              <mat-form-field
                ><mat-label>Hot months (h a day)</mat-label><input matInput type="number" min="0" max="24" [(ngModel)]="drip.hotRun" data-testid="drip-hot-run"
              /></mat-form-field>
            </div>
          }
        }
        @if (kind() === 'household') {
          <fieldset class="rn-fixtures" data-testid="use-fixtures">
            <legend>Fixtures, optional: the house's peak flow by fixture units (people still set the daily need)</legend>
            @for (f of fixtureList; track f.key) {
              <mat-form-field subscriptSizing="dynamic"
                ><mat-label>{{ f.label }}</mat-label>
                <input matInput type="number" min="0" step="1" [(ngModel)]="fixtures[f.key]" [attr.data-testid]="'fixture-' + f.key"
              /></mat-form-field>
            }
          </fieldset>
        }
        <div class="rn-row">
          @if ((kind() === 'garden' || kind() === 'tunnel') && dripOn()) {
          } @else if (kind() === 'garden' || kind() === 'tunnel') {
            <mat-form-field>
              <mat-label>Growing area ({{ label('area') }})</mat-label>
              <input matInput type="number" min="0" [(ngModel)]="amount" data-testid="use-amount" />
            </mat-form-field>
          } @else if (kind() === 'other') {
            <mat-form-field>
              <mat-label>Daily volume ({{ label('daily-volume') }})</mat-label>
              <input matInput type="number" min="0" [(ngModel)]="amount" data-testid="use-amount" />
            </mat-form-field>
          } @else {
            <mat-form-field>
              <mat-label>{{ kind() === 'livestock' ? 'Head' : kind() === 'orchard' ? 'Trees' : 'People' }}</mat-label>
              <input matInput type="number" min="0" step="1" [(ngModel)]="amount" data-testid="use-amount" />
            </mat-form-field>
          }
          <mat-form-field>
            <mat-label>Window (h)</mat-label>
            <input matInput type="number" min="0.25" max="24" [(ngModel)]="window" data-testid="use-window" />
            <mat-hint>refill or run time for the day's water</mat-hint>
          </mat-form-field>
        </div>
        @if (kind() !== 'other') {
          <div class="rn-row">
            <mat-form-field>
              <mat-label>Own figure ({{ rateUnit() }}), optional</mat-label>
              <input matInput type="number" min="0" [(ngModel)]="rate" data-testid="use-rate" placeholder="from the table" />
            </mat-form-field>
            <mat-form-field>
              <mat-label>Hot weather ({{ rateUnit() }}), optional</mat-label>
              <input matInput type="number" min="0" [(ngModel)]="hotRate" data-testid="use-hot-rate" />
            </mat-form-field>
          </div>
        }
        <fieldset class="rn-months" data-testid="use-months">
          <legend>Season</legend>
          @for (m of allMonths; track m) {
            <mat-checkbox [checked]="months().includes(m)" (change)="toggleMonth(m, $event.checked)">{{ monthNames[m - 1] }}</mat-checkbox>
          }
        </fieldset>
        <mat-form-field class="rn-wide">
          <mat-label>Served by outlets</mat-label>
          <mat-select multiple [(ngModel)]="outlets" data-testid="use-outlets">
            @for (o of data.outlets; track o.id) {
              <mat-option [value]="o.id">{{ o.name }}</mat-option>
            }
          </mat-select>
          <mat-hint>their design flows follow this use</mat-hint>
        </mat-form-field>
        @if (problems().length) {
          <ul class="rn-problems" role="alert" data-testid="use-problems">
            @for (p of problems(); track p) {
              <li>{{ p }}</li>
            }
          </ul>
        }
      }
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button mat-dialog-close type="button">Cancel</button>
      <button mat-flat-button type="button" (click)="done()" data-testid="use-save">{{ data.use ? 'Apply' : 'Add' }}</button>
    </mat-dialog-actions>
  `,
  styles: `
    .rn-use-form {
      display: flex;
      flex-direction: column;
      gap: 4px;
      min-width: min(520px, 80vw);
    }
    .rn-row {
      display: flex;
      gap: 12px;
      flex-wrap: wrap;
      > * {
        flex: 1 1 200px;
      }
    }
    .rn-months {
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: 8px;
      display: flex;
      flex-wrap: wrap;
      gap: 0 4px;
      margin: 4px 0 12px;
    }
    .rn-months legend {
      font: var(--mat-sys-label-large);
      padding: 0 4px;
    }
    .rn-months mat-checkbox {
      width: 86px;
    }
    .rn-fixtures {
      border: 1px solid var(--mat-sys-outline-variant);
      border-radius: 8px;
      display: flex;
      flex-wrap: wrap;
      gap: 8px;
      margin: 4px 0 12px;
    }
    .rn-fixtures legend {
      font: var(--mat-sys-label-large);
      padding: 0 4px;
    }
    .rn-fixtures mat-form-field {
      flex: 1 1 150px;
    }
    .rn-problems {
      color: var(--mat-sys-error);
      margin: 0;
      padding-left: 20px;
      font: var(--mat-sys-body-medium);
    }
  `,
})
export class UseDialog {
  protected readonly data = inject<UseDialogData>(MAT_DIALOG_DATA);
  private readonly ref = inject(MatDialogRef<UseDialog, BudgetUse>);

  protected readonly kinds = Object.keys(KIND_LABELS) as UseKind[];
  protected readonly kindLabels = KIND_LABELS;
  protected readonly allMonths = ALL_MONTHS;
  protected readonly monthNames = MONTH_NAMES;

  private readonly start = this.data.use;
  protected readonly kind = signal<UseKind>(this.start?.kind ?? 'livestock');
  protected readonly months = signal<number[]>([...(this.start?.months ?? ALL_MONTHS)]);
  protected readonly problems = signal<string[]>([]);
  /**
   * The dialog's view is created before its first change detection (zoneless, attached by the
   * overlay); an input in the page before its form binding has written would lose what is typed
   * into it (the first write puts the starting value over it). The fields are shown from the second render,
   * when creating and binding them happen in one pass.
   */
  protected readonly ready = signal(false);
  constructor() {
    afterNextRender(() => this.ready.set(true));
  }
  protected name = this.start?.name ?? '';
  protected rateKey = this.start?.rate_key ?? DEFAULT_KEY_BY_KIND[this.kind()];
  protected amount: number | null = this.initialAmount();
  protected window: number | null = this.start?.window_h ?? DEFAULT_WINDOW_H[this.kind()];
  protected rate: number | null = this.initialRate(false);
  protected hotRate: number | null = this.initialRate(true);
  protected outlets: string[] = [...(this.start?.outlets ?? [])];
  protected readonly fixtureList = FIXTURES;
  protected fixtures: Partial<Record<FixtureKey, number | null>> = { ...(this.start?.fixtures ?? {}) };
  protected readonly dripOn = signal(!!this.start?.drip);
  protected drip = this.initialDrip(this.start?.drip);

  protected readonly rows = computed(() => DEFAULT_RATE_ROWS.filter((r) => r.kind === this.kind()));
  protected readonly rateUnit = computed(() => (this.isDepth() ? this.label('depth-rate') : `${this.label('daily-volume')} per ${this.perWhat()}`));

  protected label(q: 'area' | 'daily-volume' | 'depth-rate' | 'length' | 'emitter-flow'): string {
    return unitLabel(q, this.data.units);
  }

  protected setKind(kind: UseKind): void {
    this.kind.set(kind);
    this.rateKey = DEFAULT_KEY_BY_KIND[kind];
    this.window = DEFAULT_WINDOW_H[kind];
  }

  protected toggleMonth(m: number, on: boolean): void {
    this.months.update((list) => (on ? [...new Set([...list, m])].sort((a, b) => a - b) : list.filter((x) => x !== m)));
  }

  protected done(): void {
    const use = this.build();
    const problems = validateBudget({ ...this.data.budget, uses: [use] }).map((p) => p.replace(/^uses\[0\] ".*?"\./, '').replace(/^uses\[0\]\./, ''));
    this.problems.set(problems);
    if (problems.length === 0) this.ref.close(use);
  }

  private build(): BudgetUse {
    const kind = this.kind();
    const u = this.data.units;
    const use: BudgetUse = {
      id: this.start?.id ?? `use-${Date.now().toString(36)}`,
      name: this.name.trim(),
      kind,
      months: this.months(),
      outlets: this.outlets,
      ...(this.window !== null ? { window_h: Number(this.window) } : {}),
      ...(kind !== 'other' ? { rate_key: this.rateKey } : {}),
      ...(this.start?.notes ? { notes: this.start.notes } : {}),
    };
    const n = this.amount === null ? Number.NaN : Number(this.amount);
    if ((kind === 'garden' || kind === 'tunnel') && this.dripOn()) {
      const d = this.drip;
      const num = (v: number | null): number => (v === null || (v as unknown) === '' ? Number.NaN : Number(v));
      const drip: DripRows = {
        rows: num(d.rows),
        row_length_m: fromDisplay('length', num(d.length), u),
        emitter_spacing_m: fromDisplay('length', num(d.spacing), u),
        emitter_flow_m3s: fromDisplay('emitter-flow', num(d.flow), u),
        run_h: num(d.run),
        ...(d.hotRun !== null && (d.hotRun as unknown) !== '' ? { hot_run_h: Number(d.hotRun) } : {}),
      };
      use.drip = drip;
    } else if (kind === 'garden' || kind === 'tunnel') {
      use.area_m2 = fromDisplay('area', n, u);
      if (this.rate !== null) use.depth_m_day = fromDisplay('depth-rate', Number(this.rate), u);
      if (this.hotRate !== null) use.hot_depth_m_day = fromDisplay('depth-rate', Number(this.hotRate), u);
    } else if (kind === 'other') {
      use.daily_m3 = fromDisplay('daily-volume', n, u);
    } else {
      use.count = n;
      const fixtures = Object.fromEntries(
        Object.entries(this.fixtures)
          .filter(([, v]) => v !== null && (v as unknown) !== '' && Number(v) !== 0)
          .map(([k, v]) => [k, Number(v)]),
      );
      if (kind === 'household' && Object.keys(fixtures).length) use.fixtures = fixtures;
      if (this.rate !== null) use.rate_m3_day = fromDisplay('daily-volume', Number(this.rate), u);
      if (this.hotRate !== null) use.hot_rate_m3_day = fromDisplay('daily-volume', Number(this.hotRate), u);
    }
    return use;
  }

  private initialDrip(d: DripRows | undefined): {
    rows: number | null;
    length: number | null;
    spacing: number | null;
    flow: number | null;
    run: number | null;
    hotRun: number | null;
  } {
    const u = this.data.units;
    if (!d) return { rows: null, length: null, spacing: null, flow: null, run: 1, hotRun: null };
    // a tape figure per length shows as 1-unit spacing with the flow per unit of length
    const spacing = d.emitter_spacing_m ?? (u === 'us' ? 0.3048 : 1);
    const flow = d.emitter_flow_m3s ?? (d.tape_flow_m3s_per_m ?? 0) * spacing;
    return {
      rows: d.rows,
      length: round(toDisplay('length', d.row_length_m, u)),
      spacing: round(toDisplay('length', spacing, u)),
      flow: round(toDisplay('emitter-flow', flow, u)),
      run: d.run_h,
      hotRun: d.hot_run_h ?? null,
    };
  }

  private isDepth(): boolean {
    return this.kind() === 'garden' || this.kind() === 'tunnel';
  }

  private perWhat(): string {
    return this.kind() === 'livestock' ? 'head' : this.kind() === 'orchard' ? 'tree' : 'person';
  }

  private initialAmount(): number | null {
    const s = this.start;
    if (!s) return null;
    if (s.kind === 'garden' || s.kind === 'tunnel') return round(toDisplay('area', s.area_m2 ?? 0, this.data.units));
    if (s.kind === 'other') return round(toDisplay('daily-volume', s.daily_m3 ?? 0, this.data.units));
    return s.count ?? null;
  }

  private initialRate(hot: boolean): number | null {
    const s = this.start;
    if (!s) return null;
    const u = this.data.units;
    if (s.kind === 'garden' || s.kind === 'tunnel') {
      const v = hot ? s.hot_depth_m_day : s.depth_m_day;
      return v === undefined ? null : round(toDisplay('depth-rate', v, u));
    }
    const v = hot ? s.hot_rate_m3_day : s.rate_m3_day;
    return v === undefined ? null : round(toDisplay('daily-volume', v, u));
  }
}

function round(v: number): number {
  return Math.round(v * 1000) / 1000;
}
