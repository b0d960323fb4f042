import { DatePipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, effect, inject, input, OnDestroy, signal, untracked } from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatExpansionModule } from '@angular/material/expansion';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { Router } from '@angular/router';
import { catchError, firstValueFrom, of } from 'rxjs';
import { ProfileSettings } from '../profile/profile-settings';
import type { Checklist } from '../../../../../engine/review/types';
import { ProjectContext } from '../../core/project-context';
import { SessionService } from '../../core/session.service';
import { ChecklistTable } from './checklist-table';
import { CommentsPanel } from './comments-panel';
import { ComparePanel } from './compare-panel';
import { ReviewApi, type ReviewThread, type StoredVersion, type VersionStatus, type VersionSummary } from './review-api.service';
import { ReviewEngine } from './review-engine';
import { WhatIfPanel } from './what-if-panel';

const STATUS_TEXT: Record<VersionStatus, string> = {
  draft: 'Draft',
  submitted: 'Submitted for review',
  approved: 'Approved (frozen)',
  returned: 'Returned with comments',
};

/**
 * Review tab: pick a version, read its checklist (computed in the review worker from that frozen
 * document), comment with pins, run the what-if failures, compare with another version, and move
 * the version through sign-off (designer submits; reviewer approves or returns). The server decides
 * every permission; the buttons only follow `SessionService.can`.
 */
@Component({
  selector: 'rn-review-screen',
  imports: [
    DatePipe,
    FormsModule,
    MatButtonModule,
    MatExpansionModule,
    MatFormFieldModule,
    MatInputModule,
    MatProgressBarModule,
    MatSelectModule,
    ChecklistTable,
    CommentsPanel,
    ComparePanel,
    WhatIfPanel,
  ],
  changeDetection: ChangeDetectionStrategy.OnPush,
  templateUrl: './review-screen.html',
  styleUrl: './review-screen.scss',
})
export class ReviewScreen implements OnDestroy {
  readonly projectId = input.required<string>();
  /** `?version=N` from a mail link; default the newest version. */
  // The router binds query parameters by name.
  // eslint-disable-next-line @angular-eslint/no-input-rename
  readonly versionParam = input<string | undefined>(undefined, { alias: 'version' });

  private readonly api = inject(ReviewApi);
  private readonly session = inject(SessionService);
  private readonly router = inject(Router);
  private readonly context = inject(ProjectContext, { optional: true });
  private readonly engine = new ReviewEngine();
  private readonly profileSettings = inject(ProfileSettings);

  readonly units = computed(() => this.context?.units() ?? 'us');
  readonly versions = signal<VersionSummary[]>([]);
  readonly selected = signal<number | null>(null);
  readonly current = signal<StoredVersion | null>(null);
  readonly checklist = signal<Checklist | null>(null);
  readonly threads = signal<ReviewThread[]>([]);
  readonly loading = signal(true);
  readonly error = signal('');
  readonly note = signal('');
  readonly busy = signal(false);
  /** The comments panel opens by itself when a version is loaded with open comments. */
  readonly commentsOpen = signal(false);
  readonly statusText = STATUS_TEXT;

  readonly latest = computed(() => this.versions()[0]?.version ?? 0);
  readonly canSubmit = computed(() => {
    const v = this.current();
    return this.session.can('review.submit') && !!v && v.version === this.latest() && (v.status === 'draft' || v.status === 'returned');
  });
  readonly canDecide = computed(() => this.session.can('review.decide') && this.current()?.status === 'submitted');
  readonly canComment = computed(() => this.session.can('review.comment'));
  readonly elements = computed(() => {
    const d = this.current()?.document;
    return d ? [...d.nodes, ...d.links].map((e) => ({ id: e.id, name: e.name })) : [];
  });
  readonly versionThreads = computed(() => this.threads());
  readonly openCount = computed(() => this.threads().filter((t) => !t.resolved).length);

  constructor() {
    effect(() => {
      const id = this.projectId();
      const wanted = Number(this.versionParam());
      untracked(() => void this.loadVersions(id, Number.isInteger(wanted) && wanted > 0 ? wanted : null));
    });
  }

  private async loadVersions(id: string, wanted: number | null): Promise<void> {
    this.loading.set(true);
    try {
      const { versions } = await firstValueFrom(this.api.versions(id));
      this.versions.set(versions);
      const pick = wanted !== null && versions.some((v) => v.version === wanted) ? wanted : (versions[0]?.version ?? null);
      await Promise.all([this.open(pick), this.loadThreads()]);
      this.commentsOpen.set(this.openCount() > 0);
    } catch {
      this.error.set('The versions of this project could not be loaded.');
    } finally {
      this.loading.set(false);
    }
  }

  async open(version: number | null): Promise<void> {
    this.selected.set(version);
    this.checklist.set(null);
    this.current.set(null);
    if (version === null) return;
    const id = this.projectId();
    const [stored, budget, profile] = await Promise.all([
      firstValueFrom(this.api.version(id, version)),
      firstValueFrom(this.api.budget(id)),
      // without the saved cover the checks use the engine's default (a failed read is not a reason to show no checklist)
      firstValueFrom(this.profileSettings.load(id).pipe(catchError(() => of(null)))),
    ]);
    if (this.selected() !== version) return;
    this.current.set(stored);
    try {
      this.checklist.set(await this.engine.checklist(stored.document, budget?.document, profile?.cover_m));
    } catch (e) {
      this.error.set(`The checklist could not be computed: ${e instanceof Error ? e.message : String(e)}`);
    }
  }

  async loadThreads(): Promise<void> {
    const { threads } = await firstValueFrom(this.api.threads(this.projectId()));
    this.threads.set(threads);
  }

  async transition(action: 'submit' | 'approve' | 'return'): Promise<void> {
    const v = this.current();
    if (!v) return;
    this.busy.set(true);
    try {
      await firstValueFrom(this.api.transition(this.projectId(), v.version, action, this.note().trim()));
      this.note.set('');
      await this.loadVersions(this.projectId(), v.version);
    } finally {
      this.busy.set(false);
    }
  }

  selectOnLayout(element: string): void {
    void this.router.navigate(['/projects', this.projectId(), 'layout'], {
      queryParams: { select: element, ...(this.current() && this.current()!.version !== this.latest() ? { version: this.current()!.version } : {}) },
    });
  }

  openOnLayout(): void {
    const v = this.current();
    void this.router.navigate(['/projects', this.projectId(), 'layout'], { queryParams: v && v.version !== this.latest() ? { version: v.version } : {} });
  }

  ngOnDestroy(): void {
    this.engine.dispose();
  }
}
