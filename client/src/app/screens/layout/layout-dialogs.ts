import { ChangeDetectionStrategy, Component, inject } from '@angular/core';
import { FormControl, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { fromDisplay, unitLabel, UnitSystem } from '../../../../../engine/units';
import { SHORTCUTS } from './editor/keys';

/** 409 on save: the user decides; nothing is overwritten or dropped silently. */
@Component({
  selector: 'rn-save-conflict-dialog',
  imports: [MatDialogModule, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>Someone else saved this network</h2>
    <mat-dialog-content>
      <p>
        Version {{ data.version }} was saved{{ who() ? ' by ' + who() : '' }}{{ data.updatedAt ? ' at ' + when() : '' }}
        while you were editing. Your changes are still here, unsaved.
      </p>
      @if (data.summary) {
        <p class="summary" data-testid="conflict-summary">{{ data.summary }}</p>
      }
      <p><strong>Load theirs</strong> replaces your changes with the saved version. <strong>Keep mine</strong> saves your version over theirs.</p>
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button [mat-dialog-close]="'theirs'" data-testid="conflict-load-theirs">Load theirs</button>
      <button mat-flat-button [mat-dialog-close]="'mine'" data-testid="conflict-keep-mine">Keep mine</button>
    </mat-dialog-actions>
  `,
  styles: `
    .summary {
      background: #f3f5f7;
      border-left: 3px solid #1769c2;
      padding: 6px 10px;
    }
  `,
})
export class SaveConflictDialog {
  readonly data = inject<{ version: number; updatedAt?: string; updatedBy?: unknown; summary?: string }>(MAT_DIALOG_DATA);
  /** The server sends a name; older shapes sent a user record. */
  who(): string {
    const u = this.data.updatedBy;
    if (typeof u === 'string') return u;
    if (u && typeof u === 'object') {
      const r = u as { name?: unknown; email?: unknown };
      return typeof r.name === 'string' ? r.name : typeof r.email === 'string' ? r.email : '';
    }
    return '';
  }
  when(): string {
    return this.data.updatedAt ? new Date(this.data.updatedAt).toLocaleTimeString() : '';
  }
}

@Component({
  selector: 'rn-shortcuts-dialog',
  imports: [MatDialogModule, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>Keyboard shortcuts</h2>
    <mat-dialog-content>
      <table class="keys" data-testid="shortcuts-table">
        @for (s of shortcuts; track s.keys) {
          <tr>
            <th>
              <kbd>{{ s.keys }}</kbd>
            </th>
            <td>{{ s.action }}</td>
          </tr>
        }
      </table>
      <p class="tip">Drawing a line: choose Pipe, Pump or Valve, click the start element, click empty ground for bends, click the end element.</p>
    </mat-dialog-content>
    <mat-dialog-actions align="end"><button mat-button mat-dialog-close>Close</button></mat-dialog-actions>
  `,
  styles: `
    .keys {
      border-collapse: collapse;
      font-size: 14px;
    }
    th {
      text-align: left;
      padding: 4px 16px 4px 0;
      font-weight: 500;
      white-space: nowrap;
    }
    kbd {
      font-family: inherit;
      background: #eef1f4;
      border: 1px solid #c5ccd2;
      border-radius: 4px;
      padding: 1px 6px;
    }
    .tip {
      color: #5b6770;
      font-size: 13px;
    }
  `,
})
export class ShortcutsDialog {
  readonly shortcuts = SHORTCUTS;
}

/** Asks the real distance between the two points clicked with the scale tool; returns metres. */
@Component({
  selector: 'rn-calibrate-dialog',
  imports: [MatDialogModule, MatButtonModule, MatCheckboxModule, MatFormFieldModule, MatInputModule, ReactiveFormsModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>Set the scale</h2>
    <mat-dialog-content>
      <p>How far apart are the two points you clicked, on the ground?</p>
      <mat-form-field>
        <mat-label>Distance</mat-label>
        <input matInput [formControl]="distance" inputmode="decimal" data-testid="calibrate-distance" (keydown.enter)="ok()" />
        <span matTextSuffix>{{ label }}</span>
        @if (distance.invalid && distance.touched) {
          <mat-error>Enter a distance greater than zero</mat-error>
        }
      </mat-form-field>
      @if (data.hasBackdrop && data.hasNetwork) {
        <mat-checkbox [formControl]="network" data-testid="calibrate-network">
          Rescale the drawn network too (it was drawn over this backdrop before the scale was set)
        </mat-checkbox>
      }
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button mat-dialog-close>Cancel</button>
      <button mat-flat-button (click)="ok()" data-testid="calibrate-ok">Set scale</button>
    </mat-dialog-actions>
  `,
})
export class CalibrateDialog {
  private readonly ref = inject(MatDialogRef<CalibrateDialog, { metres: number; network: boolean }>);
  readonly data = inject<{ units: UnitSystem; hasBackdrop: boolean; hasNetwork: boolean; backdropScaled: boolean }>(MAT_DIALOG_DATA);
  readonly label = unitLabel('length', this.data.units);
  /** Without a backdrop the scale applies to the network; a never-scaled backdrop suggests both. */
  readonly network = new FormControl(!this.data.hasBackdrop || !this.data.backdropScaled, { nonNullable: true });
  readonly distance = new FormControl<string>('', [
    Validators.required,
    Validators.pattern(/^\s*\d*\.?\d+\s*$/),
    (c) => (Number(c.value) > 0 ? null : { positive: true }),
  ]);

  ok(): void {
    this.distance.markAsTouched();
    if (this.distance.valid) {
      this.ref.close({ metres: fromDisplay('length', Number(this.distance.value), this.data.units), network: this.network.value || !this.data.hasBackdrop });
    }
  }
}

/** Messages from a rejected import, each naming the element and field. */
@Component({
  selector: 'rn-messages-dialog',
  imports: [MatDialogModule, MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <h2 mat-dialog-title>{{ data.title }}</h2>
    <mat-dialog-content>
      <ul data-testid="messages-list">
        @for (m of data.messages; track $index) {
          <li>{{ m }}</li>
        }
      </ul>
    </mat-dialog-content>
    <mat-dialog-actions align="end"><button mat-button mat-dialog-close>Close</button></mat-dialog-actions>
  `,
})
export class MessagesDialog {
  readonly data = inject<{ title: string; messages: string[] }>(MAT_DIALOG_DATA);
}

/** Preview of "apply survey elevations to all": what each element would change to; Apply is one undo step. */
@Component({
  selector: 'rn-survey-apply-dialog',
  imports: [MatDialogModule, MatButtonModule],
  template: `
    <h2 mat-dialog-title>Elevations from the survey</h2>
    <mat-dialog-content>
      @if (data.rows.length) {
        <p>Each element within 25 m of a survey point takes that point's elevation:</p>
        <table class="survey-preview" data-testid="survey-preview">
          <tr>
            <th>Element</th>
            <th>Now</th>
            <th>From survey</th>
            <th>Point</th>
          </tr>
          @for (r of data.rows; track r.id) {
            <tr>
              <td>{{ r.name }}</td>
              <td>{{ r.now }}</td>
              <td>{{ r.next }}</td>
              <td>{{ r.point }}</td>
            </tr>
          }
        </table>
      } @else {
        <p data-testid="survey-preview-empty">No element is within 25 m of a survey point with a different elevation.</p>
      }
    </mat-dialog-content>
    <mat-dialog-actions align="end">
      <button mat-button mat-dialog-close>Cancel</button>
      @if (data.rows.length) {
        <button mat-flat-button [mat-dialog-close]="true" data-testid="survey-apply">Apply to {{ data.rows.length }}</button>
      }
    </mat-dialog-actions>
  `,
  styles: `
    .survey-preview {
      border-collapse: collapse;
      font-size: 13px;
    }
    .survey-preview td,
    .survey-preview th {
      padding: 3px 10px 3px 0;
      text-align: left;
    }
  `,
})
export class SurveyApplyDialog {
  readonly data = inject<{ rows: { id: string; name: string; now: string; next: string; point: string }[] }>(MAT_DIALOG_DATA);
}
