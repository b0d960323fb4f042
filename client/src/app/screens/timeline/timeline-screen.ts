import { Component, DestroyRef, computed, effect, inject, input, signal, untracked, viewChildren } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { timelineCsv, type TimelineEvent } from '../../../../../engine/timeline';
import { formatQuantity, fromDisplay, toDisplay, unitLabel, type Quantity } from '../../../../../engine/units';
import { loadErrorText } from '../../core/resource-state';
import { BudgetService } from '../../core/budget.service';
import { ProjectContext } from '../../core/project-context';
import { LineChart, type ChartMark, type ChartSpec } from '../../shared/chart/line-chart';
import { downloadDataUrl, downloadText } from '../../shared/chart/download';
import { QuantityPipe } from '../../shared/quantity.pipe';
import { TimelineRun } from './timeline-run';

/** Time-axis ticks fall on whole hours, days or half-days. */
const HOUR_STEPS = [1, 2, 3, 6, 12, 24, 48];
const COLOURS = ['#17677a', '#a8692e', '#5b7f3a', '#7a4a8c', '#b5485d', '#3d5a80'];
const EVENT_COLOURS: Record<TimelineEvent['kind'], string> = {
  'tank-low': '#c77d1a',
  'tank-empty': '#b3261e',
  'tank-full': '#2e7d4f',
  overflow: '#3d5a80',
  'pump-stop': '#6b6b6b',
  'pump-start': '#2e7d4f',
  'low-cutoff': '#b3261e',
  'outlet-short': '#b3261e',
  'outlet-recovered': '#2e7d4f',
};

/** "07:30", "day 3 07:30". */
export function clock(t_s: number): string {
  const d = Math.floor(t_s / 86400);
  const h = Math.floor((t_s % 86400) / 3600);
  const m = Math.round((t_s % 3600) / 60);
  const hm = `${String(h).padStart(2, '0')}:${String(m === 60 ? 59 : m).padStart(2, '0')}`;
  return d > 0 ? `day ${d + 1} ${hm}` : hm;
}

/**
 * Timeline tab: simulate the saved network (its outlet flows follow the saved budget) over a day,
 * three days or a week at a chosen step, in a worker with progress and Cancel; plot tank levels
 * and bank volume, the pump with its sun factor, and an outlet's delivered against requested flow,
 * with events marked on the plots and listed; each bank's equalisation time after a fill; PNG and
 * CSV export.
 */
@Component({
  selector: 'rn-timeline-screen',
  imports: [
    FormsModule,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    MatProgressBarModule,
    LineChart,
    QuantityPipe,
  ],
  templateUrl: './timeline-screen.html',
  styleUrl: './timeline-screen.scss',
})
export class TimelineScreen {
  private readonly api = inject(BudgetService);
  protected readonly context = inject(ProjectContext);
  readonly projectId = input.required<string>();

  protected readonly units = this.context.units;
  protected readonly network = rxResource({ params: () => this.projectId(), stream: ({ params }) => this.api.network(params) });
  protected readonly loadError = loadErrorText([this.network]);
  protected readonly run = new TimelineRun();
  protected readonly days = signal(7);
  protected readonly stepMin = signal(10);
  protected readonly stepError = computed(() => {
    const s = this.stepMin();
    return Number.isFinite(s) && s >= 1 && s <= 60 ? null : 'step: give whole minutes from 1 to 60';
  });
  protected readonly outletChoice = signal<string | null>(null);
  private readonly charts = viewChildren(LineChart);

  protected readonly clock = clock;

  constructor() {
    inject(DestroyRef).onDestroy(() => this.run.cancel());
    // The tab opens on a week of the saved design (a second or less in the worker), so an owner
    // glancing at it sees the tanks rather than an empty page; Run again after changing the span or step.
    let opened = false;
    effect(() => {
      if (opened || !this.network.hasValue() || this.network.value().document.nodes.length === 0) return;
      opened = true;
      untracked(() => this.start());
    });
  }

  protected readonly names = computed(
    () =>
      new Map(
        (this.network.hasValue() ? [...this.network.value().document.nodes, ...this.network.value().document.links] : []).map((e) => [e.id, e.name || e.id]),
      ),
  );
  protected readonly outlets = computed(() => Object.keys(this.run.result()?.series.outlets ?? {}).map((id) => ({ id, name: this.names().get(id) ?? id })));
  protected readonly outlet = computed(() => {
    const r = this.run.result();
    if (!r) return null;
    const chosen = this.outletChoice();
    if (chosen && r.series.outlets[chosen]) return chosen;
    return r.events.find((e) => e.kind === 'outlet-short')?.element ?? Object.keys(r.series.outlets)[0] ?? null;
  });

  protected start(): void {
    if (!this.network.hasValue() || this.stepError()) return;
    this.run.start(this.network.value().document, this.days() * 86400, Math.round(this.stepMin()) * 60);
  }

  private x = computed(() => (this.run.result()?.series.times_s ?? []).map((t) => t / 3600));
  private readonly xFormat = (h: number): string => clock(h * 3600);

  private conv(q: Quantity, values: number[]): number[] {
    const u = this.units();
    return values.map((v) => toDisplay(q, v, u));
  }

  private fmt(q: Quantity, digits?: number): (v: number) => string {
    const u = this.units();
    // chart values are in display units already: back to SI for the one formatter
    return (v) => formatQuantity(q, fromDisplay(q, v, u), u, digits);
  }

  private marks(kinds: TimelineEvent['kind'][]): ChartMark[] {
    return (this.run.result()?.events ?? [])
      .filter((e) => kinds.includes(e.kind))
      .slice(0, 60)
      .map((e) => ({ x: e.time_s / 3600, colour: EVENT_COLOURS[e.kind] }));
  }

  protected readonly tankChart = computed<ChartSpec | null>(() => {
    const r = this.run.result();
    if (!r) return null;
    const tanks = Object.entries(r.series.tanks);
    return {
      x: this.x(),
      xLabel: 'time',
      xFormat: this.xFormat,
      xIncrs: HOUR_STEPS,
      yLabel: `level (${label('head', this.units())})`,
      y2Label: `stored (${label('volume', this.units())})`,
      series: [
        ...tanks.map(([id, t], i) => ({
          label: `${this.names().get(id) ?? id} level`,
          values: this.conv('head', t.level_m),
          colour: COLOURS[i % COLOURS.length],
          format: this.fmt('head', 2),
        })),
        {
          label: 'Bank volume',
          values: this.conv('volume', r.series.bank_volume_m3),
          colour: '#8a8f94',
          dash: [5, 4],
          scale: 'y2' as const,
          format: this.fmt('volume'),
        },
      ],
      marks: this.marks(['tank-low', 'tank-empty', 'overflow', 'low-cutoff']),
    };
  });

  protected readonly pumpChart = computed<ChartSpec | null>(() => {
    const r = this.run.result();
    if (!r) return null;
    const pumps = Object.entries(r.series.pumps);
    return {
      x: this.x(),
      xLabel: 'time',
      xFormat: this.xFormat,
      xIncrs: HOUR_STEPS,
      yLabel: `flow (${label('flow', this.units())})`,
      y2Label: 'sun (0–1)',
      series: [
        ...pumps.map(([id, p], i) => ({
          label: `${this.names().get(id) ?? id} flow`,
          values: this.conv(
            'flow',
            p.flow_m3s.map((q) => Math.max(q, 0)),
          ),
          colour: COLOURS[(i + 1) % COLOURS.length],
          stepped: true,
          format: this.fmt('flow'),
        })),
        ...pumps.map(([id, p]) => ({
          label: `${this.names().get(id) ?? id} sun`,
          values: p.sun,
          colour: '#e0a800',
          scale: 'y2' as const,
          dash: [3, 3],
          stepped: true,
          format: (v: number) => `${Math.round(v * 100)} %`,
        })),
      ],
      marks: this.marks(['pump-start', 'pump-stop', 'low-cutoff']),
    };
  });

  protected readonly outletChart = computed<ChartSpec | null>(() => {
    const r = this.run.result();
    const id = this.outlet();
    if (!r || !id) return null;
    const o = r.series.outlets[id];
    return {
      x: this.x(),
      xLabel: 'time',
      xFormat: this.xFormat,
      xIncrs: HOUR_STEPS,
      yLabel: `flow (${label('flow', this.units())})`,
      series: [
        { label: 'requested', values: this.conv('flow', o.requested_m3s), colour: '#8a8f94', dash: [5, 4], stepped: true, format: this.fmt('flow') },
        { label: 'delivered', values: this.conv('flow', o.delivered_m3s), colour: '#17677a', format: this.fmt('flow') },
      ],
      marks: (r.events ?? [])
        .filter((e) => e.element === id && e.kind === 'outlet-short')
        .slice(0, 60)
        .map((e) => ({ x: e.time_s / 3600, colour: EVENT_COLOURS[e.kind] })),
    };
  });

  protected readonly lowest = computed(() =>
    Object.entries(this.run.result()?.summary.tanks ?? {}).map(([id, t]) => ({ id, name: this.names().get(id) ?? id, ...t })),
  );
  protected readonly pumped = computed(() =>
    Object.entries(this.run.result()?.summary.pumps ?? {}).map(([id, p]) => ({ id, name: this.names().get(id) ?? id, ...p })),
  );

  protected exportCsv(): void {
    const r = this.run.result();
    if (r) downloadText(timelineCsv(r.series), `timeline-${this.days()}d.csv`, 'text/csv');
  }

  protected exportPng(index: number, name: string): void {
    const url = this.charts()[index]?.png();
    if (url) downloadDataUrl(url, `timeline-${name}.png`);
  }

  protected eventColour(e: TimelineEvent): string {
    return EVENT_COLOURS[e.kind];
  }
}

const label = unitLabel;
