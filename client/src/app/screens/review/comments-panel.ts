import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { firstValueFrom } from 'rxjs';
import type { NetworkDocument } from '../../../../../engine/network-document';
import { PlanPointPicker, type PlanPoint } from './plan-point-picker';
import { ReviewApi, type ReviewThread } from './review-api.service';

/**
 * Review comments: the threads of the project (open first), each pinned to an element or a plan
 * point, with replies and resolve / reopen; a form to pin a new one to an element of the version shown
 * or to a point clicked on its plan (./plan-point-picker).
 */
@Component({
  selector: 'rn-comments-panel',
  imports: [DatePipe, FormsModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatSelectModule, PlanPointPicker],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (canComment() && !frozen()) {
      <form class="rn-comment-form" (ngSubmit)="add()" data-testid="comment-form">
        <mat-form-field appearance="outline" subscriptSizing="dynamic">
          <mat-label>Pin to</mat-label>
          <mat-select [ngModel]="element()" (ngModelChange)="element.set($event)" name="element" data-testid="comment-element">
            <mat-option [value]="POINT" data-testid="comment-at-point">A point on the plan…</mat-option>
            @for (e of elements(); track e.id) {
              <mat-option [value]="e.id">{{ e.id }}{{ e.name ? ' · ' + e.name : '' }}</mat-option>
            }
          </mat-select>
        </mat-form-field>
        @if (element() === POINT) {
          <div class="rn-point-pick">
            <p class="rn-small rn-muted" data-testid="plan-point-hint">
              @if (point(); as p) {
                Pinned at {{ p.x_m.toFixed(1) }}, {{ p.y_m.toFixed(1) }} m on the site plan; click again to move it.
              } @else {
                Click or tap the plan where the comment belongs.
              }
            </p>
            <rn-plan-point-picker [document]="document()" [pins]="pointPins()" [point]="point()" (picked)="point.set($event)" />
          </div>
        }
        <mat-form-field appearance="outline" subscriptSizing="dynamic" class="rn-grow">
          <mat-label>Comment on version {{ version() }}</mat-label>
          <textarea matInput rows="2" [ngModel]="body()" (ngModelChange)="body.set($event)" name="body" data-testid="comment-body"></textarea>
        </mat-form-field>
        <button mat-flat-button type="submit" [disabled]="!ready() || !body().trim() || busy()" data-testid="comment-add">Pin comment</button>
      </form>
    } @else if (frozen()) {
      <p class="rn-muted">Version {{ version() }} is approved and frozen; comment on the current version.</p>
    }
    @if (!threads().length) {
      <p class="rn-muted" data-testid="comments-empty">No comments yet.</p>
    }
    <ul class="rn-threads">
      @for (t of sorted(); track t.id) {
        <li
          class="rn-thread"
          [class.rn-resolved]="t.resolved"
          [attr.data-testid]="'thread-' + (t.element ?? 'point')"
          [attr.data-point]="t.element ? null : t.x_m + ',' + t.y_m"
        >
          <div class="rn-thread-head">
            <button mat-button type="button" (click)="t.element ? selectElement.emit(t.element) : showPlan.emit()" data-testid="thread-element">
              {{ t.element ? 'Show ' + t.element : 'plan point ' + t.x_m?.toFixed(1) + ', ' + t.y_m?.toFixed(1) + ' m' }}
            </button>
            <span class="rn-muted rn-small">version {{ t.version }} · {{ t.createdBy }} · {{ t.createdAt | date: 'short' }}</span>
            <span class="rn-verdict" [class.rn-verdict-pass]="t.resolved" [class.rn-verdict-caution]="!t.resolved">{{ t.resolved ? 'resolved' : 'open' }}</span>
          </div>
          <p class="rn-thread-body">{{ t.body }}</p>
          @for (r of t.replies; track r.id) {
            <p class="rn-reply">
              <span class="rn-muted rn-small">{{ r.createdBy }}:</span> {{ r.body }}
            </p>
          }
          @if (canComment()) {
            <div class="rn-thread-actions">
              <mat-form-field appearance="outline" subscriptSizing="dynamic" class="rn-grow">
                <mat-label>Reply</mat-label>
                <input matInput [ngModel]="replies()[t.id] ?? ''" (ngModelChange)="setReply(t.id, $event)" [name]="'reply-' + t.id" data-testid="reply-body" />
              </mat-form-field>
              <button mat-button type="button" (click)="reply(t)" [disabled]="!(replies()[t.id] ?? '').trim() || busy()" data-testid="reply-send">Reply</button>
              <button mat-stroked-button type="button" (click)="resolve(t)" [disabled]="busy()" data-testid="thread-resolve">
                {{ t.resolved ? 'Reopen' : 'Resolve' }}
              </button>
            </div>
          }
        </li>
      }
    </ul>
  `,
  styleUrl: './review-screen.scss',
})
export class CommentsPanel {
  private readonly api = inject(ReviewApi);
  readonly projectId = input.required<string>();
  readonly version = input.required<number>();
  readonly frozen = input(false);
  readonly canComment = input(false);
  readonly threads = input.required<ReviewThread[]>();
  readonly elements = input.required<{ id: string; name?: string }[]>();
  /** The version's document, drawn when a comment is pinned to a plan point. */
  readonly document = input<NetworkDocument | null>(null);
  readonly changed = output<void>();
  readonly selectElement = output<string>();
  /** A plan-point thread asks for the Layout, where its pin stands. */
  readonly showPlan = output<void>();

  /** The "Pin to" choice that means a point on the plan rather than an element. */
  protected readonly POINT = '@plan-point';
  readonly element = signal<string | null>(null);
  readonly point = signal<PlanPoint | null>(null);
  readonly ready = computed(() => (this.element() === this.POINT ? this.point() !== null : !!this.element()));
  readonly pointPins = computed(() =>
    this.threads()
      .filter((t) => !t.resolved && !t.element && t.x_m !== null && t.y_m !== null)
      .map((t) => ({ id: t.id, x_m: t.x_m as number, y_m: t.y_m as number })),
  );
  readonly body = signal('');
  readonly replies = signal<Record<string, string | undefined>>({});
  readonly busy = signal(false);
  readonly sorted = computed(() => [...this.threads()].sort((a, b) => Number(a.resolved) - Number(b.resolved) || b.version - a.version));

  setReply(id: string, text: string): void {
    this.replies.update((r) => ({ ...r, [id]: text }));
  }

  private async act(fn: () => Promise<unknown>): Promise<void> {
    this.busy.set(true);
    try {
      await fn();
      this.changed.emit();
    } finally {
      this.busy.set(false);
    }
  }

  add(): void {
    const element = this.element();
    const point = this.point();
    if (!this.ready() || !element) return;
    const at = element === this.POINT && point ? { x_m: point.x_m, y_m: point.y_m } : { element };
    void this.act(async () => {
      await firstValueFrom(this.api.comment(this.projectId(), { version: this.version(), ...at, body: this.body().trim() }));
      this.body.set('');
      this.point.set(null);
    });
  }

  reply(t: ReviewThread): void {
    void this.act(async () => {
      await firstValueFrom(this.api.comment(this.projectId(), { version: t.version, parentId: t.id, body: (this.replies()[t.id] ?? '').trim() }));
      this.setReply(t.id, '');
    });
  }

  resolve(t: ReviewThread): void {
    void this.act(() => firstValueFrom(this.api.resolve(this.projectId(), t.id, !t.resolved)));
  }
}
