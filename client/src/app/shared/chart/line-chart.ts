import { ChangeDetectionStrategy, Component, DestroyRef, ElementRef, ViewEncapsulation, effect, inject, input, signal, viewChild } from '@angular/core';
import type uPlot from 'uplot';

/**
 * A line chart over uPlot (small and fast; loaded on first use, so it rides in the lazy chunk of
 * the screen that shows it). Up to two y scales (left 'y', right 'y2'), shaded x-bands and
 * vertical marks drawn under the lines, a hover legend whose values carry their units, and PNG
 * export of the plot. Series values are already in display units; `format` adds the unit.
 *
 * @example
 * <rn-line-chart [spec]="{ x, xLabel: 'hours', xFormat, series: [{ label: 'T1 level', values, colour: '#17677a', format }] }" />
 */

export interface ChartSeries {
  label: string;
  values: (number | null)[];
  colour: string;
  /** Value with its unit for the hover legend and axis ticks. */
  format: (v: number) => string;
  scale?: 'y' | 'y2';
  dash?: number[];
  width?: number;
  /** Fill under the line (e.g. the ground). */
  fill?: string;
  /** Draw as steps (pump on/off). */
  stepped?: boolean;
}

export interface ChartBand {
  from: number;
  to: number;
  colour: string;
}
export interface ChartMark {
  x: number;
  colour: string;
  label?: string;
}

export interface ChartSpec {
  x: number[];
  xLabel: string;
  xFormat: (v: number) => string;
  /** Tick steps to choose from on the x axis (e.g. hours 1, 2, 3, 6, 12, 24). */
  xIncrs?: number[];
  series: ChartSeries[];
  yLabel?: string;
  y2Label?: string;
  bands?: ChartBand[];
  marks?: ChartMark[];
}

@Component({
  selector: 'rn-line-chart',
  changeDetection: ChangeDetectionStrategy.OnPush,
  // uPlot's own stylesheet styles elements it creates, outside Angular's encapsulation
  encapsulation: ViewEncapsulation.None,
  styleUrl: '../../../../../node_modules/uplot/dist/uPlot.min.css',
  template: `<div class="rn-chart" #host [style.height.px]="height()" [attr.data-points]="points()"></div>`,
  styles: `
    .rn-chart {
      width: 100%;
      position: relative;
    }
    .rn-chart .u-legend {
      font: var(--mat-sys-body-small);
      text-align: left;
    }
    .rn-chart .u-legend .u-series > * {
      padding: 1px 3px;
    }
  `,
})
export class LineChart {
  readonly spec = input.required<ChartSpec>();
  readonly height = input(260);
  /** Points drawn per series (for tests and the benchmark). */
  readonly points = signal(0);

  private readonly host = viewChild.required<ElementRef<HTMLDivElement>>('host');
  private plot: uPlot | null = null;
  private lib: typeof uPlot | null = null;

  constructor() {
    const destroyRef = inject(DestroyRef);
    const observer = typeof ResizeObserver !== 'undefined' ? new ResizeObserver(() => this.resize()) : null;
    effect(() => {
      const spec = this.spec();
      const el = this.host().nativeElement;
      const height = this.height();
      void this.draw(el, spec, height);
      observer?.observe(el);
    });
    destroyRef.onDestroy(() => {
      observer?.disconnect();
      this.plot?.destroy();
    });
  }

  /** The plot as a PNG data URL on a white ground (null before the first draw). */
  png(): string | null {
    const canvas = this.plot?.ctx.canvas;
    if (!canvas) return null;
    const out = document.createElement('canvas');
    out.width = canvas.width;
    out.height = canvas.height;
    const ctx = out.getContext('2d');
    if (!ctx) return null;
    ctx.fillStyle = '#ffffff';
    ctx.fillRect(0, 0, out.width, out.height);
    ctx.drawImage(canvas, 0, 0);
    return out.toDataURL('image/png');
  }

  private async draw(el: HTMLDivElement, spec: ChartSpec, height: number): Promise<void> {
    this.lib ??= (await import('uplot')).default;
    const U = this.lib;
    this.plot?.destroy();
    const legendRows = 40;
    const opts: uPlot.Options = {
      width: Math.max(el.clientWidth, 240),
      height: Math.max(height - legendRows, 120),
      cursor: { drag: { x: true, y: false } },
      scales: { x: { time: false } },
      legend: { live: true },
      axes: [
        {
          label: spec.xLabel,
          values: (_u, ticks) => ticks.map((t) => spec.xFormat(t)),
          size: 36,
          labelSize: 18,
          space: 84,
          ...(spec.xIncrs ? { incrs: spec.xIncrs } : {}),
        },
        { label: spec.yLabel, scale: 'y', size: 64, labelSize: 18, values: (_u, ticks) => ticks.map((t) => trim(t)) },
        ...(spec.series.some((s) => s.scale === 'y2')
          ? [
              {
                label: spec.y2Label,
                scale: 'y2',
                side: 1 as const,
                grid: { show: false },
                size: 64,
                labelSize: 18,
                values: (_u: uPlot, ticks: number[]) => ticks.map((t) => trim(t)),
              },
            ]
          : []),
      ],
      series: [
        { label: spec.xLabel, value: (_u, v) => (v === null || v === undefined ? '—' : spec.xFormat(v)) },
        ...spec.series.map((s): uPlot.Series => ({
          label: s.label,
          stroke: s.colour,
          width: s.width ?? 1.6,
          dash: s.dash,
          fill: s.fill,
          scale: s.scale ?? 'y',
          spanGaps: false,
          paths: s.stepped ? U.paths.stepped?.({ align: 1 }) : undefined,
          value: (_u, v) => (v === null || v === undefined ? '—' : s.format(v)),
          points: { show: false },
        })),
      ],
      hooks: { drawClear: [(u) => this.underlay(u, spec)] },
    };
    const data: uPlot.AlignedData = [spec.x, ...spec.series.map((s) => s.values)];
    this.plot = new U(opts, data, el);
    this.points.set(spec.x.length);
  }

  /** Bands and marks behind the lines. */
  private underlay(u: uPlot, spec: ChartSpec): void {
    const ctx = u.ctx;
    const { top, height } = u.bbox;
    ctx.save();
    for (const b of spec.bands ?? []) {
      const x0 = u.valToPos(b.from, 'x', true);
      const x1 = u.valToPos(b.to, 'x', true);
      ctx.fillStyle = b.colour;
      ctx.fillRect(Math.min(x0, x1), top, Math.max(Math.abs(x1 - x0), 2), height);
    }
    for (const m of spec.marks ?? []) {
      const x = u.valToPos(m.x, 'x', true);
      ctx.strokeStyle = m.colour;
      ctx.lineWidth = 1.5 * devicePixelRatio;
      ctx.setLineDash([4 * devicePixelRatio, 3 * devicePixelRatio]);
      ctx.beginPath();
      ctx.moveTo(x, top);
      ctx.lineTo(x, top + height);
      ctx.stroke();
      if (m.label) {
        ctx.setLineDash([]);
        ctx.fillStyle = m.colour;
        ctx.font = `${11 * devicePixelRatio}px 'IBM Plex Sans', sans-serif`;
        ctx.fillText(m.label, x + 3 * devicePixelRatio, top + 12 * devicePixelRatio);
      }
    }
    ctx.restore();
  }

  private resize(): void {
    const el = this.host().nativeElement;
    if (this.plot && el.clientWidth > 0 && Math.abs(this.plot.width - el.clientWidth) > 2)
      this.plot.setSize({ width: el.clientWidth, height: this.plot.height });
  }
}

function trim(v: number): string {
  return Math.abs(v) >= 100 ? v.toFixed(0) : Math.abs(v) >= 10 ? v.toFixed(1).replace(/\.0$/, '') : v.toPrecision(3).replace(/\.?0+$/, '');
}
