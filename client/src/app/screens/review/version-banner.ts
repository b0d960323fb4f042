import { ChangeDetectionStrategy, Component, inject, input, signal } from '@angular/core';
import { MatButtonModule } from '@angular/material/button';
import { Router } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import { ReviewApi } from './review-api.service';

/** The Layout's strip while an earlier version is shown read-only: back to the current one, or restore it as a new version. */
@Component({
  selector: 'rn-version-banner',
  imports: [MatButtonModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    <div class="rn-version-banner" role="status" data-testid="version-banner">
      <span>Viewing version {{ version() }}, read-only.</span>
      <button mat-button type="button" (click)="back()" data-testid="version-back">Back to the current version</button>
      @if (canRestore()) {
        <button mat-flat-button type="button" (click)="restore()" [disabled]="busy()" data-testid="version-restore">Restore as a new version</button>
      }
    </div>
  `,
  styles: `
    .rn-version-banner {
      display: flex;
      flex-wrap: wrap;
      gap: 8px;
      align-items: center;
      padding: 4px 12px;
      background: #fdf0c9;
      color: #3c3000;
      font-size: 14px;
    }
  `,
})
export class VersionBanner {
  private readonly api = inject(ReviewApi);
  private readonly router = inject(Router);
  readonly projectId = input.required<string>();
  readonly version = input.required<number>();
  readonly canRestore = input(false);
  readonly busy = signal(false);

  back(): void {
    void this.router.navigate(['/projects', this.projectId(), 'layout']);
  }

  async restore(): Promise<void> {
    this.busy.set(true);
    try {
      const { versions } = await firstValueFrom(this.api.versions(this.projectId()));
      await firstValueFrom(this.api.restore(this.projectId(), this.version(), versions[0]?.version ?? 0));
      this.back();
    } finally {
      this.busy.set(false);
    }
  }
}
