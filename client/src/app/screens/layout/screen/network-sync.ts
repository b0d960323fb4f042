import type { MatDialog } from '@angular/material/dialog';
import type { MatSnackBar } from '@angular/material/snack-bar';
import { firstValueFrom } from 'rxjs';
import type { SteadyResult } from '../../../../../../engine/index';
import type { UnitSystem } from '../../../../../../engine/units';
import { conflictSummary } from '../editor/document-diff';
import { emptyDocument, markTypedLengths } from '../editor/document-store';
import type { Editor } from '../editor/editor';
import { FreshnessCheck } from '../editor/freshness-check';
import { SaveController, SaveStatus, ServerCopy } from '../editor/save-controller';
import { realTimers } from '../editor/timers';
import { SaveConflictDialog } from '../layout-dialogs';
import type { LayoutApi } from '../layout-api.service';

/** What the sync needs from the screen: its services, and where to put what it learns. */
export interface SyncHost {
  api: LayoutApi;
  dialog: MatDialog;
  snack: MatSnackBar;
  editor: Editor;
  canEdit(): boolean;
  status(s: SaveStatus): void;
  project(p: { units: UnitSystem; name: string }): void;
  serverResults(r: SteadyResult | null): void;
  loadError(message: string): void;
  /** After a project's network is in the editor (the review shows a linked version or element then). */
  loaded?(projectId: string): void;
}

/**
 * The network's round trip with the server: loading a project's network, autosave (SaveController),
 * noticing versions saved elsewhere (FreshnessCheck), and the conflict dialog on a 409.
 */
export class NetworkSync {
  readonly saver: SaveController;
  readonly freshness: FreshnessCheck;
  private loadedProject = '';
  private notifiedRevision = 0;
  private conflictOpen = false;

  constructor(private readonly host: SyncHost) {
    const ed = host.editor;
    this.saver = new SaveController(
      // Saves go to the project whose network was loaded, even while the route moves on.
      { put: (version, doc) => host.api.saveNetwork(this.loadedProject, version, doc) },
      realTimers,
      () => ed.store.doc,
      (s) => host.status(s),
    );
    this.freshness = new FreshnessCheck(
      () => this.fetchServerCopy(),
      realTimers,
      () => this.saver,
      (decision, copy) => (decision === 'reload' ? this.reloadFromServer(copy) : this.saver.raiseConflict(copy)),
    );
  }

  get project(): string {
    return this.loadedProject;
  }

  dispose(): void {
    this.saver.flush();
    this.saver.dispose();
    this.freshness.dispose();
  }

  /** Tell autosave about committed edits only: a drag saves once, when it ends. */
  noteEdit(): void {
    const store = this.host.editor.store;
    if (store.inGesture || store.revision === this.notifiedRevision) return;
    this.notifiedRevision = store.revision;
    this.saver.changed();
  }

  load(projectId: string): void {
    const { api, editor } = this.host;
    // Same screen, another project: send what is pending for the previous one first.
    if (this.loadedProject && this.loadedProject !== projectId) this.saver.flush();
    this.host.status('loading');
    api.project(projectId).subscribe({
      next: (p) => {
        editor.units = p.units;
        this.host.project({ units: p.units, name: p.name });
      },
      error: () => undefined,
    });
    api.network(projectId).subscribe({
      next: (rec) => {
        const doc = rec.document && Array.isArray(rec.document.nodes) ? markTypedLengths(rec.document) : emptyDocument();
        this.loadedProject = projectId;
        editor.store.replace(doc);
        this.notifiedRevision = editor.store.revision;
        this.host.serverResults(rec.results ?? null);
        if (this.host.canEdit()) {
          this.saver.loaded(rec.version);
          this.freshness.setVisible(document.visibilityState === 'visible');
        } else this.saver.setReadOnly();
        editor.fitToView();
        this.host.loaded?.(projectId);
      },
      error: () => this.host.loadError('The network could not be loaded. Reload the page to try again.'),
    });
  }

  visibilityChanged(): void {
    this.freshness.setVisible(document.visibilityState === 'visible' && this.host.canEdit() && !!this.loadedProject);
  }

  private async fetchServerCopy(): Promise<ServerCopy | null> {
    const project = this.loadedProject;
    if (!project) return null;
    const rec = await firstValueFrom(this.host.api.network(project, true));
    // Another project opened meanwhile: this answer is about the old one.
    if (project !== this.loadedProject || !rec.document || !Array.isArray(rec.document.nodes)) return null;
    return { version: rec.version, document: rec.document, updatedAt: rec.updatedAt ?? undefined, updatedBy: rec.updatedBy };
  }

  /** Nothing unsaved here and a newer version on the server: show that one, and say so. */
  private reloadFromServer(copy: ServerCopy): void {
    this.host.editor.store.replace(markTypedLengths(copy.document));
    this.notifiedRevision = this.host.editor.store.revision;
    this.saver.loaded(copy.version);
    this.host.serverResults(null);
    const by = copy.updatedBy ? ` saved by ${copy.updatedBy}` : ' saved elsewhere';
    this.host.snack.open(`Reloaded version ${copy.version}${by}.`, 'OK', { duration: 6000 });
  }

  /** A 409 on save: ask once; never overwrite or drop anything without the user's word. */
  askAboutConflict(): void {
    const current = this.saver.conflict;
    if (this.saver.status !== 'conflict' || this.conflictOpen || !current) return;
    this.conflictOpen = true;
    const summary = conflictSummary(this.saver.base, this.host.editor.store.doc, current.document);
    const ref = this.host.dialog.open(SaveConflictDialog, { data: { ...current, summary }, disableClose: true, width: '460px' });
    ref.afterClosed().subscribe((choice: 'mine' | 'theirs' | undefined) => {
      this.conflictOpen = false;
      if (choice === 'theirs') {
        const theirs = this.saver.conflict;
        if (theirs) this.host.editor.store.replace(markTypedLengths(theirs.document));
        this.saver.takeTheirs();
      } else this.saver.keepMine();
    });
  }
}
