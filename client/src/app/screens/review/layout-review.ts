import type { Router } from '@angular/router';
import { firstValueFrom } from 'rxjs';
import type { Editor } from '../layout/editor/editor';
import type { PlanMarkers } from '../layout/canvas/markers';
import type { ReviewApi, ReviewThread } from './review-api.service';

/** What the Layout lends the review: its editor, its plan markers and the router. */
export interface LayoutReviewHost {
  editor: Editor;
  markers: PlanMarkers;
  router: Router;
  api: ReviewApi;
  /** The version shown read-only, once loaded (the screen's banner reads it). */
  shown(version: number | null): void;
}

/**
 * The review's part of the Layout: open comment threads as pins on the plan (a click opens the
 * Review tab at the thread's version), `?select=ID` from a checklist row, and `?version=N` showing
 * an earlier saved version read-only in place of the current one.
 */
export class LayoutReview {
  constructor(private readonly host: LayoutReviewHost) {}

  async loadPins(projectId: string): Promise<void> {
    let threads: ReviewThread[];
    try {
      threads = (await firstValueFrom(this.host.api.threads(projectId))).threads;
    } catch {
      return;
    }
    this.host.markers.set(
      'comments',
      threads
        .filter((t) => !t.resolved)
        .map((t) => ({
          id: t.id,
          at: t.element ? { element: t.element } : { point: { x: t.x_m ?? 0, y: t.y_m ?? 0 } },
          kind: 'pin',
          label: t.replies.length ? String(t.replies.length + 1) : undefined,
          onClick: () => void this.host.router.navigate(['/projects', projectId, 'review'], { queryParams: { version: t.version } }),
        })),
    );
  }

  /**
   * Call each time the current network has loaded: shows version `version` read-only (when given)
   * in its place, and selects `select`.
   */
  async afterLoad(projectId: string, version: number | null, select: string | null): Promise<void> {
    const { editor } = this.host;
    if (version !== null) {
      const stored = await firstValueFrom(this.host.api.version(projectId, version));
      editor.store.replace(stored.document);
      editor.fitToView();
      this.host.shown(version);
    } else this.host.shown(null);
    if (select && [...editor.store.doc.nodes, ...editor.store.doc.links].some((e) => e.id === select)) editor.reveal(select);
  }

  dispose(): void {
    this.host.markers.clear('comments');
  }
}
