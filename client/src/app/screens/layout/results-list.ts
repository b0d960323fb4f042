import { ChangeDetectionStrategy, Component, computed, input, output } from '@angular/core';
import type { NetworkDocument } from '../../../../../engine/network-document';
import type { SteadyResult } from '../../../../../engine/index';
import { pressureText, unsuppliedIds } from '../../../../../engine/profile/pressure-state';
import type { ServiceStates } from '../../../../../engine/service-state';
import { formatQuantity, UnitSystem } from '../../../../../engine/units';
import { TONES } from './canvas/result-overlay';
import { BadgeTone, linkStateWords, nodeBadge, workStroke } from './editor/plan-words';
import { documentWarnings } from './editor/result-checks';
import { LINK_KINDS, NODE_KINDS } from './kinds';

interface Row {
  id: string;
  name: string;
  kind: string;
  value: string;
  state: string;
  tone: BadgeTone | null;
  warnings: string[];
}

const KEY_BADGES: { text: string; tone: BadgeTone; means: string }[] = [
  { text: 'OK', tone: 'ok', means: 'the outlet gets what its device needs, with margin' },
  { text: 'close', tone: 'close', means: 'within 10 % of what it needs' },
  { text: 'short', tone: 'short', means: 'below what it needs: it will run weak' },
  { text: 'near rating', tone: 'near-rating', means: "above 72 % of the pipe's pressure rating" },
  { text: 'over rating', tone: 'over-rating', means: "above the pipe's rating: risk of bursting" },
];
const KEY_LINES: { work: 'light' | 'working' | 'hard' | 'over' | 'idle'; means: string }[] = [
  { work: 'light', means: 'light use' },
  { work: 'working', means: 'working (40–80 % of the speed limit)' },
  { work: 'hard', means: 'near the 5 ft/s (1.5 m/s) speed limit' },
  { work: 'over', means: 'over the speed limit: surge and wear' },
  { work: 'idle', means: 'no flow' },
];

/** Live results beside the canvas: elements with warnings first, then trouble; a click selects the element. */
@Component({
  selector: 'rn-results-list',
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 class="title">
      Results
      @if (solveMs() > 0) {
        <span class="ms">solved in {{ solveMs().toFixed(0) }} ms</span>
      }
    </h2>
    @if (solveError()) {
      <p class="warn" role="alert">The live solve failed: {{ solveError() }}. Results shown are from the last good solve.</p>
    }
    @if (!results() || !doc().nodes.length) {
      <p class="empty">Results appear here as you draw.</p>
    } @else {
      <details class="key" data-testid="results-key">
        <summary>Reading the plan</summary>
        <ul>
          @for (k of keyBadges; track k.text) {
            <li>
              <span class="chip" [style.background]="tones[k.tone].fill" [style.color]="tones[k.tone].text" [style.border-color]="tones[k.tone].stroke">{{
                k.text
              }}</span>
              {{ k.means }}
            </li>
          }
          @for (k of keyLines; track k.work) {
            <li>
              <svg width="34" height="10" aria-hidden="true">
                <line
                  x1="2"
                  y1="5"
                  x2="32"
                  y2="5"
                  stroke="#24323d"
                  [attr.stroke-width]="stroke(k.work).width"
                  [attr.stroke-dasharray]="stroke(k.work).dash?.join(' ') ?? null"
                />
                @if (stroke(k.work).hatch) {
                  <line x1="2" y1="5" x2="32" y2="5" stroke="#fff" stroke-width="2" stroke-dasharray="5 4" />
                }
              </svg>
              {{ k.means }}
            </li>
          }
        </ul>
      </details>
      @if (unset().length) {
        <p class="ask" data-testid="results-unset">
          Set the elevation of {{ unset().join(', ') }} to see pressures: until every element has its ground height, pressures would be guesses.
        </p>
      }
      @for (m of general(); track $index) {
        <p class="warn" data-testid="results-general-warning">{{ m }}</p>
      }
      @if (!results()!.converged && rows().length) {
        <p class="warn">The solver did not converge; values are provisional.</p>
      }
      <ul data-testid="results-list">
        @for (r of rows(); track r.id) {
          <li>
            <button type="button" (click)="pick.emit(r.id)" [class.selected]="selected().includes(r.id)" [attr.data-testid]="'result-' + r.id">
              <span class="name">{{ r.name }}</span>
              <span class="value">{{ r.value }}</span>
              @if (r.state) {
                <span
                  class="state"
                  [attr.data-tone]="r.tone"
                  [style.background]="r.tone ? tones[r.tone].fill : null"
                  [style.color]="r.tone ? tones[r.tone].text : null"
                  [style.border-color]="r.tone ? tones[r.tone].stroke : null"
                  >{{ r.state }}</span
                >
              }
              @for (w of r.warnings; track $index) {
                <span class="w">⚠ {{ w }}</span>
              }
            </button>
          </li>
        }
      </ul>
    }
  `,
  styles: `
    :host {
      display: block;
      padding: 8px 14px 16px;
    }
    .title {
      font-size: 15px;
      font-weight: 600;
      margin: 4px 0 6px;
    }
    .ms {
      font-weight: 400;
      font-size: 12px;
      color: #5b6770;
      margin-left: 6px;
    }
    .empty {
      color: #5b6770;
      font-size: 13px;
    }
    .warn {
      color: #8a1c14;
      font-size: 13px;
    }
    .ask {
      color: #0f4c8a;
      background: #eef5fc;
      border: 1px dashed #1769c2;
      border-radius: 6px;
      padding: 6px 8px;
      font-size: 13px;
    }
    .key {
      font-size: 12px;
      color: #3d4b55;
      margin-bottom: 6px;
    }
    .key summary {
      cursor: pointer;
      color: #1769c2;
    }
    .key ul {
      margin: 4px 0 0;
    }
    .key li {
      display: flex;
      align-items: center;
      gap: 6px;
      padding: 2px 0;
    }
    .chip {
      border: 1px solid;
      border-radius: 8px;
      padding: 0 6px;
      font-weight: 600;
      font-size: 11px;
      white-space: nowrap;
    }
    ul {
      list-style: none;
      margin: 0;
      padding: 0;
    }
    button {
      all: unset;
      box-sizing: border-box;
      cursor: pointer;
      width: 100%;
      display: grid;
      grid-template-columns: minmax(0, 1fr) auto auto;
      gap: 1px 6px;
      align-items: center;
      padding: 2px 6px;
      border-radius: 6px;
      font-size: 13px;
      line-height: 18px;
    }
    .name {
      overflow: hidden;
      text-overflow: ellipsis;
      white-space: nowrap;
    }
    button:hover {
      background: #eef1f4;
    }
    button:focus-visible {
      outline: 2px solid #1769c2;
    }
    button.selected {
      background: #e3eefa;
    }
    .value {
      grid-column: 3;
      font-variant-numeric: tabular-nums;
      color: #24323d;
      text-align: right;
      white-space: nowrap;
    }
    .state {
      grid-column: 2;
      grid-row: 1;
      font-size: 11px;
      line-height: 15px;
      font-weight: 600;
      border: 1px solid #c5ccd2;
      border-radius: 8px;
      padding: 0 5px;
      color: #3d4b55;
      white-space: nowrap;
    }
    .w {
      grid-column: 1 / 4;
      color: #8a1c14;
      font-size: 12px;
    }
  `,
})
export class ResultsList {
  readonly doc = input.required<NetworkDocument>();
  readonly results = input<SteadyResult | null>(null);
  readonly service = input<ServiceStates | null>(null);
  /** Names of elements with no elevation yet: their pressures (and everyone's) wait for them. */
  readonly unset = input<string[]>([]);
  readonly warnings = input<Map<string, string[]>>(new Map());
  readonly units = input<UnitSystem>('us');
  readonly selected = input<string[]>([]);
  readonly solveMs = input(0);
  readonly solveError = input<string | null>(null);
  readonly pick = output<string>();

  readonly tones = TONES;
  readonly keyBadges = KEY_BADGES;
  readonly keyLines = KEY_LINES;
  readonly stroke = workStroke;
  readonly general = computed(() => documentWarnings(this.results(), this.doc()));

  readonly rows = computed<Row[]>(() => {
    const res = this.results();
    if (!res) return [];
    const u = this.units();
    const warn = this.warnings();
    const svc = this.service();
    const cutOff = unsuppliedIds(res);
    const rows: Row[] = [];
    for (const n of this.doc().nodes) {
      const r = res.nodes[n.id];
      if (!r) continue;
      const badge = nodeBadge(n, svc?.nodes[n.id], u);
      const value = this.unset().length
        ? '—'
        : n.kind === 'tank' && badge
          ? badge.text
          : cutOff.has(n.id)
            ? 'no supply'
            : // No honest number for a column that separates: words instead (engine/profile/pressure-state).
              NODE_KINDS[n.kind].showsPressure
              ? pressureText(r.pressure_m, true, (p) => formatQuantity('pressure', p, u))
              : formatQuantity('head', r.head_m, u) + ' head';
      const state = badge && n.kind !== 'tank' ? badge.text : '';
      rows.push({ id: n.id, name: n.name || n.id, kind: n.kind, value, state, tone: state ? badge!.tone : null, warnings: warn.get(n.id) ?? [] });
    }
    for (const l of this.doc().links) {
      const r = res.links[l.id];
      if (!r) continue;
      const flow = formatQuantity('flow', Math.abs(r.flow_m3s), u);
      const value = LINK_KINDS[l.kind].resultText(
        flow,
        formatQuantity('velocity', Math.abs(r.velocity_ms), u),
        formatQuantity('head', Math.max(0, -r.headloss_m), u),
      );
      const s = svc?.links[l.id];
      const tone: BadgeTone | null = r.status === 'check-closed' ? 'quiet' : s?.work === 'over' ? 'short' : s?.work === 'hard' ? 'close' : null;
      const state = tone === 'close' ? 'working hard' : tone === 'short' ? 'too fast' : linkStateWords(l, r.status, s);
      // Only what deserves a look: a shut or check-held line, a pipe working hard or too hard.
      const shown = tone !== null || r.status === 'closed';
      rows.push({ id: l.id, name: l.name || l.id, kind: l.kind, value, state: shown ? state : '', tone, warnings: warn.get(l.id) ?? [] });
    }
    // Warned first, then trouble (short, over rating), then the rest in document order.
    const rank = (r: Row) =>
      r.warnings.length ? 0 : r.tone === 'short' || r.tone === 'over-rating' ? 1 : r.tone === 'near-rating' || r.tone === 'close' ? 2 : 3;
    return rows
      .map((r, i) => ({ r, i }))
      .sort((a, b) => rank(a.r) - rank(b.r) || a.i - b.i)
      .map((x) => x.r);
  });
}
