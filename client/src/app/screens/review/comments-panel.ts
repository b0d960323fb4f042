import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input, output, signal } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { firstValueFrom } from 'rxjs';
import { ReviewApi, type ReviewThread } from './review-api.service';

/**
 * Review comments: the threads of the project (open first), each pinned to an element or a plan
 * point, with replies and resolve / reopen; a form to pin a new one to an element of the version shown.
 */
@Component({
  selector: 'rn-comments-panel',
  imports: [DatePipe, FormsModule, MatButtonModule, MatFormFieldModule, MatInputModule, MatSelectModule],
  changeDetection: ChangeDetectionStrategy.OnPush,
  template: `
    @if (canComment() && !frozen()) {
      <form class="rn-comment-form" (ngSubmit)="add()" data-testid="comment-form">
        <mat-form-field appearance="outline" subscriptSizing="dynamic">
          <mat-label>Pin to</mat-label>
          <mat-select [ngModel]="element()" (ngModelChange)="element.set($event)" name="element" data-testid="comment-element">
            @for (e of elements(); track e.id) { <mat-option [value]="e.id">{{ e.id }}{{ e.name ? ' · ' + e.name : '' }}</mat-option> }
          </mat-select>
        </mat-form-field>
        <mat-form-field appearance="outline" subscriptSizing="dynamic" class="rn-grow">
          <mat-label>Comment on version {{ version() }}</mat-label>
          <textarea matInput rows="2" [ngModel]="body()" (ngModelChange)="body.set($event)" name="body" data-testid="comment-body"></textarea>
        </mat-form-field>
        <button mat-flat-button type="submit" [disabled]="!element() || !body().trim() || busy()" data-testid="comment-add">Pin comment</button>
      </form>
    } @else if (frozen()) {
      <p class="rn-muted">Version {{ version() }} is approved and frozen; comment on the current version.</p>
    }
    @if (!threads().length) { <p class="rn-muted" data-testid="comments-empty">No comments yet.</p> }
    <ul class="rn-threads">
      @for (t of sorted(); track t.id) {
        <li class="rn-thread" [class.rn-resolved]="t.resolved" [attr.data-testid]="'thread-' + (t.element ?? 'point')">
          <div class="rn-thread-head">
            <button mat-button type="button" (click)="t.element && selectElement.emit(t.element)" [disabled]="!t.element" data-testid="thread-element">
              {{ t.element ? 'Show ' + t.element : ('plan point ' + t.x_m?.toFixed(1) + ', ' + t.y_m?.toFixed(1) + ' m') }}
            </button>
            <span class="rn-muted rn-small">version {{ t.version }} · {{ t.createdBy }} · {{ t.createdAt | date: 'short' }}</span>
            <span class="rn-verdict" [class.rn-verdict-pass]="t.resolved" [class.rn-verdict-caution]="!t.resolved">{{ t.resolved ? 'resolved' : 'open' }}</span>
          </div>
          <p class="rn-thread-body">{{ t.body }}</p>
          @for (r of t.replies; track r.id) {
            <p class="rn-reply"><span class="rn-muted rn-small">{{ r.createdBy }}:</span> {{ r.body }}</p>
          }
          @if (canComment()) {
            <div class="rn-thread-actions">
              <mat-form-field appearance="outline" subscriptSizing="dynamic" class="rn-grow">
                <mat-label>Reply</mat-label>
                <input matInput [ngModel]="replies()[t.id] ?? ''" (ngModelChange)="setReply(t.id, $event)" [name]="'reply-' + t.id" data-testid="reply-body" />
              </mat-form-field>
              <button mat-button type="button" (click)="reply(t)" [disabled]="!(replies()[t.id] ?? '').trim() || busy()" data-testid="reply-send">Reply</button>
              <button mat-stroked-button type="button" (click)="resolve(t)" [disabled]="busy()" data-testid="thread-resolve">{{ t.resolved ? 'Reopen' : 'Resolve' }}</button>
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
  readonly changed = output<void>();
  readonly selectElement = output<string>();

  readonly element = signal<string | null>(null);
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
    if (!element) return;
    void this.act(async () => {
      await firstValueFrom(this.api.comment(this.projectId(), { version: this.version(), element, body: this.body().trim() }));
      this.body.set('');
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
