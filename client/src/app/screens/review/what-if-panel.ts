import { ChangeDetectionStrategy, Component, inject, input, OnDestroy, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { firstValueFrom } from 'rxjs';
import type { NetworkDocument } from '../../../../../engine/network-document';
import type { OutletHit, WhatIfResult, WhatIfTable } from '../../../../../engine/review/what-ifs';
import { formatQuantity, type UnitSystem } from '../../../../../engine/units';
import { ReviewApi } from './review-api.service';
import { ReviewEngine } from './review-engine';

const KIND_TEXT: Record<string, string> = {
  'pipe-broken': 'Pipe broken',
  'valve-stuck-shut': 'Valve stuck shut',
  'tank-out': 'Tank out of service',
  'fill-off': 'Fill pump off',
};

/**
 * What-if failures: one click runs every single failure in the review worker and lists, per
 * failure, the outlets that go short and by how much; a reviewer can add a result to the review
 * as a comment pinned to the failed element.
 */
@Component({
  selector: 'rn-what-if-panel',
  imports: [MatButtonModule, MatProgressBarModule, MatTableModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="rn-whatif-bar">
      <button mat-flat-button type="button" (click)="run()" [disabled]="running()" data-testid="whatif-run">Run every single failure</button>
      @if (ms() !== null) {
        <span class="rn-muted rn-small" data-testid="whatif-time">{{ table()?.results?.length }} failures in {{ ms()!.toFixed(0) }} ms</span>
      }
    </div>
    @if (running()) {
      <mat-progress-bar mode="indeterminate" aria-label="Running failures" />
    }
    @if (error()) {
      <p role="alert" class="rn-error">{{ error() }}</p>
    }
    @if (table(); as t) {
      <div class="rn-checklist-scroll">
        <table mat-table [dataSource]="t.results" class="rn-whatifs" data-testid="whatif-table">
          <ng-container matColumnDef="failure">
            <th mat-header-cell *matHeaderCellDef>Failure</th>
            <td mat-cell *matCellDef="let r">{{ failure(r) }}</td>
          </ng-container>
          <ng-container matColumnDef="hit">
            <th mat-header-cell *matHeaderCellDef class="rn-num">Outlets short</th>
            <td mat-cell *matCellDef="let r" class="rn-num">
              <strong>{{ r.hit.length }}</strong>
            </td>
          </ng-container>
          <ng-container matColumnDef="outlets">
            <th mat-header-cell *matHeaderCellDef>Which and by how much</th>
            <td mat-cell *matCellDef="let r" class="rn-small">
              @for (h of r.hit; track h.outlet) {
                <div>{{ hitText(h) }}</div>
              }
              @if (r.unaffected.length) {
                <div class="rn-muted">unaffected: {{ r.unaffected.join(', ') }}</div>
              }
            </td>
          </ng-container>
          <ng-container matColumnDef="add">
            <th mat-header-cell *matHeaderCellDef></th>
            <td mat-cell *matCellDef="let r">
              @if (canComment() && r.hit.length) {
                <button mat-button type="button" (click)="addToReview(r)" [disabled]="added().has(r.scenario.key)" data-testid="whatif-add">
                  {{ added().has(r.scenario.key) ? 'Added' : 'Add to review' }}
                </button>
              }
            </td>
          </ng-container>
          <tr mat-header-row *matHeaderRowDef="columns"></tr>
          <tr mat-row *matRowDef="let r; columns: columns" [attr.data-testid]="'whatif-' + r.scenario.key"></tr>
        </table>
      </div>
    }
  `,
  styleUrl: './review-screen.scss',
})
export class WhatIfPanel implements OnDestroy {
  private readonly api = inject(ReviewApi);
  private readonly engine = new ReviewEngine();
  readonly projectId = input.required<string>();
  readonly version = input.required<number>();
  readonly document = input.required<NetworkDocument | null>();
  readonly units = input<UnitSystem>('us');
  readonly canComment = input(false);

  readonly columns = ['failure', 'hit', 'outlets', 'add'];
  readonly table = signal<WhatIfTable | null>(null);
  readonly ms = signal<number | null>(null);
  readonly running = signal(false);
  readonly error = signal('');
  readonly added = signal(new Set<string>());

  async run(): Promise<void> {
    const doc = this.document();
    if (!doc) return;
    this.running.set(true);
    this.error.set('');
    try {
      const { table, ms } = await this.engine.whatIfs(doc);
      this.table.set(table);
      this.ms.set(ms);
    } catch (e) {
      this.error.set(`The what-ifs could not run: ${e instanceof Error ? e.message : String(e)}`);
    } finally {
      this.running.set(false);
    }
  }

  failure(r: WhatIfResult): string {
    const s = r.scenario;
    const what = KIND_TEXT[s.kind] ?? s.kind;
    return s.kind === 'fill-off'
      ? `${what} ${s.days} day${s.days === 1 ? '' : 's'} (${s.element})`
      : `${what}: ${s.element}${s.elementName ? ` (${s.elementName})` : ''}`;
  }

  hitText(h: OutletHit): string {
    const u = this.units();
    const who = `${h.outlet}${h.name ? ` ${h.name}` : ''}`;
    if (h.noSupply) return `${who}: no supply`;
    if (h.unmet_m3 !== undefined) return `${who}: ${formatQuantity('volume', h.unmet_m3, u)} short (${(100 * h.lostShare).toFixed(0)} % of its need)`;
    const parts: string[] = [];
    if (h.pressureShort_m) parts.push(`${formatQuantity('pressure', h.pressureShort_m, u)} below its need`);
    if (h.deliveryShort_m3s) parts.push(`${formatQuantity('flow', h.deliveryShort_m3s, u)} short (${(100 * h.lostShare).toFixed(0)} %)`);
    return `${who}: ${parts.join(', ')}`;
  }

  async addToReview(r: WhatIfResult): Promise<void> {
    const body = `What-if — ${this.failure(r)}: ${r.hit.map((h) => this.hitText(h)).join('; ')}.`;
    await firstValueFrom(this.api.comment(this.projectId(), { version: this.version(), element: r.scenario.element, body }));
    this.added.update((s) => new Set(s).add(r.scenario.key));
  }

  ngOnDestroy(): void {
    this.engine.dispose();
  }
}
