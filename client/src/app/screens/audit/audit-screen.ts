import { DatePipe } from '@angular/common';
import { Component, inject } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import { AuditEntry } from '../../core/api-types';
import { AuditService } from '../../core/audit.service';
import { valueOr } from '../../core/resource-state';

/** Admin: the latest 200 things people did in the team. */
@Component({
  selector: 'rn-audit-screen',
  imports: [DatePipe, MatTableModule, MatProgressBarModule],
  template: `
    <div class="rn-page">
      <header class="rn-page-header"><h1>Audit log</h1></header>
      <p class="rn-muted">The latest 200 actions in this team, newest first.</p>
      @if (entries.isLoading()) {
        <mat-progress-bar mode="indeterminate" aria-label="Loading audit log" />
      }
      <div class="rn-audit-card">
        <table mat-table [dataSource]="rows()" aria-label="Audit log" data-testid="audit-table">
          <ng-container matColumnDef="at">
            <th mat-header-cell *matHeaderCellDef>When</th>
            <td mat-cell *matCellDef="let e">
              <time [attr.datetime]="e.at">{{ e.at | date: 'd MMM y, HH:mm:ss' }}</time>
            </td>
          </ng-container>
          <ng-container matColumnDef="userEmail">
            <th mat-header-cell *matHeaderCellDef>Who</th>
            <td mat-cell *matCellDef="let e" [attr.title]="e.userEmail" data-testid="audit-who">{{ e.who }}</td>
          </ng-container>
          <ng-container matColumnDef="action">
            <th mat-header-cell *matHeaderCellDef>Action</th>
            <td mat-cell *matCellDef="let e">
              <code>{{ e.action }}</code>
            </td>
          </ng-container>
          <ng-container matColumnDef="target">
            <th mat-header-cell *matHeaderCellDef>Target</th>
            <td mat-cell *matCellDef="let e">{{ e.target }}</td>
          </ng-container>
          <ng-container matColumnDef="detail">
            <th mat-header-cell *matHeaderCellDef>Detail</th>
            <td mat-cell *matCellDef="let e" class="rn-detail">{{ describe(e.detail) }}</td>
          </ng-container>
          <tr mat-header-row *matHeaderRowDef="columns"></tr>
          <tr mat-row *matRowDef="let e; columns: columns"></tr>
          <tr class="mat-row" *matNoDataRow>
            <td class="mat-cell rn-empty" [attr.colspan]="columns.length">Nothing recorded yet.</td>
          </tr>
        </table>
      </div>
    </div>
  `,
  styles: `
    @use '../../../theme/table-card' as cards;

    /* A phone: one card per entry (when and who, then action, target, detail) instead of five squeezed columns. */
    .rn-audit-card {
      @include cards.table-card(auto minmax(0, 1fr), 2px 12px, 10px 16px);
    }
    code {
      font-size: 13px;
    }
    .mat-column-at {
      white-space: nowrap;
    }
    .rn-detail {
      color: var(--mat-sys-on-surface-variant);
      max-width: 360px;
      overflow-wrap: anywhere;
    }
    .rn-empty {
      padding: 24px 16px;
      color: var(--mat-sys-on-surface-variant);
    }
    @media (max-width: 599.98px) {
      .mat-column-at {
        font: var(--mat-sys-body-small);
        color: var(--mat-sys-on-surface-variant);
      }
      .mat-column-userEmail {
        text-align: right;
        font-weight: 500;
      }
      .mat-column-action,
      .mat-column-target,
      .rn-detail {
        grid-column: 1 / -1;
        max-width: none;
      }
    }
  `,
})
export class AuditScreen {
  private readonly audit = inject(AuditService);
  protected readonly columns = ['at', 'userEmail', 'action', 'target', 'detail'];
  protected readonly entries = rxResource({ stream: () => this.audit.entries() });
  /** A failed load shows an empty table (the snack bar says why). */
  protected readonly rows = valueOr(this.entries, []);

  /** `{ roles: ['reviewer', 'owner'] }` → "roles: reviewer, owner". */
  protected describe(detail: AuditEntry['detail']): string {
    if (detail === null || detail === undefined) return '';
    if (typeof detail !== 'object') return String(detail);
    return Object.entries(detail)
      .map(([key, value]) => `${key}: ${Array.isArray(value) ? value.join(', ') : typeof value === 'object' ? JSON.stringify(value) : String(value)}`)
      .join('; ');
  }
}
