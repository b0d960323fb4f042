import { Component, computed, effect, inject, input, signal } from '@angular/core';
import { BreakpointObserver } from '@angular/cdk/layout';
import { rxResource, toSignal } from '@angular/core/rxjs-interop';
import { map } from 'rxjs';
import { HttpErrorResponse } from '@angular/common/http';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatExpansionModule } from '@angular/material/expansion';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { MatSnackBar } from '@angular/material/snack-bar';
import { MatTableModule } from '@angular/material/table';
import { MatTooltipModule } from '@angular/material/tooltip';
import {
  BudgetInputError,
  DEFAULT_RATE_ROWS,
  layoutDifferences,
  MONTH_NAMES,
  planBudget,
  type BudgetDocument,
  type BudgetPlan,
  type BudgetUse,
  type DefaultRate,
} from '../../../../../engine/budget';
import type { NetworkDocument, OutletNode } from '../../../../../engine/network-document';
import { fromDisplay, toDisplay, unitLabel } from '../../../../../engine/units';
import { apiErrorMessage } from '../../core/api-errors';
import { loadErrorText, valueOr } from '../../core/resource-state';
import { BudgetService } from '../../core/budget.service';
import { ProjectContext } from '../../core/project-context';
import { SessionService } from '../../core/session.service';
import { QuantityPipe } from '../../shared/quantity.pipe';
import { amountText, KIND_LABELS, rateText, seasonText, verdictText } from './budget-format';
import { LayoutDifferencesPanel, type DifferenceRow, type OutletChoice } from './layout-differences-panel';
import { UseDialog, type UseDialogData } from './use-dialog';

/**
 * Water budget tab: the uses table, monthly totals with the storage-and-fill verdict per month,
 * outlet design flows with their rule and source, the site's peak-sun hours and the defaults table.
 * The plan is the engine's (engine/budget) computed live from the draft; Save stores the budget
 * (409 when someone saved since) and the server carries the outlet flows into the network.
 */
@Component({
  selector: 'rn-budget-screen',
  imports: [
    FormsModule,
    MatTableModule,
    MatButtonModule,
    MatIconModule,
    MatTooltipModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    MatExpansionModule,
    MatProgressBarModule,
    QuantityPipe,
    LayoutDifferencesPanel,
  ],
  templateUrl: './budget-screen.html',
  styleUrl: './budget-screen.scss',
})
export class BudgetScreen {
  private readonly api = inject(BudgetService);
  private readonly session = inject(SessionService);
  private readonly dialog = inject(MatDialog);
  private readonly snack = inject(MatSnackBar);
  protected readonly context = inject(ProjectContext);

  readonly projectId = input.required<string>();

  protected readonly units = this.context.units;
  protected readonly canEdit = computed(() => this.session.can('budget.write'));
  protected readonly monthNames = MONTH_NAMES;
  protected readonly kindLabels = KIND_LABELS;
  protected readonly defaults = DEFAULT_RATE_ROWS;

  private readonly reload = signal(0);
  protected readonly stored = rxResource({ params: () => ({ id: this.projectId(), n: this.reload() }), stream: ({ params }) => this.api.get(params.id) });
  protected readonly network = rxResource({ params: () => ({ id: this.projectId(), n: this.reload() }), stream: ({ params }) => this.api.network(params.id) });

  protected readonly draft = signal<BudgetDocument | null>(null);
  /** Outlets whose Layout-edited flow the designer chose to replace with the budget's on the next save. */
  private readonly applyChosen = signal<ReadonlySet<string>>(new Set());
  protected readonly version = signal(0);
  protected readonly dirty = signal(false);
  protected readonly saving = signal(false);
  protected readonly loadError = loadErrorText([this.stored, this.network]);

  private readonly savedNetwork = valueOr(this.network, null);
  protected readonly doc = computed<NetworkDocument | null>(() => this.savedNetwork()?.document ?? null);
  protected readonly outletOptions = computed(() =>
    (this.doc()?.nodes ?? []).filter((n): n is OutletNode => n.kind === 'outlet').map((n) => ({ id: n.id, name: n.name || n.id })),
  );
  protected readonly pumps = computed(() => (this.doc()?.links ?? []).filter((l) => l.kind === 'pump').map((l) => ({ id: l.id, name: l.name || l.id })));
  private readonly outletName = computed(() => new Map(this.outletOptions().map((o) => [o.id, o.name])));

  /** The engine's plan of the draft against the saved network, or the problems that stop it. */
  protected readonly planned = computed<{ plan: BudgetPlan | null; problems: string[] }>(() => {
    const budget = this.draft();
    if (!budget) return { plan: null, problems: [] };
    try {
      return { plan: planBudget(budget, this.doc() ?? undefined), problems: [] };
    } catch (e) {
      return { plan: null, problems: e instanceof BudgetInputError ? e.problems : [String(e)] };
    }
  });
  protected readonly plan = computed(() => this.planned().plan);

  protected readonly useRows = computed(() => {
    const plan = this.plan();
    const budget = this.draft();
    if (!plan || !budget) return [];
    return budget.uses.map((use, i) => ({ use, need: plan.uses[i], outlets: use.outlets.map((id) => this.outletName().get(id) ?? id).join(', ') }));
  });
  protected readonly monthRows = computed(() => {
    const plan = this.plan();
    if (!plan) return [];
    return plan.months.map((m, j) => ({ total: m, verdict: plan.verdicts?.[j] ?? null, psh: this.draft()?.peak_sun_hours[j] ?? 0 }));
  });
  /**
   * Budget-driven outlets whose flow on the Layout differs both from the draft's and from what the
   * saved budget gave them (engine/budget/layout-differences), with the designer's choice so far.
   */
  protected readonly differences = computed<DifferenceRow[]>(() => {
    const plan = this.plan();
    const doc = this.doc();
    if (!plan || !doc || !this.stored.hasValue()) return [];
    const s = this.stored.value();
    const chosen = this.applyChosen();
    return layoutDifferences(doc, s.version > 0 ? s.document : null, plan).map((d) => ({
      d,
      name: this.outletName().get(d.id) ?? d.id,
      choice: chosen.has(d.id) ? ('budget' as const) : null,
    }));
  });
  /** Outlets kept at their Layout flow on this draft (marked "not from budget" here, not yet saved). */
  private readonly keptHere = computed(() => {
    const saved = new Set(this.stored.hasValue() ? (this.stored.value().document.manual_outlets ?? []) : []);
    return new Set((this.draft()?.manual_outlets ?? []).filter((id) => !saved.has(id)));
  });
  /** The panel's rows: open differences, and outlets the designer has just chosen to keep. */
  protected readonly differenceRows = computed<DifferenceRow[]>(() => {
    const open = this.differences();
    const kept = [...this.keptDifferences().values()].filter((r) => this.keptHere().has(r.d.id) && !open.some((o) => o.d.id === r.d.id));
    return [...open, ...kept.map((r) => ({ ...r, choice: 'layout' as const }))];
  });
  /** Differences seen before the designer kept them (so the row stays in the panel with its choice). */
  private readonly keptDifferences = signal<ReadonlyMap<string, DifferenceRow>>(new Map());

  protected readonly outletRows = computed(() => {
    const plan = this.plan();
    const doc = this.doc();
    if (!plan) return [];
    const nodes = new Map((doc?.nodes ?? []).map((n) => [n.id, n]));
    const differ = new Map(this.differences().map((r) => [r.d.id, r]));
    return plan.outlets.map((o) => {
      const node = nodes.get(o.id);
      const now = node?.kind === 'outlet' ? node.demand_m3s : null;
      const diff = differ.get(o.id);
      const changes = o.from_budget && now !== null && Math.abs(now - o.design_flow_m3s) > 1e-12;
      const status = !changes ? '' : !diff ? 'updates on save' : diff.choice === 'budget' ? 'budget flow on save' : 'differs: kept until you choose';
      return { o, name: this.outletName().get(o.id) ?? o.id, now, status, differs: !!diff && diff.choice !== 'budget' };
    });
  });
  protected readonly peak = computed(() => {
    const plan = this.plan();
    return plan && plan.peak_month > 0
      ? { month: plan.peak_month, total: plan.months[plan.peak_month - 1], verdict: plan.verdicts?.[plan.peak_month - 1] ?? null }
      : null;
  });
  protected readonly pumpFlagged = computed(() => (this.plan()?.verdicts ?? []).filter((v) => v.status === 'short' || v.status === 'short-and-storage-low'));

  /** Phone widths keep the columns that answer "is there enough" and drop the detail. */
  private readonly narrow = toSignal(
    inject(BreakpointObserver)
      .observe('(max-width: 700px)')
      .pipe(map((s) => s.matches)),
    { initialValue: false },
  );
  protected readonly useColumns = computed(() =>
    this.narrow() ? ['name', 'amount', 'peak', 'actions'] : ['name', 'amount', 'rate', 'season', 'outlets', 'window', 'peak', 'actions'],
  );
  protected readonly monthColumns = computed(() =>
    this.narrow() ? ['month', 'need', 'fill', 'verdict'] : ['month', 'need', 'peakFlow', 'psh', 'fill', 'reserve', 'verdict'],
  );
  protected readonly outletColumns = computed(() => (this.narrow() ? ['outlet', 'flow', 'mode'] : ['outlet', 'flow', 'daily', 'rule', 'now', 'mode']));

  constructor() {
    effect(() => {
      if (!this.stored.hasValue()) return;
      const s = this.stored.value();
      this.draft.set(structuredClone(s.document));
      this.version.set(s.version);
      this.dirty.set(false);
      this.applyChosen.set(new Set());
      this.keptDifferences.set(new Map());
    });
  }

  /** Keep the Layout's flow (the outlet becomes "not from budget") or take the budget's, on the next save. */
  protected chooseOutlet(id: string, choice: OutletChoice): void {
    const row = this.differenceRows().find((r) => r.d.id === id);
    const apply = new Set(this.applyChosen());
    if (choice === 'budget') {
      apply.add(id);
      this.change((b) => ({ ...b, manual_outlets: (b.manual_outlets ?? []).filter((m) => m !== id) }));
    } else {
      apply.delete(id);
      if (row) this.keptDifferences.update((m) => new Map(m).set(id, row));
      this.change((b) => ({ ...b, manual_outlets: [...new Set([...(b.manual_outlets ?? []), id])] }));
    }
    this.applyChosen.set(apply);
  }

  protected kindLabel(kind: string): string {
    return KIND_LABELS[kind as BudgetUse['kind']] ?? kind;
  }

  protected verdictText = verdictText;
  protected seasonText = seasonText;
  protected amountText = amountText;
  protected rateText = rateText;

  protected unit(q: 'daily-volume' | 'depth-rate'): string {
    return unitLabel(q, this.units());
  }

  private change(update: (b: BudgetDocument) => BudgetDocument): void {
    const b = this.draft();
    if (!b) return;
    this.draft.set(update(b));
    this.dirty.set(true);
  }

  protected openUse(use: BudgetUse | null): void {
    const budget = this.draft();
    if (!budget || !this.canEdit()) return;
    const data: UseDialogData = { use, budget, outlets: this.outletOptions(), units: this.units() };
    this.dialog
      .open(UseDialog, { data, maxWidth: '96vw' })
      .afterClosed()
      .subscribe((result: BudgetUse | undefined) => {
        if (!result) return;
        this.change((b) => ({ ...b, uses: use ? b.uses.map((u) => (u.id === use.id ? result : u)) : [...b.uses, result] }));
      });
  }

  protected removeUse(use: BudgetUse): void {
    this.change((b) => ({ ...b, uses: b.uses.filter((u) => u.id !== use.id) }));
  }

  protected setSunHours(month: number, value: string): void {
    const v = Number(value);
    this.change((b) => ({ ...b, peak_sun_hours: b.peak_sun_hours.map((x, j) => (j === month - 1 ? v : x)) }));
  }

  protected setPeakFactor(value: string): void {
    this.change((b) => ({ ...b, peak_factor: Number(value) }));
  }

  protected setHotMonths(months: number[]): void {
    this.change((b) => ({ ...b, hot_months: [...months].sort((x, y) => x - y) }));
  }

  protected setFillPump(id: string): void {
    this.change((b) => ({ ...b, fill_pump: id }));
  }

  protected setStorageDays(value: string): void {
    this.change((b) => {
      const { storage_days: _, ...rest } = b;
      return value === '' ? rest : { ...rest, storage_days: Number(value) };
    });
  }

  /** Mark an outlet "not from budget" (its typed flow stays) or let it follow the budget again. */
  protected setManual(outlet: string, manual: boolean): void {
    this.change((b) => {
      const list = new Set(b.manual_outlets ?? []);
      if (manual) list.add(outlet);
      else list.delete(outlet);
      return { ...b, manual_outlets: [...list] };
    });
  }

  protected overrideShown(row: DefaultRate, hot: boolean): string {
    const o = this.draft()?.rates?.[row.key];
    if (!o) return '';
    const v = hot ? (o.hot_rate ?? o.rate) : o.rate;
    return String(Math.round(toDisplay(row.unit === 'depth' ? 'depth-rate' : 'daily-volume', v, this.units()) * 1000) / 1000);
  }

  protected setOverride(row: DefaultRate, hot: boolean, value: string): void {
    const q = row.unit === 'depth' ? 'depth-rate' : 'daily-volume';
    this.change((b) => {
      const rates = { ...(b.rates ?? {}) };
      if (value === '' && !hot) delete rates[row.key];
      else {
        const si = fromDisplay(q, Number(value), this.units());
        const current = rates[row.key] ?? { rate: row.rate, hot_rate: row.hot_rate, source: 'project figure' };
        rates[row.key] = hot ? { ...current, hot_rate: value === '' ? undefined : si } : { ...current, rate: si };
      }
      return { ...b, rates };
    });
  }

  protected discard(): void {
    this.reload.update((n) => n + 1);
  }

  protected save(): void {
    const budget = this.draft();
    if (!budget || this.saving()) return;
    this.saving.set(true);
    const apply = [...this.applyChosen()].filter((id) => this.differences().some((r) => r.d.id === id));
    this.api.save(this.projectId(), this.version(), budget, apply).subscribe({
      next: (r) => {
        this.saving.set(false);
        const net = r.network ? `; outlet flows carried into the network (version ${r.network.version})` : '';
        const held = r.held.length ? `; ${r.held.length} Layout flow${r.held.length === 1 ? '' : 's'} kept until you choose` : '';
        this.snack.open(`Budget saved (version ${r.version})${net}${held}`, 'OK', { duration: 6000 });
        // reload both: the saved budget becomes the base the Layout's flows are compared with
        this.reload.update((n) => n + 1);
      },
      error: (err: unknown) => {
        this.saving.set(false);
        if (err instanceof HttpErrorResponse && err.status === 409) {
          this.snack.open(`${apiErrorMessage(err)}. The saved budget is shown again.`, 'OK', { duration: 8000 });
          this.reload.update((n) => n + 1);
        }
      },
    });
  }
}
