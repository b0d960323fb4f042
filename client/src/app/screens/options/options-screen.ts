import { CurrencyPipe, DatePipe, DecimalPipe, PercentPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, signal } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { forkJoin, of, type Observable } from 'rxjs';
import { pipeSeries, pipeSizes, type DesignSummary, type NetworkDocument, type PipeLink } from '../../../../../engine';
import { fromDisplay, unitLabel } from '../../../../../engine/units';
import { apiErrorMessage } from '../../core/api-errors';
import { OptionsService, type OptionDetail, type OptionRow, type SizingReport } from '../../core/options.service';
import { ProjectContext } from '../../core/project-context';
import { SessionService } from '../../core/session.service';
import { QuantityPipe } from '../../shared/quantity.pipe';
import { CountPipe } from '../../shared/count';
import { MiniPlan } from './mini-plan';

interface Column {
  key: string;
  name: string;
  summary: DesignSummary | null;
  option: OptionRow | null;
  document: NetworkDocument | null;
}

/**
 * Options: named variants of the design compared side by side (lowest outlet pressure and margin,
 * worst velocity, highest static pressure against rating, failing review checks, storage days,
 * pipe cost, total estimate, and a small plan showing where each differs). Designers make, edit,
 * size and promote options; owners mark the one they prefer. See README.md in this folder.
 */
@Component({
  selector: 'rn-options-screen',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    FormsModule,
    CurrencyPipe,
    DatePipe,
    DecimalPipe,
    PercentPipe,
    QuantityPipe,
    CountPipe,
    MiniPlan,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
  ],
  templateUrl: './options-screen.html',
  styleUrl: './options-screen.scss',
})
export class OptionsScreen {
  readonly projectId = input.required<string>();
  private readonly service = inject(OptionsService);
  private readonly session = inject(SessionService);
  protected readonly context = inject(ProjectContext, { optional: true });
  protected readonly units = computed(() => this.context?.units() ?? 'us');

  protected readonly canEdit = computed(() => this.session.can('options.write'));
  protected readonly canPrefer = computed(() => this.session.can('options.prefer'));

  protected readonly list = rxResource({ params: () => this.projectId(), stream: ({ params }) => this.service.list(params) });
  protected readonly documents = rxResource({
    params: () => (this.list.hasValue() ? { pid: this.projectId(), ids: this.list.value().options.map((o) => o.id) } : undefined),
    stream: ({ params }) =>
      forkJoin({
        current: this.service.network(params.pid),
        options: params.ids.length ? forkJoin(params.ids.map((id) => this.service.get(params.pid, id))) : of([] as OptionDetail[]),
      }),
  });

  protected readonly columns = computed<Column[]>(() => {
    if (!this.list.hasValue()) return [];
    const l = this.list.value();
    const docs = this.documents.hasValue() ? this.documents.value() : null;
    const currentDoc = docs?.current.document ?? null;
    return [
      { key: 'current', name: `Current design (v${l.current.version})`, summary: l.current.summary, option: null, document: currentDoc },
      ...l.options.map((o) => ({
        key: o.id,
        name: o.name,
        summary: o.summary,
        option: o,
        document: docs?.options.find((d) => d.id === o.id)?.document ?? null,
      })),
    ];
  });

  /** An element as the designer named it in this column's design (its id until the design has loaded, or when unnamed). */
  protected nameIn(c: Column, id: string | undefined): string {
    if (id === undefined) return '—';
    const e = c.document?.nodes.find((n) => n.id === id) ?? c.document?.links.find((l) => l.id === id);
    return e?.name ? e.name : id;
  }

  protected readonly pipes = computed(() => {
    const c = this.columns()[0]?.document;
    return (c?.links.filter((l) => l.kind === 'pipe') ?? []) as PipeLink[];
  });
  protected readonly series = pipeSeries;
  protected sizesOf(series: string): string[] {
    return pipeSizes(series).map((s) => s.nominal);
  }

  protected readonly busy = signal(false);
  protected readonly message = signal('');
  protected readonly error = signal('');
  protected newName = '';
  protected minPressure: number | null = null;
  protected sameSeries = false;
  protected edit: { option: string; pipe: string; series: string; nominal: string } = { option: '', pipe: '', series: '', nominal: '' };
  protected tankEdit: { tank: string; elevation: number | null } = { tank: '', elevation: null };
  protected readonly tanks = computed(() => this.columns()[0]?.document?.nodes.filter((n) => n.kind === 'tank') ?? []);
  protected elevationUnit(): string {
    return unitLabel('elevation', this.units());
  }
  protected readonly lastSizing = signal<{ option: string; report: SizingReport } | null>(null);

  protected pressureUnit(): string {
    return unitLabel('pressure', this.units());
  }
  /** The price list's currency (the estimate's, set on the Takeoff tab); USD only until the list has loaded. */
  protected readonly currency = computed(() => (this.list.hasValue() ? this.list.value().currency : 'USD'));

  private run<T>(work: Observable<T>, done: (value: T) => string): void {
    this.busy.set(true);
    this.error.set('');
    this.message.set('');
    work.subscribe({
      next: (v) => {
        this.busy.set(false);
        this.message.set(done(v));
        this.list.reload();
      },
      error: (e: unknown) => {
        this.busy.set(false);
        this.error.set(apiErrorMessage(e));
      },
    });
  }

  protected create(): void {
    const name = this.newName.trim();
    if (!name) {
      this.error.set('Give the option a name.');
      return;
    }
    this.run(this.service.create(this.projectId(), name), () => {
      this.newName = '';
      return `Option “${name}” made from the current design.`;
    });
  }

  protected size(option: OptionRow): void {
    const min =
      this.minPressure === null || this.minPressure === undefined || `${this.minPressure}` === ''
        ? undefined
        : fromDisplay('pressure', Number(this.minPressure), this.units());
    this.run(this.service.size(this.projectId(), option.id, { minPressure_m: min, sameSeries: this.sameSeries }), (r) => {
      this.lastSizing.set({ option: option.id, report: r });
      return r.feasible ? `Sized “${option.name}”: every outlet passes.` : `“${option.name}” cannot be sized from the price list: see why below.`;
    });
  }

  protected applyEdit(option: OptionRow): void {
    const e = this.edit;
    if (!e.pipe || !e.series || !e.nominal) {
      this.error.set('Choose a pipe, a series and a size.');
      return;
    }
    this.run(
      this.service.edit(this.projectId(), option.id, { pipes: [{ id: e.pipe, series: e.series, nominal: e.nominal }] }),
      () => `${e.pipe} in “${option.name}” is now ${e.series} ${e.nominal}.`,
    );
  }

  protected moveTank(option: OptionRow): void {
    const t = this.tankEdit;
    if (!t.tank || t.elevation === null || `${t.elevation}` === '') {
      this.error.set('Choose a tank and its new floor elevation.');
      return;
    }
    const elevation_m = fromDisplay('elevation', Number(t.elevation), this.units());
    this.run(
      this.service.edit(this.projectId(), option.id, { tanks: [{ id: t.tank, elevation_m }] }),
      () => `${t.tank} in “${option.name}” moved to its new elevation.`,
    );
  }

  protected countedLosses(option: OptionRow): void {
    this.run(
      this.service.edit(this.projectId(), option.id, { countedMinorLoss: true }),
      () => `Every pipe in “${option.name}” now uses the minor-loss K of its counted fittings (tees, reducers, elbows, couplings, tank outlets).`,
    );
  }

  protected promote(option: OptionRow): void {
    if (!confirm(`Make “${option.name}” the design? This saves it as a new network version.`)) return;
    this.run(this.service.promote(this.projectId(), option.id), (r) => `“${option.name}” is now the design (version ${r.version}).`);
  }

  protected prefer(option: OptionRow): void {
    this.run(this.service.prefer(this.projectId(), option.id), () => `You prefer “${option.name}”. The designer and estimator will see it.`);
  }

  protected remove(option: OptionRow): void {
    if (!confirm(`Delete the option “${option.name}”?`)) return;
    this.run(this.service.remove(this.projectId(), option.id), () => `Option “${option.name}” deleted.`);
  }

  /** Best value in a row, to mark it. */
  protected best(pick: (s: DesignSummary) => number | null | undefined, lowIsBest: boolean): number | null {
    const values = this.columns()
      .map((c) => (c.summary ? pick(c.summary) : null))
      .filter((v): v is number => typeof v === 'number' && Number.isFinite(v));
    if (values.length < 2) return null;
    return lowIsBest ? Math.min(...values) : Math.max(...values);
  }
}
