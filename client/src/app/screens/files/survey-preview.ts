import { ChangeDetectionStrategy, Component, computed, input } from '@angular/core';
import type { ParsedSurveyPoint } from '../../../../../engine/survey-point';
import type { UnitSystem } from '../../../../../engine/units';
import { QuantityPipe } from '../../shared/quantity.pipe';
import { toLocalPoints } from '../layout/editor/survey';

const W = 320;
const H = 200;
const PAD = 14;
/** Rows shown in the table; the rest are counted. */
const ROWS = 25;

/**
 * A survey file at a glance: its points on a small north-up plan (site metres, GPX projected about
 * its first point as the Layout does) and a table of names and ground elevations.
 */
@Component({
  selector: 'rn-survey-preview',
  imports: [QuantityPipe],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <p class="summary" data-testid="survey-summary">
      {{ local().length }} {{ local().length === 1 ? 'point' : 'points' }}
      @if (local().length) {
        · ground {{ range().low | quantity: 'elevation' : units() }} to {{ range().high | quantity: 'elevation' : units() }} · spread
        {{ range().width | quantity: 'length' : units() }} × {{ range().height | quantity: 'length' : units() }}
      }
    </p>
    @if (local().length) {
      <svg
        [attr.viewBox]="'0 0 ' + w + ' ' + h"
        class="plan"
        role="img"
        data-testid="survey-plan"
        [attr.aria-label]="'Plan of ' + local().length + ' survey points'"
      >
        <rect x="0.5" y="0.5" [attr.width]="w - 1" [attr.height]="h - 1" rx="4" class="frame" />
        @for (p of dots(); track $index) {
          <g [attr.transform]="'translate(' + p.x + ',' + p.y + ')'">
            <path d="M-3.5,0 H3.5 M0,-3.5 V3.5" class="peg" />
            @if (p.label) {
              <text x="5" y="-4" class="name">{{ p.label }}</text>
            }
          </g>
        }
        <g [attr.transform]="'translate(' + (w - 18) + ',18)'" class="north">
          <path d="M0,-9 L4,3 L0,0 L-4,3 Z" />
          <text y="13">N</text>
        </g>
      </svg>
      <div class="table-wrap">
        <table data-testid="survey-table">
          <thead>
            <tr>
              <th>Point</th>
              <th>Ground</th>
              <th>East</th>
              <th>North</th>
            </tr>
          </thead>
          <tbody>
            @for (p of local().slice(0, rows); track $index) {
              <tr>
                <td>{{ p.label || '—' }}</td>
                <td>{{ p.elevation_m | quantity: 'elevation' : units() }}</td>
                <td>{{ p.x_m | quantity: 'length' : units() }}</td>
                <td>{{ p.y_m | quantity: 'length' : units() }}</td>
              </tr>
            }
          </tbody>
        </table>
        @if (local().length > rows) {
          <p class="more">and {{ local().length - rows }} more in the file</p>
        }
      </div>
      @if (geographic()) {
        <p class="note">Positions from GPS latitude and longitude, measured from the first point.</p>
      }
    }
  `,
  styles: `
    :host {
      display: block;
    }
    .summary {
      margin: 0 0 8px;
    }
    .plan {
      width: 100%;
      max-width: 480px;
      height: auto;
      display: block;
      background: #fbfcfd;
    }
    .frame {
      fill: none;
      stroke: #c5ccd3;
    }
    .peg {
      stroke: #1d2a36;
      stroke-width: 1.6;
    }
    .name {
      font:
        10px system-ui,
        sans-serif;
      fill: #33414e;
      paint-order: stroke;
      stroke: #fbfcfd;
      stroke-width: 3px;
    }
    .north path {
      fill: #33414e;
    }
    .north text {
      font:
        9px system-ui,
        sans-serif;
      text-anchor: middle;
      fill: #33414e;
    }
    .table-wrap {
      overflow-x: auto;
      margin-top: 8px;
    }
    table {
      border-collapse: collapse;
      font-size: 13px;
      width: 100%;
    }
    th,
    td {
      text-align: left;
      padding: 4px 8px 4px 0;
      border-bottom: 1px solid #e3e7eb;
      white-space: nowrap;
    }
    th {
      font-weight: 600;
    }
    td:not(:first-child),
    th:not(:first-child) {
      text-align: right;
    }
    .more,
    .note {
      color: #56636f;
      font-size: 12px;
      margin: 6px 0 0;
    }
  `,
})
export class SurveyPreview {
  readonly points = input.required<ParsedSurveyPoint[]>();
  readonly units = input<UnitSystem>('us');
  readonly w = W;
  readonly h = H;
  readonly rows = ROWS;

  readonly local = computed(() => toLocalPoints(this.points()));
  readonly geographic = computed(() => this.points().some((p) => p.lat !== undefined && p.x_m === undefined));

  readonly range = computed(() => {
    const pts = this.local();
    const xs = pts.map((p) => p.x_m);
    const ys = pts.map((p) => p.y_m);
    const zs = pts.map((p) => p.elevation_m);
    return {
      low: Math.min(...zs),
      high: Math.max(...zs),
      x0: Math.min(...xs),
      y0: Math.min(...ys),
      width: Math.max(...xs) - Math.min(...xs),
      height: Math.max(...ys) - Math.min(...ys),
    };
  });

  /** Points scaled to fit the frame at one scale for both axes (so the plan keeps its shape), y up. */
  readonly dots = computed(() => {
    const r = this.range();
    const scale = Math.min((W - 2 * PAD - 60) / Math.max(r.width, 1e-6), (H - 2 * PAD) / Math.max(r.height, 1e-6));
    const s = Number.isFinite(scale) ? scale : 1;
    const ox = PAD + (W - 2 * PAD - 60 - r.width * s) / 2;
    const oy = H - PAD - (H - 2 * PAD - r.height * s) / 2;
    // Names only while they can be read: at most a dozen.
    const named = this.local().length <= 12;
    return this.local().map((p) => ({ x: ox + (p.x_m - r.x0) * s, y: oy - (p.y_m - r.y0) * s, label: named ? p.label : undefined }));
  });
}
