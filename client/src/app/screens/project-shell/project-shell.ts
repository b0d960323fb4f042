import { Component, computed, effect, inject, input } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTabsModule } from '@angular/material/tabs';
import { MatTooltipModule } from '@angular/material/tooltip';
import { RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { apiErrorMessage } from '../../core/api-errors';
import { UNIT_SYSTEM_LABELS } from '../../core/api-types';
import { handleErrorsLocally } from '../../core/http-context';
import { ProjectContext } from '../../core/project-context';
import { ProjectsService } from '../../core/projects.service';

interface ProjectTab { path: string; label: string }

export const PROJECT_TABS: readonly ProjectTab[] = [
  { path: 'layout', label: 'Layout' },
  { path: 'budget', label: 'Water budget' },
  { path: 'profile', label: 'Profile' },
  { path: 'timeline', label: 'Timeline' },
  { path: 'review', label: 'Review' },
  { path: 'options', label: 'Options' },
  { path: 'takeoff', label: 'Takeoff' },
  { path: 'files', label: 'Files' },
  { path: 'walk', label: 'Walk' },
];

/** Frame of an open project: a compact header and the tab bar; the tab's screen fills the rest. */
@Component({
  selector: 'rn-project-shell',
  imports: [RouterOutlet, RouterLink, RouterLinkActive, MatTabsModule, MatButtonModule, MatButtonToggleModule, MatIconModule, MatTooltipModule, MatProgressBarModule],
  providers: [ProjectContext],
  templateUrl: './project-shell.html',
  styleUrl: './project-shell.scss',
})
export class ProjectShell {
  private readonly projectsApi = inject(ProjectsService);
  protected readonly context = inject(ProjectContext);
  protected readonly units = this.context.units;

  readonly projectId = input.required<string>();

  protected readonly tabs = PROJECT_TABS;
  protected readonly unitLabels = UNIT_SYSTEM_LABELS;
  protected readonly project = rxResource({
    params: () => this.projectId(),
    stream: ({ params }) => this.projectsApi.get(params, handleErrorsLocally(404)),
  });
  protected readonly loadError = computed(() => {
    const err = this.project.error();
    return err
      ? apiErrorMessage(err, {
          404: 'This project does not exist in your current team. It may have been deleted, or it belongs to another team.',
        })
      : null;
  });

  constructor() {
    effect(() => this.context.set(this.project.hasValue() ? this.project.value() : null));
  }
}
