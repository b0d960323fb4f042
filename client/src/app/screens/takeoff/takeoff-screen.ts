import { CurrencyPipe, DatePipe, DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, signal } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatTableModule } from '@angular/material/table';
import type { Observable } from 'rxjs';
import type { EstimateLine, OtherItem, TakeoffRow } from '../../../../../engine';
import { soldUnit } from '../../../../../engine/takeoff/sold-unit';
import { apiErrorMessage } from '../../core/api-errors';
import { OptionsService } from '../../core/options.service';
import { ProjectContext } from '../../core/project-context';
import { SessionService } from '../../core/session.service';
import { TakeoffService, type PriceItem, type TakeoffSettingsBody } from '../../core/takeoff.service';
import { QuantityPipe } from '../../shared/quantity.pipe';
import { CountPipe } from '../../shared/count';

interface Line {
  row: TakeoffRow;
  line: EstimateLine;
  /** The unit price in the unit the row is sold by in the project's units (pipe per ft in US), null when unpriced. */
  price: number | null;
  soldBy: string;
}

/**
 * Takeoff: quantities derived from the design (pipe in coils or sticks, fittings from the
 * topology, valves, tanks, pumps, the "other" list), priced from the team's price list into an
 * estimate; the price list itself (a Material table); exports (XLSX, CSV, print). Estimators and
 * admins edit prices and settings, owners accept the estimate. See README.md in this folder.
 */
@Component({
  selector: 'rn-takeoff-screen',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    FormsModule,
    CurrencyPipe,
    DatePipe,
    DecimalPipe,
    QuantityPipe,
    CountPipe,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    MatTableModule,
  ],
  templateUrl: './takeoff-screen.html',
  styleUrl: './takeoff-screen.scss',
})
export class TakeoffScreen {
  readonly projectId = input.required<string>();
  private readonly service = inject(TakeoffService);
  private readonly optionsService = inject(OptionsService);
  private readonly session = inject(SessionService);
  protected readonly context = inject(ProjectContext, { optional: true });
  protected readonly units = computed(() => this.context?.units() ?? 'us');
  protected readonly canPrice = computed(() => this.session.can('prices.write'));
  protected readonly canSettings = computed(() => this.session.can('takeoff.write'));
  protected readonly canAccept = computed(() => this.session.can('estimate.accept'));

  protected readonly option = signal<string | null>(null);
  protected readonly options = rxResource({ params: () => this.projectId(), stream: ({ params }) => this.optionsService.list(params) });
  protected readonly view = rxResource({
    params: () => ({ pid: this.projectId(), option: this.option() }),
    stream: ({ params }) => this.service.takeoff(params.pid, params.option),
  });
  protected readonly prices = rxResource({ stream: () => this.service.prices() });

  protected readonly lines = computed<Line[]>(() => {
    if (!this.view.hasValue()) return [];
    const v = this.view.value();
    const units = this.units();
    return v.takeoff.rows.map((row, i) => {
      const line = v.estimate.lines[i];
      const sold = soldUnit(row.unit, units);
      return { row, line, price: line.unit_price === null ? null : line.unit_price / sold.perSi, soldBy: sold.unit };
    });
  });
  protected readonly unpricedOnly = signal(false);
  protected readonly priceRows = computed<PriceItem[]>(() => {
    const all = this.prices.hasValue() ? this.prices.value() : [];
    return this.unpricedOnly() ? all.filter((p) => p.price === null) : all;
  });
  protected readonly missing = computed(() => (this.view.hasValue() ? this.view.value().estimate.missing : []));
  protected readonly columns = ['code', 'description', 'unit', 'price'];

  protected settings: TakeoffSettingsBody | null = null;
  protected readonly busy = signal(false);
  protected readonly message = signal('');
  protected readonly error = signal('');
  protected newItem = { code: '', description: '', unit: 'each', price: null as number | null };

  constructor() {
    // the settings form starts from what the server holds each time the view loads
    effect(() => {
      if (this.view.hasValue()) this.settings = structuredClone(this.view.value().settings);
    });
  }

  protected currency(): string {
    return this.view.hasValue() ? this.view.value().settings.currency : 'USD';
  }
  protected workbookUrl(): string {
    return this.service.workbookUrl(this.projectId(), this.option());
  }
  protected csvUrl(): string {
    return this.service.csvUrl(this.projectId(), this.option());
  }
  protected print(): void {
    window.print();
  }

  private run<T>(work: Observable<T>, done: (v: T) => string, reload: ('view' | 'prices')[] = ['view']): void {
    this.busy.set(true);
    this.error.set('');
    this.message.set('');
    work.subscribe({
      next: (v) => {
        this.busy.set(false);
        this.message.set(done(v));
        if (reload.includes('view')) this.view.reload();
        if (reload.includes('prices')) this.prices.reload();
      },
      error: (e: unknown) => {
        this.busy.set(false);
        this.error.set(apiErrorMessage(e));
      },
    });
  }

  protected savePrice(item: PriceItem, raw: string): void {
    const text = raw.trim();
    const price = text === '' ? null : Number(text);
    if (price !== null && (!Number.isFinite(price) || price < 0)) {
      this.error.set(`${item.code}: the price must be a number ≥ 0, or empty for "not priced".`);
      return;
    }
    if (price === item.price) return;
    this.run(this.service.setPrice(item.id, price), () => (price === null ? `${item.code} is now unpriced.` : `Price of ${item.code} set to ${price}.`), [
      'view',
      'prices',
    ]);
  }

  protected addItem(): void {
    const item = { ...this.newItem, code: this.newItem.code.trim() };
    if (!item.code) {
      this.error.set('Give the item a code, such as other/gate-valve.');
      return;
    }
    this.run(
      this.service.addPrice(item),
      () => {
        this.newItem = { code: '', description: '', unit: 'each', price: null };
        return `${item.code} added to the price list.`;
      },
      ['view', 'prices'],
    );
  }

  protected importFile(input: HTMLInputElement): void {
    const file = input.files?.[0];
    if (!file) return;
    this.run(
      this.service.importPrices(file),
      (r) => {
        input.value = '';
        return `Imported ${r.imported} rows from ${file.name} (${r.created} new, ${r.updated} updated).`;
      },
      ['view', 'prices'],
    );
    input.value = '';
  }

  protected addOther(): void {
    this.settings?.other.push({ code: `other/item-${(this.settings?.other.length ?? 0) + 1}`, description: 'New item', unit: 'each', quantity: 1 });
  }
  protected removeOther(i: number): void {
    this.settings?.other.splice(i, 1);
  }
  protected otherMode(o: OtherItem): 'quantity' | 'per_pipe_m' {
    return o.per_pipe_m !== undefined ? 'per_pipe_m' : 'quantity';
  }
  protected setOtherMode(o: OtherItem, mode: 'quantity' | 'per_pipe_m'): void {
    if (mode === 'per_pipe_m') {
      o.per_pipe_m = o.quantity ?? 1;
      delete o.quantity;
    } else {
      o.quantity = o.per_pipe_m ?? 1;
      delete o.per_pipe_m;
    }
  }

  protected saveSettings(): void {
    if (!this.settings) return;
    this.run(this.service.saveSettings(this.projectId(), this.settings), () => 'Takeoff settings saved; the estimate is updated.');
  }

  protected accept(): void {
    if (!this.view.hasValue()) return;
    const v = this.view.value();
    if (!confirm(`Accept the estimate for “${v.design.name}” of ${v.estimate.total.toFixed(2)} ${v.settings.currency}?`)) return;
    this.run(this.service.accept(this.projectId(), this.option(), v.estimate.total), () => 'Estimate accepted. It is recorded with your name and the time.');
  }
}
