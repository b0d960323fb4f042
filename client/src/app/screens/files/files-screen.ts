import { BreakpointObserver } from '@angular/cdk/layout';
import { DatePipe, NgTemplateOutlet } from '@angular/common';
import { Component, computed, inject, input, signal } from '@angular/core';
import { rxResource, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { firstValueFrom, map, of } from 'rxjs';
import { apiErrorMessage } from '../../core/api-errors';
import { ProjectContext } from '../../core/project-context';
import { SessionService } from '../../core/session.service';
import { confirmAction } from '../../shared/confirm-dialog';
import { FilesApi, kindWords, previewKind, ProjectFile, sizeWords } from './files-api.service';
import { SurveyPreview } from './survey-preview';

/**
 * The project's uploads (backdrops, surveys, walk photos): who added each and when, a preview
 * (the image, or a survey's points on a small plan and in a table), download, and for designers
 * rename and delete. Desktop shows the preview beside the list; a phone opens it under the file.
 */
@Component({
  selector: 'rn-files-screen',
  imports: [DatePipe, NgTemplateOutlet, MatButtonModule, MatFormFieldModule, MatInputModule, SurveyPreview],
  templateUrl: './files-screen.html',
  styleUrl: './files-screen.scss',
})
export class FilesScreen {
  private readonly api = inject(FilesApi);
  private readonly session = inject(SessionService);
  private readonly dialog = inject(MatDialog);
  private readonly context = inject(ProjectContext, { optional: true });
  readonly projectId = input.required<string>();

  readonly units = computed(() => this.context?.units() ?? 'us');
  readonly narrow = toSignal(
    inject(BreakpointObserver)
      .observe('(max-width: 899.98px)')
      .pipe(map((s) => s.matches)),
    { initialValue: false },
  );
  readonly files = rxResource({ params: () => this.projectId(), stream: ({ params }) => this.api.list(params) });
  readonly canWrite = computed(() => this.session.can('files.write'));

  /** The file being previewed (its id), the one being renamed, and the last error in words. */
  readonly open = signal<string | null>(null);
  readonly renaming = signal<string | null>(null);
  readonly error = signal('');
  readonly busy = signal(false);

  readonly openFile = computed(() => {
    const id = this.open();
    return (this.files.hasValue() ? this.files.value() : []).find((f) => f.id === id) ?? null;
  });
  readonly points = rxResource({
    params: () => {
      const f = this.openFile();
      return f && previewKind(f) === 'survey' ? { project: this.projectId(), file: f.id } : null;
    },
    stream: ({ params }) => (params ? this.api.points(params.project, params.file) : of(null)),
  });

  readonly kindWords = kindWords;
  readonly previewKind = previewKind;
  readonly sizeWords = sizeWords;
  readonly errorWords = apiErrorMessage;
  url = (f: ProjectFile) => this.api.url(this.projectId(), f.id);

  toggle(f: ProjectFile): void {
    this.open.set(this.open() === f.id ? null : f.id);
  }

  startRename(f: ProjectFile): void {
    this.error.set('');
    this.renaming.set(f.id);
  }

  async rename(f: ProjectFile, typed: string): Promise<void> {
    const name = typed.trim();
    if (!name) return this.error.set('A file needs a name.');
    if (name === f.filename) return this.renaming.set(null);
    this.busy.set(true);
    try {
      await firstValueFrom(this.api.rename(this.projectId(), f.id, name));
      this.renaming.set(null);
      this.error.set('');
      this.files.reload();
    } catch (err) {
      this.error.set(apiErrorMessage(err));
    } finally {
      this.busy.set(false);
    }
  }

  async remove(f: ProjectFile): Promise<void> {
    const sure = await firstValueFrom(
      confirmAction(this.dialog, {
        title: `Delete ${f.filename}?`,
        message:
          f.kind === 'backdrop'
            ? 'If the plan uses this image as its backdrop, the Layout will show no backdrop. This cannot be undone.'
            : 'The file is removed from the project for everyone. This cannot be undone.',
        confirmLabel: 'Delete',
        destructive: true,
      }),
    );
    if (!sure) return;
    try {
      await firstValueFrom(this.api.remove(this.projectId(), f.id));
      if (this.open() === f.id) this.open.set(null);
      this.error.set('');
      this.files.reload();
    } catch (err) {
      this.error.set(apiErrorMessage(err));
    }
  }
}
