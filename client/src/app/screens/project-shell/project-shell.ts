import { BreakpointObserver } from '@angular/cdk/layout';
import { afterNextRender, Component, effect, ElementRef, inject, Injector, input, viewChild } from '@angular/core';
import { rxResource, toSignal } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTabsModule } from '@angular/material/tabs';
import { MatTooltipModule } from '@angular/material/tooltip';
import { RouterLink, RouterLinkActive, RouterOutlet } from '@angular/router';
import { map } from 'rxjs';
import { loadErrorText } from '../../core/resource-state';
import { UNIT_SYSTEM_LABELS } from '../../core/api-types';
import { handleErrorsLocally } from '../../core/http-context';
import { ProjectContext } from '../../core/project-context';
import { ProjectsService } from '../../core/projects.service';

interface ProjectTab {
  path: string;
  label: string;
}

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
  imports: [
    RouterOutlet,
    RouterLink,
    RouterLinkActive,
    MatTabsModule,
    MatButtonModule,
    MatButtonToggleModule,
    MatIconModule,
    MatTooltipModule,
    MatProgressBarModule,
  ],
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
  protected readonly loadError = loadErrorText([this.project], {
    404: 'This project does not exist in your current team. It may have been deleted, or it belongs to another team.',
  });

  /**
   * On a touch screen the tab strip scrolls under the finger (no paging arrows: a tab half under an
   * arrow could not be tapped, and a swipe is what a phone user tries first). Mouse users keep the arrows.
   */
  protected readonly touch = toSignal(
    inject(BreakpointObserver)
      .observe('(pointer: coarse)')
      .pipe(map((s) => s.matches)),
    { initialValue: false },
  );
  private readonly tabBar = viewChild('tabBar', { read: ElementRef });
  private readonly injector = inject(Injector);

  constructor() {
    effect(() => this.context.set(this.project.hasValue() ? this.project.value() : null));
  }

  /**
   * A tab became active (a link, a reload, a tap near the edge): once drawn, scroll the swipeable
   * strip so the tab is wholly in sight, with a little of its neighbour showing there is more.
   */
  protected revealTab(path: string): void {
    afterNextRender(
      () => {
        const strip = this.tabBar()?.nativeElement as HTMLElement | undefined;
        const tab = strip?.querySelector<HTMLElement>(`[data-testid="tab-${path}"]`);
        if (!strip || !tab || !this.touch()) return;
        const s = strip.getBoundingClientRect();
        const t = tab.getBoundingClientRect();
        const peek = 32;
        if (t.left < s.left) strip.scrollLeft -= s.left - t.left + peek;
        else if (t.right > s.right) strip.scrollLeft += t.right - s.right + peek;
      },
      { injector: this.injector },
    );
  }
}
