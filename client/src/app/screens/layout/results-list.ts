import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import type { NetworkDocument } from '../../../../../engine/network-document';
import type { SteadyResult } from '../../../../../engine/index';
import { pressureText, unsuppliedIds } from '../../../../../engine/profile/pressure-state';
import { formatQuantity, UnitSystem } from '../../../../../engine/units';
import { marginColour } from './editor/colour-scale';
import { documentWarnings } from './editor/result-checks';

interface Row { id: string; name: string; kind: string; value: string; colour: string | null; warnings: string[] }

/** Live results beside the canvas: elements with warnings first; a click selects the element. */
@Component({
  selector: 'rn-results-list',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 class="title">Results @if (solveMs() > 0) { <span class="ms">solved in {{ solveMs().toFixed(0) }} ms</span> }</h2>
    @if (solveError()) { <p class="warn" role="alert">The live solve failed: {{ solveError() }}. Results shown are from the last good solve.</p> }
    @if (!results() || !doc().nodes.length) {
      <p class="empty">Results appear here as you draw.</p>
    } @else {
      @for (m of general(); track $index) { <p class="warn" data-testid="results-general-warning">{{ m }}</p> }
      @if (!results()!.converged && rows().length) { <p class="warn">The solver did not converge; values are provisional.</p> }
      <ul data-testid="results-list">
        @for (r of rows(); track r.id) {
          <li>
            <button type="button" (click)="pick.emit(r.id)" [class.selected]="selected().includes(r.id)" [attr.data-testid]="'result-' + r.id">
              @if (r.colour) { <span class="swatch" [style.background]="r.colour"></span> } @else { <span class="swatch none"></span> }
              <span class="name">{{ r.name }}</span>
              <span class="value">{{ r.value }}</span>
              @for (w of r.warnings; track $index) { <span class="w">⚠ {{ w }}</span> }
            </button>
          </li>
        }
      </ul>
    }
  `,
  styles: `
    :host { display: block; padding: 8px 14px 16px; }
    .title { font-size: 15px; font-weight: 600; margin: 4px 0 8px; }
    .ms { font-weight: 400; font-size: 12px; color: #5b6770; margin-left: 6px; }
    .empty { color: #5b6770; font-size: 13px; }
    .warn { color: #8a1c14; font-size: 13px; }
    ul { list-style: none; margin: 0; padding: 0; }
    button { all: unset; box-sizing: border-box; cursor: pointer; width: 100%; display: grid; grid-template-columns: 12px 1fr auto; gap: 2px 8px;
      align-items: center; padding: 5px 6px; border-radius: 6px; font-size: 13px; }
    button:hover { background: #eef1f4; }
    button:focus-visible { outline: 2px solid #1769c2; }
    button.selected { background: #e3eefa; }
    .swatch { width: 12px; height: 12px; border-radius: 50%; }
    .swatch.none { border: 1px solid #c5ccd2; width: 10px; height: 10px; }
    .value { font-variant-numeric: tabular-nums; color: #24323d; }
    .w { grid-column: 2 / 4; color: #8a1c14; font-size: 12px; }
  `,
})
export class ResultsList {
  readonly doc = input.required<NetworkDocument>();
  readonly results = input<SteadyResult | null>(null);
  readonly warnings = input<Map<string, string[]>>(new Map());
  readonly units = input<UnitSystem>('us');
  readonly selected = input<string[]>([]);
  readonly solveMs = input(0);
  readonly solveError = input<string | null>(null);
  readonly pick = output<string>();

  readonly general = computed(() => documentWarnings(this.results()));

  readonly rows = computed<Row[]>(() => {
    const res = this.results();
    if (!res) return [];
    const u = this.units();
    const warn = this.warnings();
    const cutOff = unsuppliedIds(res);
    const rows: Row[] = [];
    for (const n of this.doc().nodes) {
      const r = res.nodes[n.id];
      if (!r) continue;
      const min = n.kind === 'outlet' ? (n.min_pressure_m ?? 0) : 0;
      const showsPressure = n.kind === 'outlet' || n.kind === 'tee';
      rows.push({
        id: n.id, name: n.name || n.id, kind: n.kind,
        value: cutOff.has(n.id) ? 'no supply'
          : showsPressure ? pressureText(r.pressure_m, true, (p) => formatQuantity('pressure', p, u)) : formatQuantity('head', r.head_m, u) + ' head',
        colour: showsPressure && !cutOff.has(n.id) ? marginColour(r.pressure_m - min) : null, warnings: warn.get(n.id) ?? [],
      });
    }
    for (const l of this.doc().links) {
      const r = res.links[l.id];
      if (!r) continue;
      rows.push({
        id: l.id, name: l.name || l.id, kind: l.kind,
        // A pump has no bore of its own: show the head it adds (headloss is from-minus-to head) instead of a velocity.
        value: l.kind === 'pump'
          ? `${formatQuantity('flow', Math.abs(r.flow_m3s), u)} · +${formatQuantity('head', Math.max(0, -r.headloss_m), u)} head`
          : `${formatQuantity('flow', Math.abs(r.flow_m3s), u)} · ${formatQuantity('velocity', Math.abs(r.velocity_ms), u)}`,
        colour: null, warnings: warn.get(l.id) ?? [],
      });
    }
    return rows.sort((a, b) => Number(b.warnings.length > 0) - Number(a.warnings.length > 0));
  });
}
