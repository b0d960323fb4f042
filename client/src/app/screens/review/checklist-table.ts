import { ChangeDetectionStrategy, Component, computed, input, output, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatSortModule, Sort } from '@angular/material/sort';
import { MatTableModule } from '@angular/material/table';
import { MatTooltipModule } from '@angular/material/tooltip';
import type { CheckGroup, CheckRow, CheckStatus } from '../../../../../engine/review/types';
import type { UnitSystem } from '../../../../../engine/units';
import { formatAmount } from './amount-format';

const GROUPS: { id: CheckGroup; label: string }[] = [
  { id: 'outlets', label: 'Outlets' },
  { id: 'pipes', label: 'Pipes' },
  { id: 'profile', label: 'Profile' },
  { id: 'storage', label: 'Storage and supply' },
  { id: 'safety', label: 'Safety' },
];
const STATUS_ORDER: Record<CheckStatus, number> = { fail: 0, caution: 1, pass: 2 };

interface GroupLine {
  kind: 'group';
  group: CheckGroup;
  label: string;
  counts: Record<CheckStatus, number>;
}
interface CheckLine {
  kind: 'row';
  row: CheckRow;
}
type Line = GroupLine | CheckLine;

/**
 * The checklist as a Material table: grouped (outlets, pipes, profile, storage, safety), sortable
 * within each group, filtered by words and by verdict. A row with an element asks to select it on
 * the Layout. Below 600 px each check is a card (verdict, element and value; the check; limit and
 * margin; the source) and a picker replaces the header sort (review-screen.scss).
 */
@Component({
  selector: 'rn-checklist-table',
  imports: [FormsModule, MatButtonToggleModule, MatFormFieldModule, MatInputModule, MatSelectModule, MatSortModule, MatTableModule, MatTooltipModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="rn-checklist-filters">
      <mat-form-field appearance="outline" subscriptSizing="dynamic" class="rn-checklist-search">
        <mat-label>Filter</mat-label>
        <input matInput [ngModel]="text()" (ngModelChange)="text.set($event)" placeholder="element, check or source" data-testid="checklist-filter" />
      </mat-form-field>
      <mat-button-toggle-group [value]="status()" (change)="status.set($event.value)" aria-label="Show verdicts" hideSingleSelectionIndicator>
        <mat-button-toggle value="all" data-testid="checklist-show-all">All {{ counts().total }}</mat-button-toggle>
        <mat-button-toggle value="fail" data-testid="checklist-show-fail">Fail {{ counts().fail }}</mat-button-toggle>
        <mat-button-toggle value="caution" data-testid="checklist-show-caution">Caution {{ counts().caution }}</mat-button-toggle>
        <mat-button-toggle value="pass" data-testid="checklist-show-pass">Pass {{ counts().pass }}</mat-button-toggle>
      </mat-button-toggle-group>
      <mat-form-field appearance="outline" subscriptSizing="dynamic" class="rn-phone-only rn-checklist-sort">
        <mat-label>Sort within groups</mat-label>
        <mat-select [value]="sortKey()" (selectionChange)="sortBy($event.value)" data-testid="checklist-sort">
          @for (o of sortOptions; track o.key) {
            <mat-option [value]="o.key">{{ o.label }}</mat-option>
          }
        </mat-select>
      </mat-form-field>
    </div>
    <div class="rn-checklist-scroll">
      <table mat-table [dataSource]="lines()" matSort (matSortChange)="sort.set($event)" class="rn-checklist" data-testid="checklist-table">
        <ng-container matColumnDef="groupHeader">
          <td mat-cell *matCellDef="let l" [attr.colspan]="columns.length" class="rn-group-cell">
            <span class="rn-group-label">{{ l.label }}</span>
            <span class="rn-group-counts">
              @if (l.counts.fail) {
                <span class="rn-verdict rn-verdict-fail">{{ l.counts.fail }} fail</span>
              }
              @if (l.counts.caution) {
                <span class="rn-verdict rn-verdict-caution">{{ l.counts.caution }} caution</span>
              }
              <span class="rn-verdict rn-verdict-pass">{{ l.counts.pass }} pass</span>
            </span>
          </td>
        </ng-container>
        <ng-container matColumnDef="status">
          <th mat-header-cell *matHeaderCellDef mat-sort-header>Verdict</th>
          <td mat-cell *matCellDef="let l">
            <span class="rn-verdict" [class]="'rn-verdict rn-verdict-' + l.row.status">{{ l.row.status }}</span>
          </td>
        </ng-container>
        <ng-container matColumnDef="element">
          <th mat-header-cell *matHeaderCellDef mat-sort-header>Element</th>
          <td mat-cell *matCellDef="let l">
            @if (l.row.element) {
              <strong>{{ l.row.element }}</strong>
              @if (l.row.elementName) {
                <div class="rn-muted">{{ l.row.elementName }}</div>
              }
            } @else {
              <span class="rn-muted">whole design</span>
            }
          </td>
        </ng-container>
        <ng-container matColumnDef="check">
          <th mat-header-cell *matHeaderCellDef mat-sort-header>Check</th>
          <td mat-cell *matCellDef="let l">
            <div>{{ l.row.title }}</div>
            <div class="rn-muted rn-small">{{ l.row.note }}</div>
          </td>
        </ng-container>
        <ng-container matColumnDef="measured">
          <th mat-header-cell *matHeaderCellDef mat-sort-header>Value</th>
          <td mat-cell *matCellDef="let l" class="rn-num">{{ amount(l.row.measured) }}</td>
        </ng-container>
        <ng-container matColumnDef="limit">
          <th mat-header-cell *matHeaderCellDef>Limit</th>
          <td mat-cell *matCellDef="let l" class="rn-num" [class.rn-none]="!l.row.limit">{{ amount(l.row.limit) }}</td>
        </ng-container>
        <ng-container matColumnDef="margin">
          <th mat-header-cell *matHeaderCellDef mat-sort-header>Margin</th>
          <td mat-cell *matCellDef="let l" class="rn-num" [class.rn-none]="!l.row.margin">{{ amount(l.row.margin) }}</td>
        </ng-container>
        <ng-container matColumnDef="source">
          <th mat-header-cell *matHeaderCellDef>Rule and source</th>
          <td mat-cell *matCellDef="let l" class="rn-small">
            <div>{{ l.row.ruleText }}</div>
            <div class="rn-muted">{{ l.row.source }}</div>
          </td>
        </ng-container>
        <tr mat-header-row *matHeaderRowDef="columns; sticky: true"></tr>
        <tr mat-row *matRowDef="let l; columns: ['groupHeader']; when: isGroup" class="rn-group-row" [attr.data-testid]="'checklist-group-' + l.group"></tr>
        <tr
          mat-row
          *matRowDef="let l; columns: columns"
          class="rn-check-row"
          [class.rn-clickable]="!!l.row.element"
          [matTooltip]="l.row.source"
          matTooltipShowDelay="600"
          [attr.data-testid]="'check-' + l.row.key"
          [attr.data-status]="l.row.status"
          (click)="l.row.element && selectElement.emit(l.row.element)"
          (keydown.enter)="l.row.element && selectElement.emit(l.row.element)"
          [attr.tabindex]="l.row.element ? 0 : null"
        ></tr>
        <tr class="mat-mdc-row" *matNoDataRow>
          <td class="mat-mdc-cell rn-muted" [attr.colspan]="columns.length">No check matches the filter.</td>
        </tr>
      </table>
    </div>
  `,
  styleUrl: './review-screen.scss',
})
export class ChecklistTable {
  readonly rows = input.required<CheckRow[]>();
  readonly units = input<UnitSystem>('us');
  readonly selectElement = output<string>();

  readonly columns = ['status', 'element', 'check', 'measured', 'limit', 'margin', 'source'];
  readonly text = signal('');
  readonly status = signal<'all' | CheckStatus>('all');
  readonly sort = signal<Sort>({ active: '', direction: '' });
  /** Phones have no header row to sort by: the same sorts from a picker. */
  readonly sortOptions = [
    { key: '', label: 'As listed' },
    { key: 'status:asc', label: 'Worst verdict first' },
    { key: 'margin:asc', label: 'Smallest margin first' },
    { key: 'element:asc', label: 'Element' },
    { key: 'check:asc', label: 'Check' },
  ];
  readonly sortKey = computed(() => {
    const s = this.sort();
    return s.active && s.direction ? `${s.active}:${s.direction}` : '';
  });
  sortBy(key: string): void {
    const [active, direction] = key.split(':');
    this.sort.set({ active: active ?? '', direction: (direction ?? '') as Sort['direction'] });
  }

  readonly counts = computed(() => {
    const rows = this.rows();
    return {
      total: rows.length,
      fail: rows.filter((r) => r.status === 'fail').length,
      caution: rows.filter((r) => r.status === 'caution').length,
      pass: rows.filter((r) => r.status === 'pass').length,
    };
  });

  readonly lines = computed<Line[]>(() => {
    const words = this.text().trim().toLowerCase();
    const status = this.status();
    const shown = this.rows().filter(
      (r) =>
        (status === 'all' || r.status === status) &&
        (!words || [r.element, r.elementName, r.title, r.note, r.ruleText, r.source].some((s) => s?.toLowerCase().includes(words))),
    );
    const { active, direction } = this.sort();
    const sign = direction === 'desc' ? -1 : 1;
    const key = (r: CheckRow): string | number => {
      switch (active) {
        case 'status':
          return STATUS_ORDER[r.status];
        case 'element':
          return r.element ?? '';
        case 'check':
          return r.title;
        case 'measured':
          return r.measured?.value ?? -Infinity;
        case 'margin':
          return r.margin?.value ?? -Infinity;
        default:
          return 0;
      }
    };
    const out: Line[] = [];
    for (const g of GROUPS) {
      const all = this.rows().filter((r) => r.group === g.id);
      let rows = shown.filter((r) => r.group === g.id);
      if (!rows.length) continue;
      if (active && direction)
        rows = [...rows].sort((a, b) => {
          const x = key(a);
          const y = key(b);
          return (x < y ? -1 : x > y ? 1 : 0) * sign;
        });
      out.push({
        kind: 'group',
        group: g.id,
        label: g.label,
        counts: {
          fail: all.filter((r) => r.status === 'fail').length,
          caution: all.filter((r) => r.status === 'caution').length,
          pass: all.filter((r) => r.status === 'pass').length,
        },
      });
      for (const row of rows) out.push({ kind: 'row', row });
    }
    return out;
  });

  readonly isGroup = (_i: number, l: Line): boolean => l.kind === 'group';

  amount(a: CheckRow['measured']): string {
    return formatAmount(a, this.units());
  }
}
